"""Human labels for the program's keys in documents: "fresh_water" -> "fresh water".

Case-file keys and catalogue names are snake_case; a client reads words. Names without an
underscore, and the user's own names (cases, loadings, waves), are shown as written.
"""

from __future__ import annotations

#: Labels that are not the key with spaces for underscores.
SPECIAL_LABELS = {
    "ittc1957": "ITTC-1957", "ittc": "ITTC", "jonswap": "JONSWAP",
    "prandtl_schlichting": "Prandtl-Schlichting",
}


def human(key: str) -> str:
    """The label of a key in documents: ``"towing_tank"`` -> ``"towing tank"``,
    ``"largest_model"`` -> ``"largest model"``, ``"ittc1957"`` -> ``"ITTC-1957"``."""
    text = str(key)
    return SPECIAL_LABELS.get(text, text.replace("_", " "))


__all__ = ["SPECIAL_LABELS", "human"]
