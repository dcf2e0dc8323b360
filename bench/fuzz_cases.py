"""Hostile-input fuzzer for the ``tubesim`` command line.

Generates case files by mutating the demo cases (``cases/*.toml``), runs each through
``validate``, ``run`` and a sample of the other verbs, calling ``simulator.cli.main(argv)``
in-process in a pool of worker processes, and checks the command-line contract:

* the exit code is 0, 1 or 2; no exception escapes ``main`` and no traceback is printed;
* no hang: each verb call has a time budget (``signal.alarm`` inside the worker, and the
  parent kills a worker that does not answer within the case's budget plus a grace);
* a non-zero exit prints an ``error:`` line; exit 2 writes no file into ``--out``;
* ``validate`` accepting a case that ``run``, ``assumptions``, ``size`` or ``screen`` then
  refuses as a bad case (exit 2) is a violation (``validate`` checks what every verb needs);
* exit 0 writes JSON that parses without NaN/Infinity; ``run`` gives a completed or stopped
  ``summary.json`` with conversion in [0, 1], T > 0 and P > 0 (outlet, hot spot and every
  ``profile.csv`` row), mole fractions summing to 1 within 1e-9, no negative flow beyond
  round-off, and element and energy closure within the limits the tool declares
  (``simulator.solve.checks.CLOSURE_LIMITS``, loosened to 1000 x rtol and 10 x atol_scale for
  a case that asks for looser tolerances).

Usage::

    python bench/fuzz_cases.py --cases 10000 --seed 1 --keep /tmp/fuzz_repro
    python bench/fuzz_cases.py --cases 500 --verbs validate,run

The case files come from ``bench/fuzz_mutations.py``. The generated space and the checks are shared
with ``tests/test_fuzz_cases.py``, which runs a
few hundred seeded cases through ``validate`` and ``run`` in the normal test suite.
"""
import argparse
import contextlib
import csv
import io
import json
import multiprocessing
import multiprocessing.connection
import os
import random
import re
import shutil
import signal
import sys
import tempfile
import time
import traceback
from collections import Counter
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))   # the generator next to this script

import fuzz_mutations  # noqa: E402,F401 - the generator module, for tests/test_fuzz_cases.py
from fuzz_mutations import DEMO_DIR, VERBS, demo_cases, generate_case  # noqa: E402

#: Time budget of one verb call [s]: about 20 times what the slowest demo case needs (validate 0.1 s,
#: run 0.5 s, screen and size 1-3 s, a 2-point sweep or 5-sample uncertainty run 1-2 s).
BUDGET = {"validate": 5.0, "run": 10.0, "assumptions": 20.0, "size": 30.0, "screen": 30.0,
          "sweep": 30.0, "uncertainty": 30.0}
#: Extra time the parent allows before it kills an unresponsive worker [s].
GRACE = 15.0



# --------------------------------------------------------------------------------------------
# Checks of one verb call
# --------------------------------------------------------------------------------------------
def _no_constant(text):
    raise ValueError(f"non-finite JSON number {text}")


def _finite_json(path):
    return json.loads(path.read_text(encoding="utf-8"), parse_constant=_no_constant)


def _walk(node, path=""):
    if isinstance(node, dict):
        for k, v in node.items():
            yield from _walk(v, f"{path}.{k}" if path else str(k))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            yield from _walk(v, f"{path}[{i}]")
    else:
        yield path, node


def _json_value_problems(doc, name):
    """Physical range of values in any JSON output: conversions, temperatures, pressures, fractions."""
    problems = []
    for path, v in _walk(doc):
        if not isinstance(v, (int, float)) or isinstance(v, bool):
            continue
        leaf = path.rsplit(".", 1)[-1]
        if (leaf == "conversion" or leaf.endswith("_conversion")) and not (-1e-9 <= v <= 1 + 1e-9):
            problems.append(("conversion-out-of-range", f"{name}: {path} = {v!r}"))
        elif (leaf.endswith("temperature_K") and "rise" not in leaf and "margin" not in leaf and v <= 0):
            problems.append(("non-positive-T-or-P", f"{name}: {path} = {v!r}"))
        elif leaf.endswith("pressure_Pa") and "drop" not in leaf and v <= 0:
            problems.append(("non-positive-T-or-P", f"{name}: {path} = {v!r}"))
    return problems


