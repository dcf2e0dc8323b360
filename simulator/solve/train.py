"""simulate_train(case) -> TrainResult: the beds of a reactor train in series, as one solve.

Each bed is the case of its own ``[[train]]`` entry (:mod:`simulator.case.train`) and is solved by
:func:`simulator.solve.integrate.simulate`. Bed 1 gets the case's feed (less the quench shares);
every later bed gets the previous bed's outlet exactly (molar flows through
``Feed.inlet_flows``, no renormalised mole fractions, and its T and P) after the interstage step
(:mod:`simulator.solve.interstage`).

A bed that fails ends the train: the train is ``failed`` and says which bed, where and why; its
overall numbers are not computed. A bed stopped by a design event (temperature limit, pressure
floor) ends the train too (``stopped``): the beds after it are not run and the overall conversion
is not computed, since the fresh feed of the later quenches never entered.

Conservation over the whole train (:func:`train_closure`), with every input counted (bed 1 feed
and each quench):

* elements (and total mass): ``max |out - in| / in`` over the elements;
* energy: ``H_out - H_in - sum(bed wall duties) - sum(interstage duties) = 0``, the stream
  enthalpies from Cantera's species thermo (:func:`simulator.solve.checks.stream_enthalpy`),
  independent of the NASA-7 evaluation the interstage steps and the kernel use, relative to the
  largest of the summed duties, the reaction heat at the feed temperature and a floor of
  1e-3 F_T R T_feed.
"""
import dataclasses
import math
from dataclasses import dataclass, field

import numpy as np

from simulator.errors import CaseError
from simulator.model.build import build_model, feed_molar_flow
from simulator.solve.checks import CLOSURE_FAILURE, stream_enthalpy
from simulator.solve.integrate import simulate
from simulator.solve.interstage import apply_interstage, quench_input
from simulator.thermo.species_data import build_species_data
from simulator.units import R


@dataclass(frozen=True)
class TrainResult:
    """Every bed's result and the interstage steps of one train run.

    Attributes
    ----------
    case : Case, the train case (bed 1's case with ``train`` set)
    species : tuple of str, species order of every flow array
    beds : tuple of Result, the beds that ran, in order (the last one failed or stopped if the train did)
    interstages : tuple of InterstageStep, the steps that ran
    status : "completed" | "stopped" | "failed"
    termination : str, what ended the train (which bed, where and why)
    fed_key : tuple of float, key species fed up to each bed's inlet (bed 1 feed + quenches so far) [mol/s]
    fresh_flows : ndarray, every input of the train summed (bed 1 feed + all quenches) [mol/s]
    fresh_enthalpy_inputs : tuple of (flows [mol/s], T [K], P [Pa]), each input of the train
    overall_conversion : float, key species converted over everything fed (NaN unless completed) [-]
    closure : dict, ``elements_relative`` and ``energy_relative`` over the train [-] (NaN if failed)
    """

    case: object
    species: tuple
    beds: tuple
    interstages: tuple
    status: str
    termination: str
    fed_key: tuple
    fresh_flows: np.ndarray = field(repr=False)
    overall_conversion: float = math.nan
    closure: dict = field(default_factory=dict)
    warnings: tuple = ()

    @property
    def key_species(self):
        return self.case.design.key_species

    @property
    def key_index(self):
        return self.species.index(self.key_species)

    def path_conversion(self, bed):
        """Conversion along bed ``bed`` (0-based) on the key species fed so far, (N,), [-].

        The train's own basis: after a quench it drops (fresh key species diluted in), and at the
        last outlet it is the overall conversion.
        """
        fed = self.fed_key[bed]
        return 1.0 - self.beds[bed].F[:, self.key_index] / fed


def bed_case(bed, F_in, T_in, P_in):
    """A bed's case fed exactly by ``F_in`` [mol/s] (whole reactor) at ``T_in`` [K] and ``P_in`` [Pa].

    The mole fractions and the molar flow are set consistently with the flows (the viscosity law
    and the plausibility checks read them); the integration starts from ``inlet_flows`` itself.
    """
    F_in = np.asarray(F_in, dtype=float)
    total = float(F_in.sum())
    fractions = tuple((s, float(f / total)) for s, f in zip(bed.species, F_in) if f > 0.0)
    feed = dataclasses.replace(bed.feed, temperature=float(T_in), pressure=float(P_in), mole_fractions=fractions,
                               flow_kind="molar_flow", flow_value=total,
                               inlet_flows=tuple(float(f) for f in F_in))
    return dataclasses.replace(bed, feed=feed)


