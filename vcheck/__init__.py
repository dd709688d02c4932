"""vcheck: a vibration-design rule checker for machine installations.

Importing this package is cheap on purpose: ``vcheck --version`` must not pay for
numpy, pydantic or pint. The working parts live in submodules.
"""

__version__ = "0.1.0"

__all__ = ["__version__"]
