"""Listing and looking up the available fluids (the planner searches over these)."""

from __future__ import annotations

import importlib

from .registry import FluidInfo


def list_fluids() -> tuple[FluidInfo, ...]:
    """All fluids with their validity ranges, built-in first, then optional back-ends.

    Returns
    -------
    tuple of FluidInfo
        One entry per fluid; ``FluidInfo.ranges`` gives the validity range of each input.
    """
    # The package re-exports functions named like their modules (``air``), so go by module path.
    water, seawater, glycerol_water, air, gases = (
        importlib.import_module(f"fluids_props.{m}")
        for m in ("water", "seawater", "glycerol_water", "air", "gases")
    )
    infos: list[FluidInfo] = [water.FLUID_INFO, seawater.FLUID_INFO, glycerol_water.FLUID_INFO,
                              air.FLUID_INFO]
    infos.extend(gases.builtin_fluid_infos())
    infos.extend(gases.optional_fluid_infos())
    return tuple(infos)


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
