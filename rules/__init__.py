"""The built-in rules of vcheck.

This folder is installed as ``vcheck.rules`` and reaches the engine through the
``vcheck.rules`` entry point, exactly as a company's own rule package does.
"""

from __future__ import annotations

__all__ = ["register"]


def register(registry) -> None:
    """Register every built-in rule with the engine's registry."""
    from .fatigue import FatigueDamage
    from .isolation import IsolationEfficiency, IsolatorStaticDeflection, ResonancePassage
    from .loosening import JointBoltFatigue, JointBoltYield, JointSlip
    from .measured import MeasuredVibration
    from .separation import FrequencySeparation
    from .torsional import TorsionalSeparation

    registry.add_rule(FrequencySeparation)
    registry.add_rule(JointSlip)
    registry.add_rule(JointBoltFatigue)
    registry.add_rule(JointBoltYield)
    registry.add_rule(IsolationEfficiency)
    registry.add_rule(IsolatorStaticDeflection)
    registry.add_rule(ResonancePassage)
    registry.add_rule(FatigueDamage)
    registry.add_rule(TorsionalSeparation)
    registry.add_rule(MeasuredVibration)
