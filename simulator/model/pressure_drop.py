r"""Pressure gradient in packed beds (Ergun) and empty tubes (Darcy-Weisbach).

Every kernel here is a plain scalar function of SI floats that uses only
:mod:`math` and arithmetic, so the model can compile it with ``numba.njit``
inside a compiled right-hand side. Names and codes are looked up once, at set-up
time, in :data:`FRICTION_CORRELATIONS` / :data:`FRICTION_CODES`; the kernel then
calls :func:`friction_factor_by_code` with an integer.

``numba.njit(friction_factor_by_code)`` alone cannot compile, because numba
cannot call the uncompiled correlations it dispatches to; use
:func:`compile_kernels`, which compiles the correlations first and the
dispatcher over them.

Sign convention: the axial pressure gradient ``dP/dz`` is negative for forward
flow (velocity > 0) and positive for reverse flow.
"""
import difflib
import math
import types

__all__ = [
    "ergun_1952",
    "darcy_weisbach",
    "reynolds",
    "particle_reynolds",
    "modified_particle_reynolds",
    "friction_laminar",
    "blasius_1913",
    "colebrook_1939",
    "churchill_1977",
    "haaland_1983",
    "friction_factor_by_code",
    "out_of_range",
    "compile_kernels",
    "FRICTION_CORRELATIONS",
    "FRICTION_CODES",
    "VALIDITY",
    "REFERENCES",
]

_LN10 = math.log(10.0)


# --------------------------------------------------------------------------- packed bed
def ergun_1952(superficial_velocity, density, viscosity, particle_diameter, void_fraction):
    r"""Pressure gradient in a packed bed from the Ergun equation [1]_.

    Parameters
    ----------
    superficial_velocity : float or ndarray
        Superficial gas velocity, [m/s]
    density : float or ndarray
        Gas density, [kg/m^3]
    viscosity : float or ndarray
        Dynamic viscosity, [Pa*s]
    particle_diameter : float
        Equivalent spherical particle diameter, [m]
    void_fraction : float
        Bed void fraction, [-]

    Returns
    -------
    dP_dz : float or ndarray
        Axial pressure gradient, negative for forward flow, [Pa/m]

    Raises
    ------
    ValueError
        If void_fraction is not strictly between 0 and 1.

    Notes
    -----
    .. math::
        -\frac{dP}{dz} = \frac{150\,\mu (1-\varepsilon)^2 u}{\varepsilon^3 d_p^2}
                       + \frac{1.75\,\rho (1-\varepsilon) u^2}{\varepsilon^3 d_p}

    The inertial term is evaluated as :math:`u|u|`, so reverse flow gives a
    positive gradient.

    Validity: Ergun's own paper is not re-read here. The range
    :math:`1 < Re_p/(1-\varepsilon) < 2300` (see
    :func:`modified_particle_reynolds`) is the one quoted by the ``fluids``
    package from Jones and Krier (1983); it is machine-readable as
    ``VALIDITY["ergun-1952"]``.

    References
    ----------
    .. [1] S. Ergun, "Fluid flow through packed columns," Chem. Eng. Prog.,
       vol. 48, pp. 89-94, 1952.

    Examples
    --------
    >>> ergun_1952(1.0, 1.2, 1.8e-5, 3e-3, 0.4)
    -8250.0
    """
    if not (0.0 < void_fraction < 1.0):
        raise ValueError("ergun_1952: void_fraction must be strictly between 0 and 1")
    solid = 1.0 - void_fraction
    eps3 = void_fraction * void_fraction * void_fraction
    viscous = 150.0 * viscosity * solid * solid / (eps3 * particle_diameter * particle_diameter)
    inertial = 1.75 * density * solid / (eps3 * particle_diameter)
    return -(viscous * superficial_velocity
             + inertial * superficial_velocity * abs(superficial_velocity))


