"""Pins: moment and shear from the packing, combined flexure and shear, bearing of each plate.

Loading method (Berg, Safe Building, "Rivets, Riveting and Pins", Parts 10-15 [V]): each
member's force is shared over its plates on the pin in proportion to their thickness and acts
at each plate's mid-thickness, square to the pin, directed along the member (tension pulls the
pin toward the member's far end). The pin is a beam loaded by those forces; horizontal and
vertical components are taken separately and combined vectorially at each section.

External load at the joint (the floorbeam reaction, a vector in kip applied TO the pin, e.g.
(0, -R) for a floorbeam hung from the pin): shared by thickness over the packing items whose
``member`` is "floorbeam"; when there is none it acts at the pin's mid-length (between the
outer faces of the packing) and no plate bearing is checked for it.

Which form is used where: the rating uses AASHTO LRFD 6.7.6.2.1 (combined flexure and shear)
and 6.7.6.2.2 (bearing) for ``utilization``; the EN 1993-1-8 Table 3.10 forms are computed
beside it as an independent published cross-check (``en``) and never enter the rating.

Units: forces kip, lengths in, moments kip-in, stresses ksi. x is horizontal along the span,
y vertical, both in the truss plane; z runs along the pin from the outer face of its first
packing item.
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field

import numpy as np

from rating.capacity.materials import default_material
from rating.errors import InputError
from rating.model import EyebarSet, Material, MaterialKind, MemberDesign, Pin, TrussGeometry

PHI_F = 1.00
"""Resistance factor for flexure of pins, AASHTO LRFD 6.5.4.2. [value from memory]"""
PHI_V = 1.00
"""Resistance factor for shear of pins, AASHTO LRFD 6.5.4.2. [value from memory]"""
PHI_B = 1.00
"""Resistance factor for bearing on pins, AASHTO LRFD 6.5.4.2. [value from memory]"""
INTERACTION_LIMIT = 0.95
"""Right side of the pin interaction equation, LRFD Eq. 6.7.6.2.1-1. [value from memory]"""
GAMMA_M0 = 1.00
"""Partial factor gamma_M0, EN 1993-1-1 6.1 (recommended value). [value from memory]"""
GAMMA_M2 = 1.25
"""Partial factor gamma_M2, EN 1993-1-8 Table 2.1 (recommended value). [value from memory]"""
WORN_CLEARANCE_IN = 0.25
"""A pin smaller than its hole by more than this is worn far past the fit (common practice):
rated, with a warning that bears on the decision."""
MAX_CLEARANCE_IN = 1.0
"""A pin smaller than its hole by more than this is taken as a data error (common practice)."""
PIN_WORN = "PIN WORN"
FIT_CLEARANCE_IN = 1.0 / 32.0
"""Hole not more than the pin + 1/32 in, AISC LRFD 1999 D3.2. [V]"""
FLOORBEAM = "floorbeam"


def lrfd_flexure_shear(M_u, V_u, D, F_y, phi_f: float = PHI_F, phi_v: float = PHI_V):
    """Left side of 6 M_u/(phi_f D^3 F_y) + (2.2 V_u/(phi_v D^2 F_y))^3 <= 0.95 (vectorised).

    AASHTO LRFD 6.7.6.2.1, Eq. 6.7.6.2.1-1. [value from memory]
    """
    M_u = np.asarray(M_u, dtype=float)
    v = np.asarray(V_u, dtype=float) * (2.2 / (phi_v * D**2 * F_y))
    return M_u * (6.0 / (phi_f * D**3 * F_y)) + v * v * v


def lrfd_bearing_nominal(t, D, F_y):
    """Nominal bearing of a plate on a pin, (R_pB)_n = 1.5 t D F_y, kip.

    AASHTO LRFD 6.7.6.2.2, Eq. 6.7.6.2.2-2. [value from memory]
    """
    return 1.5 * np.asarray(t, dtype=float) * D * F_y


def en_moment_resistance(D, f_yp, gamma_M0: float = GAMMA_M0):
    """M_Rd = 1.5 W_el f_yp / gamma_M0 with W_el = pi D^3 / 32, kip-in.

    EN 1993-1-8 Table 3.10, bending resistance of the pin. [V]
    """
    return 1.5 * (math.pi * D**3 / 32.0) * f_yp / gamma_M0


def en_shear_resistance(D, f_up, gamma_M2: float = GAMMA_M2):
    """F_v,Rd = 0.6 A f_up / gamma_M2 with A = pi D^2 / 4 (one shear plane), kip.

    EN 1993-1-8 Table 3.10, shear resistance of the pin. [V]
    """
    return 0.6 * (math.pi * D**2 / 4.0) * f_up / gamma_M2


def en_bearing_resistance(t, D, f_y, gamma_M0: float = GAMMA_M0):
    """F_b,Rd = 1.5 t d f_y / gamma_M0 (f_y the lower of plate and pin), kip.

    EN 1993-1-8 Table 3.10, bearing resistance of the plate and the pin. [V]
    """
    return 1.5 * np.asarray(t, dtype=float) * D * f_y / gamma_M0


def en_interaction(M, V, M_Rd, F_v_Rd):
    """(M_Ed/M_Rd)^2 + (F_v,Ed/F_v,Rd)^2 <= 1 (vectorised).

    EN 1993-1-8 Table 3.10, combined bending and shear of the pin. [V]
    """
    return (np.asarray(M, dtype=float) / M_Rd) ** 2 + (np.asarray(V, dtype=float) / F_v_Rd) ** 2


@dataclass(frozen=True)
class MemberAction:
    """One member's axial force at the joint (kip, tension positive) and the unit vector in
    the truss plane (x horizontal, y vertical) from the joint toward the member's far end."""

    member: str
    force_kip: float
    direction: tuple[float, float]


@dataclass(frozen=True)
class PlateLoad:
    """One packing item and the force it puts on the pin (kip), with its bearing check."""

    position: int = field(metadata={"label": "Item", "unit": ""})
    member: str | None = field(metadata={"label": "Member", "unit": ""})
    thickness_in: float = field(metadata={"label": "t", "unit": "in"})
    z_in: float = field(metadata={"label": "z (mid-thickness)", "unit": "in"})
    F_h_kip: float = field(metadata={"label": "F horizontal", "unit": "kip"})
    F_v_kip: float = field(metadata={"label": "F vertical", "unit": "kip"})
    bearing_resistance_kip: float = field(metadata={"label": "phi_b R_pB", "unit": "kip"})
    bearing_utilization: float = field(metadata={"label": "Bearing use", "unit": ""})

    @property
    def F_kip(self) -> float:
        return math.hypot(self.F_h_kip, self.F_v_kip)


