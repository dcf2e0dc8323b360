"""The command line on odd input: validate checks what every verb needs, no traceback ever, --debug anywhere.

Each test here failed on the code before the fix it guards (issue 10 items 9, 12, 15, 17).
"""
import subprocess
import sys
from pathlib import Path

import pytest

from simulator import cli
from simulator.cli import main

DEMO = (Path(__file__).parents[1] / "cases" / "decomposition_empty_tube.toml").read_text()
UNCERTAIN = '\n[[uncertainty]]\nparameter = "feed.temperature"\ndistribution = "normal"\nstd = "5 K"\n'


def _errors(capsys):
    err = capsys.readouterr().err
    assert "Traceback" not in err
    return [line for line in err.splitlines() if line.startswith("error: ")]


def test_validate_refuses_a_viscosity_that_run_cannot_find(write_case, capsys):
    # custom species have no transport data: before, validate said "valid" and run exited 2
    path = write_case(DEMO.replace('model = "none"', 'model = "pipe-friction"'))
    assert main(["validate", str(path)]) == 2
    (line,) = _errors(capsys)
    assert "pressure_drop.viscosity" in line and "give pressure_drop.viscosity" in line
    assert "needed by run and every verb that runs the tube" in line
    given = write_case(DEMO.replace('model = "none"', 'model = "pipe-friction"\nviscosity = "2e-5 Pa*s"'), "mu.toml")
    assert main(["validate", str(given)]) == 0


def test_validate_refuses_peng_robinson_without_critical_constants(write_case, capsys):
    path = write_case(DEMO.replace('equation_of_state = "ideal-gas"', 'equation_of_state = "peng-robinson"'))
    assert main(["validate", str(path)]) == 2
    (line,) = _errors(capsys)
    assert "no critical constants for A, B" in line and "needed by run" in line


def test_validate_refuses_bad_uncertainty_entries_naming_the_verb(write_case, capsys):
    path = write_case(DEMO + UNCERTAIN.replace('std = "5 K"', 'std = "5 bar"'))
    assert main(["validate", str(path)]) == 2
    lines = _errors(capsys)
    assert lines and all("(needed by uncertainty)" in line for line in lines)
    assert any("std" in line for line in lines)
    good = write_case(DEMO.replace('key_species = "A"', 'key_species = "A"\ntemperature_limit = "800 K"')
                      + UNCERTAIN, "good.toml")
    assert main(["validate", str(good)]) == 0


def test_validate_prints_the_plausibility_warnings(cases_dir, capsys):
    assert main(["validate", str(cases_dir / "methanol_synthesis_real_gas.toml")]) == 0
    err = capsys.readouterr().err
    assert "warning: tube.inner_diameter / bed.particle_diameter = 5.33" in err


def test_validate_says_one_tube_and_one_reaction(cases_dir, capsys):
    assert main(["validate", str(cases_dir / "froment1967_oxylene_packed_tube.toml")]) == 0
    out = capsys.readouterr().out
    assert "1 reaction," in out and "1 tube," in out and "1 tubes" not in out and "1 reactions" not in out
    assert "note: size needs design.target_conversion" in out


def test_validate_notes_that_screening_needs_a_wall_cooled_tube(cases_dir, capsys):
    assert main(["validate", str(cases_dir / "decomposition_empty_tube.toml")]) == 0
    assert "note: screen: heat.mode = 'isothermal'" in capsys.readouterr().out


def test_validate_notes_that_screening_does_not_apply_without_an_exothermic_path(cases_dir, capsys):
    # the endothermic dehydrogenation demo: screen refuses it; validate must say so in advance
    assert main(["validate", str(cases_dir / "dehydrogenation_heated_tube.toml")]) == 0
    assert "note: screen: no exothermic path for the key species C2H6" in capsys.readouterr().out


def test_debug_works_after_the_verb(write_case):
    path = write_case(DEMO.replace('length = "12 m"', "length = 12"))
    assert main(["validate", str(path)]) == 2
    for argv in (["--debug", "validate", str(path)], ["validate", str(path), "--debug"]):
        with pytest.raises(Exception, match=r"tube\.length = 12"):
            main(argv)


@pytest.mark.parametrize("argv, says", [
    (["--seed", "-1"], "--seed: '-1': must be a whole number >= 0"),
    (["--samples", "0"], "--samples: '0': must be a whole number >= 1"),
])
def test_negative_seed_and_zero_samples_are_usage_errors(cases_dir, tmp_path, capsys, argv, says):
    base = ["uncertainty", str(cases_dir / "decomposition_empty_tube.toml"), "--out", str(tmp_path / "o")]
    extra = ["--samples", "3"] if "--samples" not in argv else []
    assert main(base + extra + argv) == 2
    err = capsys.readouterr().err
    assert says in err and err.startswith("error: tubesim uncertainty: ") and len(err.strip().splitlines()) == 1
    assert not (tmp_path / "o").exists()


def test_an_unexpected_failure_is_one_line_naming_the_verb_and_exit_1(cases_dir, capsys, monkeypatch):
    def broken(args):
        raise ZeroDivisionError("float division by zero")

    monkeypatch.setitem(cli.COMMANDS, "validate", broken)
    assert main(["validate", str(cases_dir / "decomposition_empty_tube.toml")]) == 1
    (line,) = _errors(capsys)
    assert line.startswith("error: validate: internal failure (ZeroDivisionError: float division by zero)")
    assert "--debug" in line
    with pytest.raises(ZeroDivisionError):
        main(["validate", str(cases_dir / "decomposition_empty_tube.toml"), "--debug"])


def test_a_utf16_case_file_exits_2_without_a_traceback(tmp_path):
    path = tmp_path / "case.toml"
    path.write_bytes(DEMO.encode("utf-16"))
    proc = subprocess.run([sys.executable, "-m", "simulator", "run", str(path), "--out", str(tmp_path / "o")],
                          capture_output=True, text=True)
    assert proc.returncode == 2 and "Traceback" not in proc.stderr
    assert proc.stderr.strip().splitlines() == [f"error: {path}: the case file is saved as UTF-16; save it as "
                                                "UTF-8 text."]
    assert not (tmp_path / "o").exists()
