"""Species data for a case: molar masses, NASA-7 rows, validity ranges, elements.

Cantera is used here, once, when a model is built: species come from a Cantera
YAML file (a bundled data file such as ``gri30.yaml`` or the species-only
``nasa_gas.yaml``, or a path relative to the case file) or are declared in the
case with a constant heat capacity. The right-hand side never calls Cantera;
it evaluates the cached coefficient rows (:mod:`simulator.thermo.nasa7`).
Cantera works in kmol; this module converts to mol and nothing else sees kmol.
"""
import difflib
import functools
import threading
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from simulator.errors import ThermoError
from simulator.thermo.nasa7 import constant_cp_coefficients
from simulator.units import P_STANDARD

_KMOL = 1000.0


@dataclass(frozen=True)
class SpeciesData:
    """Thermo data of the model's species, in SI and mol units.

    Attributes
    ----------
    names : tuple of str
    molar_mass : ndarray, [kg/mol]
    nasa7 : ndarray (n, 15), rows on the one standard state of the kernel, 1 atm
        (:data:`simulator.units.P_STANDARD`), whatever the file declares, [-]
    t_min, t_max : ndarray, validity range of each species' data, [K]
    elements : tuple of dict, element counts (empty for custom species)
    sources : tuple of str, where each species' data came from
    reference_pressures : tuple of float, the standard-state pressure each species' data were
        given at (the file's ``reference-pressure``; 1 atm for custom species), [Pa]
    has_entropy : ndarray of bool (False for custom species without a standard entropy)
    """

    names: tuple
    molar_mass: np.ndarray
    nasa7: np.ndarray
    t_min: np.ndarray
    t_max: np.ndarray
    elements: tuple
    sources: tuple
    has_entropy: np.ndarray
    species_path: str | None
    reference_pressures: tuple = ()


def cantera_data_file(name):
    """Full path of a data file bundled with Cantera, or None."""
    import cantera as ct

    for folder in ct.get_data_directories():
        candidate = Path(folder) / name
        if candidate.is_file():
            return str(candidate)
    return None


def resolve_species_file(text, case_dir):
    """Resolve ``thermo.species_file``: a path relative to the case file, else a bundled name.

    Returns the path to open, or None when it cannot be found.
    """
    candidate = Path(case_dir) / text
    if candidate.is_file():
        return str(candidate.resolve())
    return cantera_data_file(text)


@functools.lru_cache(maxsize=16)
def species_in_file(path):
    """All species of a Cantera YAML file as ``{name: cantera.Species}`` (cached)."""
    import cantera as ct

    try:
        return {sp.name: sp for sp in ct.Species.list_from_file(path)}
    except ct.CanteraError as err:
        raise ThermoError(f"cannot read species from {path}: {cantera_message(err)}") from err


def cantera_message(err):
    """The first meaningful line of a Cantera error (not its rows of asterisks or the thrower's name).

    Examples
    --------
    >>> cantera_message(RuntimeError("\\n****\\nCanteraError thrown by X:\\nMissing data for 'H2'.\\n****\\n"))
    "Missing data for 'H2'."
    """
    for line in str(err).splitlines():
        text = line.strip()
        if text and text.strip("*") and not text.startswith("CanteraError thrown by"):
            return text
    return type(err).__name__


def near(name, choices, n=5):
    """Near matches of ``name`` among ``choices`` for did-you-mean hints."""
    matches = difflib.get_close_matches(name, list(choices), n=n, cutoff=0.5)
    if not matches:
        upper = {c.upper(): c for c in choices}
        matches = [upper[m] for m in difflib.get_close_matches(name.upper(), list(upper), n=n, cutoff=0.6)]
    return matches


def to_standard_pressure(row, reference_pressure):
    r"""NASA-7 row moved from the standard state at ``reference_pressure`` to 1 atm.

    Parameters
    ----------
    row : ndarray
        NASA-7 coefficient row of 15 floats whose entropy refers to ``reference_pressure``, [-]
    reference_pressure : float
        Standard-state pressure of the row (a species file's ``reference-pressure``), [Pa]

    Returns
    -------
    row : ndarray
        The same row with the entropy constants a7 (both ranges) shifted so that s°/R refers
        to :data:`simulator.units.P_STANDARD`, [-]

    Notes
    -----
    An ideal gas's entropy depends on its standard-state pressure as
    :math:`s^\circ(P_2) = s^\circ(P_1) - R \ln(P_2/P_1)`; enthalpy and heat capacity do not.
    Equilibrium constants built from the shifted rows refer to 1 atm throughout, so data
    files at 1 bar and at 1 atm can be mixed in one case.
    """
    out = np.array(row, dtype=float)
    shift = float(np.log(P_STANDARD / reference_pressure))
    out[7] -= shift
    out[14] -= shift
    return out


