"""Number and length formatting for the panes (display only)."""

from __future__ import annotations

from engine.model.units import format_ft_in, format_inches


def signed_inches(v: float) -> str:
    """1 3/16" or -1/4" (to 1/16 in)."""
    return format_inches(v) if v >= 0 else f"-{format_inches(-v)}"


def value(v: float, unit: str) -> str:
    """A check's demand or capacity in the unit people read: kip-ft, ft-in, percent."""
    if unit == "kip-in":
        return f"{v / 12.0:,.1f} kip-ft"
    if unit == "in":
        return signed_inches(v)
    if unit == "ratio":
        return f"{v:.0%}"
    if unit == "studs":
        return f"{v:,.0f} studs"
    return f"{v:,.1f} {unit}"


def station(x: float | None) -> str:
    return "" if x is None else format_ft_in(x)
