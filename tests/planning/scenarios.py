"""Invented test scenarios shared by the planner tests: a 150 m tanker-like ship and a tank.

Not a test module (no ``test_`` prefix); the planner test files import it.
"""

from similitude.planning.case import FluidSpec, Prototype
from similitude.planning.facilities import Facility


def ship(**kw) -> Prototype:
    """A 150 m ship in sea water at 15 degC (invented); keywords override fields."""
    base = dict(kind="surface_ship", length=150.0, speeds=(6.0, 8.0, 10.0),
                fluid=FluidSpec("sea_water", 288.15),
                dimensions={"beam": 24.0, "draught": 8.0, "midship_area": 190.0})
    base.update(kw)
    return Prototype(**base)


def tank(**kw) -> Facility:
    """A 200 m x 8 m x 4 m towing tank (invented); keywords override fields."""
    base = dict(kind="towing_tank", name="tank A", length=200.0, width=8.0, depth=4.0,
                speed_range=(0.1, 6.0), acceleration=0.5)
    base.update(kw)
    return Facility(**base)
