"""Which engine runs the cases of ``tubesim sweep`` and ``tubesim uncertainty``: one rule for both.

``auto`` takes the compiled batch integrator (:mod:`simulator.sweeps.fast`) when every
varied or sampled path is an operating number it supports, else the per-case pool. The
rule does not depend on where the cases run: with a Dask scheduler the compiled engine
sends chunks of cases to the workers (:mod:`simulator.sweeps.dask_compiled`) and the
pool engine batches of per-case solves. ``compiled`` insists (and says why it cannot),
``pool`` never compiles.
"""
from simulator.errors import CaseError

ENGINES = ("auto", "compiled", "pool")


def choose_engine(requested, case, paths, scheduler=None):
    """The engine to run and, for the compiled one, the base model.

    Parameters
    ----------
    requested : {"auto", "compiled", "pool"}
        The ``--engine`` option.
    case : simulator.case.schema.Case
        The loaded base case.
    paths : sequence of str
        Varied (sweep) or sampled (uncertainty) case paths.
    scheduler : str, optional
        Dask scheduler address (either engine runs there; kept for the callers' symmetry).

    Returns
    -------
    engine : str
        ``"compiled"`` or ``"pool"``.
    model : simulator.model.build.Model or None
        The base model when ``engine == "compiled"``.

    Raises
    ------
    CaseError
        For ``compiled`` when it cannot run these paths (the reason named), or an unknown choice.
    """
    if requested not in ENGINES:
        raise CaseError(f"--engine {requested!r}: choose one of: {', '.join(ENGINES)}")
    if requested == "pool":
        return "pool", None
    from simulator.model.build import build_model
    from simulator.sweeps.compiled_sweep import compiled_supported

    model = build_model(case)
    ok = compiled_supported(model, list(paths))
    if requested == "compiled" and not ok:
        from simulator.sweeps.fast import unsupported_reason

        why = unsupported_reason(list(paths), model)
        raise CaseError(f"--engine compiled: not available here ({why}); use --engine pool.")
    return ("compiled", model) if ok else ("pool", None)
