"""``[[train]]`` case files -> a :class:`~simulator.case.schema.Case` with its beds.

A train case holds several beds in series. Each ``[[train]]`` entry gives the keys that
belong to one bed: ``tube``, ``heat``, ``bed`` (packed beds) and ``pressure_drop``
(default: the top-level ``[pressure_drop]``). Everything else is shared by all beds:
``title``, ``thermo``, ``reactions``, ``feed``, ``design``, ``solver``, ``assumptions``.
A top-level ``[tube]``, ``[bed]`` or ``[heat]`` is refused in a train case (it would be
unclear which bed it means). ``[[train.after]]`` (at most one per bed, none after the last)
says what happens before the next bed: ``kind = "cool-to" | "heat-to"`` with
``temperature``, or ``kind = "quench"`` with either ``share`` (of the fresh feed, which
then bypasses the upstream beds; optional ``temperature``, default the feed temperature)
or a ``[train.after.stream]`` of its own (``temperature``, ``molar_flow``,
``mole_fractions``).

Problems are reported all at once, with 1-based paths such as ``train[2].tube.length``.
"""
import dataclasses
import math

from simulator.case.schema import Interstage, QuenchStream, TrainBed
from simulator.errors import CaseError
from simulator.units import parse_quantity

#: keys one bed of a train owns; the rest of a case is shared by every bed
BED_KEYS = ("tube", "bed", "heat", "pressure_drop")
TRAIN_KEYS = set(BED_KEYS) | {"after"}
AFTER_KEYS = {"kind", "temperature", "share", "stream"}
STREAM_KEYS = {"temperature", "molar_flow", "mole_fractions"}
INTERSTAGE_KINDS = ("cool-to", "heat-to", "quench")
#: equation-of-state values a train can run (interstage enthalpies are ideal-gas enthalpies)
TRAIN_EOS = ("ideal-gas",)


def load_train_case(raw, source_path, case_dir, load_case_dict):
    """Validate a case with ``[[train]]`` entries.

    Parameters
    ----------
    raw : dict
        The case as written.
    source_path : str
        Case file, for messages.
    case_dir : str
        Folder for relative species files.
    load_case_dict : callable
        The single-tube loader (:func:`simulator.case.load.load_case_dict`), applied to each bed.

    Returns
    -------
    Case
        Bed 1's case (its feed reduced by the quench shares) with ``train`` set to every bed.

    Raises
    ------
    CaseError
        Every problem found, one line each.
    """
    where = f"{source_path}: " if source_path else ""
    problems = []
    entries = raw.get("train")
    if not isinstance(entries, list) or not entries:
        raise CaseError(f"{where}train: give one [[train]] table per bed.")
    for key in ("tube", "bed", "heat"):
        if key in raw:
            problems.append(f"{where}{key}: a train case gives [{key}] inside each [[train]] bed "
                            f"([train.{key}]), not at the top level.")
    eos = raw.get("thermo", {}).get("equation_of_state", "ideal-gas") if isinstance(raw.get("thermo"), dict) \
        else "ideal-gas"
    if eos not in TRAIN_EOS:
        problems.append(f"{where}thermo.equation_of_state = {eos!r}: a reactor train runs with \"ideal-gas\" "
                        "only (its interstage enthalpy balances are ideal-gas balances).")
    shared = {k: v for k, v in raw.items() if k not in ("train", "tube", "bed", "heat")}
    beds, afters = [], []
    for k, entry in enumerate(entries, start=1):
        path = f"train[{k}]"
        if not isinstance(entry, dict):
            problems.append(f"{where}{path}: must be a table")
            continue
        for key in entry:
            if key not in TRAIN_KEYS:
                problems.append(f"{where}{path}.{key}: unknown key; a bed may give: "
                                f"{', '.join(sorted(TRAIN_KEYS))} (the rest of the case is shared).")
        bed_raw = dict(shared)
        for key in BED_KEYS:
            if key in entry:
                bed_raw[key] = entry[key]
        try:
            beds.append(load_case_dict(bed_raw, source_path=source_path, case_dir=case_dir))
        except CaseError as err:
            beds.append(None)
            for line in err.problems:
                problems.append(_bed_path(line, where, path))
        after = entry.get("after")
        afters.append(_after(after, path, where, k == len(entries), problems))
    problems = list(dict.fromkeys(problems))       # shared problems once, not once per bed
    if problems:
        raise CaseError(problems)
    for k, after in enumerate(afters, start=1):
        stream = after.stream if after is not None else None
        for name, _ in (stream.mole_fractions if stream is not None else ()):
            if name not in beds[0].species:
                problems.append(f"{where}train[{k}].after.stream.mole_fractions.{name}: {name!r} is neither in the "
                                "feed nor in any reaction.")
    if problems:
        raise CaseError(problems)
    shares = sum(a.share for a in afters if a is not None and not math.isnan(a.share))
    if shares >= 1.0:
        raise CaseError(f"{where}train: the quench shares sum to {shares:.6g}; bed 1 must get some of the feed "
                        "(shares sum below 1).")
    feed = beds[0].feed
    first_feed = dataclasses.replace(feed, flow_value=feed.flow_value * (1.0 - shares))
    train = []
    for k, (case, after) in enumerate(zip(beds, afters)):
        # the overall target is the train's: a bed alone is not sized to it
        design = dataclasses.replace(case.design, target_conversion=float("nan"))
        bed_case = dataclasses.replace(case, design=design, feed=first_feed if k == 0 else feed)
        train.append(TrainBed(case=bed_case, after=after))
    return dataclasses.replace(beds[0], feed=first_feed, raw=raw, train=tuple(train))


