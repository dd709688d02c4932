"""Fatigue-critical details of a design: the ``[[fatigue]]`` tables.

Placeholder for the fatigue work: it accepts only a name, so that any ``[[fatigue]]``
table with real data is refused until the model is complete, never ignored.
"""

from __future__ import annotations

from pydantic import Field

from .fields import DesignModel

__all__ = ["FatigueDetail"]


class FatigueDetail(DesignModel):
    """A vibrating member, weld or small-bore connection whose cycles are counted."""

    name: str = Field(min_length=1, description="e.g. 'gauge tapping on the discharge'")
