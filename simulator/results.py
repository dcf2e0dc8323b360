"""Result of one tube simulation: data only (no plotting, saving or reporting).

All arrays are SI and refer to the whole reactor (all tubes) unless a name says
"per tube". :meth:`Result.summary` is exactly what ``summary.json`` holds.
"""
import math
from dataclasses import dataclass, field

import numpy as np


def _num(value):
    """JSON-safe float: NaN/inf -> None."""
    if value is None:
        return None
    value = float(value)
    return value if math.isfinite(value) else None


@dataclass(frozen=True)
class Result:
    """Axial profiles and design numbers of one run.

    Attributes
    ----------
    z : ndarray, axial position [m]
    F : ndarray (N, n), molar flows of the whole reactor [mol/s]; a flow the solver leaves negative
        within its tolerance (beyond it the run fails) is reported as 0
    T, P, Tc : ndarray, gas temperature [K], pressure [Pa], medium temperature [K]
    Q : ndarray, heat added through the walls of all tubes up to z [W] (negative = removed)
    Z : ndarray, compressibility factor (NaN where critical data are missing) [-]
    status : "completed" | "stopped" | "failed"
    """

    case: object
    species: tuple
    z: np.ndarray
    F: np.ndarray
    T: np.ndarray
    P: np.ndarray
    Tc: np.ndarray
    Q: np.ndarray
    Z: np.ndarray
    status: str
    termination: str
    hot_spot: dict
    design: dict
    closure: dict
    warnings: tuple
    solver_stats: dict
    versions: dict
    references: tuple
    events: dict = field(default_factory=dict)
    adiabatic_temperature_rise: float = float("nan")   # [K]
    extra: dict = field(default_factory=dict)

    @property
    def key_species(self):
        return self.case.design.key_species

    @property
    def key_index(self):
        return self.species.index(self.key_species)

    @property
    def conversion(self):
        """Conversion of the key species along the tube, at most 1, [-].

        A flow that the solver leaves slightly negative, within its absolute tolerance
        (beyond it the run fails), would give X a little above 1: it is reported as 1.
        """
        F0 = self.F[0, self.key_index]
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.minimum((F0 - self.F[:, self.key_index]) / F0, 1.0)

    @property
    def mole_fractions(self):
        """Mole fractions along the tube, (N, n), [-]."""
        Ft = self.F.sum(axis=1, keepdims=True)
        return self.F / Ft

    @property
    def outlet_conversion(self):
        return float(self.conversion[-1])

    def summary(self):
        """The run's numbers as the ``summary.json`` dict (SI units, whole reactor)."""
        x_out = self.mole_fractions[-1]
        outlet = {
            "position_m": _num(self.z[-1]),
            "conversion": _num(self.conversion[-1]),
            "temperature_K": _num(self.T[-1]),
            "pressure_Pa": _num(self.P[-1]),
            "medium_temperature_K": _num(self.Tc[-1]) if self.case.heat.exchange else None,
            "molar_flows_mol_per_s": {s: _num(v) for s, v in zip(self.species, self.F[-1])},
            "mole_fractions": {s: _num(v) for s, v in zip(self.species, x_out)},
            "heat_duty_W": _num(self.Q[-1]),
            "pressure_drop_Pa": _num(self.P[0] - self.P[-1]),
        }
        if self.status == "failed":
            # a failed integration is reported as such: where and why, and no result-looking numbers
            outlet = {k: None for k in outlet}
            outlet["position_m"] = _num(self.z[-1])
            return {
                "title": self.case.title, "status": self.status, "termination": self.termination,
                "key_species": self.key_species, "outlet": outlet,
                "hot_spot": {"temperature_K": None, "position_m": None, "rise_above_feed_K": None,
                             "rise_above_medium_K": None, "located_by": None},
                "design": {"target_conversion": self.design.get("target_conversion"), "reached": False,
                           "length_m": None, "volume_m3": None, "catalyst_mass_kg": None},
                "adiabatic_temperature_rise_K": _num(self.adiabatic_temperature_rise),
                "adiabatic": self._adiabatic_block(),
                "closure": {"elements_relative": None, "energy_relative": None},
                "max_compressibility_deviation": None, "events": self.events, "warnings": list(self.warnings),
                "solver": self.solver_stats, "references": list(self.references), "versions": self.versions,
                **self._steady_states_block(),
                # only blocks a producer marks as meaningful for a failed run (a mechanism's null ignition)
                **self.extra.get("failed_summary_blocks", {}),
            }
        return {
            "title": self.case.title,
            "status": self.status,
            "termination": self.termination,
            "key_species": self.key_species,
            "outlet": outlet,
            "hot_spot": {k: (_num(v) if isinstance(v, (int, float, np.floating)) else v)
                         for k, v in self.hot_spot.items()},
            "design": {k: (_num(v) if isinstance(v, (int, float, np.floating)) and not isinstance(v, bool) else v)
                       for k, v in self.design.items()},
            "adiabatic_temperature_rise_K": _num(self.adiabatic_temperature_rise),
            "adiabatic": self._adiabatic_block(),
            "closure": {k: _num(v) for k, v in self.closure.items()},
            "max_compressibility_deviation": _num(np.nanmax(np.abs(self.Z - 1.0)))
            if np.any(np.isfinite(self.Z)) else None,
            "events": self.events,
            "warnings": self._warnings_with_network(),
            "solver": self.solver_stats,
            "references": list(self.references),
            "versions": self.versions,
            **self._steady_states_block(),
            **self._wall_block(),
            **self._network_block(),
            **self.extra.get("summary_blocks", {}),     # e.g. the 2-D model's (simulator.solve.radial_run)
        }

    def _warnings_with_network(self):
        from simulator.network_results import network_of

        notes = [n for n in network_of(self)["notes"] if n and n not in self.warnings]
        return list(self.warnings) + notes

    def _network_block(self):
        """``products`` ([design] products) and ``equilibrium`` (a reversible reaction of the key species),
        see :mod:`simulator.network_results`; their notes join the warnings."""
        from simulator.network_results import network_of

        net = network_of(self)
        out = {}
        if self.case.design.products:
            out["products"] = {k: {q: _num(v) for q, v in d.items()} for k, d in net["products"].items()}
        if net["equilibrium"] is not None:
            out["equilibrium"] = {k: (_num(v) if isinstance(v, float) else v) for k, v in net["equilibrium"].items()}
        return out

    def _wall_block(self):
        """``max_wall_temperature_K`` and ``wall`` (heat exchange only): U along the tube, where it came from,
        the hottest tube wall (null where a typed U leaves it unresolved; then its bound) and the largest flux."""
        wall = self.extra.get("wall")
        if not self.case.heat.exchange or not wall:
            return {}
        from simulator.model.heat.coefficient import describe, hottest_wall

        T, z, resolved = hottest_wall(wall, self.z)
        U = wall["overall_coefficient_W_per_m2K"]
        flux = wall["wall_heat_flux_W_per_m2"]
        finite_U = U[np.isfinite(U)]
        heat = self.case.heat
        source = (describe(self.case) if heat.coefficient is not None else
                  "given heat flux (no U)" if heat.profile_quantity == "heat_flux" else
                  "typed heat.overall_coefficient (constant)")
        limit = self.case.design.wall_temperature_limit
        return {
            "max_wall_temperature_K": _num(T) if resolved else None,
            "wall": {
                "coefficient_source": source,
                "overall_coefficient_W_per_m2K": None if not finite_U.size else {
                    "inlet": _num(U[0]), "outlet": _num(U[-1]), "min": _num(finite_U.min()),
                    "max": _num(finite_U.max())},
                "max_wall_temperature_K": _num(T) if resolved else None,
                "max_wall_temperature_position_m": _num(z) if resolved else None,
                "max_wall_temperature_bound_K": None if resolved else _num(T),
                "wall_temperature_basis": wall["basis"],
                "max_heat_flux_W_per_m2": _num(flux[np.nanargmax(np.abs(flux))]) if np.any(np.isfinite(flux)) else None,
                "wall_temperature_limit_K": _num(limit),
            },
        }

    def _steady_states_block(self):
        """``steady_states`` (counter-current medium only): every steady state found, see
        :mod:`simulator.solve.counter_current`; absent for initial-value arrangements."""
        if "steady_states" not in self.extra:
            return {}
        return {"steady_states": [dict(e) for e in self.extra["steady_states"]]}

    def _adiabatic_block(self):
        info = self.extra.get("adiabatic", {})
        if not info:
            return None
        reaction = info.get("reaction")
        limited = info.get("limited_by")
        return {
            "basis": "worst case over the declared reactions: the largest consumption of the key species (complete "
                     "unless a co-reactant runs out), then the largest heat release; reversible reactions taken to "
                     "completion (an upper bound); enthalpy balance with temperature-dependent heat capacities",
            "extents_mol_per_s": {self.case.reactions[j].equation: _num(v * self.case.tube.count)
                                  for j, v in enumerate(info.get("extents", []))},
            "reaction": None if reaction is None else self.case.reactions[reaction].equation,
            "limited_by": None if limited is None else self.species[limited],
            "outlet_temperature_K": _num(info.get("outlet_temperature")),
            "note": info.get("note", ""),
        }

    def profile_table(self):
        """(header, rows) for ``profile.csv``: one row per axial point."""
        header = ["position_m", "temperature_K", "pressure_Pa", "medium_temperature_K", "compressibility_Z",
                  f"conversion_{self.key_species}", "heat_added_W"]
        listed = self.extra.get("profile_species", self.species)   # a mechanism run lists the species present
        columns = [self.species.index(s) for s in listed]
        header += [f"molar_flow_{s}_mol_per_s" for s in listed]
        header += [f"mole_fraction_{s}" for s in listed]
        cooled = self.case.heat.exchange
        wall = self.extra.get("wall") if cooled else None
        if wall:
            from simulator.model.heat.coefficient import WALL_COLUMNS

            header += list(WALL_COLUMNS)
        network = {}
        if self.status != "failed":
            from simulator.network_results import network_of

            network = network_of(self)["columns"]
            header += list(network)
        X = self.conversion
        x = self.mole_fractions
        rows = []
        for k in range(len(self.z)):
            row = [self.z[k], self.T[k], self.P[k], self.Tc[k] if cooled else float("nan"), self.Z[k], X[k],
                   self.Q[k]]
            row += list(self.F[k, columns]) + list(x[k, columns])
            if wall:
                row += [wall[c][k] for c in WALL_COLUMNS]
            row += [network[c][k] for c in network]
            rows.append(row)
        for name, values in self.extra.get("profile_columns", ()):   # e.g. the 2-D model's temperatures
            header.append(name)
            for row, value in zip(rows, values):
                row.append(value)
        return header, rows