def standalone_case(bed):
    """A bed case as an ordinary feed (mole fractions and molar flow, no ``inlet_flows``).

    For the verbs that vary the feed of one tube (screening scans the feed fraction and flow; the
    assumption check re-solves variants): ``inlet_flows`` would pin the inlet against such a change.
    The inlet equals the exact one to round-off (x_i F_T = F_i to about 1e-16 relative).
    """
    return dataclasses.replace(bed, feed=dataclasses.replace(bed.feed, inlet_flows=()))


def _fresh_flows(case, species):
    """Molar flows of the whole fresh feed as written (before quench shares), [mol/s]."""
    written = case.train[-1].case if len(case.train) > 1 else case.train[0].case
    total = feed_molar_flow(written, species)
    x = dict(written.feed.mole_fractions)
    return np.array([x.get(s, 0.0) for s in species.names]) * total


def _run_bed(k, bed, species, model=None):
    """simulate() of one bed; a problem of the computed inlet names the bed."""
    try:
        return simulate(bed, model=model or build_model(bed, species=species))
    except CaseError as err:
        where = f"{bed.source_path}: " if bed.source_path else ""
        raise CaseError([f"{where}train[{k + 1}]: {line.removeprefix(where)}" for line in err.problems]) from err


def simulate_train(case):
    """Run the beds of a reactor train in series (see the module docstring).

    Parameters
    ----------
    case : simulator.case.schema.Case
        A validated case with ``train`` set.

    Returns
    -------
    TrainResult
    """
    if not case.train:
        raise CaseError(f"{case.source_path}: train: the case has no [[train]] beds; run it as a single tube.")
    species = build_species_data(case.species, case.thermo)
    names = species.names
    key = names.index(case.design.key_species)
    fresh = _fresh_flows(case, species)
    n_beds = len(case.train)
    beds, steps, inputs, fed, notes = [], [], [], [], []
    first = case.train[0].case
    first_model = build_model(first, species=species)
    F_in = first_model.y0[:len(names)] * first_model.count
    inputs.append((F_in.copy(), first.feed.temperature, first.feed.pressure))
    fed_key = float(F_in[key])
    bed = first
    status, termination = "completed", f"all {n_beds} beds run to the end of their tubes"
    for k, entry in enumerate(case.train):
        fed.append(fed_key)
        result = _run_bed(k, bed, species, first_model if k == 0 else None)
        beds.append(result)
        if result.status != "completed":
            status = result.status
            termination = f"bed {k + 1} of {n_beds} {result.status}: {result.termination}{_not_run(k + 2, n_beds)}"
            break
        if entry.after is None:
            continue
        step = apply_interstage(entry.after, k + 1, result.F[-1], float(result.T[-1]), float(result.P[-1]),
                                species.nasa7, names, fresh, case.train[0].case.feed.temperature)
        steps.append(step)
        notes += _step_notes(step)
        if step.kind == "quench":
            inputs.append((step.added_flows, step.added_temperature, step.pressure))
            fed_key += float(step.added_flows[key])
        bed = bed_case(case.train[k + 1].case, step.flows, step.outlet_temperature, step.pressure)
    total_in = sum(F for F, _, _ in inputs)
    overall = math.nan
    clos = {"elements_relative": math.nan, "energy_relative": math.nan}
    if status != "failed":
        clos = train_closure(first_model, inputs, beds, steps)
        defect = _closure_defect(clos)
        if defect:
            status, termination = "failed", f"train failed: {defect}"
    if status == "completed":
        overall = (total_in[key] - float(beds[-1].F[-1, key])) / total_in[key]
    elif status == "stopped":
        notes.append("overall conversion not computed: the train stopped before its last outlet")
    return TrainResult(case=case, species=names, beds=tuple(beds), interstages=tuple(steps), status=status,
                       termination=termination, fed_key=tuple(fed), fresh_flows=total_in,
                       overall_conversion=overall, closure=clos, warnings=tuple(notes))


