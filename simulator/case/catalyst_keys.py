"""``[catalyst]``: the catalyst pellets whose internal diffusion limits the rates (effectiveness factors).

::

    [catalyst]
    shape = "sphere"                          # | "cylinder" | "slab"
    effective_diffusivity = "1e-6 m^2/s"      # of the key reactant in the pellet
    volume_to_surface = "0.5 mm"              # optional V_p/S_p; default from bed.particle_diameter
    pellet_density = "1800 kg/m^3"            # optional; default bed.bulk_density / (1 - bed.void_fraction)
    external_film = false                     # the film around the pellet is not modelled yet

Only rates per catalyst mass (``rate_basis = "catalyst-mass"``) are multiplied by an effectiveness
factor; the pellet model is :mod:`simulator.model.pellet` (closed forms) and the kernel's
``effectiveness`` (a table in the generalized modulus).
"""
from dataclasses import dataclass

NAN = float("nan")
KEYS = {"shape", "effective_diffusivity", "volume_to_surface", "pellet_density", "external_film"}
SHAPES = ("sphere", "cylinder", "slab")
#: V_p/S_p per particle diameter of each shape: sphere d/6; infinite cylinder d/4; slab of thickness d: d/2
LENGTH_PER_DIAMETER = {"sphere": 1.0 / 6.0, "cylinder": 0.25, "slab": 0.5}


@dataclass(frozen=True)
class Catalyst:
    """The pellets of ``[catalyst]`` (SI)."""

    shape: str
    effective_diffusivity: float        # [m^2/s]
    volume_to_surface: float            # [m] V_p/S_p
    length_source: str                  # "given" or how it came from the particle diameter
    pellet_density: float               # [kg/m^3]
    density_source: str                 # "given" or "bulk density / (1 - void fraction)"


def read_catalyst(ck, raw, bed):
    """``[catalyst]`` -> Catalyst, or None when the case has none (problems go to ``ck``)."""
    if "catalyst" not in raw:
        return None
    c = ck.table(raw, "catalyst", "catalyst")
    ck.keys(c, KEYS, "catalyst")
    if bed is None:
        ck.fail("catalyst", ": needs a packed bed ([bed] with particle_diameter, void_fraction, bulk_density).")
        return None
    model = raw.get("model") if isinstance(raw.get("model"), dict) else {}
    if model.get("radial") == "2d":
        ck.fail("catalyst", ': not yet with model.radial = "2d" (the 2-D model does not apply effectiveness '
                "factors); remove one of them.")
    if c.get("external_film", False) is not False:
        ck.fail("catalyst.external_film", f" = {c.get('external_film')!r}: the film around the pellets is not "
                "modelled yet; write external_film = false (the surface state is then the bulk state).")
    shape = ck.choice(c, "shape", "catalyst", SHAPES, default="sphere") or "sphere"
    D_e = ck.quantity(c, "effective_diffusivity", "diffusivity", "catalyst", minimum=0.0)
    if "volume_to_surface" in c:
        length = ck.quantity(c, "volume_to_surface", "length", "catalyst", minimum=0.0)
        length_source = "given"
    else:
        length = bed.particle_diameter * LENGTH_PER_DIAMETER[shape]
        length_source = f"bed.particle_diameter x {LENGTH_PER_DIAMETER[shape]:.4g} ({shape})"
    if "pellet_density" in c:
        rho_p = ck.quantity(c, "pellet_density", "density", "catalyst", minimum=0.0)
        density_source = "given"
    else:
        rho_p = bed.bulk_density / (1.0 - bed.void_fraction)
        density_source = "bed.bulk_density / (1 - bed.void_fraction)"
    return Catalyst(shape=shape, effective_diffusivity=D_e, volume_to_surface=length, length_source=length_source,
                    pellet_density=rho_p, density_source=density_source)