@dataclass(frozen=True)
class PinSection:
    """Moment and shear at a load point along the pin (kip-in, kip).

    ``M_h``/``V_h`` come from the horizontal force components, ``M_v``/``V_v`` from the
    vertical ones (taken from the first end); ``M_kip_in``/``V_kip`` are the combined
    magnitudes used in the checks (the larger of those taken from either end, and for V the
    larger side of the load point).
    """

    z_in: float = field(metadata={"label": "z", "unit": "in"})
    M_h_kip_in: float = field(metadata={"label": "M horizontal", "unit": "kip-in"})
    M_v_kip_in: float = field(metadata={"label": "M vertical", "unit": "kip-in"})
    M_kip_in: float = field(metadata={"label": "M", "unit": "kip-in"})
    V_h_kip: float = field(metadata={"label": "V horizontal", "unit": "kip"})
    V_v_kip: float = field(metadata={"label": "V vertical", "unit": "kip"})
    V_kip: float = field(metadata={"label": "V", "unit": "kip"})
    lrfd: float = field(metadata={"label": "LRFD 6.7.6.2.1 left side", "unit": ""})
    en: float = field(metadata={"label": "EN 1993-1-8 combined", "unit": ""})


@dataclass(frozen=True)
class EnPinCheck:
    """The EN 1993-1-8 Table 3.10 cross-check (not used in the rating)."""

    M_Rd_kip_in: float
    F_v_Rd_kip: float
    interaction: float  # governing (M/M_Rd)^2 + (V/F_v,Rd)^2
    z_in: float
    bearing_utilization: float
    utilization: float


@dataclass(frozen=True)
class PinCheck:
    """Pin at one joint under one load state.

    ``utilization`` (1.0 = at the limit) is the larger of the LRFD 6.7.6.2.1 left side / 0.95
    at the governing section and the worst plate bearing ratio; it is what a caller drives to
    1.0 when searching the live-load multiplier. It is not linear in the load.
    """

    joint: str
    diameter_in: float
    F_y: float
    F_u: float
    plates: tuple[PlateLoad, ...]
    sections: tuple[PinSection, ...]
    governing: PinSection
    flexure_shear: float
    flexure_shear_limit: float
    governing_plate: PlateLoad | None
    utilization_flexure_shear: float
    utilization_bearing: float
    utilization: float
    en: EnPinCheck
    residual_force_kip: tuple[float, float]
    residual_moment_kip_in: tuple[float, float]
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    provision: str = ("AASHTO LRFD 6.7.6.2.1 and 6.7.6.2.2 [value from memory]; loading Berg, "
                      "Safe Building, Parts 10-15 [V]; cross-check EN 1993-1-8 Table 3.10 "
                      "[V]")

    @property
    def M_u_kip_in(self) -> float:
        return self.governing.M_kip_in

    @property
    def V_u_kip(self) -> float:
        return self.governing.V_kip


# --------------------------------------------------------------------------------------------
# layout: where each load acts and how the member forces are shared
# --------------------------------------------------------------------------------------------


@dataclass(frozen=True)
class _Layout:
    """Where the loads act on one pin and how they are shared: load points z and their
    thicknesses (in), each member's and the external load's share at each point, the pin length
    between the outer faces of the packing (in) and F_y for bearing (ksi)."""

    z: np.ndarray  # load points, in (plates in order, then the mid-length point if used)
    t: np.ndarray  # thickness of each load point (0 for the mid-length point)
    share: np.ndarray  # (n_points, n_members): fraction of each member's force at each point
    ext_share: np.ndarray  # (n_points,): fraction of the external load at each point
    members: tuple[str, ...]
    items: tuple[str | None, ...]
    n_plates: int
    length_in: float
    Fy_bearing: np.ndarray  # per point


def _where(pin: Pin) -> str | None:
    return pin.where or None


def _num(v: object) -> bool:
    return isinstance(v, int | float) and not isinstance(v, bool) and math.isfinite(v)


def _layout(pin: Pin, actions: Sequence[MemberAction], has_external: bool, Fy_pin: float,
            designs: Mapping[str, MemberDesign] | None, warnings: list[str],
            assumptions: list[str], max_clearance_in: float) -> _Layout:
    j = pin.joint
    if not _num(pin.diameter_in) or pin.diameter_in <= 0:
        raise InputError(f"pin at joint {j}: diameter must be a positive number of inches, got "
                         f"{pin.diameter_in!r}", _where(pin))
    if not pin.packing:
        raise InputError(f"pin at joint {j}: no packing recorded (the order of the bars on the "
                         "pin is needed)", _where(pin))
    names = [a.member for a in actions]
    dup = {n for n in names if names.count(n) > 1}
    if dup:
        raise InputError(f"pin at joint {j}: member force given twice for "
                         f"{', '.join(sorted(dup))}", _where(pin))
    for a in actions:
        if not _num(a.force_kip):
            raise InputError(f"pin at joint {j}: force of member {a.member} is not a number",
                             _where(pin))
        dx, dy = a.direction
        if not (_num(dx) and _num(dy)) or math.hypot(dx, dy) < 1e-12:
            raise InputError(f"pin at joint {j}: direction of member {a.member} is not a "
                             "non-zero vector", _where(pin))
    at_joint = set(names)
    z_list, t_list, items = [], [], []
    z0 = 0.0
    for k, it in enumerate(pin.packing, start=1):
        if not _num(it.thickness_in) or it.thickness_in <= 0:
            raise InputError(f"pin at joint {j}: packing item {k} has thickness "
                             f"{it.thickness_in!r}; it must be a positive number of inches",
                             _where(pin))
        if not _num(it.gap_before_in) or it.gap_before_in < 0:
            raise InputError(f"pin at joint {j}: packing item {k} has a gap of "
                             f"{it.gap_before_in!r} in; gaps cannot be negative", _where(pin))
        name = it.member
        if name is not None and name.strip().lower() != FLOORBEAM and name not in at_joint:
            known = ", ".join(sorted(at_joint)) or "none"
            raise InputError(f"pin at joint {j}: packing item {k} names member {name!r}, which "
                             f"does not meet at this joint (members here: {known})",
                             _where(pin))
        z0 += it.gap_before_in
        z_list.append(z0 + it.thickness_in / 2.0)
        t_list.append(it.thickness_in)
        items.append(name)
        z0 += it.thickness_in
    length = z0
    on_pin = {n for n in items if n is not None}
    missing = [n for n in names if n not in on_pin]
    if missing:
        raise InputError(f"pin at joint {j}: member(s) {', '.join(missing)} meet at this joint "
                         "but have no plate in the packing", _where(pin))
    fb = [i for i, n in enumerate(items) if n is not None and n.strip().lower() == FLOORBEAM]
    n_pl = len(items)
    use_mid = has_external and not fb
    z = np.array(z_list + ([length / 2.0] if use_mid else []), dtype=float)
    t = np.array(t_list + ([0.0] if use_mid else []), dtype=float)
    share = np.zeros((len(z), len(names)))
    for c, n in enumerate(names):
        idx = [i for i, it in enumerate(items) if it == n]
        tt = t[idx]
        share[idx, c] = tt / tt.sum()
    spliced = pin.spliced_chord
    if spliced is not None and all(n in names for n in spliced):
        # a chord spliced through the joint passes its force by the splice: its plates bring
        # only the resultant of its two members' forces into the pin, shared by thickness
        # (common practice)
        idx = [i for i, it in enumerate(items) if it in spliced]
        tt = t[idx]
        for n in spliced:
            share[:, names.index(n)] = 0.0
            share[idx, names.index(n)] = tt / tt.sum()
        assumptions.append(f"pin at joint {j}: the chord {spliced[0]}-{spliced[1]} is spliced "
                           "through the joint (Pins sheet): its plates bring only the resultant "
                           "of its two members' forces into the pin, shared by thickness "
                           "(common practice)")
    ext = np.zeros(len(z))
    if fb:
        ext[fb] = t[fb] / t[fb].sum()
        assumptions.append(f"pin at joint {j}: the floorbeam load is shared over its "
                           "packing item(s) in proportion to thickness")
    elif has_external:
        ext[-1] = 1.0
        assumptions.append(f"pin at joint {j}: no floorbeam item in the packing; the force "
                           "from outside the bars (a floorbeam's load, or at a joint without "
                           "one the members' self-weight lumped there) is applied at the pin's "
                           f"mid-length (z = {length / 2:.2f} in)")
    Fy_b = np.full(len(z), Fy_pin)
    if designs:
        for i, n in enumerate(items):
            d = designs.get(n) if n is not None else None
            if d is not None:
                Fy_b[i] = min(Fy_pin, d.material.F_y)
        _fit_checks(pin, items, designs, warnings, max_clearance_in)
    return _Layout(z, t, share, ext, tuple(names), tuple(items), n_pl, length, Fy_b)