def _not_run(first, last):
    """``; bed 3 not run`` / ``; beds 2-4 not run`` for the beds after a failure or stop (1-based), or ''."""
    if first > last:
        return ""
    return f"; bed {first} not run" if first == last else f"; beds {first}-{last} not run"


def _step_notes(step):
    """A warning when a cool-to step heats or a heat-to step cools (the set temperature is still applied)."""
    wrong = {"cool-to": step.duty > 0.0, "heat-to": step.duty < 0.0}.get(step.kind, False)
    if not wrong:
        return []
    does = "heats" if step.duty > 0.0 else "cools"
    return [f"after bed {step.after_bed}: {step.kind} {step.outlet_temperature:.6g} K {does} the gas leaving the bed "
            f"at {step.inlet_temperature:.6g} K (duty {step.duty:+.4g} W): check the interstage temperature"]


def _closure_defect(clos):
    for name, limit in CLOSURE_FAILURE.items():
        if not clos[name] <= limit:
            what = "element (mass)" if name.startswith("elements") else "energy"
            return (f"the {what} balance over the train closes only to {clos[name]:.2g} (failed above "
                    f"{limit:g}): the results are not trustworthy")
    return None


def train_closure(model, inputs, beds, steps):
    """Element and energy closure over the beds that ran, relative [-] (see the module docstring).

    Parameters
    ----------
    model : simulator.model.build.Model
        Any bed's model (species data and thermo are shared by the beds).
    inputs : list of (ndarray, float, float)
        Every stream entering the train: molar flows [mol/s], temperature [K], pressure [Pa]
    beds : list of Result
        The beds that ran, in order.
    steps : list of InterstageStep
        The interstage steps that ran.
    """
    species = model.species
    F_in = sum(F for F, _, _ in inputs)
    last = beds[-1]
    F_out = last.F[-1]
    worst = 0.0
    for e in sorted({e for el in species.elements for e in el}):
        a = np.array([el.get(e, 0.0) for el in species.elements])
        inflow = float(a @ F_in)
        if inflow > 0:
            worst = max(worst, abs(float(a @ F_out) - inflow) / inflow)
    mass_in = float(species.molar_mass @ F_in)
    worst = max(worst, abs(float(species.molar_mass @ F_out) - mass_in) / mass_in)
    H_in = sum(stream_enthalpy(model, F, T, P) for F, T, P in inputs)
    H_out = stream_enthalpy(model, F_out, float(last.T[-1]), float(last.P[-1]))
    duties = sum(float(b.Q[-1]) for b in beds) + sum(s.duty for s in steps)
    T_feed = inputs[0][1]
    reaction_heat = abs(stream_enthalpy(model, F_out, T_feed, inputs[0][2])
                        - sum(stream_enthalpy(model, F, T_feed, inputs[0][2]) for F, _, _ in inputs))
    floor = 1e-3 * float(np.sum(F_in)) * R * T_feed
    scale = max(abs(duties), sum(abs(float(b.Q[-1])) for b in beds) + sum(abs(s.duty) for s in steps),
                reaction_heat, floor)
    return {"elements_relative": worst, "energy_relative": abs(H_out - H_in - duties) / scale}


#: Verbs that do not run a train yet, each with its one-line reason (the CLI refuses them, validate lists them).
TRAIN_REFUSALS = {}     # every verb runs a train (sweep and uncertainty per case, the whole train each)


def refuse_train(case, verb):
    """Raise the one-line CaseError of a verb that does not run a train (no-op for a single tube)."""
    if case.train and verb in TRAIN_REFUSALS:
        raise CaseError(f"{case.source_path}: train: a reactor train ([[train]]) is run by `tubesim run`, "
                        f"`report`, `assumptions`, `screen` (bed by bed), `size --bed K`, `sweep` and `uncertainty`; "
                        f"{verb}: {TRAIN_REFUSALS[verb]}.")
