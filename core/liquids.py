"""Liquids and their densities.

A :class:`Liquid` is a name, a mass density [kg/m3] and plain words saying
where the density comes from. Build one with:

- :func:`fresh_water`: IAPWS-95 at one atmosphere, 0 to 100 C;
- :func:`seawater`: TEOS-10 at the sea surface;
- :func:`listed_liquid`: a short list of liquids commonly stored in tanks;
- :func:`custom_liquid` / :func:`liquid_from_specific_gravity`: a value the
  user gives.

:func:`liquid_from_spec` and :func:`liquid_to_spec` read and write the
``fluid`` object of a section file (the shared spec's ``section-format.md``,
version 1).

References
----------
IAPWS R6-95 (2018), Revised Release on the IAPWS Formulation 1995 for the
Thermodynamic Properties of Ordinary Water Substance for General and
Scientific Use (via the ``iapws`` package).
IOC, SCOR and IAPSO (2010), The international thermodynamic equation of
seawater - 2010 (TEOS-10), Manuals and Guides No. 56 (via the ``gsw``
package).
"""

from __future__ import annotations

import functools
import math
import numbers
import re
from dataclasses import dataclass
from types import MappingProxyType
from typing import Any

from . import limits
from .number_input import range_text, shown

__all__ = [
    "LiquidError",
    "Liquid",
    "WATER_REFERENCE_DENSITY",
    "FRESH_WATER",
    "SEAWATER",
    "PRESETS",
    "ATMOSPHERE",
    "fresh_water",
    "seawater",
    "LISTED_LIQUIDS",
    "listed_liquid",
    "custom_liquid",
    "liquid_from_specific_gravity",
    "liquid_from_spec",
    "liquid_to_spec",
]

WATER_REFERENCE_DENSITY = 999.975
"""Reference density for specific gravity [kg/m3]: pure, air-free water at
its density maximum (about 4 C) and one atmosphere, IAPWS-95 rounded to
0.001 kg/m3. Note that some tables quote specific gravity against water at
15.6 C (60 F, 999.0 kg/m3) or against 1000 kg/m3; convert such values first."""

FRESH_WATER = "fresh water"
SEAWATER = "seawater"
PRESETS = (FRESH_WATER, SEAWATER)
"""Preset names a section file (version 1) may give in ``fluid.preset``."""

ATMOSPHERE = 101325.0
"""Standard atmosphere [Pa] (exact, by definition)."""

_SEAWATER_MAX_SALINITY = 120.0  # [g/kg]
_SEAWATER_MAX_TEMPERATURE = 40.0  # [deg C]


class LiquidError(ValueError):
    """An impossible or unknown liquid; the one-line message says what is wrong."""


def _number(value: object, what: str) -> float:
    """`value` as a finite float, or a :class:`LiquidError` naming `what`."""
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        raise LiquidError(f"{what} must be a number, not {type(value).__name__}")
    number = _float(value)
    if not math.isfinite(number):
        raise LiquidError(f"{what} must be a finite number, not {number}")
    return number


def _float(value: numbers.Real) -> float:
    """``float(value)``; an integer too large for a float is an infinity."""
    try:
        return float(value)
    except OverflowError:  # an integer beyond the largest float
        return -math.inf if value < 0 else math.inf


def _positive(value: object, what: str) -> float:
    number = _number(value, what)
    if number <= 0.0:
        raise LiquidError(f"{what} must be positive, not {number:g}")
    return number


def _density(value: object) -> float:
    """A density [kg/m3] in :data:`wetline.core.limits.DENSITY_RANGE`."""
    density = _positive(value, "density")
    lo, hi = limits.DENSITY_RANGE
    if not lo <= density <= hi:
        raise LiquidError(f"density must be {range_text(lo, hi, 'kg/m3')}, "
                          f"not {density:g} kg/m3")
    return density


