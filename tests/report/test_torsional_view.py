"""The torsional part of `vcheck dynamics`: crossings of order lines with the modes."""

from __future__ import annotations

import re

from support import REPO


def test_gen_b11_crossing_speed_is_mode_over_order():
    from vcheck.design.loader import design_from_document, parse_toml_text
    from vcheck.report.torsional_view import torsional_lines
    from vcheck.torsional_analysis import analyse_train

    path = REPO / "examples/kestrel-yard/basement/gen-b11.toml"
    design = design_from_document(parse_toml_text(path.read_text(), "gen-b11.toml"))
    mode = analyse_train(design, 0).modes[0]
    lines = torsional_lines(design)
    row = next(line for line in lines if "firing order 3 (major" in line and "rpm" not in line
               and re.search(r"\s\d{3,4}\s", line))
    # an order line k x N crosses a mode f_n at N = f_n / k (the Campbell diagram's
    # construction, common practice): 60 f_n / 3 rpm
    assert f"{mode.nominal * 60 / 3:.0f}" in row
    assert "4.5% below" in row


def test_design_without_a_train_adds_nothing():
    from vcheck.design.loader import design_from_document, parse_toml_text
    from vcheck.report.torsional_view import torsional_lines

    path = REPO / "examples/kestrel-yard/basement/gen-b10.toml"
    design = design_from_document(parse_toml_text(path.read_text(), "gen-b10.toml"))
    assert torsional_lines(design) == []