def _bed_path(line, where, path):
    """A single-case problem line with a bed key path prefixed by ``train[k].``."""
    body = line[len(where):] if line.startswith(where) else line
    for key in BED_KEYS:
        if body.startswith(key) and body[len(key):len(key) + 1] in (".", ":", " ", "="):
            return f"{where}{path}.{body}"
    if body.startswith(("feed.", "solver.")) and "tube" in body:
        return f"{where}{path}: {body}"          # a check of the feed or solver against this bed's tube
    return f"{where}{body}"


def _after(after, path, where, last, problems):
    """The interstage after a bed, or None; problems appended with their paths."""
    if after is None:
        return None
    p = f"{path}.after"
    if isinstance(after, list):
        if len(after) != 1:
            problems.append(f"{where}{p}: give at most one [[train.after]] per bed (found {len(after)}).")
            return None
        after = after[0]
    if not isinstance(after, dict):
        problems.append(f"{where}{p}: must be a table")
        return None
    if last:
        problems.append(f"{where}{p}: the last bed has nothing after it; remove [[train.after]] or add a bed.")
        return None
    for key in after:
        if key not in AFTER_KEYS:
            problems.append(f"{where}{p}.{key}: unknown key; accepted: {', '.join(sorted(AFTER_KEYS))}.")
    kind = after.get("kind")
    if kind not in INTERSTAGE_KINDS:
        problems.append(f"{where}{p}.kind = {kind!r}: choose one of: {', '.join(INTERSTAGE_KINDS)}.")
        return None
    T = _temperature(after, p, where, problems, required=kind != "quench")
    if kind != "quench":
        extra = [k for k in ("share", "stream") if k in after]
        if extra:
            problems.append(f"{where}{p}: {', '.join(extra)} given but kind = {kind!r} ignores them.")
        return Interstage(kind=kind, temperature=T)
    if ("share" in after) == ("stream" in after):
        problems.append(f"{where}{p}: a quench gives either share (of the fresh feed) or a [train.after.stream].")
        return None
    if "share" in after:
        share = after["share"]
        if isinstance(share, bool) or not isinstance(share, (int, float)) or not 0.0 < share < 1.0:
            problems.append(f"{where}{p}.share = {share!r}: must be a plain number between 0 and 1 (exclusive).")
            return None
        return Interstage(kind=kind, temperature=T, share=float(share))
    if "temperature" in after:
        problems.append(f"{where}{p}.temperature: a quench stream gives its temperature in [train.after.stream].")
    return Interstage(kind=kind, stream=_stream(after["stream"], f"{p}.stream", where, problems))


def _temperature(table, p, where, problems, required):
    if "temperature" not in table:
        if required:
            problems.append(f"{where}{p}.temperature: missing")
        return float("nan")
    try:
        return parse_quantity(table["temperature"], "temperature", "")
    except CaseError as err:
        problems.append(f"{where}{p}.temperature{err}")
        return float("nan")


def _stream(stream, p, where, problems):
    if not isinstance(stream, dict):
        problems.append(f"{where}{p}: must be a table (temperature, molar_flow, mole_fractions)")
        return None
    for key in stream:
        if key not in STREAM_KEYS:
            problems.append(f"{where}{p}.{key}: unknown key; accepted: {', '.join(sorted(STREAM_KEYS))}.")
    T = _temperature(stream, p, where, problems, required=True)
    flow = float("nan")
    if "molar_flow" not in stream:
        problems.append(f"{where}{p}.molar_flow: missing")
    else:
        try:
            flow = parse_quantity(stream["molar_flow"], "molar_flow", "")
        except CaseError as err:
            problems.append(f"{where}{p}.molar_flow{err}")
        if not flow > 0.0:
            problems.append(f"{where}{p}.molar_flow = {stream['molar_flow']!r}: must be > 0.")
    x = stream.get("mole_fractions")
    if not isinstance(x, dict) or not x or any(isinstance(v, bool) or not isinstance(v, (int, float))
                                               or not 0.0 <= v <= 1.0 for v in x.values()):
        problems.append(f"{where}{p}.mole_fractions: give a table of plain numbers such as {{ N2 = 1.0 }}.")
        return None
    total = sum(x.values())
    if abs(total - 1.0) > 1e-6:
        problems.append(f"{where}{p}.mole_fractions: sum to {total:.12g}; they must sum to 1 (within 1e-6).")
        return None
    return QuenchStream(temperature=T, molar_flow=flow, mole_fractions=tuple((s, v / total) for s, v in x.items()))