def _fit_checks(pin: Pin, items: Sequence[str | None], designs: Mapping[str, MemberDesign],
                warnings: list[str], max_clearance_in: float) -> None:
    """Pin against the eyebar holes and bar counts.

    AISC LRFD 1999 D3.2: hole <= pin + 1/32 in; pin >= 7/8 of the body width. [V]
    """
    j, D = pin.joint, pin.diameter_in
    worn: dict[str, float] = {}
    for n in dict.fromkeys(i for i in items if i is not None):
        d = designs.get(n)
        if d is None or not isinstance(d.section, EyebarSet):
            continue
        s = d.section
        hole = s.pin_hole_diameter_in
        if D > hole + 1e-3:
            raise InputError(f"pin at joint {j}: the pin ({D:g} in) is larger than the pin hole "
                             f"of member {n} ({hole:g} in); check the pin diameter or the hole",
                             _where(pin))
        if hole - D > max_clearance_in:
            raise InputError(f"pin at joint {j}: the pin ({D:g} in) is smaller than the pin hole "
                             f"of member {n} ({hole:g} in) by {hole - D:.3f} in, more than "
                             f"{max_clearance_in:g} in; check the pin diameter or the hole",
                             _where(pin))
        if hole - D > WORN_CLEARANCE_IN:
            worn[n] = hole
        elif hole - D > FIT_CLEARANCE_IN + 1e-3:
            warnings.append(f"pin at joint {j}: member {n} hole {hole:g} in is more than 1/32 in "
                            f"over the pin {D:g} in (AISC LRFD 1999 D3.2); worn pin or hole, "
                            "the bearing is concentrated")
        if D < 7.0 / 8.0 * s.width_in - 1e-6:
            warnings.append(f"pin at joint {j}: pin {D:g} in is less than 7/8 of the body width "
                            f"{s.width_in:g} in of member {n} (AISC LRFD 1999 D3.2): a slender "
                            "pin for its bars; its bending, shear and bearing are checked with "
                            "its own diameter (section 5)")
        k = sum(1 for i in items if i == n)
        if k != s.count:
            warnings.append(f"pin at joint {j}: the packing has {k} plate(s) of member {n}, "
                            f"its section has {s.count} eyebars")
    if worn:
        many = len(worn) > 1
        warnings.append(
            f"{PIN_WORN}: pin at joint {j}: the pin ({D:g} in) is smaller than the pin "
            f"hole{'s' if many else ''} of member{'s' if many else ''} {', '.join(worn)} "
            f"({'/'.join(f'{h:g}' for h in dict.fromkeys(worn.values()))} in) by "
            f"{'up to ' if many else ''}{max(worn.values()) - D:.3f} in: a worn pin or hole. It "
            "is rated with the diameter given, but the bars bear on a narrow strip, not the "
            "half-round the bearing check assumes (AISC LRFD 1999 D3.2: 1/32 in [V]); the "
            "engineer should inspect it and judge its rating")


def _forces(layout: _Layout, actions: Sequence[MemberAction],
            external_kip: tuple[float, float] | None) -> np.ndarray:
    """(n_points, 2) forces on the pin: member force x unit direction, shared by thickness."""
    N = np.array([a.force_kip for a in actions], dtype=float)
    u = np.array([a.direction for a in actions], dtype=float).reshape(-1, 2)
    u = u / np.linalg.norm(u, axis=1)[:, None]
    F = layout.share @ (N[:, None] * u) if len(actions) else np.zeros((len(layout.z), 2))
    if external_kip is not None:
        F = F + layout.ext_share[:, None] * np.asarray(external_kip, dtype=float)[None, :]
    return F


def _section_forces(z: np.ndarray, F: np.ndarray) -> tuple[np.ndarray, ...]:
    """Moments and shears at each load point, from the first end and from the last end."""
    dz = z[:, None] - z[None, :]
    M_L = np.maximum(dz, 0.0) @ F  # from the first end
    M_R = np.maximum(-dz, 0.0) @ F  # from the last end (equal to M_L in equilibrium)
    before = (dz > 0).astype(float)
    upto = (dz >= 0).astype(float)
    V_Lm = before @ F
    V_Lp = upto @ F
    total = F.sum(axis=0)
    V_Rp = total[None, :] - V_Lp  # load beyond the point
    V_Rm = total[None, :] - V_Lm
    lens = vector_lengths(np.stack([M_L, M_R, V_Lm, V_Lp, V_Rp, V_Rm]))  # in one pass
    M = np.maximum(lens[0], lens[1])
    V = lens[2:].max(axis=0)
    return M_L, V_Lp, M, V


