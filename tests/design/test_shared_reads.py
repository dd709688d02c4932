"""A data file named by several designs of one check is parsed once (``check_scope``),
and only then: each design still opens it through the guarded opener, gets arrays of
its own, a changed file is read again, and a bad file is reported for every design.

Reference: the same designs checked one at a time, outside any scope (every file read
afresh), which is how the readers worked before the sharing existed.
"""

from __future__ import annotations

import shutil

import numpy as np
import pytest
from support import EXAMPLE

from vcheck.checking import load_designs
from vcheck.config import load_policy
from vcheck.design import fatigue_details, files, measurements

SHARED = {  # a design of the example and the data file it names
    "basement/cmp-b7.toml": "basement/data/cmp-b7-branch-strain.csv",
    "basement/gen-b8.toml": "basement/data/gen-b8-exhaust-bracket-psd.csv",
    "plant/level-3/sf-3d.toml": "plant/level-3/data/sf-3d-motor-bearing.csv",
}


@pytest.fixture
def project(tmp_path):
    root = tmp_path / "yard"
    shutil.copytree(EXAMPLE, root)
    for design in SHARED:  # a second design naming the same file
        source = root / design
        (source.parent / f"copy-{source.name}").write_text(
            source.read_text(encoding="utf-8").replace('tag = "', 'tag = "COPY-', 1),
            encoding="utf-8")
    return root


def _load(root, names):
    policy = load_policy(root)
    return load_designs(policy, names, root)


def _inputs(design):
    found = [item for item in (getattr(design, "_fatigue_inputs", ()) or ()) if item]
    found += [item for item in (getattr(design, "_spectra", ()) or ()) if item]
    return found


def _arrays(item):
    if isinstance(item, measurements.MeasuredSpectrum):
        return [item.frequency, item.amplitude]
    if item.history is not None:
        return [item.history]
    return list(item.psd)


def test_each_file_is_parsed_once_and_each_design_has_its_own_arrays(project, monkeypatch):
    counts = {"history": 0, "psd": 0, "spectrum": 0}
    for kind, module, name in (("history", fatigue_details, "_csv_channel"),
                               ("psd", fatigue_details, "_psd_columns"),
                               ("spectrum", measurements, "_spectrum_lines")):
        original = getattr(module, name)

        def counted(*args, _original=original, _kind=kind, **kwargs):
            counts[_kind] += 1
            return _original(*args, **kwargs)

        monkeypatch.setattr(module, name, counted)
    names = [n for design in SHARED for n in (design, design.replace(
        design.rsplit("/", 1)[-1], "copy-" + design.rsplit("/", 1)[-1]))]
    designs, problems = _load(project, names)
    assert problems == []
    assert counts == {"history": 1, "psd": 1, "spectrum": 1}
    by_file = {design._file: design for design in designs}
    for name in SHARED:
        copy = name.replace(name.rsplit("/", 1)[-1], "copy-" + name.rsplit("/", 1)[-1])
        first, second = _inputs(by_file[name]), _inputs(by_file[copy])
        assert len(first) == len(second) == 1
        for a, b in zip(_arrays(first[0]), _arrays(second[0])):
            assert a.tobytes() == b.tobytes()
            assert not np.shares_memory(a, b)  # one design cannot change another's


def test_the_numbers_are_those_of_a_reading_without_sharing(project):
    names = [n for n in SHARED] + ["basement/copy-cmp-b7.toml"]
    shared, _ = _load(project, names)
    for name in SHARED:
        design = next(d for d in shared if d._file == name)
        fresh = _load(project, [name])[0][0]  # a check of its own: nothing remembered
        assert len(_inputs(design)) == len(_inputs(fresh)) == 1
        for a, b in zip(_inputs(design), _inputs(fresh)):
            for x, y in zip(_arrays(a), _arrays(b)):
                assert x.tobytes() == y.tobytes()