def particle_reynolds(superficial_velocity, density, viscosity, particle_diameter):
    r"""Particle Reynolds number of a packed bed, built on the superficial velocity.

    Parameters
    ----------
    superficial_velocity : float
        Superficial gas velocity, [m/s]
    density : float
        Gas density, [kg/m^3]
    viscosity : float
        Dynamic viscosity, [Pa*s]
    particle_diameter : float
        Equivalent spherical particle diameter, [m]

    Returns
    -------
    Re_p : float
        Particle Reynolds number :math:`\rho u_s d_p / \mu`, [-]

    Notes
    -----
    .. math:: Re_p = \frac{\rho\, u_s\, d_p}{\mu}

    The grouping used by Ergun's correlation is :math:`Re_p/(1-\varepsilon)`,
    see :func:`modified_particle_reynolds`.

    References
    ----------
    .. [1] S. Ergun, "Fluid flow through packed columns," Chem. Eng. Prog.,
       vol. 48, pp. 89-94, 1952.

    Examples
    --------
    >>> particle_reynolds(1.0, 1.2, 1.8e-5, 3e-3)
    200.0
    """
    return density * superficial_velocity * particle_diameter / viscosity


def modified_particle_reynolds(superficial_velocity, density, viscosity, particle_diameter,
                               void_fraction):
    r"""Modified particle Reynolds number :math:`Re_p/(1-\varepsilon)` of Ergun's correlation.

    Parameters
    ----------
    superficial_velocity : float
        Superficial gas velocity, [m/s]
    density : float
        Gas density, [kg/m^3]
    viscosity : float
        Dynamic viscosity, [Pa*s]
    particle_diameter : float
        Equivalent spherical particle diameter, [m]
    void_fraction : float
        Bed void fraction, [-]

    Returns
    -------
    Re_mod : float
        Modified particle Reynolds number, [-]

    Notes
    -----
    .. math:: Re' = \frac{\rho\, u_s\, d_p}{\mu (1-\varepsilon)}

    This is the Reynolds number of ``VALIDITY["ergun-1952"]``.

    References
    ----------
    .. [1] S. Ergun, "Fluid flow through packed columns," Chem. Eng. Prog.,
       vol. 48, pp. 89-94, 1952.

    Examples
    --------
    >>> modified_particle_reynolds(1.0, 1.2, 1.8e-5, 3e-3, 0.4)
    333.333333
    """
    return density * superficial_velocity * particle_diameter / (viscosity * (1.0 - void_fraction))


# --------------------------------------------------------------------------- empty tube
def reynolds(density, velocity, diameter, viscosity):
    r"""Reynolds number of flow in a tube.

    Parameters
    ----------
    density : float
        Fluid density, [kg/m^3]
    velocity : float
        Mean axial velocity, [m/s]
    diameter : float
        Inner tube diameter, [m]
    viscosity : float
        Dynamic viscosity, [Pa*s]

    Returns
    -------
    Re : float
        Reynolds number :math:`\rho u D / \mu`, [-]

    Notes
    -----
    .. math:: Re = \frac{\rho\, u\, D}{\mu}

    References
    ----------
    .. [1] O. Reynolds, "An experimental investigation of the circumstances
       which determine whether the motion of water shall be direct or sinuous,
       and of the law of resistance in parallel channels," Phil. Trans. R. Soc.
       Lond., vol. 174, pp. 935-982, 1883, doi: 10.1098/rstl.1883.0029.

    Examples
    --------
    >>> reynolds(1000.0, 2.0, 0.05, 1e-3)
    100000.0
    """
    return density * velocity * diameter / viscosity


def darcy_weisbach(friction_factor, density, velocity, diameter):
    r"""Axial pressure gradient in an empty tube from the Darcy-Weisbach equation [1]_.

    Parameters
    ----------
    friction_factor : float
        Darcy (Moody) friction factor, four times the Fanning factor, [-]
    density : float
        Fluid density, [kg/m^3]
    velocity : float
        Mean axial velocity, [m/s]
    diameter : float
        Inner tube diameter, [m]

    Returns
    -------
    dP_dz : float
        Axial pressure gradient, negative for forward flow, [Pa/m]

    Notes
    -----
    .. math:: \frac{dP}{dz} = -f_D\,\frac{\rho\, u |u|}{2 D}

    References
    ----------
    .. [1] F. M. White, Fluid Mechanics, 7th ed. New York, NY, USA:
       McGraw-Hill, 2011, ch. 6 (chapter from memory).

    Examples
    --------
    >>> darcy_weisbach(0.02, 1000.0, 2.0, 0.05)
    -800.0
    """
    return -friction_factor * density * velocity * abs(velocity) / (2.0 * diameter)


