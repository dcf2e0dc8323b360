"""The tube simulator as a sweep evaluator (runs inside the workers).

``TubeEvaluator()(raw_case, case_dir)`` validates the case with the applied
values, builds the model with the species data cached once per worker process
(:func:`simulator.sweeps.execute.worker_cache`; Cantera is never shipped per
task) and solves it.

The design temperature limit does not stop sweep runs: a runaway map and an
exceedance probability need the true hot spot. Runs stop only at an internal
guard of max(T_feed, T_medium) + 3 dT_ad + 500 K (status "stopped"; its hot spot
is then a lower bound, recorded as the guard temperature). A reactor train (``[[train]]``) runs
whole per case (``simulate_train``): its row is the hottest bed's hot spot (position along the
train), the overall conversion on everything fed and the train outlet; as for a tube, the design
temperature limit does not stop it (each bed keeps its step budget; the runaway guard is per tube only).
"""
import dataclasses
import math

from simulator.sweeps.execute import worker_cache


def _species(case):
    from simulator.thermo.species_data import build_species_data

    key = ("species", case.thermo.species_path, case.species, case.thermo.custom)
    return worker_cache(key, lambda: build_species_data(case.species, case.thermo))


class TubeEvaluator:
    """Picklable evaluator: one case dict in, one results row out."""

    seconds_per_case = 0.01

    def __call__(self, raw_case, case_dir):
        from simulator.case.load import load_case_dict
        from simulator.model.build import build_model
        from simulator.solve.integrate import simulate

        raw_case = dict(raw_case, design={k: v for k, v in raw_case.get("design", {}).items()
                                          if k != "temperature_limit"})   # sweeps ignore the limit (docstring)
        case = load_case_dict(raw_case, source_path="", case_dir=str(case_dir))
        if case.train:
            return _train_row(case)
        species = _species(case)
        model = build_model(case, species=species)
        guard = _guard(case, model)
        case = dataclasses.replace(case, design=dataclasses.replace(case.design, temperature_limit=guard))
        result = simulate(case, model=model)
        if result.status == "failed":
            raise RuntimeError(result.termination)
        return {
            "status": result.status,
            "hot_spot_temperature_K": result.hot_spot["temperature_K"],
            "hot_spot_position_m": result.hot_spot["position_m"],
            "outlet_conversion": result.outlet_conversion,
            "outlet_temperature_K": float(result.T[-1]),
            "outlet_pressure_Pa": float(result.P[-1]),
            "error": None if result.status == "completed" else result.termination,
        }


def _train_row(case):
    """The results row of a reactor train: the hottest bed's hot spot (position along the whole train),
    the overall conversion on everything fed and the train outlet (:mod:`simulator.solve.train`)."""
    from simulator.solve.train import simulate_train

    train = simulate_train(case)
    if train.status == "failed":
        raise RuntimeError(train.termination)
    offsets = [0.0]
    for bed in train.beds[:-1]:
        offsets.append(offsets[-1] + float(bed.z[-1]))
    k = max(range(len(train.beds)), key=lambda i: train.beds[i].hot_spot["temperature_K"])
    hottest, last = train.beds[k], train.beds[-1]
    return {
        "status": train.status,
        "hot_spot_temperature_K": hottest.hot_spot["temperature_K"],
        "hot_spot_position_m": offsets[k] + hottest.hot_spot["position_m"],
        "outlet_conversion": train.overall_conversion,
        "outlet_temperature_K": float(last.T[-1]),
        "outlet_pressure_Pa": float(last.P[-1]),
        "error": None if train.status == "completed" else train.termination,
    }


def _guard(case, model):
    """Internal runaway guard temperature, [K]."""
    return runaway_guard(model, model.y0[:model.n], case.feed.temperature, model.y0[model.n + 2])


def runaway_guard(model, feed_flows, feed_temperature, medium_temperature):
    """Runaway guard max(T_feed, T_medium) + 3 dT_ad + 500 K of one feed, [K]

    Our choice, above any hot spot the tube can reach: the gas can be heated up to the
    medium's temperature (a furnace-heated coil) and heats itself by at most dT_ad.

    Parameters
    ----------
    model : simulator.model.build.Model
        Model of the case (thermo data and stoichiometry).
    feed_flows : ndarray
        Feed molar flows per tube, [mol/s]
    feed_temperature : float
        Feed temperature, [K]
    medium_temperature : float
        Medium temperature (where it enters; the feed temperature without a medium), [K]

    Returns
    -------
    float
        The guard; where the adiabatic rise is not finite, not positive or has no root,
        the hotter of feed and medium + 500 K, [K]
    """
    return float(guard_from_rise(guard_rise(model, feed_flows, feed_temperature), feed_temperature,
                                 medium_temperature))


def guard_rise(model, feed_flows, feed_temperature):
    """The adiabatic rise term of :func:`runaway_guard` (0 where there is no finite positive rise), [K]

    Depends on the feed only, so a batch computes it once per distinct feed.
    """
    from simulator.model import adiabatic

    try:
        rise = adiabatic.adiabatic_rise(feed_flows, feed_temperature, model.args[4], model.key_index,
                                        model.args[2])[0]
    except (ValueError, ArithmeticError):   # the root finder found no rise for this feed
        rise = math.nan
    return rise if math.isfinite(rise) and rise > 0 else 0.0


def guard_from_rise(rise, feed_temperature, medium_temperature):
    """max(T_feed, T_medium) + 3 rise + 500 K, [K] (arrays or floats)."""
    import numpy as np

    return np.maximum(feed_temperature, medium_temperature) + 3.0 * rise + 500.0