@dataclass(frozen=True)
class Liquid:
    """A liquid and its density.

    Attributes
    ----------
    name : str
        Plain name shown to the user.
    density : float
        Mass density [kg/m3], finite and positive.
    source : str
        Where the density comes from, in plain words.
    preset : str or None
        ``"fresh water"`` or ``"seawater"`` for a computed preset, the key in
        :data:`LISTED_LIQUIDS` for a listed liquid, ``None`` for a density the
        user gave.
    temperature : float or None
        Temperature the density holds at [deg C], when known.
    salinity : float or None
        Absolute salinity [g/kg] (seawater only).

    Examples
    --------
    >>> round(Liquid("brine", 1200.0, "given").specific_gravity, 4)
    1.2
    """

    name: str
    density: float
    source: str
    preset: str | None = None
    temperature: float | None = None
    salinity: float | None = None

    def __post_init__(self) -> None:
        if not isinstance(self.name, str):
            raise LiquidError(f"liquid name must be text, not {type(self.name).__name__}")
        object.__setattr__(self, "density", _density(self.density))
        for field in ("temperature", "salinity"):
            value = getattr(self, field)
            if value is not None:
                object.__setattr__(self, field, _number(value, field))

    @property
    def specific_gravity(self) -> float:
        """Density relative to :data:`WATER_REFERENCE_DENSITY` [-].

        SG = rho / 999.975 kg/m3 (pure water at its density maximum, about
        4 C, one atmosphere).
        """
        return self.density / WATER_REFERENCE_DENSITY


# --- fresh water ---------------------------------------------------------


@functools.lru_cache(maxsize=1)
def _boiling_point() -> float:
    """Boiling point of pure water at one atmosphere [deg C], IAPWS-95."""
    import iapws  # type: ignore[import-untyped]

    return float(iapws.IAPWS95(P=ATMOSPHERE / 1e6, x=0).T) - 273.15


@functools.lru_cache(maxsize=512)
def _fresh_water_state(temperature: float) -> tuple[float, bool]:
    """IAPWS-95 density [kg/m3] at `temperature` [deg C] and 1 atm, and
    whether it is the saturated liquid's (see :func:`iapws95_state`).

    Temperatures on the 0.1 C grid from 0 to 100 C are looked up in
    :mod:`wetline.core.fresh_water_table`, which holds exactly what
    :func:`iapws95_state` gives there (importing ``iapws`` costs about 0.3 s
    of scipy); any other temperature is computed.
    """
    tenths = round(temperature * 10.0)
    if 0 <= tenths <= 1000 and tenths / 10 == temperature:
        from .fresh_water_table import DENSITIES, FIRST_SATURATED

        return DENSITIES[tenths], tenths >= FIRST_SATURATED
    return iapws95_state(temperature)


def iapws95_state(temperature: float) -> tuple[float, bool]:
    """IAPWS-95 density [kg/m3] at `temperature` [deg C] and one atmosphere,
    computed by ``iapws`` (no table).

    Returns ``(density, saturated)``; `saturated` is true when one atmosphere
    is below the saturation pressure and the saturated liquid is used.

    References
    ----------
    IAPWS R6-95 (2018), via ``iapws.IAPWS95``.
    """
    import iapws

    kelvin = temperature + 273.15
    state = iapws.IAPWS95(T=kelvin, P=ATMOSPHERE / 1e6)
    saturated = state.phase != "Liquid"
    if saturated:
        # Between the boiling point (99.974 C) and 100 C one atmosphere is just
        # below the vapour pressure: IAPWS-95 returns steam. The liquid there is
        # the saturated liquid, at its vapour pressure (at most 101.42 kPa).
        state = iapws.IAPWS95(T=kelvin, x=0)
    density = float(state.rho)
    if not (state.status and math.isfinite(density) and density > 0.0):
        raise LiquidError(f"IAPWS-95 gave no liquid density at {temperature:g} C")
    return density, saturated