def _evaluate(layout: _Layout, F: np.ndarray, D: float, Fy: float, Fu: float, phi_f: float,
              phi_v: float, phi_b: float, limit: float, gamma_M0: float, gamma_M2: float):
    _, _, M, V = _section_forces(layout.z, F)
    lrfd = lrfd_flexure_shear(M, V, D, Fy, phi_f, phi_v)
    Fmag = np.linalg.norm(F, axis=1)
    npl = layout.n_plates
    cap = phi_b * lrfd_bearing_nominal(layout.t[:npl], D, layout.Fy_bearing[:npl])
    bear = Fmag[:npl] / cap
    return M, V, lrfd, bear, Fmag


def _material(pin: Pin, default: Material | None, assumptions: list[str]) -> Material:
    if pin.material is not None:
        return pin.material
    if default is not None:
        assumptions.append(f"pin at joint {pin.joint}: pin material not recorded; F_y = "
                           f"{default.F_y:g} ksi, F_u = {default.F_u:g} ksi taken "
                           f"({default.basis})")
        return default
    md = default_material(MaterialKind.STEEL, None)
    assumptions.append(f"pin at joint {pin.joint}: pin material not recorded; {md.assumption}")
    return md.material


@dataclass(frozen=True, eq=False)
class PinPrepared:
    """A pin's packing layout and material for the members at its joint (in this order),
    worked out once: the checks of several load states share it (:func:`prepare_pin`)."""

    pin: Pin
    members: tuple[str, ...]
    has_external: bool
    material: Material
    layout: _Layout
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]  # of the material, then of the layout


def prepare_pin(pin: Pin, members: Sequence[str], directions: Sequence[tuple[float, float]],
                *, has_external: bool = True,
                designs: Mapping[str, MemberDesign] | None = None,
                default_pin_material: Material | None = None,
                max_clearance_in: float = MAX_CLEARANCE_IN) -> PinPrepared:
    """The layout of :func:`pin_check` (and :class:`PinModel`) for these members, once."""
    warnings: list[str] = []
    assumptions: list[str] = []
    mat = _material(pin, default_pin_material, assumptions)
    actions = [MemberAction(m, 0.0, d) for m, d in zip(members, directions, strict=True)]
    lay = _layout(pin, actions, has_external, mat.F_y, designs, warnings, assumptions,
                  max_clearance_in)
    return PinPrepared(pin, tuple(members), has_external, mat, lay, tuple(warnings),
                       tuple(assumptions))


def pin_check(pin: Pin, actions: Sequence[MemberAction], *,
              external_kip: tuple[float, float] | None = None,
              designs: Mapping[str, MemberDesign] | None = None,
              default_pin_material: Material | None = None,
              phi_f: float = PHI_F, phi_v: float = PHI_V, phi_b: float = PHI_B,
              limit: float = INTERACTION_LIMIT, gamma_M0: float = GAMMA_M0,
              gamma_M2: float = GAMMA_M2, max_clearance_in: float = MAX_CLEARANCE_IN,
              equilibrium_tolerance: float = 1e-3,
              prepared: PinPrepared | None = None) -> PinCheck:
    """Moment, shear and bearing of a pin under the concurrent member forces of ONE load state.

    AASHTO LRFD 6.7.6.2.1-1 and 6.7.6.2.2-2 [value from memory]; loading Berg Parts 10-15 [V].

    Args:
        pin: diameter, packing (order, thicknesses, gaps) and material.
        actions: every member meeting at the joint, with its force and direction.
        external_kip: (horizontal, vertical) force applied to the pin at the joint, kip.
        designs: member designs by label (optional): plate F_y for bearing (the lower of plate
            and pin is used) and the pin-to-hole fit of eyebars.
        default_pin_material: used when ``pin.material`` is None (else MBE default steel).
        max_clearance_in: a hole larger than the pin by more than this is taken as a data
            error (common practice); more than 1/32 in is a warning, more than 1/4 in one
            that bears on the decision (PIN WORN).
        equilibrium_tolerance: relative tolerance of the force and moment balance check.
        prepared: the layout worked out before (:func:`prepare_pin`) for these members in
            this order, with the same designs, material and clearance; used when it fits.
    """
    warnings: list[str] = []
    assumptions: list[str] = [
        f"pin at joint {pin.joint}: each member's force is shared over its plates in proportion "
        "to thickness and acts at each plate's mid-thickness (Berg, Safe Building, Parts "
        "10-15)",
        f"pin at joint {pin.joint}: the rating uses AASHTO LRFD 6.7.6.2.1 (flexure and shear, "
        f"limit {limit:g}) and 6.7.6.2.2 (bearing); EN 1993-1-8 Table 3.10 is shown as a "
        f"cross-check only (gamma_M0 = {gamma_M0:g}, gamma_M2 = {gamma_M2:g}, recommended "
        "values from memory; its combined bending-shear criterion, written for replaceable "
        "pins, is applied to every pin)",
    ]
    if (prepared is not None and prepared.pin is pin
            and prepared.has_external == (external_kip is not None)
            and prepared.members == tuple(a.member for a in actions)):
        for a in actions:
            if not _num(a.force_kip):
                raise InputError(f"pin at joint {pin.joint}: force of member {a.member} is "
                                 "not a number", _where(pin))
        mat, lay = prepared.material, prepared.layout
        warnings.extend(prepared.warnings)
        assumptions.extend(prepared.assumptions)
    else:
        mat = _material(pin, default_pin_material, assumptions)
        lay = _layout(pin, actions, external_kip is not None, mat.F_y, designs, warnings,
                      assumptions, max_clearance_in)
    D, Fy, Fu = float(pin.diameter_in), mat.F_y, mat.F_u
    if external_kip is not None and not all(_num(v) for v in external_kip):
        raise InputError(f"pin at joint {pin.joint}: the external load is not a pair of numbers",
                         _where(pin))
    F = _forces(lay, actions, external_kip)
    M_L, V_Lp, M, V, = _section_forces(lay.z, F)
    lrfd = lrfd_flexure_shear(M, V, D, Fy, phi_f, phi_v)
    M_Rd = en_moment_resistance(D, Fy, gamma_M0)
    Fv_Rd = en_shear_resistance(D, Fu, gamma_M2)
    en = en_interaction(M, V, M_Rd, Fv_Rd)
    Fmag = vector_lengths(F)
    npl = lay.n_plates
    cap = phi_b * lrfd_bearing_nominal(lay.t[:npl], D, lay.Fy_bearing[:npl])
    bear = Fmag[:npl] / cap
    en_bear = Fmag[:npl] / en_bearing_resistance(lay.t[:npl], D, lay.Fy_bearing[:npl],
                                                 gamma_M0)

    scale = float(np.abs(F).sum()) + 1e-9
    res_F = F.sum(axis=0)
    res_M = (F * lay.z[:, None]).sum(axis=0)
    tolF = max(0.01, equilibrium_tolerance * scale)
    if np.linalg.norm(res_F) > tolF:
        warnings.append(f"pin at joint {pin.joint}: the forces on the pin do not balance "
                        f"(residual {res_F[0]:.2f} kip horizontal, {res_F[1]:.2f} kip vertical);"
                        " moments are taken from both ends and the larger used")
    elif np.linalg.norm(res_M) > tolF * max(lay.length_in, 1.0):
        warnings.append(f"pin at joint {pin.joint}: the packing is not balanced about the pin "
                        f"(net couple {res_M[0]:.1f} kip-in horizontal, {res_M[1]:.1f} kip-in "
                        "vertical); moments are taken from both ends and the larger used "
                        "(conservative)")

    # (Python floats of whole arrays at once: the same values as float() of each element)
    z_, ML_, M_, VL_, V_, lrfd_, en_ = (a.tolist() for a in (lay.z, M_L, M, V_Lp, V, lrfd, en))
    sections = tuple(PinSection(z_[k], ML_[k][0], ML_[k][1], M_[k], VL_[k][0], VL_[k][1],
                                V_[k], lrfd_[k], en_[k])
                     for k in np.argsort(lay.z, kind="stable").tolist())
    t_, F_, cap_, bear_ = (a.tolist() for a in (lay.t, F, cap, bear))
    plates = tuple(PlateLoad(i + 1, lay.items[i], t_[i], z_[i], F_[i][0], F_[i][1], cap_[i],
                             bear_[i])
                   for i in range(npl))
    # of sections tied within round-off (a plate between equal loads), the first along z,
    # so the governing section does not hang on the last digit of the forces
    near = np.flatnonzero(lrfd >= lrfd.max() - 1e-9 * max(abs(float(lrfd.max())), 1.0))
    kg = int(near[np.argmin(lay.z[near])])
    gov = next(s for s in sections if s.z_in == float(lay.z[kg]))
    kb = int(np.argmax(bear)) if npl else -1
    u_fs = float(lrfd[kg]) / limit
    u_b = float(bear[kb]) if npl else 0.0
    ke = int(np.argmax(en))
    u_en = max(float(en[ke]), float(np.max(en_bear)) if npl else 0.0)
    en_chk = EnPinCheck(M_Rd, Fv_Rd, float(en[ke]), float(lay.z[ke]),
                        float(np.max(en_bear)) if npl else 0.0, u_en)
    return PinCheck(pin.joint, D, Fy, Fu, plates, sections, gov, float(lrfd[kg]), limit,
                    plates[kb] if npl else None, u_fs, u_b, max(u_fs, u_b), en_chk,
                    (float(res_F[0]), float(res_F[1])), (float(res_M[0]), float(res_M[1])),
                    tuple(dict.fromkeys(warnings)), tuple(assumptions))


