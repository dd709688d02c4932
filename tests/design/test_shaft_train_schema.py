"""`vcheck schema` documents [[shaft-train]]: checked with jsonschema (an independent
validator, test-only)."""

from __future__ import annotations

import jsonschema
from support import REPO

from vcheck.design.loader import parse_toml_text
from vcheck.design.schema import design_schema


def _read(name: str) -> dict:
    path = REPO / "examples/kestrel-yard/basement" / name
    return parse_toml_text(path.read_text(), name).data


def test_schema_accepts_the_example_trains_and_refuses_a_bare_inertia():
    validator = jsonschema.Draft202012Validator(design_schema())
    for name in ("gen-b11.toml", "gen-b12.toml"):
        data = _read(name)
        assert "shaft-train" in data
        assert list(validator.iter_errors(data)) == []
    data = _read("gen-b11.toml")
    data["shaft-train"][0]["disc"][0]["inertia"] = 3.0
    assert list(validator.iter_errors(data))
    data["shaft-train"][0]["disc"][0]["inertia"] = "3.0 kg*m^2"
    data["shaft-train"][0]["link"][0]["stifness"] = "1 MN*m/rad"
    assert list(validator.iter_errors(data))


def test_schema_describes_the_train_tables():
    definitions = design_schema()["$defs"]
    assert {"ShaftTrain", "TrainShaft", "Disc", "Link", "GearMesh"} <= set(definitions)
    stiffness = definitions["Link"]["properties"]["stiffness"]["anyOf"][0]
    assert "2.4 MN*m/rad" in stiffness["examples"]