def fresh_water(temperature: float = 20.0) -> Liquid:
    """Pure water at one atmosphere, by the IAPWS-95 formulation.

    Parameters
    ----------
    temperature : float
        Water temperature [deg C], 0 to 100.

    Returns
    -------
    Liquid
        ``name="fresh water"``, ``preset="fresh water"``, density [kg/m3].

    Raises
    ------
    LiquidError
        Below 0 C (the water freezes), above 100 C (it boils), or not a
        finite number.

    Notes
    -----
    rho = IAPWS95(T, p = 101.325 kPa).rho. Above the boiling point at one
    atmosphere (99.974 C) up to 100 C the saturated liquid ``IAPWS95(T, x=0)``
    is used; above 100 C no liquid density is returned. Air-free pure water;
    dissolved air changes the density by a few parts per million (from
    memory). Results are
    cached: one IAPWS-95 evaluation takes milliseconds.

    References
    ----------
    IAPWS R6-95 (2018), via ``iapws.IAPWS95``.

    Examples
    --------
    >>> round(fresh_water(20).density, 3)
    998.207
    """
    t = _number(temperature, "fresh water temperature")
    if t < 0.0:
        raise LiquidError(
            f"fresh water is not liquid at {t:g} C and one atmosphere (it freezes at 0 C)"
        )
    if t > 100.0:
        raise LiquidError(
            f"fresh water is not liquid at {t:g} C and one atmosphere "
            f"(it boils at {_boiling_point():.2f} C)"
        )
    t = t + 0.0  # -0.0 -> 0.0, so both share a cache entry and an equal Liquid
    density, saturated = _fresh_water_state(t)
    where = "saturated liquid" if saturated else "one atmosphere"
    return Liquid(
        name=FRESH_WATER,
        density=density,
        source=f"IAPWS-95, pure water at {t:g} C, {where}",
        preset=FRESH_WATER,
        temperature=t,
    )


# --- seawater ------------------------------------------------------------


def seawater(temperature: float = 10.0, salinity: float = 35.0) -> Liquid:
    """Seawater at the sea surface, by TEOS-10.

    Parameters
    ----------
    temperature : float
        In-situ temperature [deg C], from the freezing point to 40 C.
    salinity : float
        Absolute salinity SA [g/kg], 0 to 120. Open-ocean water is about 35.

    Returns
    -------
    Liquid
        ``name="seawater"``, ``preset="seawater"``, density [kg/m3].

    Raises
    ------
    LiquidError
        Salinity outside 0..120 g/kg, temperature above 40 C or below the
        freezing point of the water, or a value that is not a finite number.

    Notes
    -----
    rho = gsw.rho_t_exact(SA, t, p = 0 dbar), the full TEOS-10 Gibbs function
    at sea pressure 0 (absolute pressure 101.325 kPa). The pressure a tank
    adds raises the density by about 4.5e-6 of its value per metre of depth
    (compressibility about 4.5e-10 1/Pa, from memory); it is left out.

    Range: IAPWS-08 / TEOS-10 hold in the "oceanographic standard range"
    SA 0..42 g/kg, t from freezing to 40 C (TEOS-10 Manual, IOC et al. 2010,
    sec. 2; from memory). At the surface the Gibbs function is fitted further,
    to 120 g/kg (Feistel 2008, "A Gibbs function for seawater thermodynamics
    for -6 to 80 C and salinity up to 120 g/kg", Deep-Sea Res. I 55, cited in
    the ``gsw.gibbs`` docstring). Wetline accepts SA 0..120 g/kg and keeps the
    40 C limit of the standard range. The freezing point is
    ``gsw.t_freezing(SA, 0, 1)`` (air-saturated water, common practice for
    water open to the air), compared at the 0.01 C the message shows.

    Examples
    --------
    >>> round(seawater(10, 35).density, 3)
    1026.826
    """
    import gsw  # type: ignore[import-untyped]

    t = _number(temperature, "seawater temperature")
    sa = _number(salinity, "seawater salinity")
    if not 0.0 <= sa <= _SEAWATER_MAX_SALINITY:
        raise LiquidError(
            f"seawater salinity must be 0 to {_SEAWATER_MAX_SALINITY:g} g/kg "
            f"(TEOS-10 range), not {sa:g} g/kg"
        )
    if t > _SEAWATER_MAX_TEMPERATURE:
        raise LiquidError(
            f"seawater density is computed up to {_SEAWATER_MAX_TEMPERATURE:g} C "
            f"(TEOS-10 range), not {t:g} C"
        )
    freezing = round(float(gsw.t_freezing(sa, 0.0, 1.0)), 2) + 0.0
    if t < freezing:
        raise LiquidError(
            f"seawater with {sa:g} g/kg salt is not liquid at {t:g} C "
            f"(it freezes at {freezing:.2f} C)"
        )
    t, sa = t + 0.0, sa + 0.0
    density = float(gsw.rho_t_exact(sa, t, 0.0))
    return Liquid(
        name=SEAWATER,
        density=density,
        source=f"TEOS-10, seawater at {t:g} C and {sa:g} g/kg absolute salinity, sea surface",
        preset=SEAWATER,
        temperature=t,
        salinity=sa,
    )


