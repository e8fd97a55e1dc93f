"""Tensile resistance of truss members: built-up and rolled members, eyebars and rods.

Pure provision functions first (nominal resistances, kip; areas in^2, stresses ksi), then
``tension_checks`` which evaluates them at every location of a ``SectionReport`` and keeps the
governing location of each check.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np

from rating.capacity.checks import Check, Sense
from rating.capacity.sections import SectionAtLocation, SectionReport
from rating.model import EyebarSet, FindingRegion, Material, MemberRole, RodEnd, RodSet

PHI_Y = 0.95
"""Resistance factor for yielding on the gross section, AASHTO LRFD 6.5.4.2. [value from memory]"""
PHI_U = 0.80
"""Resistance factor for fracture on the net section, AASHTO LRFD 6.5.4.2. [value from memory]"""
PHI_PIN_PLATE = 0.75
"""phi_t = phi_sf for pin-connected members, AISC LRFD 1999 D3.1. [value from memory]"""
B_EFF_ADD_IN = 0.63
"""The 0.63 in added to 2t in the effective width of a pin-connected plate, AISC LRFD 1999 D3."""

SECONDARY_ROLES = frozenset({MemberRole.SUB_STRUT, MemberRole.SUB_TIE})
"""Roles treated as secondary members for the slenderness limits. [common practice]"""


def yielding_nominal(A_g, F_y):
    """Nominal tensile yielding on the gross section, P_ny = F_y A_g, kip.

    AASHTO LRFD 6.8.2.1, Eq. 6.8.2.1-1 [value from memory]; SSDH Section 13, Eq. 13.11 [V].
    """
    return F_y * A_g


def fracture_nominal(A_n, F_u, U=1.0):
    """Nominal tensile fracture on the net section, P_nu = F_u A_n U, kip.

    AASHTO LRFD 6.8.2.1, Eq. 6.8.2.1-2 [value from memory]; SSDH Section 13, Eq. 13.12 [V].
    """
    return F_u * A_n * U


def pin_plate_effective_width_in(t, edge_in):
    """Effective width b_eff = 2t + 0.63 in, not more than the hole-to-edge distance, in.

    AISC LRFD 1999 D3.1(a), b_eff definition. [V]
    """
    return np.minimum(2.0 * np.asarray(t, dtype=float) + B_EFF_ADD_IN, edge_in)


def pin_plate_tension_nominal(t, edge_in, F_u):
    """Tension on the net effective area of a pin-connected plate, P_n = 2 t b_eff F_u, kip.

    AISC LRFD 1999 D3.1(a), Eq. D3-1. [V]
    """
    return 2.0 * np.asarray(t, dtype=float) * pin_plate_effective_width_in(t, edge_in) * F_u


def pin_plate_shear_nominal(t, a_in, d_hole_in, F_u):
    """Shear on the effective area beyond the hole, P_n = 0.6 A_sf F_u, A_sf = 2 t (a + d/2).

    AISC LRFD 1999 D3.1(b), Eq. D3-2. [V]
    """
    A_sf = 2.0 * np.asarray(t, dtype=float) * (a_in + d_hole_in / 2.0)
    return 0.6 * A_sf * F_u


@dataclass(frozen=True)
class TensionResult:
    """The tension checks of one member, each at its governing location (nominal resistance in
    kip), with the warnings and assumptions they raised."""

    checks: tuple[Check, ...]
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]


def _governing(name: str, phi: float, provision: str,
               candidates: Sequence[SectionAtLocation],
               nominal: Callable[[SectionAtLocation], float],
               detail: Callable[[SectionAtLocation], str]) -> Check:
    """The check at the location with the least nominal resistance (first on a tie)."""
    values = [float(nominal(s)) for s in candidates]
    if values and all(v == v for v in values):
        # a handful of locations: plain Python finds the first least value as np.argmin does
        k = min(range(len(values)), key=values.__getitem__)
    else:
        k = int(np.argmin(np.array(values, dtype=float)))  # numpy's rules for NaN or none
    s = candidates[k]
    return Check(name, Sense.TENSION, phi, values[k], provision, s.location, detail(s))


def _in(regions: set[FindingRegion | None], tension: Sequence[SectionAtLocation]):
    return [s for s in tension if s.location.region in regions]


def tension_checks(report: SectionReport, material: Material, *, role: MemberRole | None = None,
                   length_ft: float | None = None, phi_y: float = PHI_Y, phi_u: float = PHI_U,
                   phi_pin_plate: float = PHI_PIN_PLATE, head_as_pin_plate: bool = True,
                   head_ratio_min: float = 1.5, beyond_ratio_min: float = 0.65,
                   slenderness_limit: float = 200.0,
                   slenderness_limit_secondary: float = 240.0) -> TensionResult:
    """Every tension check of the member at its governing location.

    AASHTO LRFD 6.8.2.1 (phi_y 0.95, phi_u 0.80) [value from memory]; AISC LRFD 1999 D3 [V].

    Args:
        report: section as built and at every location (``section_properties``).
        material: F_y, F_u in ksi.
        head_as_pin_plate: check eyebar heads with the pin-connected plate forms of AISC LRFD
            1999 D3 (conservative for heads that meet the eyebar proportions); False checks
            the head net section through the hole by LRFD 6.8.2.1 fracture instead.
        head_ratio_min: least head net section through the hole / body area (Waddell 1898,
            p. 176: 50% more than the body) [V].
        beyond_ratio_min: least section beyond the hole / section through the hole (Waddell
            1898, p. 176: 65%) [V].
        slenderness_limit, slenderness_limit_secondary: L/r limits of tension members other
            than eyebars and rods, primary / secondary (AASHTO LRFD 6.8.4) [value from memory].
    """
    Fy, Fu = material.F_y, material.F_u
    T = report.tension
    m = report.member
    warnings: list[str] = []
    assumptions: list[str] = []
    checks: list[Check] = []
    yield_prov = ("AASHTO LRFD 6.8.2.1, Eq. 6.8.2.1-1 [value from memory]; SSDH Section 13, "
                  "Eq. 13.11 [V]")
    frac_prov = ("AASHTO LRFD 6.8.2.1, Eq. 6.8.2.1-2 [value from memory]; SSDH Section 13, "
                 "Eq. 13.12 [V]")
    if report.carrying_count == 0:
        warnings.append(f"member {m}: no bar or part is left carrying load; its tensile "
                        "resistance is zero")
    if report.kind == "eyebar set":
        body = _in({None, FindingRegion.BODY}, T)
        head = _in({None, FindingRegion.HEAD}, T)
        checks.append(_governing(
            "eyebar body yielding", phi_y, yield_prov + "; body as A_g, AISC LRFD 1999 D3.2 "
            "[V]", body,
            lambda s: float(yielding_nominal(sum(b.body_area_in2 for b in s.eyebars), Fy)),
            lambda s: f"{len(s.eyebars)} bars, A_body = "
                      f"{sum(b.body_area_in2 for b in s.eyebars):.3f} in2, F_y = {Fy:g} ksi"))

        arrays: dict[tuple[int, str], np.ndarray] = {}

        def _arr(s: SectionAtLocation, name: str) -> np.ndarray:
            # each array once per location (several checks and their details read it); the
            # locations live as long as this call, so their ids are a safe key
            key = (id(s), name)
            a = arrays.get(key)
            if a is None:
                a = arrays[key] = np.array([getattr(b, name) for b in s.eyebars], dtype=float)
            return a

        def _beff(s: SectionAtLocation) -> np.ndarray:
            return pin_plate_effective_width_in(_arr(s, "head_thickness_in"),
                                                _arr(s, "side_edge_in"))

        if head_as_pin_plate:
            checks.append(_governing(
                "eyebar head, tension through the pin hole (pin-plate form)", phi_pin_plate,
                "AISC LRFD 1999 D3.1(a), Eq. D3-1 [V]; phi 0.75 [value from memory]", head,
                lambda s: _total(pin_plate_tension_nominal(
                    _arr(s, "head_thickness_in"), _arr(s, "side_edge_in"), Fu)),
                lambda s: f"{len(s.eyebars)} heads, t_h = "
                          f"{_fmt(_arr(s, 'head_thickness_in'))} in, b_eff = "
                          f"{_fmt(_beff(s))} in, F_u = {Fu:g} ksi"))
            assumptions.append(f"member {m}: eyebar heads are checked as pin-connected plates "
                               "(AISC LRFD 1999 D3.1 a and b), conservative for heads that meet "
                               "the eyebar proportions")
        else:
            checks.append(_governing(
                "eyebar head, net section through the pin hole", phi_u, frac_prov, head,
                lambda s: float(fracture_nominal(s.A_n_in2, Fu)),
                lambda s: f"A_n (head through hole) = {s.A_n_in2:.3f} in2, F_u = {Fu:g} ksi"))
        checks.append(_governing(
            "eyebar head, shear beyond the pin hole", phi_pin_plate,
            "AISC LRFD 1999 D3.1(b), Eq. D3-2 [V]; phi 0.75 [value from memory]", head,
            lambda s: _total(pin_plate_shear_nominal(
                _arr(s, "head_thickness_in"), _arr(s, "beyond_hole_in"),
                _arr(s, "hole_diameter_in"), Fu)),
            lambda s: f"{len(s.eyebars)} heads, a = {_fmt(_arr(s, 'beyond_hole_in'))} in, "
                      f"d = {_fmt(_arr(s, 'hole_diameter_in'))} in, F_u = {Fu:g} ksi"))
        warnings.extend(_eyebar_proportions(report, head_ratio_min, beyond_ratio_min))
        per_bar = {"body": (body, phi_y, lambda b: float(yielding_nominal(b.body_area_in2, Fy))),
                   "head through the hole" + (" (pin-plate form)" if head_as_pin_plate else ""):
                   (head, phi_pin_plate if head_as_pin_plate else phi_u,
                    (lambda b: float(pin_plate_tension_nominal(
                        b.head_thickness_in, b.side_edge_in, Fu))) if head_as_pin_plate
                    else (lambda b: float(fracture_nominal(b.through_hole_area_in2, Fu)))),
                   "head beyond the hole": (head, phi_pin_plate, lambda b: float(
                       pin_plate_shear_nominal(b.head_thickness_in, b.beyond_hole_in,
                                               b.hole_diameter_in, Fu)))}
        weakest = _each_bar_weakest(checks, per_bar, lambda s: s.eyebars, "bar",
                                    "AASHTO LRFD 6.8.2.1 [value from memory]; AISC LRFD 1999 "
                                    "D3 [V]")
        if weakest is not None:
            checks.append(weakest)
    elif report.kind == "rod set":
        body = _in({None, FindingRegion.BODY}, T)
        end = _in({None, FindingRegion.THREAD}, T)
        checks.append(_governing(
            "rod body yielding", phi_y, yield_prov, body,
            lambda s: float(yielding_nominal(s.A_g_in2, Fy)),
            lambda s: f"{len(s.rods)} rods, A_body = {s.A_g_in2:.3f} in2, F_y = {Fy:g} ksi"))
        end_kind = report.section.end if isinstance(report.section, RodSet) else RodEnd.UPSET
        checks.append(_governing(
            f"rod end fracture at the {rod_end_label(end_kind)}", phi_u,
            frac_prov + "; rod ends on the root area, upset ends on the body [common practice]",
            end,
            lambda s: float(fracture_nominal(s.A_n_in2, Fu)),
            lambda s: f"{len(s.rods)} rods, A_end = {s.A_n_in2:.3f} in2, F_u = {Fu:g} ksi"))
        weakest = _each_bar_weakest(checks, {
            "body": (body, phi_y, lambda r: float(yielding_nominal(r.body_area_in2, Fy))),
            f"{rod_end_label(end_kind)}": (end, phi_u,
                                           lambda r: float(fracture_nominal(r.end_area_in2, Fu)))},
            lambda s: s.rods, "rod", "AASHTO LRFD 6.8.2.1 [value from memory]")
        if weakest is not None:
            checks.append(weakest)
        if end_kind is RodEnd.LOOP:
            warnings.extend(_loop_loss_as_local(m, end, checks, Fy, phi_y))
    else:
        checks.append(_governing(
            "yielding on the gross section", phi_y, yield_prov, T,
            lambda s: float(yielding_nominal(s.A_g_in2, Fy)),
            lambda s: f"A_g = {s.A_g_in2:.3f} in2, F_y = {Fy:g} ksi"))
        checks.append(_governing(
            "fracture on the net section", phi_u, frac_prov, T,
            lambda s: float(fracture_nominal(s.A_n_in2, Fu, s.shear_lag_U)),
            lambda s: f"A_n = {s.A_n_in2:.3f} in2, U = {s.shear_lag_U:g}, F_u = {Fu:g} ksi"))
        if length_ft is not None and T[0].A_g_in2 > 0:
            r = T[0].r_least_in
            L_r = length_ft * 12.0 / r if r > 0 else float("inf")
            lim = slenderness_limit_secondary if role in SECONDARY_ROLES else slenderness_limit
            if L_r > lim:
                shown = f"{L_r:.0f}" if round(L_r) > lim else f"{L_r:.1f}"
                warnings.append(f"member {m}: tension slenderness L/r = {shown} exceeds "
                                f"{lim:g} (AASHTO LRFD 6.8.4, value from memory); expect "
                                "vibration and handling damage")
    return TensionResult(tuple(checks), tuple(warnings), tuple(assumptions))


def _each_bar_weakest(checks: Sequence[Check],
                      parts: dict[str, tuple[Sequence[SectionAtLocation], float,
                                             Callable[[object], float]]],
                      bars_of: Callable[[SectionAtLocation], Sequence[object]], word: str,
                      provision: str) -> Check | None:
    """The bars of a set each at its own weakest part, summed: the check that governs where the
    loss is in different parts of different bars (bar 1 at its head, bar 2 in its body). The
    bars act side by side, each no stronger than its weakest part, so the set carries the sum
    over the bars of each bar's least factored resistance (common practice); the checks of
    one part summed over every bar (``checks``) can each be well above that. None where it
    gives no less than those checks (the same part governs every bar).

    ``parts``: for each part of a bar, the locations it is checked at, its resistance factor
    and the nominal resistance of one bar there (AASHTO LRFD 6.8.2.1 [value from memory],
    AISC LRFD 1999 D3 [V]: the provisions of the checks summed over the bars). The result is
    given as the sum of the bars' nominal resistances with the resistance factor that makes
    their factored sum (phi = sum phi_i R_i / sum R_i), the quantities bar by bar in its
    detail."""
    least = min((c.phi_R_n_kip for c in checks), default=0.0)
    best: dict[str, tuple[float, float, float, str, SectionAtLocation]] = {}
    for part, (locations, phi, nominal) in parts.items():
        for s in locations:
            for b in bars_of(s):
                rn = nominal(b)
                label = b.label  # type: ignore[attr-defined]
                if label not in best or phi * rn < best[label][0]:
                    best[label] = (phi * rn, rn, phi, part, s)
    if not best:
        return None
    factored = sum(v[0] for v in best.values())
    if not factored < least * (1.0 - 1e-9):
        return None
    nominal_sum = sum(v[1] for v in best.values())
    # the location of the bar whose weakest part is furthest below its as-built state names
    # the finding shown with the check; every bar's part is in the detail
    shown = min(best.values(), key=lambda v: (v[4].location.finding is None, v[0]))[4]
    detail = "; ".join(
        f"{label.replace('bar', word)} {part} ({s.location.describe()}): {phi:g} x "
        f"{rn:.1f} = {f:.1f} kip" for label, (f, rn, phi, part, s) in best.items())
    by_part: dict[str, list[str]] = {}
    for label, v in best.items():
        by_part.setdefault(v[3], []).append(label.split()[-1])
    which = "; ".join(f"{word}{'s' if len(n) > 1 else ''} {', '.join(n)} {part}"
                      for part, n in by_part.items())
    return Check(f"{word}s each at their weakest part ({which})", Sense.TENSION,
                 factored / nominal_sum if nominal_sum > 0 else 0.0, nominal_sum,
                 f"{provision}; each {word} at its weakest part, summed over the {word}s "
                 "[common practice]", shown.location,
                 f"{detail}; sum {factored:.1f} kip of R_n {nominal_sum:.1f} kip (phi weighted "
                 "over the bars)")


def _loop_loss_as_local(member: str, end: Sequence[SectionAtLocation], checks: Sequence[Check],
                        F_y: float, phi_y: float) -> list[str]:
    """Loss recorded at a loop is checked for fracture only, as a local section (like a
    thread root, AASHTO LRFD 6.8.2.1 [value from memory]); a loop is a length of bar around
    the pin, and where the loss runs along it, yielding on the reduced section governs
    instead. Said, with that resistance, where it would be lower than every check (common
    practice; the engineer decides where the loss lies)."""
    least = min((c.phi_R_n_kip for c in checks), default=0.0)
    out = []
    for s in end:
        if s.location.finding is None:
            continue
        y = phi_y * float(yielding_nominal(s.A_n_in2, F_y))
        if y < least * (1.0 - 1e-9):
            out.append(f"member {member}: the loss at its loop ({s.location.describe()}) is "
                       f"checked as a local section, for fracture only (as at a thread "
                       f"root); if it runs along the bar around the pin, yielding on that "
                       f"section governs: phi_y F_y A = {phi_y:g} x {F_y:g} ksi x "
                       f"{s.A_n_in2:.3f} in2 = {y:.1f} kip, against phi R_n = {least:.1f} kip "
                       "as rated. "
                       "Record the loss on the body to rate it so (the engineer's judgement "
                       "of where the loss lies)")
            break
    return out


def _total(a: np.ndarray) -> float:
    """The sum over the bars, as ``np.sum`` makes it (its own call, less the wrapper)."""
    return float(np.add.reduce(a, axis=None))


def _fmt(a: np.ndarray) -> str:
    vals = sorted({round(v, 4) for v in np.atleast_1d(a).tolist()})  # Python floats
    return "/".join(f"{v:g}" for v in vals) if vals else "-"


def _eyebar_proportions(report: SectionReport, head_ratio_min: float,
                        beyond_ratio_min: float) -> list[str]:
    """Period head proportions, as built.

    Waddell, De Pontibus, 1898, p. 176 [V]; AISC LRFD 1999 D3.2 dimensions [V].
    """
    out: list[str] = []
    m = report.member
    bars = report.as_built.eyebars
    if not bars:
        return out
    b = bars[0]
    ratio = b.through_hole_area_in2 / b.body_area_in2
    if ratio < head_ratio_min - 1e-9:
        out.append(f"member {m}: eyebar head net section through the hole is {ratio:.2f} x the "
                   f"body (period proportion {head_ratio_min:g} x, Waddell 1898 p. 176); the "
                   "head may govern")
    sec = report.section
    if isinstance(sec, EyebarSet) and sec.head_beyond_hole_in is not None:
        beyond = b.beyond_hole_area_in2 / b.through_hole_area_in2
        if beyond < beyond_ratio_min - 1e-9:
            out.append(f"member {m}: eyebar head section beyond the hole is {beyond:.2f} of the "
                       f"section through the hole (period proportion {beyond_ratio_min:g}, "
                       "Waddell 1898 p. 176)")
    if b.hole_diameter_in < 7.0 / 8.0 * b.width_in - 1.0 / 32.0:
        out.append(f"member {m}: pin hole {b.hole_diameter_in:g} in is smaller than 7/8 of the "
                   f"body width {b.width_in:g} in (AISC LRFD 1999 D3.2 proportion): the head "
                   "may be weaker than the body; its checks through and beyond the hole use "
                   "its own dimensions and govern the member's tension where they are lower")
    return out


def rod_end_label(end: RodEnd) -> str:
    """Words for the end a rod's end check is made on."""
    return {RodEnd.THREADED: "thread root", RodEnd.UPSET: "upset end",
            RodEnd.LOOP: "loop at the forge line"}[end]