def _closure_limits():
    from simulator.solve.checks import CLOSURE_LIMITS

    return dict(CLOSURE_LIMITS)


def _summary_problems(summary, profile):
    """Checks of ``summary.json`` (and ``profile.csv``) of a ``run`` that exited 0."""
    problems = []
    status = summary.get("status")
    if status not in ("completed", "stopped"):
        problems.append(("exit-0-but-not-completed", f"status {status!r} with exit 0"))
    outlet = summary.get("outlet") or {}
    fractions = outlet.get("mole_fractions") or {}
    values = [v for v in fractions.values() if isinstance(v, (int, float))]
    if values and abs(sum(values) - 1.0) > 1e-9:
        problems.append(("mole-fractions-not-summing-to-1", f"outlet mole fractions sum to {sum(values)!r}"))
    if values and min(values) < -1e-9:
        problems.append(("negative-flow", f"outlet mole fraction {min(values)!r}"))
    flows = [v for v in (outlet.get("molar_flows_mol_per_s") or {}).values() if isinstance(v, (int, float))]
    if flows and min(flows) < -1e-6 * max(sum(abs(f) for f in flows), 1e-300):
        problems.append(("negative-flow", f"outlet molar flow {min(flows)!r} mol/s"))
    for key, where in (("temperature_K", outlet), ("pressure_Pa", outlet)):
        if where.get(key) is None:
            problems.append(("missing-outlet-value", f"outlet.{key} is null in a completed run"))
    solver = summary.get("solver") or {}
    rtol, atol_scale = solver.get("rtol") or 0.0, solver.get("atol_scale") or 0.0
    for key, limit in _closure_limits().items():
        value = (summary.get("closure") or {}).get(key)
        allowed = max(limit, 1e3 * rtol, 10 * atol_scale)     # a case may ask for looser tolerances
        if value is None:
            problems.append(("closure-missing", f"closure.{key} is null"))
        elif value > allowed:
            problems.append(("closure-above-limit", f"closure.{key} = {value:.3g} > {allowed:g}"))
    if profile is not None:
        problems.extend(_profile_problems(profile))
    return problems


def _profile_problems(path):
    problems = []
    with path.open(newline="", encoding="utf-8") as handle:
        rows = list(csv.reader(handle))
    if not rows:
        return [("profile-empty", "profile.csv has no header")]
    header = rows[0]
    cols = {name: i for i, name in enumerate(header)}
    for row in rows[1:]:
        for name, cell in zip(header, row):
            if cell.strip().lower() in ("nan", "inf", "-inf", "infinity", "-infinity"):
                return [("non-finite-output", f"profile.csv {name} = {cell}")]
        for name, cell in zip(header, row):
            if name.startswith("conversion") and cell and not -1e-9 <= float(cell) <= 1 + 1e-9:
                return [("conversion-out-of-range", f"profile.csv {name} = {cell} at z = {row[0]} m")]
        for name in ("temperature_K", "pressure_Pa"):
            i = cols.get(name)
            if i is not None and i < len(row) and row[i] and float(row[i]) <= 0:
                return [("non-positive-T-or-P", f"profile.csv {name} = {row[i]} at {row[0]}")]
    return problems


