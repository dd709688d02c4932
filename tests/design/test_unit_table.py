"""The written-down unit factors against the pint registry they were taken from.

Outside reference: pint (the units library, with vcheck's ``units.txt``): every entry of
``UNIT_FACTORS`` must be exactly what the registry gives for that spelling, so a check that
reads its units from the table reads the same numbers as one that asks pint.
"""

from __future__ import annotations

import subprocess
import sys

import pytest
from support import EXAMPLE, REPO

from vcheck.design.unit_table import TABLE_UNITS, UNIT_FACTORS, _generated
from vcheck.design.units import QUANTITY_KINDS, parse_amount, pint_unit_factor


@pytest.mark.parametrize("unit", TABLE_UNITS)
def test_table_entry_equals_the_pint_registry(unit):
    assert UNIT_FACTORS[unit] == pint_unit_factor(unit)


def test_table_is_the_generated_one_and_covers_every_accepted_unit():
    # the table in the file is what the generator writes from pint today
    source = (REPO / "vcheck" / "design" / "unit_table.py").read_text(encoding="utf-8")
    assert _generated() in source
    assert set(UNIT_FACTORS) == set(TABLE_UNITS)
    accepted = {unit for kind in QUANTITY_KINDS.values() for unit in kind.accepted}
    assert accepted <= set(UNIT_FACTORS), sorted(accepted - set(UNIT_FACTORS))


def test_units_outside_the_table_still_go_to_pint():
    # 1 ft/min = 0.3048 m / 60 s exactly (NIST SP 811, Appendix B); "ft/min" is not in
    # the table, so this reading comes from the registry
    assert "ft/min" not in UNIT_FACTORS
    assert parse_amount("600 ft/min", "velocity").value == pytest.approx(3.048, rel=1e-15)


def test_checking_the_example_does_not_import_pint():
    # Start-up budget (benchmarks/bench_startup.py): the example's units are all in the
    # table, so its check never imports pint (about 0.1 s).
    code = ("import sys, io, contextlib; from vcheck.cli import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            f"    main(['check', {str(EXAMPLE)!r}])\n"
            "print('pint' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         cwd=REPO, check=True)
    assert out.stdout.strip().endswith("False")
