"""The one entry point the rating engine calls: a member's resistances after section loss.

``member_capacity`` runs the section properties at every location, every tension and
compression check, and the condition and system factors, and returns a frozen
``MemberCapacity``. In each sense the check with the lowest factored resistance governs.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass, field

from rating.capacity.checks import Check, Sense
from rating.capacity.compression import PHI_C, compression_checks, effective_length_factor
from rating.capacity.factors import combined_factor, member_factors
from rating.capacity.own_weight import OWN_WEIGHT_CHECKS, own_weight_checks
from rating.capacity.sections import gross_area_as_built_in2, section_properties
from rating.capacity.tension import PHI_PIN_PLATE, PHI_U, PHI_Y, tension_checks
from rating.errors import InputError
from rating.model import BarState, BuiltUpSection, Finding, MemberDesign, MemberRole


@dataclass(frozen=True)
class SectionSummary:
    """The governing section in a few numbers (in, in^2, ksi, ft).

    ``A_g_in2``/``A_n_in2`` are the least gross and net areas over the locations (tension,
    carrying bars only); ``r_in_plane_in``/``r_out_of_plane_in`` those at the governing
    compression location (0 for eyebars and rods); ``KL_r`` the governing effective
    slenderness (inf for a tension-only member).
    """

    kind: str = field(metadata={"label": "Section", "unit": ""})
    A_g_in2: float = field(metadata={"label": "A_g", "unit": "in2"})
    A_n_in2: float = field(metadata={"label": "A_n", "unit": "in2"})
    A_g_as_built_in2: float = field(metadata={"label": "A_g as built", "unit": "in2"})
    F_y: float = field(metadata={"label": "F_y", "unit": "ksi"})
    F_u: float = field(metadata={"label": "F_u", "unit": "ksi"})
    E: float = field(metadata={"label": "E", "unit": "ksi"})
    K: float = field(metadata={"label": "K", "unit": ""})
    KL_r: float = field(metadata={"label": "KL/r", "unit": ""})
    length_ft: float = field(metadata={"label": "L", "unit": "ft"})
    r_in_plane_in: float = field(default=0.0, metadata={"label": "r in plane", "unit": "in"})
    r_out_of_plane_in: float = field(default=0.0,
                                     metadata={"label": "r out of plane", "unit": "in"})
    Q: float = field(default=1.0, metadata={"label": "Q", "unit": ""})


@dataclass(frozen=True)
class MemberCapacity:
    """All resistance checks of one member with its factors, warnings and assumptions.

    ``factored_resistance(sense)`` = phi_c phi_s phi R_n of the governing check in that sense
    (phi_c phi_s not less than ``phi_cs_floor``), kip; it is 0.0 when the member has no
    resistance in that sense (eyebars and rods in compression, all bars lost).
    """

    member: str
    role: MemberRole
    checks: tuple[Check, ...]
    phi_c: float = field(metadata={"label": "phi_c", "unit": ""})
    phi_s: float = field(metadata={"label": "phi_s", "unit": ""})
    condition: str
    condition_rating: int | None
    summary: SectionSummary
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    tension_only: bool
    removed: tuple[str, ...] = ()
    phi_cs_floor: float = 0.85
    # "singly symmetric" or "unsymmetric": a built-up compression member whose torsional
    # buckling could not be checked; "laced" or "battened": one whose open section would
    # buckle lower than the closed one the rating takes (rating.capacity.compression)
    open_section: str = ""
    open_ratio: float = 1.0  # "laced" or "battened": the open form's P_n over the closed one's

    @property
    def phi_cs(self) -> float:
        """phi_c phi_s with the floor applied (Khan 2010, p. 187) [V]."""
        return combined_factor(self.phi_c, self.phi_s, self.phi_cs_floor)

    def checks_in(self, sense: Sense | str) -> tuple[Check, ...]:
        s = Sense(sense)
        return tuple(c for c in self.checks if c.sense is s)

    def governing(self, sense: Sense | str) -> Check | None:
        """The check with the lowest factored resistance in ``sense`` (first on a tie)."""
        cs = self.checks_in(sense)
        return min(cs, key=lambda c: c.phi_R_n_kip) if cs else None

    def factored_resistance(self, sense: Sense | str) -> float:
        """C = phi_c phi_s phi R_n of the governing check, kip.

        MBE 6A.4.2.1, Eq. 6A.4.2.1-2 with phi_c phi_s >= 0.85 (Khan 2010, p. 187) [V].
        """
        g = self.governing(sense)
        return 0.0 if g is None else self.phi_cs * g.phi_R_n_kip

    def carries_nothing(self) -> bool:
        """Every bar out (loose, missing, broken, cracked): no resistance in either sense by
        the member's own checks (its own-weight checks aside: their zero is the moment's,
        rating.capacity.own_weight)."""
        return bool(self.removed) and all(
            min((c.phi_R_n_kip for c in self.checks_in(s_) if c.name not in OWN_WEIGHT_CHECKS),
                default=0.0) == 0.0 for s_ in Sense)


def _material_notes(design: MemberDesign) -> tuple[list[str], list[str]]:
    mat, m = design.material, design.member
    for name in ("F_y", "F_u", "E"):
        v = getattr(mat, name)
        if not isinstance(v, int | float) or not math.isfinite(v) or v <= 0:
            raise InputError(f"member {m}: material {name} must be a positive number in ksi, "
                             f"got {v!r}", design.where or None)
    warnings: list[str] = []
    assumptions: list[str] = []
    if mat.F_u < mat.F_y:
        warnings.append(f"member {m}: F_u = {mat.F_u:g} ksi is less than F_y = {mat.F_y:g} ksi;"
                        " check the material record")
    if mat.F_y > 100.0:
        warnings.append(f"member {m}: F_y = {mat.F_y:g} ksi is very high for an old truss; was "
                        "it given in MPa?")
    if mat.assumed:
        assumptions.append(f"member {m}: material {mat.kind.value} F_y = {mat.F_y:g} ksi, "
                           f"F_u = {mat.F_u:g} ksi assumed ({mat.basis})")
    return warnings, assumptions


def _without_slender_parts(design: MemberDesign, m: str, findings: tuple[Finding, ...],
                           length_ft: float, role: MemberRole, K: float, connectors,
                           phi_c: float, report, c, KL_out_ft: float | None = None,
                           torsion_found: dict | None = None, connectors_close: bool = True):
    """A part whose slender (corroded) elements lower the whole section's Q may carry less
    than nothing by the Q method; a part cannot weaken the member, so the section is also
    rated without each such part, and without all of them, and the larger resistance kept
    (common practice: a part that buckles locally is taken as not carrying compression).
    AASHTO LRFD 6.9.4.2 [value from memory]. Returns the checks kept and the sections they
    were found on (their locations with the inspection's findings alone)."""
    from rating.capacity.compression import element_Q

    F_y, E = design.material.F_y, design.material.E
    slender = sorted({e.part for s_ in report.compression for e in s_.elements
                      if not e.stiffened and e.t_in > 0 and element_Q(e, F_y, E) < 1.0})
    best, best_report = c, report
    options = [[p] for p in slender] + ([slender] if len(slender) > 1 else [])
    for parts in options:
        extra = tuple(Finding(m, p, bar_state=BarState.LOOSE) for p in parts)
        try:
            rep = section_properties(design.section, member=m, findings=findings + extra,
                                     length_ft=length_ft, where=design.where)
        except InputError:
            continue  # nothing left to carry the load without them
        alt = compression_checks(rep, design.material, K=K, length_ft=length_ft, role=role,
                                 connectors=connectors, phi_c=phi_c,
                                 KL_out_of_plane_ft=KL_out_ft, torsion_found=torsion_found,
                                 connectors_close=connectors_close)
        if alt.checks[0].R_n_kip > best.checks[0].R_n_kip:
            note = (f"member {m}: {', '.join(parts)} taken as not carrying compression: "
                    "its slender elements would lower the whole section's Q more than it "
                    "adds (a part cannot weaken the member; common practice)")
            # the location's findings are the inspection's own (the part left out is said
            # in the note, not as a finding nobody recorded)
            def own(loc, extra=extra):
                return dataclasses.replace(loc, findings=tuple(
                    f for f in loc.findings if f not in extra))

            chk = alt.checks[0]
            chk = dataclasses.replace(chk, location=own(chk.location))
            best = type(alt)((chk,), alt.warnings, alt.assumptions + (note,), alt.K,
                             alt.KL_r, alt.Q, alt.torsional_unchecked, alt.open_ratio)
            best_report = dataclasses.replace(rep, compression=tuple(
                dataclasses.replace(s_, location=own(s_.location)) for s_ in rep.compression))
    return best, best_report


def member_capacity(design: MemberDesign, role: MemberRole, length_ft: float,
                    findings: tuple[Finding, ...], tension_only: bool, *,
                    end_condition: str = "pinned", head_as_pin_plate: bool = True,
                    phi_y: float = PHI_Y, phi_u: float = PHI_U,
                    phi_pin_plate: float = PHI_PIN_PLATE, phi_c_axial: float = PHI_C,
                    phi_cs_floor: float | None = None, own_weight_klf: float = 0.0,
                    gamma_dc: float = 1.25,
                    KL_out_of_plane_ft: float | None = None,
                    torsion_found: dict | None = None,
                    connectors_close: bool = True) -> MemberCapacity:
    """Resistances of one member after the recorded section loss, with phi_c and phi_s.

    AASHTO LRFD 6.8.2.1 and 6.9.4.1.1 [value from memory]; AISC LRFD 1999 D3 [V].

    Args:
        design: section and material; ``design.K`` overrides the effective length factor.
        role: the member's role (secondary members get the looser slenderness limits).
        length_ft: panel-point to panel-point length, ft (stations of findings run along it).
        findings: this member's findings (a finding for another member is an error).
        tension_only: the analysis treats the member as tension-only (no compression counted).
        end_condition: "pinned" (K 0.875) or "riveted" (K 0.75) when ``design.K`` is None.
        head_as_pin_plate: check eyebar heads with the AISC LRFD 1999 D3 pin-plate forms.
        phi_y, phi_u, phi_pin_plate, phi_c_axial: resistance factors (owner may change).
        phi_cs_floor: lower limit of phi_c phi_s (default 0.85 from factors.json).
        own_weight_klf: the member's own weight per foot across its axis (details included,
            unfactored; 0 for a vertical member): the bending it makes is combined with the
            axial force (rating.capacity.own_weight), factored by ``gamma_dc``.
        KL_out_of_plane_ft: the effective length out of the truss plane found apart (a pony
            truss's chord on its U-frames, rating.analysis.uframe); None: K L.
        torsion_found: the torsion analyses of sections already found (see
            ``compression_checks``), shared by the caller's members; None: this call's own.
        connectors_close: False rates a laced or battened section open (a sensitivity; see
            ``compression_checks``).
    """
    m = design.member
    if not isinstance(length_ft, int | float) or not math.isfinite(length_ft) or length_ft <= 0:
        raise InputError(f"member {m}: length must be a positive number of feet, got "
                         f"{length_ft!r}", design.where or None)
    if design.K is not None:
        if not isinstance(design.K, int | float) or not math.isfinite(design.K) \
                or not 0 < design.K <= 3.0:
            raise InputError(f"member {m}: effective length factor K must be more than 0 and "
                             f"not more than 3, got {design.K!r}", design.where or None)
        K = float(design.K)
        k_note = f"member {m}: effective length factor K = {K:g} set by the owner"
    else:
        K = effective_length_factor(end_condition)
        k_note = (f"member {m}: effective length factor K = {K:g} for {end_condition} ends "
                  "(AASHTO LRFD 4.6.2.5, value from memory)")
        if role is MemberRole.END_POST:
            # out of the truss plane an end post is held at its top only by the portal frame
            k_note += (", in and out of the truss plane alike: out of plane an end post is "
                       "held at its top by the portal bracing, which is not checked here; "
                       "where the portal sways, K out of plane is larger (1.0 or more), and "
                       "the engineer gives it on the Members sheet")
    warnings, assumptions = _material_notes(design)
    report = section_properties(design.section, member=m, findings=findings,
                                length_ft=float(length_ft), where=design.where)
    warnings.extend(report.warnings)
    assumptions.extend(report.assumptions)
    t = tension_checks(report, design.material, role=role, length_ft=float(length_ft),
                       phi_y=phi_y, phi_u=phi_u, phi_pin_plate=phi_pin_plate,
                       head_as_pin_plate=head_as_pin_plate)
    connectors = design.section.connectors if isinstance(design.section, BuiltUpSection) \
        else None
    c = compression_checks(report, design.material, K=K, length_ft=float(length_ft), role=role,
                           tension_only=tension_only, connectors=connectors, phi_c=phi_c_axial,
                           KL_out_of_plane_ft=KL_out_of_plane_ft, torsion_found=torsion_found,
                           connectors_close=connectors_close)
    comp_report = report
    if isinstance(design.section, BuiltUpSection) and not tension_only and c.Q < 1.0:
        c, comp_report = _without_slender_parts(design, m, findings, float(length_ft), role,
                                                K, connectors, phi_c_axial, report, c,
                                                KL_out_of_plane_ft, torsion_found,
                                                connectors_close)
    if report.kind in ("built-up", "rolled shape") and not tension_only:
        assumptions.append(k_note)
    f = member_factors(design, findings, report.carrying_count, floor=phi_cs_floor)
    warnings.extend(t.warnings + c.warnings + f.warnings)
    assumptions.extend(t.assumptions + c.assumptions + f.assumptions)
    bending: tuple[Check, ...] = ()
    if own_weight_klf > 0.0 and not tension_only:
        bending, notes, heavy = own_weight_checks(
            report, comp_report, design.material, c.checks[0], c.Q, K, float(length_ft),
            own_weight_klf, gamma_dc, combined_factor(f.phi_c, f.phi_s, f.floor), phi_y,
            phi_u)
        assumptions.extend(notes)
        warnings.extend(heavy)

    A_g = min(s.A_g_in2 for s in report.tension)
    A_n = min(s.A_n_in2 for s in report.tension)
    gc = c.checks[0]
    comp_at = next((s for s in report.compression if s.location == gc.location), None)
    mat = design.material
    # a built-up section's as-built build is all its rectangles: the same sum, already made
    A_as_built = report.as_built.A_g_in2 if isinstance(design.section, BuiltUpSection) \
        else gross_area_as_built_in2(design.section)
    summary = SectionSummary(report.kind, A_g, A_n, A_as_built,
                             mat.F_y, mat.F_u, mat.E, K, c.KL_r, float(length_ft),
                             comp_at.r_x_in if comp_at else 0.0,
                             comp_at.r_y_in if comp_at else 0.0, c.Q)
    removed = tuple(comp for comp, _ in report.removed)
    return MemberCapacity(m, role, t.checks + c.checks + bending, f.phi_c, f.phi_s, f.condition,
                          f.condition_rating, summary, tuple(dict.fromkeys(warnings)),
                          tuple(dict.fromkeys(assumptions)), tension_only, removed, f.floor,
                          c.torsional_unchecked, c.open_ratio)
