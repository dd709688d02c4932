"""Inertia tensors with signed products: accepted when a body could have them, located
errors when not.

Outside reference: the mass moments of inertia of a uniform box about its centre,
m (b^2 + c^2) / 12 and so on (any dynamics handbook; common practice), and the tensor
transformation I' = R I R^T for a rotation R of the axes; the physical conditions of a
rigid body's tensor (positive definite, each principal moment no greater than the sum of
the other two).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from support import EXAMPLE

DESIGN = EXAMPLE / "basement" / "gen-b10.toml"
LINE = 'inertia = { xx = "62 kg*m^2", yy = "190 kg*m^2", zz = "175 kg*m^2" }'


def _project(tmp_path, inertia: str):
    text = DESIGN.read_text()
    assert LINE in text
    (tmp_path / "vcheck.toml").write_text("")
    (tmp_path / "gen.toml").write_text(text.replace(LINE, f"inertia = {inertia}"))
    return tmp_path


def _box_tensor_rotated(m, a, b, c, angle):
    principal = np.diag([m * (b * b + c * c) / 12, m * (a * a + c * c) / 12,
                         m * (a * a + b * b) / 12])
    s, co = math.sin(angle), math.cos(angle)
    rotation = np.array([[co, -s, 0.0], [s, co, 0.0], [0.0, 0.0, 1.0]])
    return rotation @ principal @ rotation.T, np.sort(np.diag(principal))


def test_a_rotated_box_with_negative_products_is_accepted(run_cli, tmp_path):
    from vcheck.design.modal import InertiaTensor

    tensor, principal = _box_tensor_rotated(1200.0, 1.8, 0.9, 1.1, math.radians(-25))
    # the tensor holds -Ixy off the diagonal, so the product is minus that entry
    ixy = -tensor[0, 1]
    assert ixy < 0  # this rotation gives a negative product of inertia
    fields = {"xx": f"{float(tensor[0, 0])!r} kg*m^2", "yy": f"{float(tensor[1, 1])!r} kg*m^2",
              "zz": f"{float(tensor[2, 2])!r} kg*m^2", "xy": f"{float(ixy)!r} kg*m^2"}
    model = InertiaTensor.model_validate(fields)
    np.testing.assert_allclose(np.linalg.eigvalsh(np.array(model.as_matrix())), principal,
                               rtol=1e-12)
    inline = "{ " + ", ".join(f'{k} = "{v}"' for k, v in fields.items()) + " }"
    ran = run_cli("check", "gen.toml", "--format", "json", cwd=_project(tmp_path, inline))
    assert ran.status in (0, 1), ran.err


def test_a_tensor_that_is_not_positive_definite_is_located(run_cli, tmp_path):
    inline = '{ xx = "62 kg*m^2", yy = "190 kg*m^2", zz = "175 kg*m^2", xy = "120 kg*m^2" }'
    ran = run_cli("check", "gen.toml", "--format", "json", cwd=_project(tmp_path, inline))
    assert ran.status == 2
    # eigenvalues of [[62, -120, 0], [-120, 190, 0], [0, 0, 175]]: numpy, below
    moments = np.linalg.eigvalsh(np.array([[62.0, -120, 0], [-120, 190, 0], [0, 0, 175]]))
    assert moments[0] < 0
    shown = ", ".join(f"{m:.4g}" for m in moments)
    assert ran.err.strip() == (
        f"gen.toml:34:11: mounting.inertia: the inertia tensor is not positive definite: its "
        f"principal moments are {shown} kg*m^2; a product of inertia is too large for the "
        "moments, or has the wrong sign")


def test_principal_moments_that_break_the_triangle_inequality_are_located(run_cli, tmp_path):
    inline = '{ xx = "20 kg*m^2", yy = "30 kg*m^2", zz = "175 kg*m^2" }'
    ran = run_cli("check", "gen.toml", "--format", "json", cwd=_project(tmp_path, inline))
    assert ran.status == 2
    assert ran.err.strip() == (
        "gen.toml:34:11: mounting.inertia: the principal moments 20, 30, 175 kg*m^2 break the "
        "triangle inequality (the largest, 175, exceeds the sum of the other two): no rigid "
        "body has them")


@pytest.mark.parametrize("bad", ['"nan kg*m^2"', '"1e999 kg*m^2"'])
def test_hostile_products_are_located_errors(run_cli, tmp_path, bad):
    inline = '{ xx = "62 kg*m^2", yy = "190 kg*m^2", zz = "175 kg*m^2", xz = ' + bad + " }"
    ran = run_cli("check", "gen.toml", "--format", "json", cwd=_project(tmp_path, inline))
    assert ran.status == 2 and "gen.toml:34:" in ran.err
    assert "Traceback" not in ran.err
