"""Command line: ``tubesim VERB CASE [options]`` (also ``python -m simulator``).

Subcommands are thin: they call the public API and print. Exit codes: 0 run
completed or stopped by a design event, 1 numerical, thermo or report failure,
2 bad case or usage. Errors are one line each on stderr; ``--debug`` shows the
traceback.
"""
import argparse
import sys

EPILOG = """examples:
  tubesim validate cases/decomposition_empty_tube.toml
  tubesim run cases/hydrogenation_cooled_packed_bed.toml --out out/h
  tubesim assumptions cases/hydrogenation_cooled_packed_bed.toml --out out/h
  tubesim screen cases/froment1967_oxylene_packed_tube.toml --out out/ox
  tubesim size cases/train_three_bed_converter.toml --bed 3 --out out/train
  tubesim report cases/hydrogenation_cooled_packed_bed.toml --out out/h
  tubesim sweep CASE --vary "heat.medium.temperature=600 K..660 K in 31" --out DIR
  python -m simulator run CASE --out DIR      (same as tubesim)

Results are screening-level engineering estimates; see the report's cautions.
"""


def _whole_number(lowest):
    """argparse type: a whole number >= ``lowest`` (a usage error otherwise, exit 2)."""
    def parse(text):
        try:
            value = int(text)
        except ValueError:
            raise argparse.ArgumentTypeError(f"{text!r}: must be a whole number >= {lowest}") from None
        if value < lowest:
            raise argparse.ArgumentTypeError(f"{text!r}: must be a whole number >= {lowest}")
        return value
    return parse


def _execution_options(p):
    p.add_argument("--scheduler", default=None, metavar="ADDRESS",
                   help="Dask scheduler address, e.g. tcp://10.0.0.5:8786 (default: local process pool)")
    p.add_argument("--batch-size", type=_whole_number(1), default=None,
                   help="cases per task (default: automatic; per-case engine >= 25, compiled engine on Dask "
                        ">= 0.5 s of work per task)")
    p.add_argument("--engine", choices=("auto", "compiled", "pool"), default="auto",
                   help="auto: the compiled batch integrator when every varied (sweep) or sampled (uncertainty) "
                        "path is an operating number it supports, else per-case solves; either runs on the local "
                        "cores or, with --scheduler, on the Dask workers (default auto); the engine that ran is "
                        "printed")


class _Parser(argparse.ArgumentParser):
    """argparse with usage errors as one line in the house style (``error: ...``), exit 2."""

    def error(self, message):
        self.exit(2, f"error: {self.prog}: {message} (see {self.prog} --help)\n")


def build_parser():
    """The argparse parser of the ``tubesim`` command."""
    parser = _Parser(
        prog="tubesim", description="Tubular and packed-bed reactor design and review.",
        epilog=EPILOG, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--debug", action="store_true", help="show tracebacks on errors")
    parser.add_argument("--version", action="store_true", help="print the version and exit")
    # --debug also after the verb; SUPPRESS keeps a sub-parser from resetting a --debug given before it
    common = _Parser(add_help=False)
    common.add_argument("--debug", action="store_true", default=argparse.SUPPRESS,
                        help="show tracebacks on errors")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND")

    p = sub.add_parser("validate", parents=[common], help="check a case file for every verb, without running the tube")
    p.add_argument("case", help="case file (TOML)")

    p = sub.add_parser("run", parents=[common], help="solve the tube balances; write summary.json and profile.csv")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", required=True, help="output folder")

    p = sub.add_parser("assumptions", parents=[common],
                       help="ideal design (isothermal, isobaric, ideal gas) vs full model; "
                       "write assumptions.json")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", required=True, help="output folder")

    p = sub.add_parser("size", parents=[common],
                       help="length for the given tube count and tube count for the given length; "
                       "write sizing.json")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", required=True, help="output folder")
    p.add_argument("--bed", type=_whole_number(1), default=None,
                   help="reactor train only: the bed (1-based) whose length is sized for the train's target")

    p = sub.add_parser("screen", parents=[common], help="runaway screening: hot spot, criteria, critical values; "
                       "write screening.json and sensitivity.csv")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", required=True, help="output folder")
    p = sub.add_parser("report", parents=[common], help="design-basis report: report.html and report.pdf")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", required=True, help="output folder")
    p.add_argument("--no-pdf", action="store_true", help="write the HTML report only")

    p = sub.add_parser("sweep", parents=[common], help="full grid over case parameters; results.sqlite/.csv and plots")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--vary", action="append", required=True, metavar='"PATH=START..STOP in N"',
                   help='e.g. "heat.medium.temperature=600 K..660 K in 31" (repeat for a grid)')
    p.add_argument("--out", required=True, help="output folder (a rerun with the same folder resumes)")
    _execution_options(p)

    p = sub.add_parser("uncertainty", parents=[common], help="Monte Carlo over the case's [[uncertainty]] entries")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--samples", type=_whole_number(1), required=True, help="number of samples")
    p.add_argument("--seed", type=_whole_number(0), default=None,
                   help="sampler seed, a whole number >= 0 (recorded; drawn if not given)")
    p.add_argument("--method", choices=("lhs", "sobol"), default="lhs", help="sampling design (default lhs)")
    p.add_argument("--out", required=True, help="output folder (a rerun with the same folder resumes)")
    _execution_options(p)

    return parser