def check_call(verb, code, stdout, stderr, out_dir, validate_code=None, validate_text=""):
    """Contract violations of one verb call: a list of (kind, detail).

    ``validate_code`` and ``validate_text`` are the exit code and output of ``validate`` on the same
    case: a case that ``validate`` accepts must not be refused as bad by ``run``, nor by
    ``assumptions``, ``size`` or ``screen`` unless ``validate`` named that verb in its output.
    """
    problems = []
    if code not in (0, 1, 2):
        problems.append(("bad-exit-code", f"exit {code!r}"))
    if "Traceback (most recent call last)" in stderr or "Traceback (most recent call last)" in stdout:
        last = [ln for ln in stderr.splitlines() if ln.strip()][-1:] or [""]
        problems.append(("traceback-printed", last[0][:300]))
    if code in (1, 2) and not any(ln.startswith("error") for ln in stderr.splitlines()):
        problems.append(("error-without-message", f"exit {code} with stderr {stderr[-200:]!r}"))
    if "*****" in stderr:
        problems.append(("raw-library-message", next(ln for ln in stderr.splitlines() if "*****" in ln)[:200]))
    files = sorted(p for p in out_dir.rglob("*") if p.is_file()) if out_dir is not None and out_dir.exists() else []
    if code == 2 and files:
        problems.append(("exit-2-wrote-files", ", ".join(p.name for p in files[:5])))
    named = verb != "run" and re.search(rf"\b{verb}\b", validate_text)
    if code == 2 and validate_code == 0 and verb in ("run", "assumptions", "size", "screen") and not named:
        first = next((ln for ln in stderr.splitlines() if ln.startswith("error")), "")
        problems.append(("validate-passes-verb-refuses", first[:300]))
    if code == 0 and out_dir is not None:
        docs = {}
        for p in files:
            if p.suffix == ".json":
                try:
                    docs[p.name] = _finite_json(p)
                except ValueError as err:
                    problems.append(("non-finite-output", f"{p.name}: {err}"))
        for name, doc in docs.items():
            problems.extend(_json_value_problems(doc, name))
        expected = {"run": "summary.json", "assumptions": "assumptions.json", "size": "sizing.json",
                    "screen": "screening.json", "uncertainty": "uncertainty.json"}.get(verb)
        if expected and not (out_dir / expected).is_file():
            problems.append(("exit-0-without-output", f"no {expected}"))
        if verb == "run" and "summary.json" in docs:
            profile = out_dir / "profile.csv"
            problems.extend(_summary_problems(docs["summary.json"], profile if profile.exists() else None))
    return problems


# --------------------------------------------------------------------------------------------
# In-process execution of one case (in a worker, or in the test)
# --------------------------------------------------------------------------------------------
class VerbTimeout(BaseException):
    """Raised by the alarm when a verb call exceeds its budget (BaseException: no handler swallows it)."""


def _on_alarm(signum, frame):
    raise VerbTimeout()


def call_cli(argv, budget):
    """Run ``simulator.cli.main(argv)`` with captured output and a time budget (main thread only).

    Returns (exit code or None, stdout, stderr, exception kind or None, last traceback line, seconds).
    """
    from simulator import cli

    out, err = io.StringIO(), io.StringIO()
    kind = last = None
    code = None
    start = time.perf_counter()
    previous = signal.signal(signal.SIGALRM, _on_alarm)
    signal.setitimer(signal.ITIMER_REAL, budget)
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            code = cli.main(list(argv))
    except VerbTimeout as exc:
        kind = "hang"
        last = f"over the {budget:g} s budget" + _innermost(exc.__traceback__)
    except SystemExit as exc:
        kind = "system-exit"
        last = f"SystemExit({exc.code!r}) escaped main"
    except BaseException as exc:  # noqa: BLE001 - any escaping exception is the finding
        kind = "uncaught-exception"
        last = f"{type(exc).__name__}: {str(exc)[:200]}" + _innermost(exc.__traceback__)
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)
    return code, out.getvalue(), err.getvalue(), kind, last, time.perf_counter() - start


def _innermost(tb):
    """The innermost frame and the three innermost frames of the package, innermost first."""
    frames = traceback.extract_tb(tb)
    inner = [f for f in frames if f"{os.sep}simulator{os.sep}" in f.filename][-3:]
    text = [f"{Path(f.filename).name}:{f.lineno} {f.name}" for f in reversed(inner)]
    if frames and (not inner or frames[-1] is not inner[-1]):
        text.insert(0, f"~{Path(frames[-1].filename).name}:{frames[-1].lineno} {frames[-1].name}")
    return " [" + " <- ".join(text) + "]"


