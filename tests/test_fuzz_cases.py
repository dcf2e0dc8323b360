"""Property-based fuzzing of the command line over generated and mutated case files.

The generator lives in ``bench/fuzz_mutations.py`` and the contract checks in ``bench/fuzz_cases.py``
(the long fuzzing run over 10 000 and more cases, see ``bench/README.md``); here a few hundred seeded
cases go through
``validate`` and ``run`` in-process, each with a time budget. Kind of check: invariant (the
command-line contract of the README: exit codes 0/1/2, one-line errors and no traceback, exit 2
writes nothing, exit 0 writes finite JSON with conversion in [0, 1], T > 0, P > 0, mole fractions
summing to 1 and closures within the tool's own limits).
"""
import importlib.util
import json
import tempfile
import tomllib
from pathlib import Path

import pytest
from hypothesis import HealthCheck, Phase, given, settings
from hypothesis import strategies as st

ROOT = Path(__file__).resolve().parents[1]


def _load_fuzzer():
    spec = importlib.util.spec_from_file_location("fuzz_cases", ROOT / "bench" / "fuzz_cases.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


FUZZ = _load_fuzzer()
GENERATOR = FUZZ.fuzz_mutations
DEMOS = GENERATOR.demo_cases()

#: Cases per normal run: 150 took 13 s of calls on the unfixed code without its hangs (most cases are
#: refused at load in milliseconds); the whole test stays under a minute on two shared cores.
EXAMPLES = 250
#: The test allows twice the fuzzer's budgets (validate 10 s, run 20 s): the suite shares the cores.
BUDGET_SCALE = 2.0


def _describe(data, records, notes):
    text = FUZZ.case_text(data)
    lines = [f"{kind} ({rec['verb']}, exit {rec['code']}): {detail}" for rec in records
             for kind, detail in rec["problems"]]
    return "\n".join(lines + [f"mutations: {'; '.join(notes)}", "case file:", text[:3000]])


@pytest.fixture(scope="module")
def warmed_up():
    """The unit registry and compiled kernel loaded before the first budgeted call."""
    FUZZ.warm_up()


@settings(max_examples=EXAMPLES, deadline=None, derandomize=True, database=None,
          phases=(Phase.explicit, Phase.generate),  # no shrinking: a failing case is printed whole
          suppress_health_check=(HealthCheck.too_slow, HealthCheck.data_too_large))
@given(rng=st.randoms(use_true_random=False))
def test_generated_cases_keep_the_command_line_contract(warmed_up, rng):
    data, calls, notes = GENERATOR.generate_case(rng, DEMOS, verbs=("validate", "run"))
    with tempfile.TemporaryDirectory(prefix="tubesim-fuzz-", dir=FUZZ.scratch_root()) as work:
        records = FUZZ.run_case(data, calls, work, budget_scale=BUDGET_SCALE)
    assert not any(rec["problems"] for rec in records), _describe(data, records, notes)


@pytest.mark.parametrize("name", [name for name, _ in DEMOS])
def test_toml_writer_reproduces_every_demo_case(name):
    raw = dict(DEMOS)[name]
    assert tomllib.loads(GENERATOR.toml_dumps(raw)) == raw


def _write_summary(out, **changes):
    summary = {"status": "completed",
               "outlet": {"conversion": 0.5, "temperature_K": 700.0, "pressure_Pa": 3e5,
                          "mole_fractions": {"A": 0.25, "B": 0.75}, "molar_flows_mol_per_s": {"A": 1.0, "B": 3.0}},
               "closure": {"elements_relative": 1e-15, "energy_relative": 1e-14}, "solver": {"rtol": 1e-8}}
    for path, value in changes.items():
        node = summary
        *head, leaf = path.split("__")
        for key in head:
            node = node[key]
        node[leaf] = value
    out.mkdir(parents=True, exist_ok=True)
    (out / "summary.json").write_text(json.dumps(summary, allow_nan=True))


@pytest.mark.parametrize("changes, kind", [
    ({}, None),
    ({"outlet__conversion": 1.0047}, "conversion-out-of-range"),
    ({"outlet__temperature_K": float("nan")}, "non-finite-output"),
    ({"outlet__pressure_Pa": -1.0}, "non-positive-T-or-P"),
    ({"outlet__mole_fractions": {"A": 0.25, "B": 0.76}}, "mole-fractions-not-summing-to-1"),
    ({"outlet__molar_flows_mol_per_s": {"A": -0.5, "B": 3.0}}, "negative-flow"),
    ({"closure__energy_relative": 0.58}, "closure-above-limit"),
    ({"closure__energy_relative": 2.5e-5}, "closure-above-limit"),
    ({"closure__energy_relative": 2.5e-5, "solver__atol_scale": 1e-3}, None),   # the case asked for it
    ({"status": "failed"}, "exit-0-but-not-completed"),
])
def test_contract_checks_flag_each_kind_of_violation(tmp_path, changes, kind):
    _write_summary(tmp_path / "out", **changes)
    kinds = {k for k, _ in FUZZ.check_call("run", 0, "", "", tmp_path / "out")}
    assert kinds == ({kind} if kind else set())


def test_contract_checks_flag_exit_codes_tracebacks_and_files_after_exit_2(tmp_path):
    out = tmp_path / "out"
    out.mkdir()
    assert {k for k, _ in FUZZ.check_call("run", 2, "", "error: case.toml: tube.length = '-3 m': must be > 0\n",
                                          out)} == set()
    (out / "summary.json").write_text("{}")
    kinds = {k for k, _ in FUZZ.check_call("run", 2, "", "Traceback (most recent call last):\nKeyError: ''\n", out,
                                           validate_code=0)}
    assert kinds == {"traceback-printed", "error-without-message", "exit-2-wrote-files",
                     "validate-passes-verb-refuses"}
    assert {k for k, _ in FUZZ.check_call("validate", 3, "", "error: x\n", None)} == {"bad-exit-code"}


def test_a_verb_may_refuse_what_validate_named_for_it_but_run_may_not(tmp_path):
    refused = "error: case.toml: design.target_conversion: missing; sizing needs a target.\n"
    named = "case.toml: valid (...)\nnote: size needs design.target_conversion\n"
    assert FUZZ.check_call("size", 2, "", refused, tmp_path, validate_code=0, validate_text=named) == []
    assert [k for k, _ in FUZZ.check_call("size", 2, "", refused, tmp_path, validate_code=0,
                                          validate_text="case.toml: valid\n")] == ["validate-passes-verb-refuses"]
    assert [k for k, _ in FUZZ.check_call("run", 2, "", refused, tmp_path, validate_code=0,
                                          validate_text="note: run needs it\n")] == ["validate-passes-verb-refuses"]


def test_a_verb_over_its_budget_is_reported_as_a_hang(monkeypatch):
    import time

    from simulator import cli

    monkeypatch.setattr(cli, "main", lambda argv: time.sleep(5))
    code, _, _, kind, last, seconds = FUZZ.call_cli(["run", "x.toml"], 0.2)
    assert (code, kind) == (None, "hang") and seconds < 2, last