def main(argv=None):
    """Entry point of ``tubesim``; returns the exit code."""
    parser = build_parser()
    global _ARGV
    _ARGV = list(sys.argv[1:] if argv is None else argv)
    try:
        args = parser.parse_args(argv)
    except SystemExit as exc:  # argparse exits 2 on usage errors, 0 on --help
        return int(exc.code or 0)
    if args.version:
        from simulator import __version__

        print(f"tubesim {__version__}")
        return 0
    if not args.command:
        parser.print_help()
        return 2
    from simulator.errors import CaseError, SimulatorError

    out = getattr(args, "out", None)
    if out is not None:
        from pathlib import Path

        if Path(out).exists() and not Path(out).is_dir():
            print(f"error: --out {out}: is a file; give a folder (it is created if missing)", file=sys.stderr)
            return 2
    try:
        return COMMANDS[args.command](args)
    except CaseError as err:
        if args.debug:
            raise
        for line in err.problems:
            print(f"error: {line}", file=sys.stderr)
        return 2
    except SimulatorError as err:
        if args.debug:
            raise
        print(f"error: {err}", file=sys.stderr)
        return 2 if isinstance(err, ValueError) else 1      # a refused resume is a usage error
    except OSError as err:
        if args.debug:
            raise
        where = f" {err.filename}" if getattr(err, "filename", None) else ""
        print(f"error: cannot write or read{where}: {err.strerror or err}", file=sys.stderr)
        return 2 if isinstance(err, (NotADirectoryError, FileExistsError, IsADirectoryError)) else 1
    except KeyboardInterrupt:
        print("interrupted", file=sys.stderr)
        return 130
    except Exception as err:  # last resort: never a traceback without --debug
        if args.debug:
            raise
        print(f"error: {args.command}: internal failure ({_first_line(err)}); this is a defect of tubesim, "
              "not of the case; rerun with --debug for the traceback and report it.", file=sys.stderr)
        return 1


def _first_line(err):
    """``Type: first line of the message`` of an exception, for one-line errors."""
    lines = str(err).strip().splitlines()
    return f"{type(err).__name__}: {lines[0]}" if lines else type(err).__name__


def _plural(n, word):
    """``1 tube``, ``40 tubes``."""
    return f"{n} {word}" if n == 1 else f"{n} {word}s"


def _validate(args):
    from simulator.readiness import check_case

    ready = check_case(args.case)
    case = ready.case
    print(f"{args.case}: valid ({len(case.species)} species, {_plural(case.mechanism.reactions_kept if case.mechanism else len(case.reactions), 'reaction')}, "
          f"{_plural(case.tube.count, 'tube')}, heat mode {case.heat.mode}, pressure drop {case.pressure_drop.model})")
    if case.train:
        from simulator.solve.train import TRAIN_REFUSALS

        print(f"note: a reactor train of {len(case.train)} beds (the line above describes bed 1); `run` and `report` "
              f"run the train, `assumptions` and `screen` check it bed by bed, `size --bed K` sizes one bed, `sweep` "
              f"and `uncertainty` run the whole train per case (paths such as train.0.tube.length)"
              + (f"; not yet for a train: {', '.join(TRAIN_REFUSALS)}" if TRAIN_REFUSALS else ""))
    for line in ready.notes:
        print(f"note: {line}")
    for line in ready.warnings:
        print(f"warning: {line}", file=sys.stderr)
    return 0


def _run(args):
    from simulator.case.load import load_case
    from simulator.output import print_summary, write_run
    from simulator.solve.integrate import simulate

    case = load_case(args.case)
    if case.train:
        return _run_train(case, args)
    result = simulate(case)
    write_run(result, args.out)
    print_summary(result)
    if result.status == "failed":
        print(f"error: {result.termination}", file=sys.stderr)
        return 1
    return 0


