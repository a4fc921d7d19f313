"""Naming a pipe, tube or rod conductor by a size a shop sells: owns the words only; the sizes are
catalog.py's `stock` table (with their sources), the rounding units.format_length's "size" step."""

from __future__ import annotations

from buildsheet import units
from buildsheet.catalog import catalog

OTHER = {"imperial": "metric", "metric": "imperial"}


def conductor_size(diameter_m: float, system: str, material: str = "") -> str:
    """A conductor's diameter (m) as a builder buys it, in the sheet's units `system`:
    '3/4 in copper pipe (7/8" OD)' or '6 mm rod' where a stock size of that system matches,
    '4 mm rod (5/32")' where only one of the other system does, else '5/32" dia.'."""
    size = units.format_length(diameter_m, system, "size")
    c = catalog()
    stock = c.stock_size(diameter_m, system, material)
    if stock is not None:
        # a rod's name is its diameter; a tube's name is a trade size, so its outside diameter follows
        return f"{stock.name} ({size} OD)" if stock.kind == "tube" else stock.name
    stock = c.stock_size(diameter_m, OTHER[system], material)
    if stock is not None:
        return f"{stock.name} ({size})"
    return f"{size} dia."


def conductor_name(diameter_m: float, system: str, material: str) -> str:
    """conductor_size with its material, unless the stock name already says it: '1/2 in copper pipe
    (5/8" OD)', '6 mm rod, aluminium'."""
    size = conductor_size(diameter_m, system, material)
    return size if material in size else f"{size}, {material}"


#: below this a rigid conductor with no stock size is taken for rod, from it up for tube (common
#: practice: rod is sold to about 3/8 in or 10 mm; thicker conductors are tube)
ROD_BELOW_M = 0.012


def rigid_kind(diameter_m: float, material: str) -> str:
    """'tube' or 'rod': the stock size's kind where one of either system matches the diameter (m),
    else by ROD_BELOW_M."""
    c = catalog()
    for system in ("imperial", "metric"):
        stock = c.stock_size(diameter_m, system, material)
        if stock is not None:
            return stock.kind
    return "rod" if diameter_m < ROD_BELOW_M else "tube"