def violation_class(kind, verb, detail):
    """Class of a violation for the counts: kind and verb, and for exceptions and hangs also the
    exception type and the innermost function of the package (``load.py load_case``)."""
    if kind not in ("uncaught-exception", "hang"):
        return f"{kind} ({verb})"
    match = re.search(r"\[([^\]]*)\]$", detail)
    frames = [f for f in match.group(1).split(" <- ") if not f.startswith("~")] if match else []
    where = re.sub(r":(\d+|None) ", " ", frames[0]) if frames else "?"
    what = detail.split(":", 1)[0] if kind == "uncaught-exception" else "hang"
    return f"{kind} ({verb}): {what} in {where}"


def warm_up():
    """Import the package, build the unit registry and load the compiled kernel once (about 2 s).

    Done before any budgeted call (in the parent before the workers fork, and once in the test),
    so a budget never interrupts the one-time set-up and counts it as a hang.
    """
    with tempfile.TemporaryDirectory(prefix="tubesim-fuzz-", dir=scratch_root()) as work:
        for path in sorted(DEMO_DIR.glob("*.toml"))[:1]:
            code, _, stderr, kind, last, _ = call_cli(["run", str(path), "--out", str(Path(work) / "out")], 600)
            if code != 0:
                raise RuntimeError(f"warm-up run of {path.name} failed: exit {code} {kind or ''} {last or stderr}")


def scratch_root():
    """Folder for case files and --out folders: in memory where possible (the tool fsyncs every output)."""
    return "/dev/shm" if os.path.isdir("/dev/shm") and os.access("/dev/shm", os.W_OK) else None


def run_case(data, calls, workdir, budget_scale=1.0):
    """Write the case and run every call in-process; returns a list of per-call records."""
    workdir = Path(workdir)
    workdir.mkdir(parents=True, exist_ok=True)
    case = workdir / "case.toml"
    case.write_bytes(data)
    records = []
    validate_code, validate_text = None, ""
    for i, (verb, extra) in enumerate(calls):
        out = workdir / f"out{i}_{verb}"
        argv = [verb, str(case)] + list(extra) + ([] if verb == "validate" else ["--out", str(out)])
        code, stdout, stderr, kind, last, seconds = call_cli(argv, BUDGET[verb] * budget_scale)
        problems = []
        if kind is not None:
            problems.append((kind, last))
        else:
            problems.extend(check_call(verb, code, stdout, stderr, None if verb == "validate" else out,
                                       validate_code, validate_text))
        if verb == "validate":
            validate_code, validate_text = code, stdout + stderr
        records.append({"verb": verb, "argv": argv[:1] + ["case.toml"] + argv[2:], "code": code,
                        "seconds": round(seconds, 3), "problems": problems,
                        "stderr_tail": stderr.strip().splitlines()[-1][:300] if stderr.strip() else ""})
    return records


# --------------------------------------------------------------------------------------------
# Worker pool with a hard per-case deadline
# --------------------------------------------------------------------------------------------
def _worker(conn, scratch):
    os.environ.setdefault("TUBESIM_KERNEL", "compiled")
    import warnings

    warnings.simplefilter("ignore")          # warnings go to stderr; not findings themselves
    while True:
        task = conn.recv()
        if task is None:
            return
        index, data, calls = task[:3]
        workdir = Path(scratch) / f"c{index}"
        try:
            records = run_case(data, calls, workdir)
        finally:
            shutil.rmtree(workdir, ignore_errors=True)
        conn.send((index, records))


