"""Grid sweeps and Monte Carlo uncertainty runs over raw cases, on a process pool or Dask.

Modules: :mod:`~simulator.sweeps.paths` (dotted paths, ``--vary``, grids),
:mod:`~simulator.sweeps.store` (results.sqlite with resume),
:mod:`~simulator.sweeps.execute` (batched execution, evaluator seam, drivers),
:mod:`~simulator.sweeps.sampling` (uncertainty entries, LHS/Sobol', statistics),
:mod:`~simulator.sweeps.progress` (progress bar / periodic lines).
Nothing heavy is imported here (no dask, no scipy).
"""
