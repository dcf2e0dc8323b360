"""Compile the kernel into numba's on-disk cache: ``python -m simulator.solve.warmup``.

Started in the background by :func:`simulator.model.kernels.warm_in_background` on a
cold cache; safe to run by hand (e.g. in a container build step). It solves a small
built-in case of its own (invented data) on both equations of state, and its 2-D (radial)
model, so that every function a run needs is compiled with the argument types real runs use.
"""
import sys

CASE = {
    "title": "kernel warm-up (invented data)",
    "thermo": {"species_file": "gri30.yaml",
               "custom": {"A": {"molar_mass": "28.014 g/mol", "cp": "30 J/(mol*K)",
                                "enthalpy_of_formation": "-10 kJ/mol", "critical_temperature": "126.2 K",
                                "critical_pressure": "3.39 MPa", "acentric_factor": 0.038}}},
    "reactions": [{"equation": "A => N2", "pre_exponential": "1e3 1/s", "activation_energy": "50 kJ/mol"}],
    "feed": {"temperature": "500 K", "pressure": "5 bar", "molar_flow": "1 mol/s",
             "mole_fractions": {"A": 0.5, "N2": 0.5}},
    "tube": {"length": "1 m", "inner_diameter": "25 mm", "count": 1},
    "bed": {"particle_diameter": "3 mm", "void_fraction": 0.4, "bulk_density": "1000 kg/m^3"},
    "heat": {"mode": "exchange", "overall_coefficient": "100 W/(m^2*K)", "medium": {"temperature": "500 K"}},
    "pressure_drop": {"model": "ergun", "viscosity": "2e-5 Pa*s"},
    "design": {"key_species": "A", "target_conversion": 0.5},
}


def main():
    """Compile and cache; returns 0."""
    import copy

    from simulator.case.load import load_case_dict
    from simulator.model import kernel as K
    from simulator.model.build import build_model
    from simulator.solve.integrate import _Tube
    import numpy as np

    for eos in ("ideal-gas", "peng-robinson"):
        raw = copy.deepcopy(CASE)
        raw["thermo"]["equation_of_state"] = eos
        model = build_model(load_case_dict(raw))
        tube = _Tube(model, 1e-6, model.scale * 1e-10, 0.0, kernel=K)
        zs = np.linspace(0.0, 1.0, 11)
        ys, _, _ = tube.run(model.y0, zs, mxstep=5000)
        K.derivative_profile(zs, ys, *model.args)
        n = model.n
        K.compressibility_profile(np.ascontiguousarray(ys[:, n]), np.ascontiguousarray(ys[:, n + 1]),
                                  np.ascontiguousarray(np.clip(ys[:, :n], 0, None)), model.args[9])
        K.pr_phase_profile(np.ascontiguousarray(ys[:, n]), np.ascontiguousarray(ys[:, n + 1]),
                           np.ascontiguousarray(np.clip(ys[:, :n], 0, None)), model.args[9])
        K.wall_columns(zs, np.ascontiguousarray(ys), *model.args[:4])
    # the 2-D (radial) kernel, which has no plain-Python twin: compiled here so a first 2-D run need not wait
    from simulator.solve.radial import solve_radial

    model = build_model(load_case_dict(copy.deepcopy(CASE)))
    solve_radial(model, 3, 1.0, 1e-4, 100.0, np.linspace(0.0, 1.0, 11))
    return 0


if __name__ == "__main__":
    sys.exit(main())