def pin_actions(geometry: TrussGeometry, joint: str, forces: Mapping[str, float],
                where: str = "") -> tuple[MemberAction, ...]:
    """Member actions at ``joint`` from the geometry and one load state's member forces.

    Statics of a pin-jointed truss: direction from the joint toward each member's far end.
    """
    if joint not in geometry.joint_index:
        raise InputError(f"pin at joint {joint!r}: no such joint in the truss", where or None)
    here = geometry.members_at(joint)
    labels = {m.label for m in here}
    extra = [k for k in forces if k not in labels]
    if extra:
        raise InputError(f"pin at joint {joint}: force given for {', '.join(extra)}, which does "
                         "not meet at this joint", where or None)
    j = geometry.joint(joint)
    out = []
    for m in here:
        if m.label not in forces:
            raise InputError(f"pin at joint {joint}: no force given for member {m.label}",
                             where or None)
        far = geometry.joint(m.end if m.start == joint else m.start)
        dx, dy = far.x_ft - j.x_ft, far.y_ft - j.y_ft
        L = math.hypot(dx, dy)
        out.append(MemberAction(m.label, float(forces[m.label]), (dx / L, dy / L)))
    return tuple(out)


def pin_load_multiplier(pin: Pin, base: Sequence[MemberAction], added: Sequence[MemberAction],
                        *, base_external_kip: tuple[float, float] | None = None,
                        added_external_kip: tuple[float, float] | None = None,
                        designs: Mapping[str, MemberDesign] | None = None,
                        default_pin_material: Material | None = None,
                        phi_f: float = PHI_F, phi_v: float = PHI_V, phi_b: float = PHI_B,
                        limit: float = INTERACTION_LIMIT,
                        max_clearance_in: float = MAX_CLEARANCE_IN,
                        lam_max: float = 1e6) -> float:
    """The multiplier lam >= 0 with utilization(base + lam * added) = 1.0.

    Root of the AASHTO LRFD 6.7.6.2.1/6.7.6.2.2 utilization (convex in lam). [value from memory]
    Returns 0.0 when the base state alone reaches the limit and inf when the added state never
    brings the pin to it (below ``lam_max``). ``base`` and ``added`` must name the same
    members with the same directions (the forces of one position: factored dead and live).
    """
    b = {a.member: a for a in base}
    a_ = {a.member: a for a in added}
    if set(b) != set(a_):
        raise InputError(f"pin at joint {pin.joint}: the base and added load states name "
                         "different members", _where(pin))
    notes: list[str] = []
    mat = _material(pin, default_pin_material, notes)
    has_ext = base_external_kip is not None or added_external_kip is not None
    lay = _layout(pin, base, has_ext, mat.F_y, designs, [], [], max_clearance_in)
    F0 = _forces(lay, base, base_external_kip or (0.0, 0.0) if has_ext else None)
    added_in_order = [MemberAction(m, a_[m].force_kip, b[m].direction) for m in lay.members]
    F1 = _forces(lay, added_in_order, added_external_kip or (0.0, 0.0) if has_ext else None)
    D = float(pin.diameter_in)

    def u(lam: float) -> float:
        _, _, lrfd, bear, _ = _evaluate(lay, F0 + lam * F1, D, mat.F_y, mat.F_u, phi_f, phi_v,
                                        phi_b, limit, GAMMA_M0, GAMMA_M2)
        return max(float(np.max(lrfd)) / limit, float(np.max(bear)) if len(bear) else 0.0)

    if u(0.0) >= 1.0:
        return 0.0
    lo, hi = 0.0, min(1.0, lam_max)
    while u(hi) < 1.0:
        if hi >= lam_max:
            return math.inf
        lo, hi = hi, min(hi * 2.0, lam_max)
    return _crossing(u, lo, hi)