# --- listed liquids ------------------------------------------------------


def _listed(key: str, density: float, temperature: float, source: str) -> Liquid:
    return Liquid(name=key, density=density, source=source, preset=key,
                  temperature=temperature)


_CHECK_SUPPLIER = "check the supplier's data sheet"

LISTED_LIQUIDS = MappingProxyType({
    str(liquid.preset): liquid
    for liquid in (
        _listed("diesel fuel", 835.0, 15.0,
                "typical value inside the EN 590 limits of 820-845 kg/m3 at 15 C "
                "(from memory)"),
        _listed("petrol", 745.0, 15.0,
                "typical value inside the EN 228 limits of 720-775 kg/m3 at 15 C "
                "(from memory)"),
        _listed("kerosene", 800.0, 15.0,
                "typical value for kerosene and jet fuel, about 775-840 kg/m3 at "
                "15 C (from memory)"),
        _listed("ethanol", 789.3, 20.0,
                "CRC Handbook of Chemistry and Physics, 0.7893 g/cm3 at 20 C "
                "(from memory)"),
        _listed("methanol", 791.4, 20.0,
                "CRC Handbook of Chemistry and Physics, 0.7914 g/cm3 at 20 C "
                "(from memory)"),
        _listed("ethylene glycol", 1113.5, 20.0,
                "CRC Handbook of Chemistry and Physics, 1.1135 g/cm3 at 20 C "
                "(from memory)"),
        _listed("sulfuric acid 98 %", 1836.1, 20.0,
                "98 % by mass; CRC Handbook of Chemistry and Physics, "
                "concentrative properties of aqueous solutions, 1.8361 g/cm3 "
                "at 20 C (from memory)"),
        _listed("hydrochloric acid 32 %", 1159.3, 20.0,
                "32 % by mass; CRC Handbook of Chemistry and Physics, "
                "concentrative properties of aqueous solutions, 1.1593 g/cm3 "
                "at 20 C (from memory)"),
        _listed("sodium hydroxide 50 %", 1525.3, 20.0,
                "50 % by mass; CRC Handbook of Chemistry and Physics, "
                "concentrative properties of aqueous solutions, 1.5253 g/cm3 "
                "at 20 C (from memory)"),
        _listed("sodium hypochlorite 12.5 %", 1200.0, 20.0,
                "trade strength, 12.5 % available chlorine; typical supplier "
                f"value, specific gravity about 1.2 (from memory; {_CHECK_SUPPLIER})"),
        _listed("ferric chloride 40 %", 1420.0, 20.0,
                "40 % by mass; typical supplier value, specific gravity about "
                f"1.42 (from memory; {_CHECK_SUPPLIER})"),
        _listed("milk", 1030.0, 20.0,
                "whole cow's milk, usually 1028-1034 kg/m3 at 20 C "
                "(from memory)"),
        _listed("raw sewage", 1010.0, 15.0,
                "typical value for raw municipal sewage with its grit and solids, about "
                "1000-1020 kg/m3; the water itself governs (from memory)"),
        _listed("activated sludge", 1005.0, 15.0,
                "mixed liquor and return activated sludge at about 0.3-1 % solids, "
                "specific gravity about 1.002-1.005 (from memory)"),
        _listed("primary sludge", 1020.0, 15.0,
                "primary (settled) sludge at about 3-6 % solids, specific gravity about "
                "1.02 (from memory; wastewater engineering handbooks quote 1.02)"),
        _listed("fats, oils and grease", 900.0, 20.0,
                "animal and vegetable fats, oils and grease floating on drain water, about "
                "860-930 kg/m3 at 20 C (from memory)"),
        _listed("light fuel oil", 845.0, 15.0,
                "light heating oil, typical value under the DIN 51603-1 limit of 860 kg/m3 "
                "at 15 C (from memory)"),
    )
})
"""Common stored liquids by plain lower-case name, each a :class:`Liquid`
whose ``source`` says where its density comes from. These are typical
values: a real product's data sheet overrides them."""

