"""Case keys of the two-dimensional (radial) tube model: ``[model]`` and the radial ``[bed]`` keys.

``[model] radial = "1d" | "2d"`` (default ``"1d"``) and ``radial_points`` (interior radial
collocation points, 1..8, default 5); ``[bed] radial_conductivity`` (effective radial
conductivity lambda_er of the bed), ``radial_diffusivity`` (effective radial diffusivity D_er,
on the bed's cross-section) and ``wall_coefficient`` (bed-side wall coefficient h_w). The bed
keys may be given with ``radial = "1d"`` too: the ``one_dimensional`` row of ``assumptions``
then runs the 2-D model with them.

The 2-D model (:mod:`simulator.model.radial`) is built for a packed bed, an ideal gas, heat
exchange with a uniform or co-current medium and the typed ``heat.overall_coefficient``
(taken as the part of the resistance outside the bed: 1/U_total = 1/h_w + 1/U). Every other
combination is refused here in one line naming the field.
"""
from dataclasses import dataclass

NAN = float("nan")

#: keys of the ``[model]`` table
MODEL_KEYS = {"radial", "radial_points"}
#: radial keys of the ``[bed]`` table -> (dimension name of :mod:`simulator.units`)
BED_KEYS = {"radial_conductivity": "thermal_conductivity", "radial_diffusivity": "diffusivity",
            "wall_coefficient": "heat_transfer_coefficient"}
RADIAL_CHOICES = ("1d", "2d")
DEFAULT_RADIAL_POINTS = 5
#: most interior radial collocation points (equal to simulator.model.radial.MAX_RADIAL_POINTS; the
#: case layer may not import the model layer, tests/test_radial_run.py checks that they agree)
MAX_RADIAL_POINTS = 8
#: arrangements of the medium the 2-D model integrates (an initial-value problem with the kernel's
#: one wall flux); counter-current (boundary-value) and given wall profiles are not built for it
RADIAL_ARRANGEMENTS = ("uniform", "co-current")


@dataclass(frozen=True)
class RadialSettings:
    """What the case says about the radial model (SI; NaN where a value is not given)."""

    dimension: str = "1d"                 # "1d" or "2d"
    points: int = DEFAULT_RADIAL_POINTS   # interior collocation points [-]
    conductivity: float = NAN             # effective radial conductivity lambda_er [W/(m*K)]
    diffusivity: float = NAN              # effective radial diffusivity D_er [m^2/s]
    wall_coefficient: float = NAN         # bed-side wall coefficient h_w [W/(m^2*K)]

    @property
    def two_dimensional(self):
        return self.dimension == "2d"

    @property
    def given(self):
        """True when all three radial bed parameters are given."""
        return all(v == v for v in (self.conductivity, self.diffusivity, self.wall_coefficient))


def radial_settings(ck, raw):
    """Parse ``[model]`` and the radial ``[bed]`` keys; problems go to the loader's checker ``ck``.

    Parameters
    ----------
    ck : simulator.case.load._Checker
        The loader's problem collector (``table``, ``keys``, ``choice``, ``number``, ``quantity``).
    raw : dict
        The case as written.

    Returns
    -------
    RadialSettings
    """
    m = ck.table(raw, "model", "model", required=False)
    ck.keys(m, MODEL_KEYS, "model")
    dimension = ck.choice(m, "radial", "model", RADIAL_CHOICES, default="1d") or "1d"
    points = DEFAULT_RADIAL_POINTS
    if isinstance(m, dict) and "radial_points" in m:
        value = m["radial_points"]
        if isinstance(value, bool) or not isinstance(value, int) or not 1 <= value <= MAX_RADIAL_POINTS:
            ck.fail("model.radial_points", f" = {value!r}: must be a whole number from 1 to {MAX_RADIAL_POINTS} "
                    "(more points make the radial operator stiff without adding accuracy).")
        else:
            points = value
        if dimension != "2d":
            ck.fail("model.radial_points", f' = {value!r} given but model.radial = "{dimension}" ignores it; '
                    'remove it or write model.radial = "2d".')
    bed = raw.get("bed") if isinstance(raw.get("bed"), dict) else {}
    values = {key: ck.quantity(bed, key, dim, "bed", required=False, minimum=0.0) for key, dim in BED_KEYS.items()}
    settings = RadialSettings(dimension=dimension, points=points, conductivity=values["radial_conductivity"],
                              diffusivity=values["radial_diffusivity"],
                              wall_coefficient=values["wall_coefficient"])
    if dimension == "2d":
        _two_dimensional_problems(ck, raw, bed)
    return settings


def _two_dimensional_problems(ck, raw, bed):
    """Refuse what the 2-D model is not built for, one line per field."""
    if "bed" not in raw:
        ck.fail("model.radial", ' = "2d": needs a packed bed ([bed] table with radial_conductivity, '
                "radial_diffusivity and wall_coefficient); an empty tube is one-dimensional here.")
        return
    for key in BED_KEYS:
        if key not in bed:
            ck.fail(f"bed.{key}", f': missing; model.radial = "2d" needs it (e.g. {_EXAMPLE[key]}).')
    heat = raw.get("heat") if isinstance(raw.get("heat"), dict) else {}
    mode = heat.get("mode")
    if mode != "exchange":
        ck.fail("heat.mode", f' = {mode!r}: model.radial = "2d" needs heat exchange through the wall '
                '(mode = "exchange" with a uniform or co-current medium).')
        return
    medium = heat.get("medium") if isinstance(heat.get("medium"), dict) else {}
    arrangement = medium.get("arrangement", "uniform")
    if arrangement not in RADIAL_ARRANGEMENTS:
        ck.fail("heat.medium.arrangement", f' = {arrangement!r}: the 2-D model (model.radial = "2d") is built for '
                f'{" and ".join(repr(a) for a in RADIAL_ARRANGEMENTS)} media only; a {arrangement} medium with '
                'radial gradients is not built: use model.radial = "1d".')
    if "coefficient" in heat:
        ck.fail("heat.coefficient", ': not used by the 2-D model (model.radial = "2d"), which takes the typed '
                "heat.overall_coefficient as the resistance outside the bed; remove one of them.")
    eos = (raw.get("thermo") or {}).get("equation_of_state", "ideal-gas") if isinstance(raw.get("thermo"), dict) \
        else "ideal-gas"
    if eos != "ideal-gas":
        ck.fail("thermo.equation_of_state", f' = {eos!r}: the 2-D model (model.radial = "2d") is built for an ideal '
                'gas only; use model.radial = "1d".')


_EXAMPLE = {"radial_conductivity": 'radial_conductivity = "0.9 W/(m*K)"',
            "radial_diffusivity": 'radial_diffusivity = "3e-4 m^2/s"',
            "wall_coefficient": 'wall_coefficient = "120 W/(m^2*K)"'}
