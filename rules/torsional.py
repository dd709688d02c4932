"""Torsional separation: the torsional modes of a shaft train clear of its excitations."""

from __future__ import annotations

from pydantic import Field, model_validator

from vcheck.engine import Rule, RuleOptions
from vcheck.findings import Measure, Source, Status, computed
from vcheck.wording import apart as _apart

__all__ = ["TorsionalOptions", "TorsionalSeparation", "clearing_coupling_stiffness"]

_TOLERANCE = 1e-9

API_684 = Source(
    "API 684 (rotordynamic tutorial) and API 617 torsional analysis: torsional natural "
    "frequencies at least 10% away from every excitation frequency over the operating "
    "speed range", "from memory")
WARN_PRACTICE = Source(
    "warning below 20% torsional separation, where stiffness tolerances and the dynamic "
    "stiffness of elastomeric couplings move the modes", "common practice")


class TorsionalOptions(RuleOptions):
    """Policy of the torsional-separation rule."""

    required_margin: float = Field(
        0.10, ge=0, lt=1,
        description="Least separation of a torsional natural frequency from an excitation "
        "band, as a fraction of the band edge; below it the rule fails. Default 0.10: API "
        "684 / API 617 (from memory).")
    warn_margin: float = Field(
        0.20, ge=0, lt=1,
        description="Separation below which the rule warns. Default 0.20: the project's "
        "choice (common practice).")
    minor_margin: float = Field(
        0.05, ge=0, lt=1,
        description="Separation from a minor engine or compressor order below which the "
        "rule warns (minor orders never fail: with even firing they carry a small share of "
        "the torque, and the half orders of a four-stroke lie so close together that no "
        "mode clears them all by 10%). Default 0.05: the project's choice (common practice "
        "judges minor orders by the vibratory torque they cause).")

    @model_validator(mode="after")
    def _ordered(self) -> TorsionalOptions:
        if self.minor_margin > self.warn_margin:
            raise ValueError(f"minor-margin ({self.minor_margin}) must not be above "
                             f"warn-margin ({self.warn_margin})")
        if self.warn_margin < self.required_margin:
            raise ValueError(f"warn-margin ({self.warn_margin}) must not be below "
                             f"required-margin ({self.required_margin})")
        return self


def _hz(value: float) -> str:
    return f"{value:.2f}" if value < 10 else f"{value:.1f}"


def _band(low: float, high: float) -> str:
    return f"{_hz(low)} Hz" if low == high else f"{_hz(low)}-{_hz(high)} Hz"


def _stiffness(value: float) -> str:
    if value >= 1e6:
        return f"{value / 1e6:.3g} MN*m/rad"
    return f"{value / 1e3:.3g} kN*m/rad"


def _pairs(modes, bands):
    from vcheck.dynamics.torsion.interference import band_separation

    pairs = []
    for mode in modes:
        for band in bands:
            margin, side = band_separation(mode.low, mode.high, band.low, band.high)
            pairs.append((margin, mode.nominal, band.low, mode, band, side))
    pairs.sort(key=lambda item: item[:3])
    return pairs


_RANK = {Status.FAIL: 2, Status.WARN: 1, Status.PASS: 0}


def pair_status(margin: float, band, options: TorsionalOptions) -> Status:
    """The status one mode-excitation pair earns on its own."""
    slack = 1 - _TOLERANCE
    if not band.major:
        return Status.WARN if margin < options.minor_margin * slack else Status.PASS
    if margin < options.required_margin * slack:
        return Status.FAIL
    if margin < options.warn_margin * slack:
        return Status.WARN
    return Status.PASS


def _governing(pairs, options: TorsionalOptions):
    """(status, pair) of the worst pair: the highest status, then the least margin."""
    ranked = [(-_RANK[pair_status(p[0], p[4], options)], p[:3], i) for i, p in enumerate(pairs)]
    _, _, index = min(ranked)
    pair = pairs[index]
    return pair_status(pair[0], pair[4], options), pair


def _torsional_quantities(result, pairs, options: TorsionalOptions) -> list:
    """Every torsional mode (with where it twists), every excitation band and the
    separation of every pair, closest first [Hz, fraction]."""
    train = result.train.name
    out = []
    for mode in result.modes:
        where = {"train": train, "mode": str(mode.number)}
        out += [computed("torsional natural frequency", mode.nominal, "Hz", **where,
                         twists=mode.twist),
                computed("strain-energy share", mode.twist_share, "fraction", **where,
                         link=mode.twist)]
        if mode.low != mode.high:
            out.append(computed("torsional natural frequency band", (mode.low, mode.high),
                                "Hz", **where))
    for band in result.bands:
        out.append(computed("excitation band", (band.low, band.high), "Hz", train=train,
                            band=band.name, kind=band.kind,
                            order=None if band.order is None else f"{band.order:g}",
                            major="yes" if band.major else "no"))
    for margin, _, _, mode, band, side in pairs:
        out.append(computed("separation", margin, "fraction", train=train,
                            mode=str(mode.number), band=band.name, side=side))
    out += [computed("required separation", options.required_margin, "fraction"),
            computed("required separation from a minor order", options.minor_margin,
                     "fraction")]
    return out