def test_a_changed_file_is_read_again_and_a_bad_file_is_read_for_each_design(
        project, monkeypatch):
    data = project / SHARED["plant/level-3/sf-3d.toml"]
    with files.check_scope():
        first = _load(project, ["plant/level-3/sf-3d.toml"])[0][0]
        data.write_text(data.read_text(encoding="utf-8") + "5000,0.5\n", encoding="utf-8")
        second = _load(project, ["plant/level-3/copy-sf-3d.toml"])[0][0]
        assert len(_inputs(second)[0].frequency) == len(_inputs(first)[0].frequency) + 1
        data.write_text("frequency,amplitude\n1,x\n2,3\n", encoding="utf-8")
        readings = []
        original = measurements._spectrum_lines
        monkeypatch.setattr(measurements, "_spectrum_lines",
                            lambda *a: readings.append(1) or original(*a))
        designs, problems = _load(project, ["plant/level-3/sf-3d.toml",
                                            "plant/level-3/copy-sf-3d.toml"])
    assert designs == [] and len(readings) == 2  # the failed reading was not remembered
    assert [p.message for p in problems if p.file == SHARED["plant/level-3/sf-3d.toml"]] \
        == ["amplitude 'x' is not a finite number"]


def test_outside_a_check_nothing_is_remembered():
    calls = []
    assert files.read_once(("k",), lambda: calls.append(1) or 1) == 1
    assert files.read_once(("k",), lambda: calls.append(1) or 1) == 1
    assert calls == [1, 1]
    with files.check_scope():
        files.read_once(("k",), lambda: calls.append(1) or 1)
        files.read_once(("k",), lambda: calls.append(1) or 1)
    assert calls == [1, 1, 1]


def test_each_design_opens_each_data_file_once_and_closes_it(project, monkeypatch):
    # the first reading reads the descriptor the checks were made on (no second open);
    # a design whose file was parsed already closes its own. Reference: the count of
    # designs naming each file, and the descriptors open before the check.
    import os

    opened = []
    original = files.open_inside

    def counted(root, target, **kwargs):
        found = original(root, target, **kwargs)
        opened.append(found[1].name)
        return found

    monkeypatch.setattr(files, "open_inside", counted)
    names = [n for design in SHARED for n in (design, design.replace(
        design.rsplit("/", 1)[-1], "copy-" + design.rsplit("/", 1)[-1]))]
    before = sorted(os.listdir("/proc/self/fd")) if os.path.isdir("/proc/self/fd") else None
    designs, problems = _load(project, names)
    assert problems == [] and len(designs) == 6
    data = [name for name in opened if name.endswith(".csv")]
    assert sorted(data) == sorted(2 * [path.rsplit("/", 1)[-1] for path in SHARED.values()])
    if before is not None:
        assert sorted(os.listdir("/proc/self/fd")) == before



@pytest.mark.parametrize("structure_first", [True, False])
def test_a_structure_file_among_the_design_files_is_parsed_once(project, monkeypatch,
                                                                structure_first):
    # Reference: the structure loaded on its own (read afresh). A check given the
    # structure file among its design files, before or after the designs that stand on
    # it, reads and parses it once and keeps the same structure.
    from vcheck.design import loader

    root = project.resolve()
    named = ["structures/deck-3-bay-c.toml", "plant/level-3/chwp-3a.toml",
             "plant/level-3/chwp-3b.toml"]
    if not structure_first:
        named = named[1:] + named[:1]
    parsed = []
    original = loader.parse_toml_text
    monkeypatch.setattr(loader, "parse_toml_text",
                        lambda text, name: (parsed.append(name), original(text, name))[1])
    designs, problems = load_designs(load_policy(project), [], project,
                                     files=[(root / name, name) for name in named])
    assert not problems and len(designs) == 2
    assert parsed.count("structures/deck-3-bay-c.toml") == 1
    monkeypatch.setattr(loader, "parse_toml_text", original)
    alone = loader.load_structure(root / named[0 if structure_first else 2], root)
    assert all(d.structure == alone and d.structure.file == alone.file for d in designs)