def _run_train(case, args):
    from simulator.solve.train import simulate_train
    from simulator.train_output import print_train_summary, write_train_run

    train = simulate_train(case)
    write_train_run(train, args.out)
    print_train_summary(train)
    if train.status == "failed":
        print(f"error: {train.termination}", file=sys.stderr)
        return 1
    from pathlib import Path

    from simulator.fileio import atomic_write_text
    from simulator.report.train_plots import train_path_svg

    print(f"figure: {atomic_write_text(Path(args.out) / 'train_path.svg', train_path_svg(train))}")
    return 0


def _assumptions(args):
    from pathlib import Path

    from simulator.assumptions import check_assumptions, format_table
    from simulator.fileio import atomic_write_json

    case = _tube_verb_case(args.case, "assumptions")
    if case.train:
        from simulator.train_checks import format_train_assumptions, train_assumptions

        report = train_assumptions(case)
        atomic_write_json(Path(args.out) / "assumptions.json", report)
        print(format_train_assumptions(report))
        return 0
    report = check_assumptions(case)
    atomic_write_json(Path(args.out) / "assumptions.json", report)
    print(format_table(report))
    return 0


def _size(args):
    from pathlib import Path

    from simulator.fileio import atomic_write_json
    from simulator.sizing import format_sizing, size

    case = _tube_verb_case(args.case, "size")
    if case.train or args.bed is not None:
        from simulator.errors import CaseError
        from simulator.train_sizing import format_train_sizing, size_train_bed

        if not case.train:
            raise CaseError(f"{args.case}: --bed {args.bed}: the case is one tube, not a reactor train; "
                            "remove --bed.")
        if args.bed is None:
            raise CaseError(f"{args.case}: train: size a reactor train bed by bed: give --bed K (1 to "
                            f"{len(case.train)}), the bed whose length is sized for the train's target.")
        report = size_train_bed(case, args.bed)
        atomic_write_json(Path(args.out) / "sizing.json", report)
        print(format_train_sizing(report))
        return 0
    report = size(case)
    atomic_write_json(Path(args.out) / "sizing.json", report)
    print(format_sizing(report))
    return 0


def _screen(args):
    import csv
    import io
    from pathlib import Path

    from simulator.fileio import atomic_write_json, atomic_write_text
    from simulator.screening.screen import format_screening, screen, screening_json, sensitivity_rows

    case = _tube_verb_case(args.case, "screen")
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    if case.train:
        from simulator.train_checks import format_train_screening, train_screening

        summary, rows = train_screening(case)
        header, text = ["bed"], format_train_screening(summary)
    else:
        report = screen(case)
        summary, rows = screening_json(report), sensitivity_rows(report)
        header, text = [], format_screening(report)
    writer.writerow(header + ["parameter", "value_SI", "hot_spot_temperature_K", "normalized_sensitivity"])
    for *bed, name, value, T, s in rows:
        writer.writerow(bed + [name, repr(float(value)), "" if T != T else repr(float(T)),
                               "" if s != s else repr(float(s))])
    out = Path(args.out)
    atomic_write_json(out / "screening.json", summary)
    atomic_write_text(out / "sensitivity.csv", buffer.getvalue())
    print(text)
    return 0


def _report(args):
    from simulator.report.build import write_design_report

    case = _tube_verb_case(args.case, "report")
    if case.train:
        from simulator.report.train_report import write_train_report

        paths = write_train_report(case, args.out, pdf=not args.no_pdf, command_line=_command_line())
    else:
        paths = write_design_report(args.case, args.out, pdf=not args.no_pdf, command_line=_command_line())
    for kind, path in paths.items():
        if path:
            print(f"{kind}: {path}")
    return 0


def _tube_verb_case(path, verb):
    """The loaded case for ``verb``; a mechanism case is refused in one line where the verb cannot run it yet."""
    from simulator.case.load import load_case
    from simulator.mechanism.verbs import refuse_for_mechanism

    case = load_case(path)
    refuse_for_mechanism(case, verb)
    return case


_ARGV = []


def _command_line():
    import shlex

    return "tubesim " + " ".join(shlex.quote(a) for a in _ARGV)


def _raw_case(path, verb):
    from pathlib import Path

    from simulator.case.load import load_case
    from simulator.mechanism.verbs import refuse_for_mechanism
    from simulator.solve.train import refuse_train

    case = load_case(path)               # validate the base case first: every problem at once
    refuse_for_mechanism(case, verb)
    refuse_train(case, verb)
    return case.raw, str(Path(path).resolve().parent)