class Pool:
    """Worker processes, each fed one case at a time; a worker past its deadline is killed and replaced."""

    def __init__(self, workers, scratch):
        self.ctx = multiprocessing.get_context("fork")
        self.scratch = scratch
        self.slots = [self._start() for _ in range(workers)]

    def _start(self):
        parent, child = self.ctx.Pipe()
        proc = self.ctx.Process(target=_worker, args=(child, self.scratch), daemon=False)
        proc.start()
        child.close()
        return {"proc": proc, "conn": parent, "task": None, "deadline": None, "done": 0}

    def run(self, tasks, on_result):
        tasks = iter(tasks)
        pending = True
        while True:
            for i, slot in enumerate(self.slots):
                if slot["task"] is None and pending:
                    task = next(tasks, None)
                    if task is None:
                        pending = False
                        continue
                    budget = sum(BUDGET[v] for v, _ in task[2]) + GRACE
                    slot["task"], slot["deadline"] = task, time.monotonic() + budget
                    slot["conn"].send(task)
            busy = [s for s in self.slots if s["task"] is not None]
            if not busy:
                return
            ready = multiprocessing.connection.wait([s["conn"] for s in busy] + [s["proc"].sentinel for s in busy],
                                                    timeout=1.0)
            now = time.monotonic()
            for i, slot in enumerate(self.slots):
                if slot["task"] is None:
                    continue
                if slot["conn"] in ready:
                    try:
                        index, records = slot["conn"].recv()
                    except EOFError:
                        records = None
                    if records is not None:
                        on_result(slot["task"], records)
                        slot["task"] = None
                        slot["done"] += 1
                        continue
                if slot["proc"].sentinel in ready or not slot["proc"].is_alive():
                    on_result(slot["task"], [{"verb": "?", "argv": [], "code": None, "seconds": None,
                                              "problems": [("worker-died", f"exit code {slot['proc'].exitcode}")],
                                              "stderr_tail": ""}])
                    self._replace(i)
                elif now > slot["deadline"]:
                    on_result(slot["task"], [{"verb": ",".join(v for v, _ in slot["task"][2]), "argv": [],
                                              "code": None, "seconds": None,
                                              "problems": [("hang", "no answer within the case budget; worker "
                                                                    "killed (stuck outside Python)")],
                                              "stderr_tail": ""}])
                    self._replace(i)

    def _replace(self, i):
        slot = self.slots[i]
        slot["proc"].kill()
        slot["proc"].join()
        self.slots[i] = self._start()

    def close(self):
        for slot in self.slots:
            try:
                slot["conn"].send(None)
            except (BrokenPipeError, OSError):
                pass
        for slot in self.slots:
            slot["proc"].join(timeout=10)
            if slot["proc"].is_alive():
                slot["proc"].kill()
                slot["proc"].join()


# --------------------------------------------------------------------------------------------
# Driver
# --------------------------------------------------------------------------------------------
def _parse_args(argv):
    p = argparse.ArgumentParser(description="Fuzz the tubesim command line with generated case files.")
    p.add_argument("--cases", type=int, default=10_000, help="number of generated cases (default 10000)")
    p.add_argument("--seed", type=int, default=1, help="generator seed (default 1)")
    p.add_argument("--verbs", default=",".join(VERBS),
                   help=f"comma-separated verbs (default all: {','.join(VERBS)}); validate and run see every case")
    p.add_argument("--keep", default=None, metavar="DIR", help="write the case file of every violation here")
    p.add_argument("--workers", type=int, default=2, help="worker processes (default 2)")
    p.add_argument("--json", default=None, metavar="FILE", help="also write counts and reproducers as JSON")
    args = p.parse_args(argv)
    verbs = [v.strip() for v in args.verbs.split(",") if v.strip()]
    unknown = [v for v in verbs if v not in VERBS]
    if unknown or not verbs:
        p.error(f"--verbs {args.verbs}: unknown verb {', '.join(unknown) or '(none)'}; choose from {', '.join(VERBS)}")
    if args.cases < 1 or args.workers < 1:
        p.error("--cases and --workers must be >= 1")
    args.verb_list = verbs
    return args