def _row_from_cantera(sp, path):
    thermo = sp.thermo
    model = thermo.input_data.get("model", "")
    c = np.asarray(thermo.coeffs, dtype=float)
    if model == "NASA7":
        return to_standard_pressure(c, thermo.reference_pressure)
    if model == "constant-cp":
        T0, h0, s0, cp0 = c[:4]
        return to_standard_pressure(constant_cp_coefficients(cp0 / _KMOL, h0 / _KMOL, s0 / _KMOL, T0),
                                    thermo.reference_pressure)
    raise ThermoError(f"species {sp.name!r} in {path} uses the thermo model {model!r}; "
                      "tubesim supports NASA7 and constant-cp species. Declare it under "
                      f"[thermo.custom.{sp.name}] or use a NASA7 data file.")


def build_species_data(names, thermo):
    """Collect the thermo data of ``names`` from the case's species file and custom species.

    Parameters
    ----------
    names : sequence of str
        Species of the model, in order.
    thermo : simulator.case.schema.Thermo
        Validated thermo section (``species_path`` already resolved).

    Returns
    -------
    SpeciesData
    """
    custom = {c.name: c for c in thermo.custom}
    in_file = species_in_file(thermo.species_path) if thermo.species_path else {}
    mw, rows, tmin, tmax, elements, sources, has_s, p_ref = [], [], [], [], [], [], [], []
    for name in names:
        if name in custom:
            c = custom[name]
            entropy = c.standard_entropy
            rows.append(constant_cp_coefficients(c.cp, c.enthalpy_of_formation,
                                                 0.0 if np.isnan(entropy) else entropy))
            mw.append(c.molar_mass)
            tmin.append(0.0)
            tmax.append(np.inf)
            elements.append({})
            sources.append("case file: constant cp (no stated range)")
            has_s.append(not np.isnan(entropy))
            p_ref.append(P_STANDARD)
        else:
            sp = in_file[name]
            rows.append(_row_from_cantera(sp, thermo.species_path))
            mw.append(sp.molecular_weight / _KMOL)
            tmin.append(sp.thermo.min_temp)
            tmax.append(sp.thermo.max_temp)
            elements.append(dict(sp.composition))
            model = sp.thermo.input_data.get("model", "")
            sources.append(f"{thermo.species_file} ({model})")
            has_s.append(True)
            p_ref.append(float(sp.thermo.reference_pressure))
    return SpeciesData(
        names=tuple(names), molar_mass=np.array(mw), nasa7=np.array(rows).reshape(len(names), 15),
        t_min=np.array(tmin), t_max=np.array(tmax), elements=tuple(elements),
        sources=tuple(sources), has_entropy=np.array(has_s, dtype=bool),
        species_path=thermo.species_path, reference_pressures=tuple(p_ref),
    )


def cantera_solution(species, thermo, transport=False):
    """An ideal-gas ``cantera.Solution`` holding exactly the model's species.

    Custom species get a pseudo-element whose atomic weight is their molar mass
    and a ``constant-cp`` thermo model, so Cantera reproduces their molar mass,
    heat capacity and enthalpy. Used for independent checks (energy closure) and
    transport properties, never inside the right-hand side.
    """
    import cantera as ct

    custom = {c.name: c for c in thermo.custom}
    file_names = [n for n in species.names if n not in custom]
    lines = ["units: {quantity: mol, energy: J}", "elements:"]
    pseudo = {}
    for i, name in enumerate(n for n in species.names if n in custom):
        symbol = f"Xq{i}"
        pseudo[name] = symbol
        lines += [f"- symbol: {symbol}", f"  atomic-weight: {custom[name].molar_mass * _KMOL!r}"]
    if not pseudo:
        lines[-1] = "elements: []"
    lines.append("species:")
    for name, symbol in pseudo.items():
        c = custom[name]
        s0 = 0.0 if np.isnan(c.standard_entropy) else c.standard_entropy
        lines += [f"- name: {_quote(name)}", f"  composition: {{{symbol}: 1}}",
                  f"  thermo: {{model: constant-cp, T0: 298.15 K, h0: {c.enthalpy_of_formation!r} J/mol, "
                  f"s0: {s0!r} J/mol/K, cp0: {c.cp!r} J/mol/K}}"]
    element_set = sorted({e for el in species.elements for e in el} | set(pseudo.values()))
    entries = []
    if file_names:
        entries.append("{" + _quote(f"{species.species_path}/species") + ": ["
                       + ", ".join(_quote(n) for n in file_names) + "]}")
    if pseudo:
        entries.append("{species: [" + ", ".join(_quote(n) for n in pseudo) + "]}")
    lines += ["phases:", "- name: gas", "  thermo: ideal-gas",
              f"  elements: [{', '.join(element_set)}]",
              f"  species: [{', '.join(entries)}]"]
    if transport:
        lines.append("  transport: mixture-averaged")
    try:
        return ct.Solution(yaml="\n".join(lines) + "\n")
    except ct.CanteraError as err:
        hint = ' (no transport data); give pressure_drop.viscosity, e.g. "2.2e-5 Pa*s"' if transport else ""
        raise ThermoError(f"Cantera could not build the species set: {cantera_message(err)}{hint}") from err


