"""Pure numerical methods of vibration design.

Every function here takes SI numbers (or numpy arrays of them) and returns SI numbers.
Nothing in this package reads files, knows about design files, policy or reports, or
imports any other part of vcheck: only numpy and scipy. Each function's docstring gives
the published source of its formula and the unit of every argument in brackets.
"""
