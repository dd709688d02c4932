"""Brackwater Engineering's vibration rules for vcheck (an invented company)."""

from __future__ import annotations

__all__ = ["register"]
__version__ = "1.0.0"


def register(registry) -> None:
    """Called by vcheck through the ``vcheck.rules`` entry point."""
    from .rules import ElastomerLowSpeed, FloorIsolationFrequency, RoofRestraint

    for rule in (RoofRestraint, ElastomerLowSpeed, FloorIsolationFrequency):
        registry.add_rule(rule)
