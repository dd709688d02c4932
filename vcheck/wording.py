"""Words for numbers that several rules and writers say the same way."""

from __future__ import annotations

__all__ = ["apart"]


def apart(margin: float, side: str) -> str:
    """A separation as a table shows it: "23.8% below", "x3.24 above" (a natural frequency
    more than twice the band's top is said as a multiple of it), "inside".

    ``margin`` is the separation as a fraction of the band edge it is measured from,
    ``side`` "below", "above" or "inside" (the natural frequency against the band).
    """
    if side == "inside":
        return "inside"
    if side == "above" and margin >= 1:
        return f"x{1 + margin:.3g} above"
    return f"{margin:.1%} {side}"