def friction_laminar(Re):
    r"""Darcy friction factor of fully developed laminar flow, :math:`64/Re` [1]_.

    Parameters
    ----------
    Re : float
        Reynolds number, [-]

    Returns
    -------
    f : float
        Darcy friction factor, [-]

    Raises
    ------
    ValueError
        If Re is not > 0.

    Notes
    -----
    Hagen-Poiseuille flow. Validity: laminar flow; the upper limit
    Re = 2300 in ``VALIDITY["laminar"]`` is common practice, no source.

    References
    ----------
    .. [1] F. M. White, Fluid Mechanics, 7th ed. New York, NY, USA:
       McGraw-Hill, 2011, ch. 6 (chapter from memory).

    Examples
    --------
    >>> friction_laminar(1000.0)
    0.064
    """
    if not Re > 0.0:
        raise ValueError("friction_laminar: Re must be > 0")
    return 64.0 / Re


def blasius_1913(Re):
    r"""Darcy friction factor of a smooth tube from Blasius [1]_.

    Parameters
    ----------
    Re : float
        Reynolds number, [-]

    Returns
    -------
    f : float
        Darcy friction factor, [-]

    Raises
    ------
    ValueError
        If Re is not > 0.

    Notes
    -----
    .. math:: f = 0.3164\, Re^{-1/4}

    Validity: hydraulically smooth tubes, 4e3 <= Re <= 1e5 (the range commonly
    quoted; the ``fluids`` package quotes 3e3 < Re < 2e5; the original was not
    re-read). Wall roughness is ignored.

    References
    ----------
    .. [1] H. Blasius, "Das Aehnlichkeitsgesetz bei Reibungsvorgaengen in
       Fluessigkeiten," Mitt. Forschungsarb. Geb. Ingenieurwes., vol. 131,
       pp. 1-41, 1913, doi: 10.1007/978-3-662-02239-9_1.

    Examples
    --------
    >>> blasius_1913(1e4)
    0.03164
    """
    if not Re > 0.0:
        raise ValueError("blasius_1913: Re must be > 0")
    return 0.3164 / math.sqrt(math.sqrt(Re))


def colebrook_1939(Re, relative_roughness):
    r"""Darcy friction factor from the Colebrook equation [1]_, solved to machine precision.

    Parameters
    ----------
    Re : float
        Reynolds number, [-]
    relative_roughness : float
        Wall roughness divided by the inner diameter, e/D, [-]

    Returns
    -------
    f : float
        Darcy friction factor, [-]

    Raises
    ------
    ValueError
        If Re is not > 0 or relative_roughness is not >= 0.

    Notes
    -----
    .. math::
        \frac{1}{\sqrt{f}} = -2\log_{10}\left(\frac{e/D}{3.7}
                            + \frac{2.51}{Re\sqrt{f}}\right)

    Solved for :math:`x = 1/\sqrt{f}` by Newton's method on
    :math:`g(x) = x + 2\log_{10}(a + b x)`, starting from Haaland's explicit
    form [2]_. :math:`g` is increasing and concave, so after the first step
    the iterates rise monotonically to the root; the loop stops when the step
    is below 1e-15 relative (at most four steps for Re >= 4e3).

    Validity: turbulent flow; ``VALIDITY["colebrook-1939"]`` holds
    Re >= 4e3 and e/D <= 0.05, the range of the usual Moody chart (common
    practice, no source).

    References
    ----------
    .. [1] C. F. Colebrook, "Turbulent flow in pipes, with particular reference
       to the transition region between the smooth and rough pipe laws,"
       J. Inst. Civ. Eng., vol. 11, no. 4, pp. 133-156, 1939,
       doi: 10.1680/ijoti.1939.13150.
    .. [2] S. E. Haaland, "Simple and explicit formulas for the friction factor
       in turbulent pipe flow," J. Fluids Eng., vol. 105, no. 1, pp. 89-90,
       1983, doi: 10.1115/1.3240948.

    Examples
    --------
    >>> colebrook_1939(1e5, 1e-4)
    0.0185138661
    """
    if not Re > 0.0:
        raise ValueError("colebrook_1939: Re must be > 0")
    if not relative_roughness >= 0.0:
        raise ValueError("colebrook_1939: relative_roughness must be >= 0")
    a = relative_roughness / 3.7
    b = 2.51 / Re
    # explicit start (Haaland 1983); fall back to a point left of the root
    x = -1.8 * math.log10(a ** 1.11 + 6.9 / Re)
    if not x > 0.0:
        x = 1e-3
    for _ in range(100):
        s = a + b * x
        g = x + 2.0 * math.log10(s)
        dg = 1.0 + 2.0 * b / (_LN10 * s)
        step = g / dg
        x_new = x - step
        if not x_new > 0.0:
            x_new = 0.5 * x
        if abs(x_new - x) <= 1e-15 * x_new:
            x = x_new
            break
        x = x_new
    return 1.0 / (x * x)


