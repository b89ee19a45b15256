"""The cautions every output carries, worded for the kind of test.

Model-test predictions feed ship and structure design, so each summary, workbook and JSON
document says what its figures are (estimates inside stated validity ranges) and what they
defer to. Ship and propeller tests in water defer to the ITTC Recommended Procedures; tests in
air to the wind-tunnel correction practice that applies; both to class rules or the applicable
codes, local codes and licensed professional practice. One module holds the wording so the
command line, the workbooks and the notebook view say the same thing.

References
----------
.. [1] ITTC, Recommended Procedures and Guidelines (ittc.info), e.g. 7.5-02-02-01 Resistance
   Test, 7.5-02-03-01.4 1978 ITTC Performance Prediction Method.
.. [2] AGARD-AG-336, Wind Tunnel Wall Correction, B. F. R. Ewald (ed.), 1998.
"""

from __future__ import annotations

#: Facility kinds whose tests are in air: their corrections follow wind-tunnel practice.
AIR_FACILITIES = ("wind_tunnel",)

_ESTIMATES = ("All figures are estimates for planning, valid only inside the stated validity "
              "ranges of the correlations used")
_WATER_PRACTICE = "the ITTC Recommended Procedures, class rules, local codes and licensed practice"
_AIR_PRACTICE = ("the applicable wind-tunnel wall and blockage correction practice (e.g. "
                 "AGARD-AG-336) and the facility's own procedures, the applicable codes and "
                 "standards, local codes and licensed practice")
_WATER_SHORT = "the ITTC recommended procedures, class rules, local codes and licensed practice"
_AIR_SHORT = ("wind-tunnel correction practice (e.g. AGARD-AG-336), the applicable codes, local "
              "codes and licensed practice")

#: Cautions of every after-test (full-scale) result, in the order they are shown.
PREDICTION_CAUTIONS = (
    "These full-scale figures are ESTIMATES derived from model tests with published methods.",
    "Defer to the test facility's own model-ship correlation practice, to the current ITTC "
    "recommended procedures (7.5-02-03-01.4, 7.5-02-02-01) and to licensed professional practice.",
    "The uncertainty sheet covers the measurement inputs only, not the errors of the method.",
)

#: The one-sentence form of :data:`PREDICTION_CAUTIONS`, for notes and summaries.
PREDICTION_CAUTION = (
    "Full-scale predictions are estimates from the ITTC-1978 method as revised; they do not "
    "replace the facility's own correlation practice, the current ITTC recommended procedures "
    "or licensed professional practice."
)


def _in_air(facility_kind: str | None) -> bool:
    return facility_kind in AIR_FACILITIES


def caution_line(facility_kind: str | None = None) -> str:
    """The short caution printed under a command-line summary.

    Parameters
    ----------
    facility_kind : str, optional
        Kind of the test facility (``"towing_tank"``, ``"wind_tunnel"`` ...); None: the
        general wording (water-test practice), as in ``similitude --help``.
    """
    practice = _AIR_SHORT if _in_air(facility_kind) else _WATER_SHORT
    return f"Estimates only: check validity ranges, and defer to {practice}."


def plan_caution(facility_kind: str | None = None) -> str:
    """The caution of a test plan (workbook, notebook view, JSON), worded for the facility."""
    practice = _AIR_PRACTICE if _in_air(facility_kind) else _WATER_PRACTICE
    return f"{_ESTIMATES}; defer to {practice}."


__all__ = ["AIR_FACILITIES", "PREDICTION_CAUTION", "PREDICTION_CAUTIONS", "caution_line",
           "plan_caution"]
