"""Pure numerical methods of vibration design.

Every function here takes SI numbers (or numpy arrays of them) and returns SI numbers.
Nothing in this package reads files, knows about design files, policy or reports, or
imports any other part of vcheck: only numpy and scipy. Each function's docstring gives
the published source of its formula and the unit of every argument in brackets.

The package is grouped by topic:

- :mod:`vcheck.dynamics.modes`: natural frequencies and mode shapes (one degree of
  freedom, beams, lumped models, a rigid machine on mounts and its forced response);
- :mod:`vcheck.dynamics.forcing`: what a machine puts out (forcing frequencies,
  unbalance, the free forces and moments of crank mechanisms, torque reaction, belt pull);
- :mod:`vcheck.dynamics.isolation`: transmissibility, damping models and the peak
  response over a speed range;
- :mod:`vcheck.dynamics.joints`: threads, bolt materials, preload and joint safety;
- :mod:`vcheck.dynamics.fatigue`: S-N curves, rainflow, spectral methods, Miner's sum;
- :mod:`vcheck.dynamics.roots` and :mod:`vcheck.dynamics.vibration_level`: shared by
  several topics (scalar root finding; vibration levels and severity zones).

Modules that lived at the top of the package before the grouping (``vcheck.dynamics.
sn_curves`` and so on) can still be imported by their old names, with a
DeprecationWarning; they are the same module objects as the new ones.
"""

from __future__ import annotations

import importlib
import importlib.abc
import importlib.util
import sys
import warnings

MOVED_MODULES = {
    "beams": "modes", "lumped": "modes", "rigid_mounts": "modes", "sdof": "modes",
    "excitations": "forcing", "unbalance": "forcing",
    "transmissibility": "isolation", "damping": "isolation",
    "threads": "joints", "bolt_materials": "joints", "preload": "joints",
    "sn_curves": "fatigue", "miner": "fatigue", "rainflow": "fatigue", "spectral": "fatigue",
}
"""Old module name -> the topic subpackage that holds it now."""


class _MovedModuleLoader(importlib.abc.Loader):
    def __init__(self, target: str) -> None:
        self.target = target

    def create_module(self, spec):
        return importlib.import_module(self.target)

    def exec_module(self, module) -> None:
        pass


class _MovedModuleFinder(importlib.abc.MetaPathFinder):
    """Resolves ``vcheck.dynamics.<old name>`` to the module in its topic subpackage."""

    def find_spec(self, fullname, path=None, target=None):
        head, _, name = fullname.rpartition(".")
        if head != __name__ or name not in MOVED_MODULES:
            return None
        new = f"{__name__}.{MOVED_MODULES[name]}.{name}"
        warnings.warn(f"{fullname} is now {new}", DeprecationWarning, stacklevel=2)
        return importlib.util.spec_from_loader(fullname, _MovedModuleLoader(new))


if not any(isinstance(finder, _MovedModuleFinder) for finder in sys.meta_path):
    sys.meta_path.append(_MovedModuleFinder())