def churchill_1977(Re, relative_roughness):
    r"""Darcy friction factor for all flow regimes from Churchill's equation [1]_.

    Parameters
    ----------
    Re : float
        Reynolds number, [-]
    relative_roughness : float
        Wall roughness divided by the inner diameter, e/D, [-]

    Returns
    -------
    f : float
        Darcy friction factor, [-]

    Raises
    ------
    ValueError
        If Re is not > 0 or relative_roughness is not >= 0.

    Notes
    -----
    .. math::
        f = 8\left[\left(\frac{8}{Re}\right)^{12} + (A+B)^{-3/2}\right]^{1/12},\quad
        A = \left[2.457\ln\frac{1}{(7/Re)^{0.9} + 0.27\,e/D}\right]^{16},\quad
        B = \left(\frac{37530}{Re}\right)^{16}

    Explicit and continuous through laminar, transition and turbulent flow.
    Validity: the source states no range (as quoted by the ``fluids``
    package); ``VALIDITY["churchill-1977"]`` caps e/D at 0.05 (common practice,
    no source). Measured against :func:`colebrook_1939` for Re >= 1e4 and
    e/D <= 0.05 it differs by up to 2.2 % (largest near Re = 1e4,
    e/D = 0.01) and by up to 1.5 % for Re >= 5e4.

    References
    ----------
    .. [1] S. W. Churchill, "Friction-factor equation spans all fluid-flow
       regimes," Chem. Eng., vol. 84, no. 24, pp. 91-92, 1977 (journal details
       from memory).

    Examples
    --------
    >>> churchill_1977(1e5, 1e-4)
    0.018462624566
    """
    if not Re > 0.0:
        raise ValueError("churchill_1977: Re must be > 0")
    if not relative_roughness >= 0.0:
        raise ValueError("churchill_1977: relative_roughness must be >= 0")
    A = (2.457 * math.log(1.0 / ((7.0 / Re) ** 0.9 + 0.27 * relative_roughness))) ** 16.0
    B = (37530.0 / Re) ** 16.0
    return 8.0 * ((8.0 / Re) ** 12.0 + (A + B) ** -1.5) ** (1.0 / 12.0)


def haaland_1983(Re, relative_roughness):
    r"""Darcy friction factor of turbulent flow from Haaland's explicit formula [1]_.

    Parameters
    ----------
    Re : float
        Reynolds number, [-]
    relative_roughness : float
        Wall roughness divided by the inner diameter, e/D, [-]

    Returns
    -------
    f : float
        Darcy friction factor, [-]

    Raises
    ------
    ValueError
        If Re is not > 0 or relative_roughness is not >= 0.

    Notes
    -----
    .. math::
        \frac{1}{\sqrt{f}} = -1.8\log_{10}\left[\left(\frac{e/D}{3.7}\right)^{1.11}
                            + \frac{6.9}{Re}\right]

    Validity: 4e3 <= Re <= 1e8 and 1e-6 <= e/D <= 0.05 (as quoted by the
    ``fluids`` package; the original was not re-read). Within that range it
    is within 1.5 % of :func:`colebrook_1939` (measured here).

    References
    ----------
    .. [1] S. E. Haaland, "Simple and explicit formulas for the friction factor
       in turbulent pipe flow," J. Fluids Eng., vol. 105, no. 1, pp. 89-90,
       1983, doi: 10.1115/1.3240948.

    Examples
    --------
    >>> haaland_1983(1e5, 1e-4)
    0.018265053
    """
    if not Re > 0.0:
        raise ValueError("haaland_1983: Re must be > 0")
    if not relative_roughness >= 0.0:
        raise ValueError("haaland_1983: relative_roughness must be >= 0")
    x = -1.8 * math.log10((relative_roughness / 3.7) ** 1.11 + 6.9 / Re)
    return 1.0 / (x * x)


# --------------------------------------------------------------------------- registries
#: Friction-factor correlations by case-file name. ``friction_laminar`` and
#: ``blasius_1913`` take ``Re`` only; the others take ``(Re, relative_roughness)``.
#: For one call shape use ``friction_factor_by_code(FRICTION_CODES[name], Re, e_D)``.
FRICTION_CORRELATIONS = {
    "churchill-1977": churchill_1977,
    "colebrook-1939": colebrook_1939,
    "blasius-1913": blasius_1913,
    "laminar": friction_laminar,
    "haaland-1983": haaland_1983,
}