ADVICE_GRID = 481
"""Stiffnesses tried for a coupling, evenly in log k from 1/100 to 100 times its present
stiffness (a step of about 2%)."""

ADVICE_GRID_LARGE = 97
"""The same for a train of more than :data:`ADVICE_LARGE_TRAIN` degrees of freedom (a step
of about 10%), so that a long train is judged in seconds, not minutes."""

ADVICE_LARGE_TRAIN = 20

ADVICE_COUPLINGS = 2
"""Couplings searched for the advice: those with the largest share of the governing
mode's strain energy (the ones that move it)."""


def _clears_each(frequencies, lows, highs, major, options: TorsionalOptions):
    """Whether the modes of each trial, a row of ``frequencies`` (trials by modes) [Hz],
    pass against bands ``lows``-``highs`` [Hz] (``major`` a mask) by the rule's margins:
    a boolean per trial; :func:`pair_status` vectorised."""
    import numpy as np

    f = np.asarray(frequencies)[:, :, None]
    margin = np.where(f < lows, (lows - f) / lows, np.where(f > highs, (f - highs) / highs, 0.0))
    slack = 1 - _TOLERANCE
    # each band against its own margin (a major band the warn margin, a minor order the
    # minor margin) in one comparison, not the two selections of major and minor bands
    least = np.where(major, options.warn_margin * slack, options.minor_margin * slack)
    return ~np.any(margin < least, axis=(1, 2))


def clearing_coupling_stiffness(result, mode, options: TorsionalOptions) -> list[str]:
    """Advice: for the couplings that move ``mode`` most, the nearest stiffness below and
    above the present one at which the whole train passes (every mode clear of every
    excitation by the rule's margins, at both ends of the coupling's tolerance), found on
    a grid of :data:`ADVICE_GRID` stiffnesses from 1/100 to 100 times the present one."""
    import numpy as np

    from vcheck.dynamics.torsion.modes import torsional_frequencies_varied, torsional_modes

    referred, train = result.referred, result.train
    lows = np.array([b.low for b in result.bands])
    highs = np.array([b.high for b in result.bands])
    major = np.array([b.major for b in result.bands], dtype=bool)
    nominal_links = [(x, y, kn) for x, y, _, kn, _ in referred.links]
    shares = torsional_modes(referred.inertias, nominal_links).energy_shares[:, mode.number - 1]
    couplings = sorted((i for i, link in enumerate(train.link) if link.kind == "coupling"),
                       key=lambda i: (-shares[i], i))[:ADVICE_COUPLINGS]
    words = []
    for index in sorted(couplings):
        link = train.link[index]
        a, b, low, nominal, high = referred.links[index]
        to_stated = (link.dynamic_ratio or 1.0) * nominal / link.stiffness_band()[1]
        stated = nominal / to_stated
        points = ADVICE_GRID if len(referred.inertias) <= ADVICE_LARGE_TRAIN else ADVICE_GRID_LARGE
        grid = stated * np.logspace(-2, 2, points)
        step = 100.0 ** (2.0 / (points - 1)) - 1
        # every grid stiffness at both ends of the tolerance, as one stacked solve
        clears = np.ones(grid.size, dtype=bool)
        for scale in (low / nominal, high / nominal):
            found = torsional_frequencies_varied(referred.inertias, nominal_links, index,
                                                 grid * to_stated * scale)
            clears &= _clears_each(found, lows, highs, major, options)
        below = [k for k, ok in zip(grid, clears) if ok and k < stated]
        above = [k for k, ok in zip(grid, clears) if ok and k > stated]
        name = link.name or f"coupling {link.between[0]} - {link.between[1]}"
        kind = "static stiffness" if link.elastomeric else "stiffness"
        found = []
        if below:
            found.append(f"at most {_stiffness(max(below))}")
        if above:
            found.append(f"at least {_stiffness(min(above))}")
        now = link.stiffness.text if link.stiffness is not None else _stiffness(stated)
        if found:
            words.append(f"coupling '{name}' with a {kind} of " + " or ".join(found)
                         + f" (now {now}, tolerance kept) clears every torsional mode of the "
                         f"train by the margins (searched in steps of {step:.0%})")
        else:
            words.append(f"no stiffness of coupling '{name}' from 1/100 to 100 times its "
                         f"present {now} clears every torsional mode by the margins: change "
                         "the inertias or another link")
    return words


