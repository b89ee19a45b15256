"""Listing and looking up the available fluids (the planner searches over these)."""

from __future__ import annotations

from .air import FLUID_INFO as AIR
from .gases import builtin_fluid_infos, optional_fluid_infos
from .glycerol_water import FLUID_INFO as GLYCEROL_WATER
from .registry import FluidInfo
from .seawater import FLUID_INFO as SEA_WATER
from .water import FLUID_INFO as FRESH_WATER


def list_fluids() -> tuple[FluidInfo, ...]:
    """All fluids with their validity ranges, built-in first, then optional back-ends.

    Returns
    -------
    tuple of FluidInfo
        One entry per fluid; ``FluidInfo.ranges`` gives the validity range of each input.
    """
    return (FRESH_WATER, SEA_WATER, GLYCEROL_WATER, AIR, *builtin_fluid_infos(),
            *optional_fluid_infos())


def get_fluid(name: str) -> FluidInfo:
    """Look a fluid up by name (case-insensitive; '-' and ' ' read as '_').

    Raises
    ------
    ValueError
        For an unknown name, listing the known ones.
    """
    key = name.strip().lower().replace("-", "_").replace(" ", "_")
    aliases = {"water": "fresh_water", "freshwater": "fresh_water", "seawater": "sea_water",
               "n2": "nitrogen", "glycerol": "glycerol_water", "glycerin": "glycerol_water",
               "glycerine": "glycerol_water", "water_glycerol": "glycerol_water",
               "glycerol_solution": "glycerol_water"}
    key = aliases.get(key, key)
    fluids = list_fluids()
    for info in fluids:
        if info.name == key:
            return info
    names = ", ".join(f.name for f in fluids)
    raise ValueError(f"fluid: unknown fluid {name!r}; expected one of: {names}")