#: Integer code of each friction correlation, for compiled kernels.
FRICTION_CODES = {
    "churchill-1977": 0,
    "colebrook-1939": 1,
    "blasius-1913": 2,
    "laminar": 3,
    "haaland-1983": 4,
}

_INF = math.inf

#: Stated range of each correlation. ``Re`` and ``relative_roughness`` are closed
#: intervals ``(low, high)``; ``Re_definition`` says which Reynolds number is meant;
#: ``relative_roughness`` is None where roughness does not enter; ``source`` says
#: where the range comes from.
VALIDITY = {
    "churchill-1977": {
        "Re": (0.0, _INF),
        "relative_roughness": (0.0, 0.05),
        "Re_definition": "tube Reynolds number rho*u*D/mu",
        "source": "no range stated by the source; e/D <= 0.05 is common practice, no source",
    },
    "colebrook-1939": {
        "Re": (4.0e3, _INF),
        "relative_roughness": (0.0, 0.05),
        "Re_definition": "tube Reynolds number rho*u*D/mu",
        "source": "turbulent flow; Re >= 4e3 and e/D <= 0.05 (Moody chart) are common practice, no source",
    },
    "blasius-1913": {
        "Re": (4.0e3, 1.0e5),
        "relative_roughness": (0.0, 0.0),
        "Re_definition": "tube Reynolds number rho*u*D/mu",
        "source": "smooth tubes, 4e3 <= Re <= 1e5 as commonly quoted (original not re-read)",
    },
    "laminar": {
        "Re": (0.0, 2300.0),
        "relative_roughness": None,
        "Re_definition": "tube Reynolds number rho*u*D/mu",
        "source": "laminar flow; Re <= 2300 is common practice, no source",
    },
    "haaland-1983": {
        "Re": (4.0e3, 1.0e8),
        "relative_roughness": (1.0e-6, 0.05),
        "Re_definition": "tube Reynolds number rho*u*D/mu",
        "source": "range as quoted by the fluids package (original not re-read)",
    },
    "ergun-1952": {
        "Re": (1.0, 2300.0),
        "relative_roughness": None,
        "Re_definition": "modified particle Reynolds number rho*u_s*d_p/(mu*(1-void_fraction))",
        "source": "Jones and Krier (1983) as quoted by the fluids package (Ergun 1952 not re-read)",
    },
}

#: Source keys (tests/sources.toml, simulator.references) of each correlation.
REFERENCES = {
    "ergun-1952": ("ergun1952",),
    "churchill-1977": ("churchill1977",),
    "colebrook-1939": ("colebrook1939",),
    "blasius-1913": ("blasius1913",),
    "laminar": ("white2011",),
    "haaland-1983": ("haaland1983",),
}


def friction_factor_by_code(code, Re, relative_roughness):
    r"""Darcy friction factor from the correlation with integer ``code`` (compiled-kernel dispatch).

    Parameters
    ----------
    code : int
        Value of :data:`FRICTION_CODES` for the wanted correlation, [-]
    Re : float
        Reynolds number, [-]
    relative_roughness : float
        Wall roughness divided by the inner diameter, e/D; ignored by
        ``laminar`` and ``blasius-1913``, [-]

    Returns
    -------
    f : float
        Darcy friction factor, [-]

    Raises
    ------
    ValueError
        If code is not a value of FRICTION_CODES.

    Notes
    -----
    Integer branches so that numba can compile it; see :func:`compile_kernels`.

    References
    ----------
    .. [1] S. W. Churchill, "Friction-factor equation spans all fluid-flow
       regimes," Chem. Eng., vol. 84, no. 24, pp. 91-92, 1977.
    .. [2] C. F. Colebrook, "Turbulent flow in pipes, with particular reference
       to the transition region between the smooth and rough pipe laws,"
       J. Inst. Civ. Eng., vol. 11, no. 4, pp. 133-156, 1939,
       doi: 10.1680/ijoti.1939.13150.

    Examples
    --------
    >>> friction_factor_by_code(FRICTION_CODES["colebrook-1939"], 1e5, 1e-4)
    0.0185138661
    """
    if code == 0:
        return churchill_1977(Re, relative_roughness)
    if code == 1:
        return colebrook_1939(Re, relative_roughness)
    if code == 2:
        return blasius_1913(Re)
    if code == 3:
        return friction_laminar(Re)
    if code == 4:
        return haaland_1983(Re, relative_roughness)
    raise ValueError("friction_factor_by_code: unknown code; use a value of FRICTION_CODES")