class TorsionalSeparation(Rule):
    """Torsional modes of a shaft train must stay clear of its excitations over the speed range.

    Each ``[[shaft-train]]`` (discs, shaft sections, couplings and gears, referred to one
    shaft by the square of the speed ratio) gives its elastic torsional modes; the
    rigid-body mode of a free train is left out. Each mode, over the band its stiffness
    tolerances allow, is compared with every excitation of every shaft over the whole
    speed range: 1x and 2x shaft speed, gear mesh, engine firing orders (major and minor,
    by cylinder count and stroke), compressor torque orders, the 6x and 12x output
    frequency torque pulsations of a drive-fed motor and twice line frequency of a motor
    on the line or of a generator.

    Fails when a mode lies within ``required-margin`` (10%) of a major excitation; warns
    when a mode lies within ``warn-margin`` (20%) of a major excitation, or within
    ``minor-margin`` (5%) of a minor engine or compressor order; passes otherwise. The
    advice names, for the couplings that move the governing mode most, the stiffness at
    which the whole train clears.

    A verdict never rests on an excitation the design leaves out: the rule warns at most,
    naming the missing input, when an elastomeric coupling has no dynamic ratio, a gear
    has no teeth, a motor or generator shaft has no supply frequency, or an engine or
    compressor has no shaft of its kind. A design without a shaft train is reported
    (warn) only when its machine implies a torsionally critical train (an engine, a
    generator set, a reciprocating compressor, gears, or a drive-fed motor); other
    designs get no finding from this rule.

    Limits of validity: a lumped, undamped model; gear meshes rigid; the stiffness of a
    shaft section is that of a uniform circular shaft (no shoulders, keyways or
    shrink-fit allowance).
    """

    id = "torsional-separation"
    title = "Torsional modes of shaft trains clear of their excitations"
    applies_to = "shaft-train"
    sources = (API_684, WARN_PRACTICE)
    Options = TorsionalOptions

    def check(self, design, options: TorsionalOptions):
        from vcheck.torsional_analysis import analyse_train, torsionally_critical

        if not design.shaft_train:
            why = torsionally_critical(design)
            if why:
                yield self.finding(
                    design, ("machine",), Status.WARN,
                    f"{why}, but no [[shaft-train]] is given: the torsional modes of the "
                    "train are not checked",
                    advice=("give a [[shaft-train]] with the train's discs (inertias), "
                            "links (shaft sections and couplings with their stiffness) and "
                            "gears, for its torsional modes",))
            return
        for index in range(len(design.shaft_train)):
            yield self._train(design, analyse_train(design, index), options)

    def _train(self, design, result, options: TorsionalOptions):
        here = ("shaft-train", result.index)
        name = result.train.name
        gaps = list(result.gaps)
        if not result.modes:
            return self.finding(
                design, here, Status.WARN if gaps else Status.PASS,
                f"{name}: one disc turning freely has no torsional mode",
                assumptions=result.assumptions, advice=[give for _, _, give in gaps])
        pairs = _pairs(result.modes, result.bands)
        status, governing = _governing(pairs, options)
        margin, _, _, mode, band, side = governing
        separated = status is Status.PASS
        if gaps and status is Status.PASS:
            status = Status.WARN
        where = {"inside": "lies inside", "below": f"is {margin:.1%} below",
                 "above": f"is {margin:.1%} above" if margin < 1
                 else f"is at {1 + margin:.3g} times the top of"}[side]
        if side != "inside" and margin < 0.0005:
            where = "lies on"
        span = "" if mode.low == mode.high else f" (band {_band(mode.low, mode.high)})"
        message = (f"torsional mode {mode.number} at {_hz(mode.nominal)} Hz{span}, twisting most in "
                   f"{mode.twist} ({mode.twist_share:.0%} of its strain energy), {where} "
                   f"{band.name} {_band(band.low, band.high)}; separation needed "
                   f"{options.required_margin:.0%}, warn below {options.warn_margin:.0%}")
        if not band.major:
            message += f" (a minor order: warns below {options.minor_margin:.0%})"
        if gaps:
            message += "; not considered: " + "; ".join(what for _, what, _ in gaps)
        assumptions = list(result.assumptions)
        if design.machine.speed.is_range:
            assumptions.append("excitation bands cover the whole speed range "
                               f"{design.machine.speed.min.text} to "
                               f"{design.machine.speed.max.text}")
        advice = []
        if not separated:
            advice += clearing_coupling_stiffness(result, mode, options)
        advice += [give for _, _, give in gaps]
        table = [("torsional mode", "Hz", "twists most", "excitation", "band Hz", "separation")]
        for m, _, _, md, bd, sd in pairs[:6]:
            table.append((f"{md.number}", _band(md.low, md.high), md.twist, bd.name,
                          _band(bd.low, bd.high), _apart(m, sd)))
        # the limit of the governing pair's kind: a minor order is held to minor-margin
        limit = (Measure("required separation", options.required_margin, "fraction")
                 if band.major else
                 Measure("required separation from a minor order", options.minor_margin,
                         "fraction"))
        return self.finding(
            design, here, status, f"{name}: {message}",
            quantities=_torsional_quantities(result, pairs, options),
            measured=Measure("separation", round(margin, 6), "fraction"),
            limit=limit, margin=round(margin - limit.value, 6),
            assumptions=assumptions, advice=advice, table=table,
            table_title="closest pairs")