_ALIASES = MappingProxyType({
    "gasoline": "petrol",
    "jet fuel": "kerosene",
    "caustic soda 50 %": "sodium hydroxide 50 %",
    "diesel": "diesel fuel",
    "sewage": "raw sewage",
    "grease": "fats, oils and grease",
    "fog": "fats, oils and grease",
    "heating oil": "light fuel oil",
})


def _normalise_name(name: str) -> str:
    name = " ".join(name.lower().split())
    return re.sub(r"\s*%", " %", name)


def listed_liquid(name: str) -> Liquid:
    """A liquid from :data:`LISTED_LIQUIDS`, by name.

    Parameters
    ----------
    name : str
        Key of :data:`LISTED_LIQUIDS`, any case and spacing (``"Diesel
        fuel"``, ``"sulfuric acid 98%"``); ``"gasoline"``, ``"jet fuel"`` and
        ``"caustic soda 50 %"`` are accepted too.

    Returns
    -------
    Liquid

    Raises
    ------
    LiquidError
        For a name not in the list; the message lists the known names.

    Examples
    --------
    >>> listed_liquid("Diesel Fuel").density
    835.0
    """
    if not isinstance(name, str):
        raise LiquidError(f"liquid name must be text, not {type(name).__name__}")
    key = _normalise_name(name)
    key = _ALIASES.get(key, key)
    try:
        return LISTED_LIQUIDS[key]
    except KeyError:
        known = ", ".join(LISTED_LIQUIDS)
        raise LiquidError(f"unknown liquid {name!r} (known: {known})") from None


# --- given densities -----------------------------------------------------


def custom_liquid(density: float, name: str = "custom liquid") -> Liquid:
    """A liquid of a density the user gives.

    Parameters
    ----------
    density : float
        Mass density [kg/m3], finite and positive.
    name : str
        Plain name shown to the user.

    Raises
    ------
    LiquidError
        If `density` is not a finite positive number.

    Examples
    --------
    >>> custom_liquid(1100, "brine").density
    1100.0
    """
    return Liquid(name=name, density=_positive(density, "density"),
                  source="density given by the user")


def liquid_from_specific_gravity(sg: float, name: str = "custom liquid") -> Liquid:
    """A liquid from its specific gravity.

    Parameters
    ----------
    sg : float
        Specific gravity relative to :data:`WATER_REFERENCE_DENSITY`
        (pure water at about 4 C) [-], finite and positive.
    name : str
        Plain name shown to the user.

    Notes
    -----
    rho = SG x 999.975 kg/m3.

    Examples
    --------
    >>> liquid_from_specific_gravity(1.0).density
    999.975
    """
    sg = _positive(sg, "specific gravity")
    return Liquid(
        name=name,
        density=sg * WATER_REFERENCE_DENSITY,
        source=f"specific gravity {sg:g} given by the user, relative to water "
               f"at 4 C ({WATER_REFERENCE_DENSITY:g} kg/m3)",
    )


# --- section file ``fluid`` object --------------------------------------

_SPEC_KEYS = ("name", "density", "preset", "temperature", "salinity")
_DEFAULT_TEMPERATURE = {FRESH_WATER: 20.0, SEAWATER: 10.0}
_DEFAULT_SALINITY = 35.0


def _spec_number(spec: dict[str, Any], key: str) -> float:
    value = spec[key]
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        raise LiquidError(
            f"'{key}' in fluid must be a number, not {type(value).__name__}"
        )
    number = _float(value)
    if not math.isfinite(number):
        raise LiquidError(f"'{key}' in fluid must be a finite number, not {number}")
    return number