_LEAF_KERNELS = {
    "ergun_1952": ergun_1952,
    "darcy_weisbach": darcy_weisbach,
    "reynolds": reynolds,
    "particle_reynolds": particle_reynolds,
    "modified_particle_reynolds": modified_particle_reynolds,
    "friction_laminar": friction_laminar,
    "blasius_1913": blasius_1913,
    "colebrook_1939": colebrook_1939,
    "churchill_1977": churchill_1977,
    "haaland_1983": haaland_1983,
}


def compile_kernels(jit):
    r"""Compile every kernel of this module with ``jit``, the dispatcher over the compiled ones.

    Parameters
    ----------
    jit : callable
        Compiler applied to each plain function, e.g. ``numba.njit``.

    Returns
    -------
    kernels : dict
        Function name -> compiled function, for every scalar kernel of this
        module and ``"friction_factor_by_code"``.

    Notes
    -----
    :func:`friction_factor_by_code` calls other module functions, which numba
    cannot do with plain Python functions. Here the dispatcher's code object
    is re-bound to a namespace in which those names are the compiled versions,
    then compiled; its body stays the single source.

    Examples
    --------
    >>> kernels = compile_kernels(lambda func: func)   # identity: no compilation
    >>> kernels["friction_factor_by_code"](FRICTION_CODES["laminar"], 1000.0, 0.0)
    0.064
    """
    compiled = {name: jit(func) for name, func in _LEAF_KERNELS.items()}
    namespace = dict(friction_factor_by_code.__globals__)
    namespace.update(compiled)
    rebound = types.FunctionType(
        friction_factor_by_code.__code__, namespace, "friction_factor_by_code"
    )
    rebound.__doc__ = friction_factor_by_code.__doc__
    compiled["friction_factor_by_code"] = jit(rebound)
    return compiled


def out_of_range(name, Re, relative_roughness):
    r"""Warning text if a correlation is used outside its stated range, else None.

    Parameters
    ----------
    name : str
        Key of :data:`VALIDITY`, e.g. ``"colebrook-1939"`` or ``"ergun-1952"``.
    Re : float
        Reynolds number of the kind given by ``VALIDITY[name]["Re_definition"]``, [-]
    relative_roughness : float
        Wall roughness divided by the inner diameter, e/D; not checked where
        roughness does not enter, [-]

    Returns
    -------
    message : str or None
        One line naming the correlation, the value and the stated range, or
        None when the state is inside the range.

    Raises
    ------
    ValueError
        If name is not a key of VALIDITY.

    Notes
    -----
    The caller decides whether to warn, raise or ignore
    (``on_out_of_range``); this function only compares numbers. NaN is
    reported as out of range.

    Examples
    --------
    >>> out_of_range("colebrook-1939", 1e5, 1e-4) is None
    True
    >>> print(out_of_range("blasius-1913", 2e5, 0.0))
    blasius-1913: Re = 2e+05 is outside the stated range 4000 to 100000 (smooth tubes, 4e3 <= Re <= 1e5 as commonly quoted (original not re-read)).
    """
    if name not in VALIDITY:
        near = difflib.get_close_matches(str(name), list(VALIDITY), n=2)
        hint = f" Did you mean {', '.join(repr(n) for n in near)}?" if near else ""
        raise ValueError(
            f"friction correlation = {name!r}: unknown; choose one of: "
            f"{', '.join(sorted(VALIDITY))}.{hint}"
        )
    entry = VALIDITY[name]
    problems = []
    low, high = entry["Re"]
    if not low <= Re <= high:
        problems.append(f"Re = {Re:.4g} is outside the stated range {low:g} to {high:g}")
    rough = entry["relative_roughness"]
    if rough is not None:
        low, high = rough
        if not low <= relative_roughness <= high:
            problems.append(
                f"relative roughness e/D = {relative_roughness:.4g} is outside the stated range "
                f"{low:g} to {high:g}"
            )
    if not problems:
        return None
    return f"{name}: {'; '.join(problems)} ({entry['source']})."
