"""tubesim: design and review of tubular and packed-bed reactors.

Public API (heavy modules load on first use)::

    from simulator import load_case, simulate
    result = simulate(load_case("cases/decomposition_empty_tube.toml"))
    result.summary()          # == summary.json
"""
__version__ = "0.1.0"

__all__ = ["load_case", "load_case_dict", "simulate", "__version__"]


def __getattr__(name):
    """Lazy public API, so ``import simulator`` and ``tubesim --help`` stay light."""
    if name in ("load_case", "load_case_dict"):
        from simulator.case import load

        return getattr(load, name)
    if name == "simulate":
        from simulator.solve.integrate import simulate

        return simulate
    raise AttributeError(f"module 'simulator' has no attribute {name!r}")