def liquid_from_spec(spec: object) -> Liquid:
    """The liquid described by a section file's ``fluid`` object.

    Parameters
    ----------
    spec : dict
        One of (section file version 1):

        - ``{"density": 998.2, "name": "..."}``: density [kg/m3] > 0, name
          optional (default ``"custom liquid"``);
        - ``{"preset": "fresh water", "temperature": 20}``: IAPWS-95,
          temperature [deg C] optional, default 20 C;
        - ``{"preset": "seawater", "temperature": 10, "salinity": 35}``:
          TEOS-10, temperature [deg C] default 10 C, absolute salinity
          [g/kg] default 35 g/kg.

        A preset may carry a ``name`` too; it replaces the preset's name.

    Returns
    -------
    Liquid

    Raises
    ------
    LiquidError
        Naming the problem: an unknown key, a value of the wrong type, both
        or neither of ``density`` and ``preset``, an unknown preset,
        ``temperature`` or ``salinity`` where they would be ignored, or a
        value out of range.

    Examples
    --------
    >>> liquid_from_spec({"preset": "seawater"}).salinity
    35.0
    """
    if not isinstance(spec, dict):
        raise LiquidError(f"fluid must be an object, not {type(spec).__name__}")
    for key in spec:
        if key not in _SPEC_KEYS:
            raise LiquidError(f"unknown key {key!r} in fluid")
    name = spec.get("name")
    if name is not None and not isinstance(name, str):
        raise LiquidError(f"'name' in fluid must be text, not {type(name).__name__}")

    if "density" in spec and "preset" in spec:
        raise LiquidError("fluid gives both 'density' and 'preset'; give one")
    if "density" in spec:
        for key in ("temperature", "salinity"):
            if key in spec:
                raise LiquidError(
                    f"'{key}' in fluid applies only to a preset, not to a given density"
                )
        density = _spec_number(spec, "density")
        if density <= 0.0:
            raise LiquidError(f"fluid density must be positive, not {density:g} kg/m3")
        lo, hi = limits.DENSITY_RANGE
        if not lo <= density <= hi:
            raise LiquidError(f"fluid density must be {range_text(lo, hi, 'kg/m3')}, "
                              f"not {shown(spec['density'])} kg/m3")
        if name is not None:
            listed = LISTED_LIQUIDS.get(name)
            if listed is not None and listed.density == density:
                return listed  # keeps the listed value's source
        return custom_liquid(density, "custom liquid" if name is None else name)
    if "preset" not in spec:
        raise LiquidError("fluid needs a 'density' or a 'preset'")

    preset = spec["preset"]
    if preset not in PRESETS:
        known = " or ".join(f"'{p}'" for p in PRESETS)
        raise LiquidError(f"unknown preset {preset!r} in fluid (use {known})")
    temperature = (
        _spec_number(spec, "temperature")
        if "temperature" in spec
        else _DEFAULT_TEMPERATURE[preset]
    )
    if preset == FRESH_WATER:
        if "salinity" in spec:
            raise LiquidError("'salinity' in fluid applies only to the seawater preset")
        liquid = fresh_water(temperature)
    else:
        salinity = (
            _spec_number(spec, "salinity") if "salinity" in spec else _DEFAULT_SALINITY
        )
        liquid = seawater(temperature, salinity)
    if name is not None and name != liquid.name:
        liquid = Liquid(name=name, density=liquid.density, source=liquid.source,
                        preset=liquid.preset, temperature=liquid.temperature,
                        salinity=liquid.salinity)
    return liquid


def liquid_to_spec(liquid: Liquid) -> dict[str, Any]:
    """The section file ``fluid`` object for `liquid`.

    Fresh water and seawater are written as presets with their inputs, so
    the file re-computes them; every other liquid as ``name`` and
    ``density``. ``liquid_from_spec(liquid_to_spec(x)) == x`` for presets,
    custom and listed liquids: a name and density that match a listed liquid
    exactly are read back as that liquid, with its source; the file never
    depends on the list (a changed list reads it as a custom liquid).

    Parameters
    ----------
    liquid : Liquid

    Returns
    -------
    dict
        JSON-ready ``fluid`` object.

    Examples
    --------
    >>> liquid_to_spec(fresh_water(15))
    {'preset': 'fresh water', 'temperature': 15.0}
    >>> liquid_to_spec(listed_liquid("milk"))
    {'name': 'milk', 'density': 1030.0}
    """
    inputs_known = liquid.temperature is not None and (
        liquid.preset != SEAWATER or liquid.salinity is not None
    )
    if liquid.preset in PRESETS and inputs_known:
        spec = {"preset": liquid.preset, "temperature": liquid.temperature}
        if liquid.preset == SEAWATER:
            spec["salinity"] = liquid.salinity
        if liquid.name != liquid.preset:
            spec["name"] = liquid.name
        return spec
    return {"name": liquid.name, "density": liquid.density}
