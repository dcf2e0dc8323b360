"""Detailed gas-phase mechanisms (Cantera YAML) in a tube: balances, integration, results.

* :mod:`simulator.mechanism.balances`: the tube balances with Cantera's rates and thermo and
  their Jacobian from Cantera's rate derivatives (one object, ``MechanismTube``).
* :mod:`simulator.mechanism.integrate`: stiff integration (SUNDIALS CVODE through scikit-sundae).
* :mod:`simulator.mechanism.ignition`: ignition position and residence time to it.
* :mod:`simulator.mechanism.closure`: element and energy closure from Cantera's enthalpies.
* :mod:`simulator.mechanism.run`: ``simulate_mechanism(case) -> Result`` (composed by
  :func:`simulator.solve.integrate.simulate`).
"""
