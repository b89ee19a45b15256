"""Importing the packages stays light, and keeps one shared unit registry.

Each check runs in a fresh interpreter, because the test session itself has already imported
pandas, CoolProp and the rest. These are checks of behaviour (which modules get loaded and
which registry is used), not of timing: times are reported by ``benchmarks/run.py``.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys

import pytest


def _run(code: str) -> str:
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True, timeout=120)
    return done.stdout.strip()


def _loaded_after_import(package: str, candidates: tuple[str, ...]) -> list[str]:
    code = (f"import sys, json; import {package}; "
            f"print(json.dumps([m for m in {list(candidates)!r} if m in sys.modules]))")
    return json.loads(_run(code))


# Project rule (issue 2, common practice for libraries): heavy modules load inside the functions
# that need them, not at import. Checked against Python's own record, sys.modules.
@pytest.mark.parametrize("module", ["pandas", "matplotlib", "CoolProp"])
def test_import_fluids_props_does_not_load_heavy_module(module):
    assert _loaded_after_import("fluids_props", (module,)) == []


@pytest.mark.parametrize("module", ["pandas", "matplotlib", "openpyxl", "CoolProp"])
def test_import_similitude_does_not_load_heavy_module(module):
    assert _loaded_after_import("similitude", (module,)) == []


def test_quantity_made_before_import_converts_with_to_si():
    # pint documents get_application_registry() as the registry shared between packages;
    # 15 degC = 288.15 K, definition of the Celsius scale (SI Brochure, 9th ed., 2019; memory).
    code = ("import pint; q = pint.get_application_registry().Quantity(15, 'degC'); "
            "from fluids_props.units import to_si; print(to_si(q, '[temperature]'))")
    assert float(_run(code)) == pytest.approx(288.15, abs=1e-12)


def test_quantity_made_after_import_converts_with_to_si():
    # 1 bar = 1e5 Pa exactly (SI Brochure, 8th ed., 2006, Table 8; from memory).
    code = ("import fluids_props, pint; q = pint.get_application_registry().Quantity(2, 'bar'); "
            "from fluids_props.units import to_si; print(to_si(q, 'Pa'))")
    assert float(_run(code)) == pytest.approx(2e5, rel=1e-15)


def test_both_packages_and_pint_share_one_registry_after_import():
    code = ("import pint, fluids_props, similitude; app = pint.get_application_registry().get(); "
            "print(fluids_props.ureg.get() is app and similitude.ureg.get() is app)")
    assert _run(code) == "True"


def test_registry_set_by_user_before_import_is_kept():
    # pint.set_application_registry is pint's documented way for a user to choose the registry.
    code = ("import pint; r = pint.UnitRegistry(); pint.set_application_registry(r); "
            "import fluids_props; print(fluids_props.ureg.get() is r)")
    assert _run(code) == "True"


def test_quantities_of_user_and_package_add_without_conversion_error():
    # 2 bar + 1 Pa = 200001 Pa (1 bar = 1e5 Pa exactly, SI Brochure, 8th ed., Table 8).
    code = ("import pint; a = pint.get_application_registry().Quantity(2, 'bar'); "
            "import fluids_props; b = fluids_props.Q_(1, 'Pa'); print((a + b).to('Pa').magnitude)")
    assert float(_run(code)) == pytest.approx(200001.0, rel=1e-15)


def test_import_works_when_the_unit_cache_folder_cannot_be_created(tmp_path):
    # The disk cache is an optimisation only; 1 bar = 1e5 Pa (SI Brochure, 8th ed., Table 8).
    blocker = tmp_path / "not_a_folder"
    blocker.write_text("a file where the cache folder would go")
    code = ("from fluids_props.units import to_si, ureg; "
            "print(to_si('2 bar', 'Pa'), ureg.cache_folder is None)")
    env = {**os.environ, "XDG_CACHE_HOME": str(blocker / "cache")}
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True, timeout=120, env=env)
    value, no_cache = done.stdout.split()
    assert float(value) == pytest.approx(2e5, rel=1e-15) and no_cache == "True"