def _crossing(u, lo: float, hi: float) -> float:
    """Root of u(x) = 1 in [lo, hi] with u(lo) < 1 <= u(hi), by Illinois regula falsi.

    (A bracketing method is enough here: u is convex along the load path.)
    """
    f_lo, f_hi = u(lo) - 1.0, u(hi) - 1.0
    side = 0
    for _ in range(100):
        x = hi - f_hi * (hi - lo) / (f_hi - f_lo) if f_hi != f_lo else 0.5 * (lo + hi)
        if not lo < x < hi:
            x = 0.5 * (lo + hi)
        f = u(x) - 1.0
        if f >= 0.0:
            hi, f_hi = x, f
            if side == 1:
                f_lo *= 0.5
            side = 1
        else:
            lo, f_lo = x, f
            if side == -1:
                f_hi *= 0.5
            side = -1
        if hi - lo <= 1e-12 * max(hi, 1.0) or abs(f) < 1e-13:
            break
    return float(hi if f_hi == 0.0 else x)


# --------------------------------------------------------------------------------------------
# many load states at once (the rating searches many vehicle positions per pin)
# --------------------------------------------------------------------------------------------


def vector_lengths(G: np.ndarray) -> np.ndarray:
    """Length of each 2-vector of G (..., 2) (moments and forces of a few hundred kip-in: no
    overflow to guard against, so no hypot, several times slower)."""
    sq = np.square(G)  # (one pass over G, then the halves: 1.2-3x faster than x*x + y*y)
    out = np.add(sq[..., 0], sq[..., 1])
    return np.sqrt(out, out=out)


def _largest_shears(g: np.ndarray, n: int, nv: int) -> np.ndarray:
    """The largest of the ``nv`` shears at each of the ``n`` sections, (..., n), from the
    lengths g (..., K) of the checked vectors (:class:`PinModel`: two blocks of n moments,
    then ``nv`` blocks of n shears); element by element over the blocks (faster than a
    reduction over a short middle axis; the same numbers)."""
    out = g[..., 2 * n:3 * n].copy()
    for b in range(3, 2 + nv):
        np.maximum(out, g[..., b * n:(b + 1) * n], out=out)
    return out


def _projected_parts(G: np.ndarray, n: int, D, F_y, phi_f, phi_v, limit,
                     bearing_cap: np.ndarray | None, nv: int = 4
                     ) -> tuple[np.ndarray, np.ndarray | None]:
    """(flexure and shear, bearing) utilizations, 1.0 at each limit, of the projected vectors
    G (..., K, 2) of a pin with ``n`` sections (:class:`PinModel`: moments from the left and
    the right at each section, the ``nv`` shears about it, then each plate's force): AASHTO
    LRFD Eq. 6.7.6.2.1-1 with the larger moment and shear at each section, and each plate's
    bearing against ``bearing_cap`` (6.7.6.2.2) [value from memory]. The pin's data (D,
    F_y, phi_f, phi_v, limit) are numbers or arrays of G's leading shape (one pin per
    state); ``bearing_cap`` (..., n_plates) or None where no plate bears (then bearing
    None)."""
    g = vector_lengths(G)
    M = np.maximum(g[..., :n], g[..., n:2 * n])
    V = _largest_shears(g, n, nv)
    D_, Fy_ = np.asarray(D)[..., None], np.asarray(F_y)[..., None]
    fs = lrfd_flexure_shear(M, V, D_, Fy_, np.asarray(phi_f)[..., None],
                            np.asarray(phi_v)[..., None])
    u_fs = fs.max(axis=-1) / limit
    if bearing_cap is None:
        return u_fs, None
    return u_fs, (g[..., (2 + nv) * n:] / bearing_cap).max(axis=-1)


def _projected_bounds(G0: np.ndarray, G1: np.ndarray, n: int, D, F_y, phi_f, phi_v, limit,
                      bearing_cap: np.ndarray | None, nv: int = 4
                      ) -> tuple[np.ndarray, np.ndarray]:
    """Bounds on the least lam >= 0 at which the utilization (:func:`_projected_parts`) of
    the projected vectors G0 + lam G1 (P, K, 2) reaches 1.0, without solving for it:
    (lower, upper), (P,). The pin's data as in :func:`_projected_parts`, numbers or (P,).

    Lower: every checked vector is no longer than |G0| + lam |G1| (triangle inequality),
    so the checks of those lengths (flexure and shear with the larger moment and shear
    at each section, AASHTO LRFD 6.7.6.2.1 [value from memory]; bearing, 6.7.6.2.2)
    reach their limits no later; for flexure and shear, convex in lam, the chord of that
    bound below its root. Upper: each vector is at least lam |G1| - |G0| long, so one
    moment, one shear or one plate's bearing alone reaches its limit there.
    """
    a, b = vector_lengths(G0), vector_lengths(G1)
    D_, Fy_ = np.asarray(D)[..., None], np.asarray(F_y)[..., None]
    c1 = np.asarray(phi_f)[..., None] * D_**3 * Fy_
    c2 = np.asarray(phi_v)[..., None] * D_**2 * Fy_
    lim = np.asarray(limit)[..., None]
    m_lim, v_lim = lim * c1 / 6.0, lim ** (1.0 / 3.0) * c2 / 2.2
    mA, mB = np.maximum(a[:, :n], a[:, n:2 * n]), np.maximum(b[:, :n], b[:, n:2 * n])
    e = (2 + nv) * n  # the end of the shears, the start of the plates
    vA, vB = _largest_shears(a, n, nv), _largest_shears(b, n, nv)

    # 6 M / c1 + (2.2 V / c2)^3 - limit with M = mA + lam mB, V = vA + lam vB
    m0, m1 = mA * (6.0 / c1), mB * (6.0 / c1)
    v0, v1 = vA * (2.2 / c2), vB * (2.2 / c2)

    def f(lam: np.ndarray | float) -> np.ndarray:
        v = v0 + lam * v1
        return m0 + lam * m1 + v * v * v - lim

    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        f0 = f(0.0)
        hi = np.maximum(np.minimum(np.where(mB > 0, (m_lim - mA) / mB, np.inf),
                                   np.where(vB > 0, (v_lim - vA) / vB, np.inf)), 0.0)
        fin = np.isfinite(hi)
        h = np.where(fin, hi, 0.0)
        for _ in range(2):  # Newton from above: stays above the root of a convex f
            v = v0 + h * v1
            slope = m1 + 3.0 * v * v * v1
            h = np.where(slope > 0, np.maximum(h - f(h) / np.where(slope > 0, slope, 1.0),
                                               0.0), h)
        fh = f(h)
        chord = np.where(fh > f0, h * (-f0) / (fh - f0), h)
        low_fs = np.where(f0 >= 0, 0.0, np.where(fin, np.where(fh >= 0, chord, h),
                                                 np.inf)).min(axis=1)
        ub_m = np.where(b[:, :2 * n] > 0, (m_lim + a[:, :2 * n]) / b[:, :2 * n],
                        np.inf).min(axis=1)
        ub_v = np.where(b[:, 2 * n:e] > 0, (v_lim + a[:, 2 * n:e])
                        / b[:, 2 * n:e], np.inf).min(axis=1)
        low, up = low_fs, np.minimum(ub_m, ub_v)
        if bearing_cap is not None:
            cap = bearing_cap
            ap, bp = a[:, e:], b[:, e:]
            low = np.minimum(low, np.where(ap >= cap, 0.0, np.where(
                bp > 0, (cap - ap) / bp, np.inf)).min(axis=1))
            up = np.minimum(up, np.where(bp > 0, (cap + ap) / bp, np.inf).min(axis=1))
    return np.maximum(low * (1.0 - 1e-12), 0.0), up


