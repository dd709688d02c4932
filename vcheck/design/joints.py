"""Bolted joints of a design: the ``[[joint]]`` tables.

Placeholder for the fastener-loosening work: it accepts only a name, so that any
``[[joint]]`` with real data is refused until the model is complete, never ignored.
"""

from __future__ import annotations

from pydantic import Field

from .fields import DesignModel

__all__ = ["Joint"]


class Joint(DesignModel):
    """A bolted joint carrying a vibrating part."""

    name: str = Field(min_length=1, description="what the joint holds, e.g. 'motor feet'")