def _quote(text):
    return '"' + text.replace("\\", "\\\\").replace('"', '\\"') + '"'


def viscosity_fits(species, thermo):
    """Cantera's pure-species viscosity fits of the model's species, (n, 5), [-].

    Row i holds a_i0..a_i4 of mu_i = sqrt(T) (sum_c a_ic (ln T)^c)^2 [Pa*s] (Cantera's
    ``get_viscosity_polynomial``, fitted to its kinetic-theory viscosities). The Cantera
    transport object is built once per species set and file (cached).

    Raises ThermoError when a species has no transport data (custom species never do).
    """
    return _transport_fits(species, thermo, "viscosity", 'give pressure_drop.viscosity, e.g. "2.2e-5 Pa*s"')


def conductivity_fits(species, thermo):
    """Cantera's pure-species thermal-conductivity fits of the model's species, (n, 5), [-].

    Row i holds a_i0..a_i4 of k_i = sqrt(T) sum_c a_ic (ln T)^c [W/(m*K)] (Cantera's
    ``get_thermal_conductivity_polynomial``); the mixture rule is in
    :func:`simulator.model.heat_coefficient.gas_conductivity`.

    Raises ThermoError when a species has no transport data (custom species never do).
    """
    return _transport_fits(species, thermo, "thermal_conductivity",
                           'give heat.coefficient.conductivity, e.g. "0.05 W/(m*K)"')


def _transport_fits(species, thermo, quantity, remedy):
    """Rows of Cantera's ``get_<quantity>_polynomial`` for every species, cached per species set."""
    missing = [n for n in species.names if n in {c.name for c in thermo.custom}]
    if missing:
        raise ThermoError(f"no transport data for custom species {', '.join(missing)}; {remedy}")
    key = (species.species_path, tuple(species.names), quantity)
    if key not in _TRANSPORT_FITS:
        import cantera as ct

        gas = _transport_solution(species, thermo)
        fit = getattr(gas, f"get_{quantity}_polynomial")
        try:
            rows = [np.asarray(fit(gas.species_index(n)), dtype=float) for n in species.names]
        except ct.CanteraError as err:
            raise ThermoError(f"{quantity.replace('_', ' ')} from transport data failed: {cantera_message(err)}; "
                              f"{remedy}") from err
        if any(len(r) != 5 for r in rows):
            raise ThermoError(f"Cantera's {quantity.replace('_', ' ')} fits are not of degree 4; {remedy}")
        if len(_TRANSPORT_FITS) > 32:
            _TRANSPORT_FITS.clear()
        _TRANSPORT_FITS[key] = np.array(rows)
    return _TRANSPORT_FITS[key].copy()


_TRANSPORT_FITS = {}
_TRANSPORT = {}
_TRANSPORT_LOCK = threading.Lock()


def _transport_solution(species, thermo):
    """A mixture-averaged transport Solution of the model's species, built once per species set.

    Only for species sets without custom species (those have no transport data), so the key
    (file, names) identifies it.
    """
    key = (species.species_path, tuple(species.names))
    if key not in _TRANSPORT:
        if len(_TRANSPORT) > 32:
            _TRANSPORT.clear()
        _TRANSPORT[key] = cantera_solution(species, thermo, transport=True)
    return _TRANSPORT[key]


def mixture_viscosity(species, thermo, temperature, pressure, mole_fractions):
    """Mixture-averaged viscosity from the species file's transport data, [Pa*s].

    Raises ThermoError when a species has no transport data (custom species never do).
    """
    import cantera as ct

    missing = [n for n in species.names if n in {c.name for c in thermo.custom}]
    if missing:
        raise ThermoError(f"no transport data for custom species {', '.join(missing)}; "
                          'give pressure_drop.viscosity, e.g. "2.2e-5 Pa*s"')
    try:
        with _TRANSPORT_LOCK:          # one shared Cantera object per species set: set and read together
            gas = _transport_solution(species, thermo)
            gas.TPX = temperature, pressure, np.clip(mole_fractions, 0.0, None)
            return float(gas.viscosity)
    except ct.CanteraError as err:
        raise ThermoError(f"viscosity from transport data failed: {cantera_message(err)}; "
                          'give pressure_drop.viscosity, e.g. "2.2e-5 Pa*s"') from err