class PinModel:
    """One pin with its layout fixed, evaluated for whole batches of load states.

    Same forms as :func:`pin_check` (AASHTO LRFD 6.7.6.2.1 and 6.7.6.2.2 [value from
    memory]; loading Berg, Safe Building, Parts 10-15 [read]), vectorized over leading axes.
    """

    def __init__(self, pin: Pin, members: Sequence[str],
                 directions: Sequence[tuple[float, float]], *, has_external: bool = True,
                 designs: Mapping[str, MemberDesign] | None = None,
                 default_pin_material: Material | None = None, phi_f: float = PHI_F,
                 phi_v: float = PHI_V, phi_b: float = PHI_B, limit: float = INTERACTION_LIMIT,
                 max_clearance_in: float = MAX_CLEARANCE_IN, prepared: PinPrepared | None = None,
                 balanced: bool = False) -> None:
        if prepared is None or prepared.members != tuple(members) \
                or prepared.has_external != has_external:
            prepared = prepare_pin(pin, members, directions, has_external=has_external,
                                   designs=designs, default_pin_material=default_pin_material,
                                   max_clearance_in=max_clearance_in)
        self.material = prepared.material
        self.layout = prepared.layout
        u = np.array(directions, dtype=float).reshape(-1, 2)
        self._unit = u / np.linalg.norm(u, axis=1)[:, None]
        self.D = float(pin.diameter_in)
        self.phi_f, self.phi_v, self.limit = phi_f, phi_v, limit
        z = self.layout.z
        dz = z[:, None] - z[None, :]
        npl = self.layout.n_plates
        self._bearing_cap = phi_b * lrfd_bearing_nominal(self.layout.t[:npl], self.D,
                                                         self.layout.Fy_bearing[:npl])
        # Every force vector the checks need is linear in the point forces: at each section
        # (a point's mid-thickness) the moments from the left and from the right, the shears
        # just before and just after it from the left and from the right, then each plate's
        # own force for bearing. One matrix W gives them all: W @ F. Where every state is in
        # balance (``balanced``: the caller adds the external force that balances the bars,
        # and each member's share and the external one sum to one) the shears from the right
        # are those from the left reversed, and only those are kept.
        n = len(z)
        self._n_sections = n
        lay = self.layout
        self._nv = 2 if (balanced and has_external
                         # (np.allclose with rtol=0, written out: it is slow on a few numbers)
                         and bool((np.abs(lay.share.sum(axis=0) - 1.0) <= 1e-12).all())
                         and abs(float(lay.ext_share.sum()) - 1.0) <= 1e-12) else 4
        rows = [np.maximum(dz, 0.0), np.maximum(-dz, 0.0), dz > 0, dz >= 0, dz < 0, dz <= 0]
        rows = rows[:2 + self._nv]
        if npl:
            rows.append(np.eye(n)[:npl])
        self._W = np.vstack(rows).astype(float)

    def point_forces(self, member_forces_kip: np.ndarray,
                     external_kip: np.ndarray | None = None) -> np.ndarray:
        """(..., n_points, 2) forces on the pin from member forces (..., n_members)."""
        N = np.asarray(member_forces_kip, dtype=float)
        F = self.layout.share @ (N[..., :, None] * self._unit)
        if external_kip is not None:
            F = F + self.layout.ext_share[:, None] * np.asarray(external_kip)[..., None, :]
        return F

    def project(self, F: np.ndarray) -> np.ndarray:
        """The checked vectors W @ F (..., K, 2) of point forces F (..., n_points, 2): the
        moments and shears at every section and each plate's force (see ``__init__``)."""
        return self._W @ F

    def utilization_parts(self, F: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """(flexure and shear, bearing) utilizations, 1.0 at each limit, of each load state
        in the batch (bearing 0 where no plate bears)."""
        return self._parts(self._W @ F)

    def _parts(self, G: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Utilizations from the projected vectors G = W @ F (..., K, 2)."""
        u_fs, u_b = _projected_parts(G, self._n_sections, self.D, self.material.F_y,
                                     self.phi_f, self.phi_v, self.limit,
                                     self._bearing_cap if self.layout.n_plates else None,
                                     self._nv)
        return u_fs, (np.zeros_like(u_fs) if u_b is None else u_b)

    def multiplier_bounds(self, G0: np.ndarray, G1: np.ndarray
                          ) -> tuple[np.ndarray, np.ndarray]:
        """Bounds on the least lam >= 0 at which the utilization of the projected vectors
        G0 + lam G1 (P, K, 2) reaches 1.0, without solving for it: (lower, upper), (P,)
        (:func:`_projected_bounds`)."""
        return _projected_bounds(G0, G1, self._n_sections, self.D, self.material.F_y,
                                 self.phi_f, self.phi_v, self.limit,
                                 self._bearing_cap if self.layout.n_plates else None,
                                 self._nv)

    def _utilization_projected(self, G: np.ndarray) -> np.ndarray:
        u_fs, u_b = self._parts(G)
        return np.maximum(u_fs, u_b)

    def utilization(self, F: np.ndarray) -> np.ndarray:
        """Governing utilization (1.0 at the limit) of each load state in the batch."""
        u_fs, u_b = self.utilization_parts(F)
        return np.maximum(u_fs, u_b)

    def multipliers(self, F_base: np.ndarray, F_added: np.ndarray, lam_max: float = 1e3,
                    upper: np.ndarray | None = None) -> np.ndarray:
        """lam with utilization(F_base + lam F_added) = 1 for each state pair (P, n, 2).

        ``F_base`` is one state (n, 2) shared by all, or one per added state (P, n, 2);
        ``upper`` (P,) limits the search of each pair (default ``lam_max``). The utilization
        is convex in lam (norms of affine forces, raised to powers >= 1), so from below the
        limit it crosses 1.0 once: a geometric grid brackets it, finer grids narrow it, a
        secant step closes it. 0.0 where the base alone reaches the limit, inf where it is not
        reached up to the upper limit.
        """
        F1 = np.asarray(F_added, dtype=float)
        F0 = np.broadcast_to(np.asarray(F_base, dtype=float), F1.shape)
        # the checked vectors are linear in lam too: project once, then only norms per lam
        return self.multipliers_projected(self._W @ F0, self._W @ F1, lam_max, upper)

    def multipliers_projected(self, G0: np.ndarray, G1: np.ndarray, lam_max: float = 1e3,
                              upper: np.ndarray | None = None) -> np.ndarray:
        """:meth:`multipliers` of projected vectors G0 + lam G1 (P, K, 2) (see ``project``)."""
        P = G1.shape[0]
        top = np.full(P, float(lam_max)) if upper is None else np.asarray(upper, dtype=float)
        frac = np.concatenate(([0.0], np.geomspace(1e-5, 1.0, 13)))
        grid = top[:, None] * frac[None, :]  # (P, 14)
        U = self._utilization_projected(G0[:, None] + grid[:, :, None, None] * G1[:, None])
        over = U >= 1.0
        out = np.full(P, np.inf)
        first = np.where(over.any(axis=1), over.argmax(axis=1), -1)
        out[first == 0] = 0.0
        todo = np.nonzero(first > 0)[0]
        if todo.size:
            lo = grid[todo, first[todo] - 1]
            hi = grid[todo, first[todo]]
            f_lo = U[todo, first[todo] - 1] - 1.0
            f_hi = U[todo, first[todo]] - 1.0
            out[todo] = self._crossings(G0[todo], G1[todo], lo, hi, f_lo, f_hi)
        return out

    def _crossings(self, G0: np.ndarray, G1: np.ndarray, lo: np.ndarray, hi: np.ndarray,
                   f_lo: np.ndarray, f_hi: np.ndarray) -> np.ndarray:
        """Roots of utilization(G0 + lam G1) = 1 (projected vectors, see ``_parts``) within
        brackets f(lo) < 0 <= f(hi), all
        at once: the Illinois regula falsi of :func:`_crossing`, row by row to convergence
        (u is convex along lam, so the bracket is sound)."""
        out = hi.copy()
        side = np.zeros(lo.size, dtype=int)
        live = np.arange(lo.size)
        for _ in range(100):
            d = f_hi - f_lo
            x = np.where(d != 0.0, hi - f_hi * (hi - lo) / np.where(d != 0.0, d, 1.0),
                         0.5 * (lo + hi))
            x = np.where((lo < x) & (x < hi), x, 0.5 * (lo + hi))
            f = self._utilization_projected(G0[live] + x[:, None, None] * G1[live]) - 1.0
            right = f >= 0.0
            f_lo = np.where(right & (side == 1), 0.5 * f_lo, f_lo)
            f_hi = np.where(~right & (side == -1), 0.5 * f_hi, f_hi)
            hi, f_hi = np.where(right, x, hi), np.where(right, f, f_hi)
            lo, f_lo = np.where(right, lo, x), np.where(right, f_lo, f)
            side = np.where(right, 1, -1)
            done = (hi - lo <= 1e-12 * np.maximum(hi, 1.0)) | (np.abs(f) < 1e-13)
            out[live] = np.where(f_hi == 0.0, hi, x)
            keep = ~done
            if not keep.any():
                break
            live, lo, hi, f_lo, f_hi, side = (live[keep], lo[keep], hi[keep], f_lo[keep],
                                              f_hi[keep], side[keep])
        return out


class PinStack:
    """Several :class:`PinModel` evaluated together: each pin's projected vectors padded to
    one layout (``n`` sections, ``n_plates`` plates), so that states of different pins go
    through the checks in one array computation (``which``: the pin of each state).

    A padded section carries no moment or shear and a padded plate has an infinite bearing
    capacity, so padding changes no utilization and no bound (they are maxima and minima
    over the checked vectors)."""

    def __init__(self, models: Sequence[PinModel]) -> None:
        self.models = tuple(models)
        self.n = max((m._n_sections for m in self.models), default=0)
        self.n_plates = max((m.layout.n_plates for m in self.models), default=0)
        n = self.n
        # shears: two where every pin's states are in balance, else four (a pin with two
        # leaves the other two zero: padding)
        self.nv = max((m._nv for m in self.models), default=4)
        e = (2 + self.nv) * n
        self.K = e + self.n_plates
        self.rows = []  # where each pin's K_i checked vectors go in the padded K
        for m in self.models:
            ni, npl = m._n_sections, m.layout.n_plates
            self.rows.append(np.concatenate([b * n + np.arange(ni) for b in range(2 + m._nv)]
                                            + [e + np.arange(npl)]).astype(int))
        self.D = np.array([m.D for m in self.models])
        self.F_y = np.array([m.material.F_y for m in self.models])
        self.phi_f = np.array([m.phi_f for m in self.models])
        self.phi_v = np.array([m.phi_v for m in self.models])
        self.limit = np.array([m.limit for m in self.models])
        self.bearing_cap = np.full((len(self.models), self.n_plates), np.inf)
        for i, m in enumerate(self.models):
            self.bearing_cap[i, :m.layout.n_plates] = m._bearing_cap

    def pad(self, i: int, G: np.ndarray) -> np.ndarray:
        """Pin ``i``'s projected vectors (..., K_i, 2) in the padded layout (..., K, 2)."""
        out = np.zeros(G.shape[:-2] + (self.K, 2))
        out[..., self.rows[i], :] = G
        return out

    def _params(self, which: np.ndarray) -> tuple:
        return (self.D[which], self.F_y[which], self.phi_f[which], self.phi_v[which],
                self.limit[which], self.bearing_cap[which] if self.n_plates else None)

    def utilization(self, G: np.ndarray, which: np.ndarray) -> np.ndarray:
        """Governing utilization (1.0 at the limit) of padded projected vectors G (P, K, 2),
        state p on pin ``which[p]`` (:func:`_projected_parts`)."""
        u_fs, u_b = _projected_parts(G, self.n, *self._params(which), self.nv)
        return u_fs if u_b is None else np.maximum(u_fs, u_b)

    def multiplier_bounds(self, G0: np.ndarray, G1: np.ndarray, which: np.ndarray
                          ) -> tuple[np.ndarray, np.ndarray]:
        """:meth:`PinModel.multiplier_bounds` of padded states, state p on pin
        ``which[p]`` (:func:`_projected_bounds`)."""
        return _projected_bounds(G0, G1, self.n, *self._params(which), self.nv)
