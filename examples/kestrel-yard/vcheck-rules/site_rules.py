"""Kestrel Yard's own rule, kept in the design repository (policy: local-rules).

The building's structural engineer asks that every machine on the roof or on roof
steel comes with at least one mode of the steel that carries it: the roof frame is
lively, and an isolation check alone says nothing about it.
"""

from __future__ import annotations

from vcheck.analysis import analyse
from vcheck.engine import Rule
from vcheck.findings import Source, Status

SITE_NOTE = Source("Kestrel Yard structural design basis, note SDB-7 (example site policy)")


class RoofSteelModes(Rule):
    """Machines on the roof or roof steel give at least one mode of the supporting steel.

    Fails when a machine on a roof or steel frame has no natural frequency besides its
    own isolation modes; passes when a listed, imported, beam, lumped or structure-file
    mode is given. A machine elsewhere is not checked (there is no roof steel to judge);
    a design without a support warns, since it may stand on the roof.
    """

    id = "kestrel-roof-steel-modes"
    title = "Roof steel modes given"
    applies_to = "support"
    sources = (SITE_NOTE,)

    def check(self, design, options):
        support = design.support
        kind = support.kind if support is not None else None
        if design.structure is not None:
            kind = design.structure.structure.kind
        if kind is None:
            yield self.finding(design, ("machine",), Status.WARN,
                               "no [support] is given, so it is not known whether the machine "
                               "stands on the roof steel",
                               advice=["give [support] with its kind"])
            return
        if kind not in ("roof", "steel-frame"):
            yield self.finding(design, ("support",), Status.NOT_CHECKED,
                               f"not on the roof steel ({kind})")
            return
        steel = [m for m in analyse(design).modes if not m.is_isolation]
        if steel:
            yield self.finding(design, steel[0].key_path, Status.PASS,
                               f"{len(steel)} mode(s) of the supporting steel given, lowest "
                               f"{steel[0].nominal:.1f} Hz ({steel[0].name})")
        else:
            yield self.finding(
                design, ("support", "kind"), Status.FAIL,
                "on the roof steel, but no mode of the steel is given",
                advice=["list the frame's modes ([[natural-frequency]] or [[mode-file]]), "
                        "or describe it as a [[beam]] or a shared structure file"])


def register(registry) -> None:
    registry.add_rule(RoofSteelModes)
