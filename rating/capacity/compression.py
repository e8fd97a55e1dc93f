"""Compressive resistance of truss members after section loss.

Pure provision functions first (vectorised over numpy arrays; kip, in^2, ksi), then
``compression_checks`` which evaluates them at every location of a ``SectionReport``.
Effect of the width-thickness check (AASHTO LRFD Table 6.9.4.2-1 limits): the squash load is
P_o = Q F_y A_g with Q = Q_s Q_a. Slender UNSTIFFENED elements (channel flanges, angle legs) give
Q_s, the least over the elements. Slender STIFFENED elements (webs, cover plates) count with
their effective width b_e (AISC 360-10 E7.2, Eq. E7-18, f = F_cr of the member with Q = 1.0):
Q_a = A_eff / A_g with A_eff = A_g - sum (b - b_e) t; a warning states b_e and Q_a.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from rating.capacity.checks import Check, Sense
from rating.capacity.sections import (
    AreaProperties,
    ElementAtLocation,
    SectionAtLocation,
    SectionReport,
)
from rating.capacity.tension import SECONDARY_ROLES
from rating.capacity.torsion import TorsionProperties, torsion_properties
from rating.model import CONNECTOR_WORDS, ConnectorKind, Connectors, Material, MemberRole

PHI_C = 0.95
"""Resistance factor for axial compression, AASHTO LRFD 6.5.4.2. [value from memory]"""
K_PINNED = 0.875
"""K, truss member with pinned ends, AASHTO LRFD 4.6.2.5. [value from memory]"""
K_RIVETED = 0.75
"""Effective length factor, truss member with riveted (bolted/welded) ends, AASHTO LRFD 4.6.2.5.
[value from memory]"""

K_UNSTIFFENED = 0.56
"""b/t limit coefficient, flanges of channels and rolled shapes, LRFD Table 6.9.4.2-1. [value
from memory]"""
K_UNSTIFFENED_SLENDER = 1.03
"""Upper coefficient of the Q_s transition, AISC 360-10 E7.1(a). [value from memory]"""
K_LEG = 0.45
"""b/t limit coefficient, legs of angles standing apart and all other unstiffened elements,
LRFD Table 6.9.4.2.1-1; AISC 360-10 E7.1(c). [value from memory]"""
K_LEG_SLENDER = 0.91
"""Upper coefficient of the Q_s transition for such legs, AISC 360-10 E7.1(c). [value from
memory]"""
K_PLATE = 1.40
"""b/t limit coefficient, cover plates between lines of connectors, AASHTO LRFD Table 6.9.4.2-1.
[value from memory]"""
K_WEB = 1.49
"""b/t limit coefficient, webs supported on two edges, LRFD Table 6.9.4.2-1. [value from memory]"""
K_EFFECTIVE_WIDTH = 1.92
"""Leading coefficient of b_e, stiffened elements, AISC 360-10 Eq. E7-18. [value from memory]"""
K_EFFECTIVE_WIDTH_REDUCTION = 0.34
"""Coefficient of the reduction term of b_e, AISC 360-10 Eq. E7-18. [value from memory]"""
K_EFFECTIVE_WIDTH_ONSET = 1.49
"""Eq. E7-18 applies where b/t >= 1.49 sqrt(E/f), AISC 360-10 E7.2(b). [value from memory]"""


def nominal_compressive_resistance(A_g, F_y, E, KL_r, Q=1.0):
    """Nominal compressive resistance P_n of a member, kip (vectorised).

    AASHTO LRFD 6.9.4.1.1, Eqs. 6.9.4.1.1-1 and -2 (P_o = Q F_y A_g). [value from memory]

    Args:
        A_g: gross area, in^2. F_y, E: ksi. KL_r: effective slenderness (dimensionless).
        Q: slender-element reduction factor (1.0 for nonslender elements).
    """
    A_g = np.asarray(A_g, dtype=float)
    KL_r = np.asarray(KL_r, dtype=float)
    P_o = np.asarray(Q, dtype=float) * F_y * A_g
    with np.errstate(divide="ignore", invalid="ignore"):
        P_e = np.where(KL_r > 0, math.pi**2 * E * A_g / np.where(KL_r > 0, KL_r, 1.0) ** 2,
                       np.inf)
        ratio = np.where(P_e > 0, P_o / P_e, np.inf)
        P_n = np.where(ratio <= 1.0 / 0.44, 0.658**ratio * P_o, 0.877 * P_e)
    P_n = np.where(A_g > 0, P_n, 0.0)
    return P_n if P_n.ndim else float(P_n)


G_OVER_E = 0.385
"""Shear modulus over Young's modulus of steel, G = 0.385 E, AASHTO LRFD 6.9.4.1.3. [value
from memory]"""
K_Z = 1.0
"""Effective length factor for torsional buckling of a truss member between panel points:
its pins hold its ends against twisting but not against warping (common practice)."""


def _euler_kip(E: float, A_g: float, KL_r: float) -> float:
    """Flexural buckling load pi^2 E A_g / (KL/r)^2, kip (AASHTO LRFD Eq. 6.9.4.1.2-1
    [value from memory]); zero for an infinite slenderness."""
    if not math.isfinite(KL_r):
        return 0.0
    return math.pi ** 2 * E * A_g / KL_r ** 2 if KL_r > 0 else math.inf


def torsional_buckling_load(tp: TorsionProperties, E: float, G: float, P_ex: float,
                            P_ey: float, KL_z_in: float) -> tuple[float, str]:
    """The elastic torsional or flexural-torsional buckling load P_e, kip, and its mode.

    AASHTO LRFD 6.9.4.1.3 [value from memory]: P_ez = (pi^2 E C_w / (K_z l_z)^2 + G J) /
    r_o^2, r_o^2 = x_o^2 + y_o^2 + (I_x + I_y)/A_g; a doubly symmetric section buckles in
    torsion at P_ez (Eq. 6.9.4.1.3-1), a singly symmetric one at the lower root of
    Eq. 6.9.4.1.3-2, an unsymmetric one at the least root of the cubic Eq. 6.9.4.1.3-3. All
    three are the least eigenvalue P, among the modes that twist, of

        | P_ey - P     c          -P y_o          |
        | c            P_ex - P    P x_o          |  = 0,  c = I_xy sqrt(P_ex P_ey / (I_x I_y))
        | -P y_o       P x_o       r_o^2 (P_ez - P)|

    (displacements along x and y and the twist about the shear centre; Timoshenko and Gere,
    *Theory of Elastic Stability*, 2nd ed., 1961, Art. 5.4 [value from memory]), which with
    c = 0 (principal axes) is the standard's cubic; c carries a product of inertia left by
    uneven loss, with each axis's own effective length.

    Args:
        tp: the section's torsion and warping properties. E, G: ksi.
        P_ex, P_ey: flexural buckling loads about x and y, kip (with the modified slenderness
            of a built-up member where it applies).
        KL_z_in: the effective length for twisting, in.
    Returns:
        P_e, the least load of a mode that twists (a purely flexural mode, about an axis the
        twist does not couple with, is the flexural check's own), and the mode's name,
        "torsional" (no shear-centre offset) or "flexural-torsional".
    """
    r_o2 = tp.r_o_in ** 2
    P_ez = (math.pi ** 2 * E * tp.C_w_in6 / KL_z_in ** 2 + G * tp.J_in4) / r_o2
    x_o, y_o = tp.x_o_in, tp.y_o_in
    coupled = math.hypot(x_o, y_o) > 1e-6 * math.sqrt(r_o2)
    if not coupled:
        x_o = y_o = 0.0  # (round-off of a symmetric section: the twist alone, exactly)
        if tp.area.I_xy_in4 == 0.0:
            return P_ez, "torsional"
    area = tp.area
    c = area.I_xy_in4 * math.sqrt(P_ex * P_ey / (area.I_x_in4 * area.I_y_in4))
    stiffness = np.array([[P_ey, c, 0.0], [c, P_ex, 0.0], [0.0, 0.0, r_o2 * P_ez]])
    geometric = np.array([[1.0, 0.0, -y_o], [0.0, 1.0, x_o], [-y_o, x_o, r_o2]])
    # the generalized symmetric problem through the Cholesky factor of the (positive
    # definite) geometric matrix: eigenvalues of L^-1 K L^-T
    L_inv = np.linalg.inv(np.linalg.cholesky(geometric))
    P, W = np.linalg.eigh(L_inv @ stiffness @ L_inv.T)
    modes = L_inv.T @ W  # (u, v, twist) of each mode, by column
    twists = np.abs(modes[2]) * math.sqrt(r_o2) > 1e-9 * np.linalg.norm(modes[:2], axis=0)
    return (float(P[twists].min()), "flexural-torsional" if coupled else "torsional")


def effective_length_factor(end_condition: str = "pinned", *, K_pinned: float = K_PINNED,
                            K_riveted: float = K_RIVETED) -> float:
    """K for a truss member: pinned ends 0.875, riveted/bolted/welded ends 0.75.

    AASHTO LRFD 4.6.2.5. [value from memory]
    """
    key = end_condition.strip().lower()
    if key in ("pinned", "pin", "pin-connected"):
        return K_pinned
    if key in ("riveted", "bolted", "welded"):
        return K_riveted
    raise ValueError(f"unknown end condition {end_condition!r}; use 'pinned' or 'riveted'")


def modified_slenderness(KL_r_o, a_in, r_i_in):
    """(KL/r)_m = sqrt((KL/r)_o^2 + (a/r_i)^2), built-up member with snug-tight connectors.

    Chen (ed.), Structural Engineering Handbook, Sec. 31.9. [V]
    """
    return np.sqrt(np.asarray(KL_r_o, dtype=float) ** 2 + (np.asarray(a_in) / r_i_in) ** 2)


def unstiffened_Q(b_t, F_y, E, *, k_limit: float = K_UNSTIFFENED,
                  k_slender: float = K_UNSTIFFENED_SLENDER, leg: bool = False):
    """Q_s of an unstiffened element (flange, outstanding leg) from its b/t (vectorised).

    AASHTO LRFD 6.9.4.2.2 (same form as AISC 360-10 Eqs. E7-4 to E7-6) [value from memory].
    ``leg``: a leg of an angle that stands apart from the other parts (the angles of a laced
    post), an "other unstiffened element" of LRFD Table 6.9.4.2.1-1, k = 0.45: AISC 360-10
    Eqs. E7-10 to E7-12, Q_s = 1.34 - 0.76 (b/t) sqrt(F_y/E) up to 0.91 sqrt(E/F_y), then
    0.53 E / (F_y (b/t)^2) [value from memory].
    """
    lam = np.asarray(b_t, dtype=float)
    s = math.sqrt(E / F_y)
    if leg:
        k_limit, k_slender, a, b, c = K_LEG, K_LEG_SLENDER, 1.34, 0.76, 0.53
    else:
        a, b, c = 1.415, 0.74, 0.69
    with np.errstate(divide="ignore"):
        q = np.where(lam <= k_limit * s, 1.0,
                     np.where(lam < k_slender * s, a - b * lam * math.sqrt(F_y / E),
                              c * E / (F_y * np.maximum(lam, 1e-12) ** 2)))
    return q if q.ndim else float(q)


def element_Q(e: ElementAtLocation, F_y: float, E: float) -> float:
    """Q_s of one unstiffened element of a built-up section: an angle's leg by the form for
    legs standing apart, any other (a channel's flange) as a flange (:func:`unstiffened_Q`)."""
    return float(unstiffened_Q(e.b_in / e.t_in, F_y, E, leg=e.element.startswith("leg")))


def width_thickness_limit(stiffened: bool, element: str, F_y: float, E: float) -> float:
    """Limiting b/t = k sqrt(E/F_y): 0.56 flanges, 0.45 legs of angles (element "leg ..."),
    1.49 webs, 1.40 plates.

    AASHTO LRFD 6.9.4.2, Table 6.9.4.2-1. [value from memory]
    """
    if not stiffened:
        k = K_LEG if element.startswith("leg") else K_UNSTIFFENED
    elif element == "web":
        k = K_WEB
    else:
        k = K_PLATE
    return k * math.sqrt(E / F_y)


def stiffened_effective_width(b_in, t_in, f, E):
    """Effective width b_e of a uniformly compressed stiffened element, in (vectorised).

    AISC 360-10 E7.2(b), Eq. E7-18 (stiffened elements other than flanges of square and
    rectangular sections of uniform thickness): where b/t >= 1.49 sqrt(E/f),
    b_e = 1.92 t sqrt(E/f) [1 - 0.34 / (b/t) sqrt(E/f)] <= b, else b_e = b. The same form is
    AASHTO LRFD 6.9.4.2.2 in the editions that use Q. [value from memory]

    Args:
        b_in, t_in: width and thickness of the element, in (t > 0).
        f: stress on the element, ksi (AISC 360-10 E7.2: F_cr of the member with Q = 1.0).
        E: ksi.
    """
    b = np.asarray(b_in, dtype=float)
    t = np.asarray(t_in, dtype=float)
    s = np.sqrt(E / np.asarray(f, dtype=float))
    lam = b / t
    b_e = K_EFFECTIVE_WIDTH * t * s * (1.0 - K_EFFECTIVE_WIDTH_REDUCTION / lam * s)
    # below the onset Eq. E7-18 is outside its range (it would fall again, even below zero)
    out = np.where(lam >= K_EFFECTIVE_WIDTH_ONSET * s, np.minimum(b_e, b), b)
    return out if out.ndim else float(out)


def stiffened_Q_a(A_g: float, b_in, t_in, f: float, E: float) -> float:
    """Q_a = A_eff / A_g, A_eff = A_g - sum (b - b_e) t over the slender stiffened elements.

    AISC 360-10 E7.2, Eq. E7-16, with b_e of Eq. E7-18 (``stiffened_effective_width``).
    [value from memory]

    Args:
        A_g: gross area, in^2 (> 0). b_in, t_in: widths and thicknesses of the slender
            stiffened elements, in. f: F_cr of the member with Q = 1.0, ksi. E: ksi.
    """
    b = np.asarray(b_in, dtype=float)
    t = np.asarray(t_in, dtype=float)
    lost = float(np.sum((b - stiffened_effective_width(b, t, f, E)) * t))
    return (A_g - lost) / A_g


@dataclass(frozen=True)
class CompressionResult:
    """The compression check of one member (flexural buckling at the governing location, or zero
    resistance) with its warnings and assumptions, K, the governing KL/r (inf: none) and the
    slender-element factor Q = Q_s Q_a at the governing location."""

    checks: tuple[Check, ...]
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    K: float
    KL_r: float  # governing effective slenderness at the governing location (inf: none)
    Q: float
    # "singly symmetric", "unsymmetric" or UNKNOWN_SYMMETRY (a rolled shape): a section
    # whose torsional and flexural-torsional buckling could not be computed; else ""
    torsional_unchecked: str = ""
    # laced or battened and taken as closed: the open form's least P_n over the flexural P_n
    # (at most 1.0; 1.0 where the open form does not buckle lower)
    open_ratio: float = 1.0


NOTHING_LEFT = "no section is left"
"""Why a location has no torsional check: nothing carries load there (its resistance is
zero in flexural buckling already)."""

UNKNOWN_SYMMETRY = "unknown symmetry"
"""The symmetry of a rolled shape whose shear centre is not given (or whose principal axes are
not x and y), for its flag when its torsional buckling is not checked."""


def _Q_at(s: SectionAtLocation, F_y: float,
          E: float) -> tuple[float, list[ElementAtLocation]]:
    """Q_s (unstiffened elements) and the slender stiffened elements at a location.

    AASHTO LRFD 6.9.4.2, Table 6.9.4.2-1, and 6.9.4.2.2. [value from memory]
    """
    un = [e for e in s.elements if not e.stiffened and e.t_in > 0]
    Q = min((element_Q(e, F_y, E) for e in un), default=1.0)
    slender = [e for e in s.elements if e.stiffened and e.t_in > 0
               and e.b_in / e.t_in > width_thickness_limit(True, e.element, F_y, E)]
    return Q, slender


def _Q_a_at(s: SectionAtLocation, slender: list[ElementAtLocation], f: float, F_y: float,
            E: float) -> tuple[float, str]:
    """Q_a at a location and the statement of its slender stiffened elements.

    AISC 360-10 E7.2, Eqs. E7-16 and E7-18 (f = F_cr with Q = 1.0). [value from memory]
    """
    b = np.array([e.b_in for e in slender])
    t = np.array([e.t_in for e in slender])
    b_e = np.atleast_1d(stiffened_effective_width(b, t, f, E))
    notes = [f"{e.part} {e.element} b/t = {e.b_in / e.t_in:.1f} > "
             f"{width_thickness_limit(True, e.element, F_y, E):.1f}, b_e = {be:.2f} in of "
             f"{e.b_in:g} in" for e, be in zip(slender, b_e, strict=True)]  # (each length
    # with its unit: an SI report converts each "<number> in")
    return stiffened_Q_a(s.A_g_in2, b, t, f, E), "; ".join(notes)


def _Q_text(Q_s: float, Q_a: float) -> str:
    """Q for the check's detail: Q_s Q_a written out where Q_a reduces."""
    if Q_a == 1.0:
        return f"Q = {Q_s:.3f}"
    return f"Q = Q_s Q_a = {Q_s:.3f} x {Q_a:.3f} = {Q_s * Q_a:.3f}"


TORSIONAL_NOTE = (
    "Members in compression are checked for flexural buckling about both axes (AASHTO LRFD "
    "6.9.4.1.1, with Q for slender elements, and the modified slenderness of built-up "
    "members) [value from memory]. Torsional and flexural-torsional buckling (LRFD "
    "6.9.4.1.3 [value from memory]) are checked for built-up members whose parts are riveted "
    "into one section: its torsional constant J, warping constant C_w and shear centre are "
    "found by finite elements on its rectangles after the loss at each location (the "
    "riveted faces taken as continuous), with K_z = 1.0 between panel points and "
    "G = 0.385 E. A section open on a face that lacing or battens cross (a chord of two "
    "channels with a cover plate on one side and lacing on the other) is taken as closed by "
    "them, so that it buckles in flexure (common practice for lacing or battens in sound "
    "condition); where its open form would buckle lower, the member's warning gives that "
    "resistance. For a rolled shape they are checked where the Rolled sheet gives its J, "
    "C_w and shear centre about principal axes x and y; an angle, given with its least "
    "radius r_z, is checked in flexure about its least axis over the longer effective "
    "length and its torsional buckling is left to the engineer. "
    "Members whose check could not be made (a rolled shape without those properties, a "
    "built-up section whose parts do not make one section) and that are not doubly "
    "symmetric are named in their own notes, for the engineer to check by hand.")
"""Said once in a report with any compression member (the same words for every member)."""


def _torsional_at(s: SectionAtLocation, E: float, P_ex: float, P_ey: float, KL_z_in: float,
                  found: dict[tuple, TorsionProperties | str]
                  ) -> tuple[float, str, TorsionProperties] | str:
    """Elastic torsional or flexural-torsional buckling load at one location (see
    ``torsional_buckling_load``), or why it cannot be found there. ``found`` keeps the
    torsion analysis of each distinct set of rectangles for this call."""
    tp = found.get(s.torsion_rects)
    if tp is None:
        tp = found[s.torsion_rects] = torsion_properties(s.torsion_rects)
    if isinstance(tp, str):
        return tp
    P_e, mode = torsional_buckling_load(tp, E, G_OVER_E * E, P_ex, P_ey, KL_z_in)
    return P_e, mode, tp


def _tabulated_at(s: SectionAtLocation, E: float, P_ex: float, P_ey: float, KL_z_in: float
                  ) -> tuple[float, str, TorsionProperties] | str:
    """As ``_torsional_at`` for a rolled shape, from its tabulated J, C_w and shear centre
    (after the loss: rating.capacity.sections.rolled_torsion_after_loss) about its principal
    axes x and y."""
    if s.A_g_in2 <= 0.0:
        return NOTHING_LEFT
    if s.r_z_in is not None:
        return "x and y are not its principal axes (r_z given)"
    if s.torsion_tabulated is None:
        return ("J is not given on the Rolled sheet" if s.rolled_symmetry else
                "J, C_w and the shear centre are not given on the Rolled sheet")
    J, C_w, x_o, y_o = s.torsion_tabulated
    A = s.A_g_in2
    tp = TorsionProperties(AreaProperties(A, 0.0, 0.0, A * s.r_x_in ** 2, A * s.r_y_in ** 2,
                                          0.0), J, x_o, y_o, C_w, 0)
    P_e, mode = torsional_buckling_load(tp, E, G_OVER_E * E, P_ex, P_ey, KL_z_in)
    return P_e, mode, tp


def compression_checks(report: SectionReport, material: Material, *, K: float,
                       length_ft: float, role: MemberRole | None = None,
                       tension_only: bool = False, connectors: Connectors | None = None,
                       phi_c: float = PHI_C, limit_primary: float = 120.0,
                       limit_secondary: float = 140.0,
                       KL_out_of_plane_ft: float | None = None,
                       torsion_found: dict | None = None,
                       connectors_close: bool = True) -> CompressionResult:
    """Flexural buckling of the member at its governing location, or zero if tension-only;
    for a built-up member also torsional and flexural-torsional buckling, which replaces it
    where lower (an open section; see ``_torsional_notes`` for a laced or battened one).

    AASHTO LRFD 6.9.4.1.1 with Q per 6.9.4.2 [value from memory]; Chen Sec. 31.9 [V];
    AASHTO LRFD 6.9.4.1.3 [value from memory].

    Args:
        K: effective length factor. length_ft: panel-point to panel-point length, ft.
        tension_only: the analysis treats the member as tension-only (a counter): no
            compressive resistance is counted.
        limit_primary, limit_secondary: KL/r limits for a warning (AASHTO LRFD 6.9.3)
            [value from memory].
        KL_out_of_plane_ft: the effective length out of the truss plane where it is found
            apart (a pony truss's chord on its U-frames, rating.analysis.uframe); else K L.
        torsion_found: the torsion analysis (``rating.capacity.torsion``) of each distinct
            set of a built-up section's rectangles already found, by those rectangles; this
            call adds its own. None: kept for this call only.
        connectors_close: sound lacing or battens close the section they cross (the rule);
            False rates the section open, as a sensitivity (rating.lrfr.engine).
    """
    m = report.member
    warnings: list[str] = []
    assumptions: list[str] = []
    base = report.tension[0].location
    if report.kind in ("eyebar set", "rod set") or tension_only:
        why = (f"{report.kind.split()[0]}s carry no compression" if report.kind in
               ("eyebar set", "rod set") else "the member is tension-only in the analysis")
        assumptions.append(f"member {m}: compressive resistance taken as zero ({why})")
        chk = Check("compression: tension-only member", Sense.COMPRESSION, phi_c, 0.0,
                    f"{why} [common practice]", base, why)
        return CompressionResult((chk,), tuple(warnings), tuple(assumptions), K, math.inf, 1.0)

    E, Fy = material.E, material.F_y
    C = report.compression
    L_in = length_ft * 12.0
    # a handful of locations: plain Python lists (numpy's call overhead would dominate); each
    # value is the same IEEE operation as the element-wise numpy form (no r: KL/r infinite)
    A = [s.A_g_in2 for s in C]
    KL_in = K * L_in
    KL_y = KL_in if KL_out_of_plane_ft is None else KL_out_of_plane_ft * 12.0
    klr_x = [KL_in / s.r_x_in if s.r_x_in > 0 else math.inf for s in C]
    klr_y = [KL_y / s.r_y_in if s.r_y_in > 0 else math.inf for s in C]
    # a rolled shape whose least principal axis is neither x nor y (an angle) buckles about
    # it over the longer of the two effective lengths (conservative; common practice)
    klr_z = [max(KL_in, KL_y) / s.r_z_in if s.r_z_in else 0.0 for s in C]
    use_mod = (connectors is not None and connectors.kind is not ConnectorKind.SOLID)
    if use_mod:
        # the lacing or battens themselves are not rated (common practice: they are taken as
        # sound and able to make the parts act together; inspection judges them)
        assumptions.append(f"member {m}: the {connectors.kind.value} bars or plates and their "
                           "rivets are not checked; they are taken as sound and able to make "
                           "the parts act together unless the Findings sheet records them "
                           f"out of action (component '{connectors.kind.value}'; loose, bent "
                           f"or missing {connectors.kind.value} lowers the buckling resistance: "
                           "engineer to judge from the inspection)")
    if use_mod and connectors.spacing_in is None:
        warnings.append(f"member {m}: {connectors.kind.value} spacing not recorded; the modified "
                        "slenderness of the built-up member could not be applied "
                        "(unconservative)")
        use_mod = False
    defective = report.connectors_defective
    if use_mod:
        # a connection lost doubles the length between sound ones (rating.capacity.sections
        # ._connector_notes)
        a = connectors.spacing_in * (2.0 if defective else 1.0)
        for i, s in enumerate(C):
            if s.modified_axis is None or not s.r_i_in:
                continue
            if s.modified_axis == "x":
                klr_x[i] = float(modified_slenderness(klr_x[i], a, s.r_i_in))
            else:
                klr_y[i] = float(modified_slenderness(klr_y[i], a, s.r_i_in))
        if not connectors.snug_tight:
            assumptions.append(f"member {m}: the snug-tight form of the modified slenderness "
                               "is used for all connectors (conservative)")
        s0 = C[0]
        if s0.modified_axis is not None and s0.r_i_in:
            axis = "in-plane" if s0.modified_axis == "x" else "out-of-plane"
            assumptions.append(f"member {m}: modified slenderness (Chen Sec. 31.9) applied to "
                               f"{axis} buckling, a = {a:g} in, r_i = {s0.r_i_in:.3f} in")
            ratio = a / s0.r_i_in
            gov = max(klr_x[0], klr_y[0])
            if ratio > 0.75 * gov:
                warnings.append(f"member {m}: a/r_i = {ratio:.0f} between connectors exceeds "
                                f"3/4 of the member's KL/r = {gov:.0f} (AISC 360-10 E6.2, value "
                                "from memory); the components may buckle between connectors")
    # np.maximum's rule: the first on a tie, NaN if either is NaN
    klr = [x if x >= y or x != x else y for x, y in zip(klr_x, klr_y, strict=True)]
    klr = [z if z > v else v for v, z in zip(klr, klr_z, strict=True)]
    klr_n = [v if math.isfinite(v) else 1e9 for v in klr]
    Q_s, slender = zip(*(_Q_at(s, Fy, E) for s in C), strict=True)
    Q_a = [1.0] * len(C)
    if any(slender):
        # AISC 360-10 E7.2: f = F_cr of the member with Q = 1.0 at the same location and
        # slenderness (no iteration on Q) [value from memory]
        F_cr1 = np.atleast_1d(nominal_compressive_resistance(A, Fy, E, klr_n)) \
            / np.where(np.asarray(A) > 0, A, 1.0)
        for i, s in enumerate(C):
            if not slender[i] or A[i] <= 0:
                continue
            f = float(F_cr1[i])
            Q_a[i], notes = _Q_a_at(s, slender[i], f, Fy, E)
            warnings.append(f"member {m}: slender stiffened element(s) at {s.location.describe()}"
                            f" ({notes}); LRFD 6.9.4.2 limit exceeded: effective width b_e by "
                            f"AISC 360-10 E7.2, Eq. E7-18 with f = F_cr(Q = 1) = {f:.2f} ksi "
                            f"[value from memory], Q_a = A_eff/A_g = {Q_a[i]:.3f} (Eq. E7-16)")
    # Q_a 1.0 leaves Q_s as it is, to the bit
    Q = [qs * qa for qs, qa in zip(Q_s, Q_a, strict=True)]
    Pn = np.atleast_1d(nominal_compressive_resistance(A, Fy, E, klr_n, Q))
    k = int(np.argmin(Pn))
    # the symmetry of the section rated (a part removed by the inspection is out of it)
    shape = C[0].properties.symmetry() if C[0].properties else ""
    torsional: list[tuple[float, str, TorsionProperties] | str] = []
    if report.kind == "built-up" and shape:
        found = {} if torsion_found is None else torsion_found
        for i, s in enumerate(C):
            torsional.append(_torsional_at(s, E, _euler_kip(E, A[i], klr_x[i]),
                                           _euler_kip(E, A[i], klr_y[i]), K_Z * L_in, found))
    elif report.kind == "rolled shape":
        shape = C[0].rolled_symmetry or UNKNOWN_SYMMETRY
        torsional = [_tabulated_at(s, E, _euler_kip(E, A[i], klr_x[i]),
                                   _euler_kip(E, A[i], klr_y[i]), K_Z * L_in)
                     for i, s in enumerate(C)]
        if C[0].r_z_in is not None:
            assumptions.append(f"member {m}: rated as a concentric column, in flexural "
                               f"buckling about its least axis (r_z = {C[0].r_z_in:g} in); a "
                               "single angle connected through one leg also carries that "
                               "connection's eccentricity, for which AASHTO LRFD 6.9.4.4 "
                               "[value from memory] gives an effective slenderness: the "
                               "engineer should check it by hand where the member governs")
        if C[0].torsion_tabulated is not None:
            assumptions.append(f"member {m}: J, C_w and the shear centre as tabulated on the "
                               "Rolled sheet; a percent loss thins every wall of the shape, "
                               "J with the cube of what is left and C_w in proportion "
                               "(thin-walled open section; common practice)")
    def on_curve(i: int, t: tuple[float, str, TorsionProperties] | str) -> float:
        # the torsional mode's resistance on the same column curve: the slenderness whose
        # Euler load is that mode's P_e (inf where it was not found)
        if isinstance(t, str):
            return math.inf
        if t[0] <= 0.0:
            return 0.0
        return float(nominal_compressive_resistance(A[i], Fy, E,
                                                    math.pi * math.sqrt(E * A[i] / t[0]), Q[i]))

    Pn_t = [on_curve(i, t) for i, t in enumerate(torsional)]
    k_t = min(range(len(Pn_t)), key=Pn_t.__getitem__) if Pn_t else -1
    if Q_s[k] < 1.0:
        q_txt = f"Q = {Q[k]:.3f}" if Q_a[k] == 1.0 else f"Q_s = {Q_s[k]:.3f}"
        warnings.append(f"member {m}: slender unstiffened element(s); {q_txt} reduces the "
                        "squash load (LRFD 6.9.4.2.2)")
    if report.kind == "rolled shape":
        assumptions.append(f"member {m}: rolled shape taken as nonslender (no element "
                           "dimensions)")
    assumptions.append(TORSIONAL_NOTE)
    # lacing or battens across the open face: the rating takes them as closing the section
    closed_by = (CONNECTOR_WORDS[connectors.kind][0] if connectors is not None
                 and not defective and connectors_close
                 and connectors.kind in CONNECTOR_WORDS else "")
    unchecked = _torsional_notes(m, shape, C, torsional, Pn_t, k_t, length_ft, closed_by,
                                 float(Pn[k]), assumptions, warnings)
    g = float(klr[0])
    lim = limit_secondary if role in SECONDARY_ROLES else limit_primary
    if math.isfinite(g) and g > lim:
        shown = f"{g:.0f}" if round(g) > lim else f"{g:.1f}"  # (not "120 exceeds 120")
        warnings.append(f"member {m}: compression slenderness KL/r = {shown} exceeds {lim:g} "
                        "(AASHTO LRFD 6.9.3, value from memory)")
    s = C[k]
    axis = "in-plane" if klr_x[k] >= klr_y[k] else "out-of-plane"
    if klr_z[k] > max(klr_x[k], klr_y[k]):
        axis = f"least principal axis, r_z = {s.r_z_in:g} in"
    out = ("" if KL_out_of_plane_ft is None else
           f", KL out of plane = {KL_out_of_plane_ft:.3f} ft (U-frames)")
    detail = (f"A_g = {A[k]:.3f} in2, K = {K:g}, L = {length_ft:g} ft{out}, KL/r = "
              f"{klr[k]:.1f} ({axis}), {_Q_text(Q_s[k], Q_a[k])}, F_y = {Fy:g} ksi, "
              f"E = {E:g} ksi")
    chk = Check("compression: flexural buckling", Sense.COMPRESSION, phi_c, float(Pn[k]),
                "AASHTO LRFD 6.9.4.1.1, Eqs. 6.9.4.1.1-1 and -2 [value from memory]",
                s.location, detail)
    if k_t >= 0 and Pn_t[k_t] < float(Pn[k]) * (1.0 - 1e-12) and not closed_by:
        # the torsional mode governs: its own location and quantities
        P_e, mode, tp = torsional[k_t]
        i = k_t
        detail = (f"A_g = {A[i]:.3f} in2, {_Q_text(Q_s[i], Q_a[i])}, F_y = {Fy:g} ksi, "
                  f"E = {E:g} ksi, G = {G_OVER_E:g} E; {_torsion_text(tp)}, K_z L = "
                  f"{K_Z * length_ft:g} ft, KL/r = {klr_x[i]:.1f} (in-plane), "
                  f"{klr_y[i]:.1f} (out-of-plane){out}: P_e = {P_e:.1f} kip; flexural "
                  f"buckling alone P_n = {float(Pn[k]):.1f} kip")
        chk = Check(f"compression: {mode} buckling", Sense.COMPRESSION, phi_c, Pn_t[i],
                    "AASHTO LRFD 6.9.4.1.3 with Eqs. 6.9.4.1.1-1 and -2 [value from memory]",
                    C[i].location, detail)
        k = i
    open_ratio = (Pn_t[k_t] / float(Pn[k]) if unchecked in ("laced", "battened")
                  and float(Pn[k]) > 0.0 else 1.0)
    return CompressionResult((chk,), tuple(warnings), tuple(assumptions), K, float(klr[k]),
                             float(Q[k]), unchecked, open_ratio)


def _torsion_text(tp: TorsionProperties) -> str:
    """The torsion analysis's quantities for a check's detail."""
    def at(v: float) -> str:
        return f"{v if abs(v) >= 0.005 else 0.0:.2f}"  # (never "-0.00")

    return (f"J = {tp.J_in4:.4g} in4, C_w = {tp.C_w_in6:.4g} in6, shear centre x_o = "
            f"{at(tp.x_o_in)} in, y_o = {at(tp.y_o_in)} in from the centroid, r_o = "
            f"{tp.r_o_in:.2f} in")


def _torsional_notes(m: str, shape: str, C: Sequence[SectionAtLocation],
                     torsional: Sequence[tuple[float, str, TorsionProperties] | str],
                     Pn_t: Sequence[float], k_t: int, length_ft: float, closed_by: str,
                     Pn_flexural: float, assumptions: list[str], warnings: list[str]) -> str:
    """The member's notes on its torsional and flexural-torsional buckling.

    Returns what the engine must say if the member decides a posting in compression: its
    as-built symmetry where some location could not be checked and the section is not
    doubly symmetric; "laced" or "battened" where the rating takes the lacing or battens as
    closing a section whose open form would buckle lower; "" otherwise.
    """
    if not torsional:
        return ""
    # (a location with nothing left has no resistance to check; its flexural P_n is zero)
    missed = [(s, t) for s, t in zip(C, torsional, strict=True) if isinstance(t, str)
              and s.A_g_in2 > 0.0]
    flag = ""
    if k_t >= 0 and math.isfinite(Pn_t[k_t]):
        _, mode, tp = torsional[k_t]
        found = (f"least P_n = {Pn_t[k_t]:.1f} kip ({mode}) at "
                 f"{C[k_t].location.describe()}: {_torsion_text(tp)}, K_z = {K_Z:g}, l_z = "
                 f"{length_ft:g} ft")
        if not closed_by:
            assumptions.append(f"member {m}: torsional and flexural-torsional buckling (AASHTO "
                               f"LRFD 6.9.4.1.3 [value from memory]) checked at each location; "
                               f"{found}")
        elif Pn_t[k_t] < Pn_flexural * (1.0 - 1e-12):
            flag = "laced" if closed_by == "lacing" else "battened"
            carry, leave = ("carries", "leaves") if closed_by == "lacing" else ("carry", "leave")
            # the same words for every such member (the report lists them once); the
            # numbers in the member's own note
            warnings.append(
                f"member {m}: the rating takes the {closed_by} as closing the section, which "
                f"then buckles in flexure (common practice for sound {closed_by}, which "
                f"{carry} the shear across the open face); open, the section would buckle "
                "lower, in torsional or flexural-torsional buckling (AASHTO LRFD 6.9.4.1.3 "
                "[value from memory]; the member's notes give both resistances). Loose, "
                f"broken, missing or bent {closed_by} {leave} it open: the engineer judges the "
                f"{closed_by} from the inspection, and records it so on the Findings sheet "
                f"(component '{closed_by}') to rate the member open")
            assumptions.append(
                f"member {m}: with the {closed_by} closing the section, flexural buckling "
                f"P_n = {Pn_flexural:.1f} kip; open, {mode} buckling "
                f"{100.0 * (1.0 - Pn_t[k_t] / Pn_flexural):.0f} % lower, {found}")
        else:
            assumptions.append(f"member {m}: flexural-torsional buckling of the section open "
                               f"on its {closed_by} face (AASHTO LRFD 6.9.4.1.3 [value from "
                               f"memory]) does not govern even with the {closed_by} taken as "
                               f"not closing it: {found}")
    if not missed or shape == "doubly symmetric" and all(
            t.startswith("the parts do not make one") for _, t in missed):
        return flag
    by_reason: dict[str, list[str]] = {}
    for s, t in missed:
        by_reason.setdefault(t, []).append(s.location.describe())
    where = "; ".join(f"at {', '.join(locs)}: {t}" for t, locs in by_reason.items())
    if shape == "doubly symmetric":
        assumptions.append(f"member {m}: torsional buckling not checked {where}")
        return flag
    what = ("a rolled shape, not shown to be doubly symmetric," if shape == UNKNOWN_SYMMETRY
            else f"an {shape} section" if shape[0] in "aeiou" else f"a {shape} section")
    assumptions.append(f"member {m}: {what} whose torsional and "
                       "flexural-torsional buckling (AASHTO LRFD 6.9.4.1.3 [value from "
                       f"memory]) could not be checked {where}; the engineer should check "
                       "them by hand")
    return shape