#: Cases from which sweep and uncertainty say at once what they are doing (start-up takes seconds).
_LONG_RUN = 1000


def _long_run_on_terminal(n_cases):
    """True for a long run watched on a terminal: say at once what it does (logs keep one-line errors)."""
    isatty = getattr(sys.stderr, "isatty", None)
    return n_cases >= _LONG_RUN and bool(isatty and isatty())


def _interrupted(args):
    """Ctrl-C in a sweep or uncertainty run: what is kept, and the command that resumes it."""
    print(f"interrupted: the finished cases are stored in {args.out}/results.sqlite; "
          f"the same command resumes where it stopped: {_command_line()}", file=sys.stderr)
    return 130


def _sweep(args):
    from simulator.sweeps.paths import parse_vary

    specs = [parse_vary(v) for v in args.vary]
    n_cases = 1
    for spec in specs:
        n_cases *= len(spec.values_si)
    if _long_run_on_terminal(n_cases):   # at once: loading Cantera and building the model take seconds
        print(f"sweep: {n_cases} cases; checking the case and the values, then building the model",
              file=sys.stderr, flush=True)
    from simulator.case.load import load_case
    from simulator.report.sweep_plots import write_sweep_figures
    from simulator.sweeps.compiled_sweep import run_compiled_sweep
    from simulator.sweeps.engine import choose_engine
    from simulator.sweeps.evaluator import TubeEvaluator
    from simulator.sweeps.execute import run_grid_sweep
    from simulator.sweeps.validity import check_vary_values

    raw, case_dir = _raw_case(args.case, "sweep")
    check_vary_values(raw, case_dir, specs, args.case)
    engine, model = choose_engine(args.engine, load_case(args.case), [spec.path for spec in specs], args.scheduler)
    try:
        if engine == "compiled":
            summary = run_compiled_sweep(raw, case_dir, specs, model, args.out, progress=True,
                                         scheduler=args.scheduler, chunk=args.batch_size)
        else:
            summary = run_grid_sweep(raw, case_dir, specs, TubeEvaluator(), args.out, scheduler=args.scheduler,
                                     batch_size=args.batch_size, progress=True)
    except KeyboardInterrupt:
        return _interrupted(args)
    figures = write_sweep_figures(args.out, raw)
    unit = "threads" if engine == "compiled" or args.scheduler else "workers"
    where = f" on Dask at {args.scheduler}" if args.scheduler else ""
    invalid = f", {summary.invalid} invalid (refused by the case)" if summary.invalid else ""
    print(f"{summary.total} cases ({engine} engine{where}): {summary.computed} computed now, {summary.skipped} already "
          f"done, {summary.failed} failed{invalid}; {summary.elapsed:.1f} s on {summary.workers} {unit}")
    for path in figures:
        print(f"figure: {path}")
    print(f"results: {args.out}/results.csv, {args.out}/results.sqlite")
    return 0


def _uncertainty(args):
    if _long_run_on_terminal(args.samples):
        print(f"uncertainty: {args.samples} samples; checking the case and the distributions, then building the "
              "model", file=sys.stderr, flush=True)
    from simulator.case.load import load_case
    from simulator.report.sweep_plots import write_uncertainty_figure
    from simulator.sweeps.engine import choose_engine
    from simulator.sweeps.evaluator import TubeEvaluator
    from simulator.sweeps.execute import run_uncertainty
    from simulator.sweeps.sampling import format_summary

    raw, case_dir = _raw_case(args.case, "uncertainty")
    if not raw.get("uncertainty"):
        from simulator.errors import CaseError

        raise CaseError(f"{args.case}: uncertainty: no [[uncertainty]] entries in the case.")
    paths = [e.get("parameter") for e in raw["uncertainty"] if isinstance(e, dict)]
    engine, model = choose_engine(args.engine, load_case(args.case), [p for p in paths if isinstance(p, str)],
                                  args.scheduler)
    try:
        result = run_uncertainty(raw, case_dir, TubeEvaluator(), args.out, args.samples, seed=args.seed,
                                 method=args.method, scheduler=args.scheduler, batch_size=args.batch_size,
                                 progress=True, engine=engine, model=model, source_path=args.case)
    except KeyboardInterrupt:
        return _interrupted(args)
    figure = write_uncertainty_figure(args.out, raw, result)
    print(format_summary(result))
    print(f"figure: {figure}")
    return 0


COMMANDS = {"validate": _validate, "run": _run, "assumptions": _assumptions, "size": _size, "screen": _screen, "report": _report,
            "sweep": _sweep, "uncertainty": _uncertainty}