def main(argv=None):
    args = _parse_args(argv)
    rng = random.Random(args.seed)
    demos = demo_cases()

    def tasks():                                 # generated as the workers ask for them
        for index in range(args.cases):
            yield (index,) + generate_case(rng, demos, args.verb_list)

    keep = Path(args.keep) if args.keep else None
    if keep:
        keep.mkdir(parents=True, exist_ok=True)
    exit_counts = Counter()
    violation_counts = Counter()
    first = {}
    every = []
    seconds = Counter()
    n_calls = Counter()
    cases_with_violation = 0
    start = time.monotonic()
    done = [0]

    def on_result(task, records):
        nonlocal cases_with_violation
        index, data, calls, notes = task
        bad = False
        for rec in records:
            exit_counts[(rec["verb"], rec["code"])] += 1
            if rec["seconds"] is not None:
                seconds[rec["verb"]] += rec["seconds"]
                n_calls[rec["verb"]] += 1
            for kind, detail in rec["problems"]:
                bad = True
                key = violation_class(kind, rec["verb"], detail)
                violation_counts[key] += 1
                every.append({"case": index, "class": key, "detail": detail[:300], "notes": notes})
                if key not in first:
                    first[key] = {"case": index, "kind": kind, "verb": rec["verb"], "detail": detail,
                                  "argv": rec["argv"], "notes": notes, "stderr_tail": rec["stderr_tail"],
                                  "data": data}
                if keep:
                    (keep / f"case{index:05d}.toml").write_bytes(data)
                    with (keep / f"case{index:05d}.txt").open("a", encoding="utf-8") as note:
                        note.write(f"{kind} ({rec['verb']}): {detail}\nargv: {rec['argv']}\nmutations: {notes}\n")
        cases_with_violation += bad
        done[0] += 1
        if done[0] % 250 == 0 or done[0] == args.cases:
            rate = done[0] / max(time.monotonic() - start, 1e-9)
            print(f"  {done[0]} / {args.cases} cases, {cases_with_violation} with a violation, {rate:.1f} cases/s",
                  file=sys.stderr, flush=True)
            if args.json:                        # partial results while a long run goes on
                _write_json(args, done[0], time.monotonic() - start, exit_counts, violation_counts, first, every)

    warm_up()
    scratch = tempfile.mkdtemp(prefix="tubesim-fuzz-", dir=scratch_root())
    pool = Pool(args.workers, scratch)
    try:
        pool.run(tasks(), on_result)
    finally:
        pool.close()
        shutil.rmtree(scratch, ignore_errors=True)
    elapsed = time.monotonic() - start
    print(f"{args.cases} cases (seed {args.seed}, verbs {','.join(args.verb_list)}) in {elapsed:.0f} s "
          f"({args.cases / elapsed:.1f} cases/s on {args.workers} workers)")
    print("exit codes by verb:")
    for verb in args.verb_list + ["?"]:
        row = {code: n for (v, code), n in exit_counts.items() if v == verb}
        if row:
            mean = seconds[verb] / n_calls[verb] if n_calls[verb] else float("nan")
            print(f"  {verb:12s} " + "  ".join(f"{code}: {n}" for code, n in sorted(row.items(), key=str))
                  + f"   (mean {mean:.2f} s)")
    total = sum(violation_counts.values())
    print(f"violations: {total} in {cases_with_violation} cases")
    for key, n in sorted(violation_counts.items(), key=lambda kv: -kv[1]):
        print(f"  {n:6d}  {key}")
    for key, rep in sorted(first.items()):
        print(f"\n--- first {key}: case {rep['case']}")
        print(f"    detail:    {rep['detail']}")
        print(f"    argv:      {' '.join(rep['argv'])}")
        print(f"    mutations: {'; '.join(rep['notes'])[:400]}")
    if args.json:
        _write_json(args, args.cases, elapsed, exit_counts, violation_counts, first, every)
    return 1 if total else 0


def case_text(data):
    """The case file for a message: its text, or the repr of its first bytes when it is not clean UTF-8."""
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        text = None
    if text is None or "\x00" in text:
        return repr(data[:600]) + (" ..." if len(data) > 600 else "")
    return text


def _write_json(args, cases, elapsed, exit_counts, violation_counts, first, every):
    Path(args.json).write_text(json.dumps({
        "cases": cases, "seed": args.seed, "verbs": args.verb_list, "seconds": elapsed,
        "exit_codes": [[v, c, n] for (v, c), n in exit_counts.items()],
        "violations": dict(violation_counts),
        "first": [{"class": key, **{x: y for x, y in rep.items() if x != "data"}, "case_text": case_text(rep["data"])}
                  for key, rep in first.items()],
        "every": every}, indent=1, default=str), encoding="utf-8")


if __name__ == "__main__":
    sys.exit(main())
