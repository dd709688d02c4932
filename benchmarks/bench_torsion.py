"""Torsional-separation on a failing train of N discs (the advice searches a grid of
coupling stiffnesses): medians of repeated runs, against one eigen solution of the same
train measured in the same run.

    .venv/bin/python benchmarks/bench_torsion.py
"""

from __future__ import annotations

import statistics
import time


def _design(discs: int, couplings: int) -> str:
    lines = ['format = 1', '[machine]', 'tag = "B-1"', 'kind = "generator-set"',
             'mass = "900 kg"', 'speed = "1500 rpm"', 'cylinders = 6', 'strokes = 4',
             '[[shaft-train]]', 'name = "long train"', '[[shaft-train.shaft]]',
             'name = "crankshaft"', 'kind = "engine"']
    for i in range(discs):
        lines += ['[[shaft-train.disc]]', f'name = "d{i}"', 'inertia = "0.5 kg*m^2"']
    step = max(1, (discs - 1) // max(couplings, 1))
    for i in range(discs - 1):
        kind = "coupling" if i % step == 0 and i // step < couplings else "shaft"
        lines += ['[[shaft-train.link]]', f'between = ["d{i}", "d{i + 1}"]',
                  f'kind = "{kind}"', 'stiffness = "3 MN*m/rad +-10%"']
    return "\n".join(lines) + "\n"


def _median(func, repeat: int = 5) -> float:
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        func()
        times.append(time.perf_counter() - start)
    return statistics.median(times)


def main() -> None:
    from vcheck.rules.torsional import TorsionalOptions, TorsionalSeparation

    from vcheck.design.loader import design_from_document, parse_toml_text
    from vcheck.torsional_analysis import analyse_train, train_modes

    for discs, couplings in ((3, 1), (10, 2), (50, 5), (100, 10)):
        design = design_from_document(parse_toml_text(_design(discs, couplings), "b.toml"))
        referred = analyse_train(design, 0).referred
        one = _median(lambda: train_modes(referred))
        rule = _median(lambda: list(TorsionalSeparation().check(design, TorsionalOptions())),
                       repeat=3)
        print(f"{discs:4d} discs, {couplings:3d} couplings: one eigen solution "
              f"{one * 1e3:8.3f} ms; whole rule {rule * 1e3:9.1f} ms "
              f"({rule / one:7.0f} x)")


if __name__ == "__main__":
    main()
