"""Resistances of a built-up member that bends between its pins under its own weight.

The member's own weight across its axis gives the moment M(x) = gamma_DC w x (L - x) / 2,
gamma_DC w L^2 / 8 at mid-length (a pin-ended member, statics); it is combined with the axial
force at each location along the member by rating.capacity.interaction (AASHTO LRFD 6.8.2.3
and 6.9.2.2 [value from memory]). The least axial force at which the interaction reaches 1.0
is the member's axial resistance for the rating.
"""

from __future__ import annotations

import math

from rating.capacity.checks import Check, Sense
from rating.capacity.interaction import (
    PHI_F,
    axial_limit_kip,
    interaction,
    magnifier,
    own_weight_moment_kip_in,
)
from rating.capacity.sections import Location, SectionAtLocation, SectionReport
from rating.capacity.tension import fracture_nominal, yielding_nominal
from rating.model import Material

OWN_WEIGHT_CHECKS = ("compression: buckling with own-weight bending",
                     "tension with own-weight bending")
"""The names of the checks of :func:`own_weight_checks` (compression, tension)."""

OWN_WEIGHT_NOTE = (
    "Built-up members that are not vertical bend between their pins under their own weight "
    "across their length (details included, as in the dead load): the moment, dead load at "
    "gamma_DC, is combined with the axial force at each location along the member by the "
    "interaction equations of AASHTO LRFD 6.8.2.3 and 6.9.2.2, magnified in compression "
    "(4.5.3.2.2b, with the member's K in the truss plane, at most 1.0) [value from memory]; "
    "P_r and M_r = phi_f F_y S_x at each location (times Q in compression; first yield; "
    "lateral-torsional buckling of a laced or plated member not checked) both carry the "
    "member's phi_c phi_s. The pins are taken on "
    "the centroid: an eccentric pin's moment is not included. Eyebars and rods (tension "
    "straightens them) are not checked so.")
"""The one assumption every member checked by :func:`own_weight_checks` gives (the same
words, said once in a report)."""

NEGLIGIBLE = 1e-4
"""An own-weight moment below this fraction of the member's least M_r is not checked (a
member all but vertical): it would change no resistance beyond round-off."""


def moment_factor(location: Location, length_ft: float) -> float:
    """M(x) / M(L/2) = 4 x (L - x) / L^2 at the location's station; 1.0 for a location over
    the whole length (statics of a uniformly loaded simple span)."""
    if location.station_ft is None:
        return 1.0
    x = min(max(location.station_ft, 0.0), length_ft)
    return 4.0 * x * (length_ft - x) / length_ft**2


def _num(x: float) -> str:
    """Five significant digits, never an exponent: the text of an SI bridge is converted from
    these to four (rating.units.si_text), so it reads as the tables do."""
    if x == 0.0 or not math.isfinite(x):
        return f"{x:g}"
    return f"{x:.0f}" if abs(x) >= 10000.0 else f"{x:.5g}"


def own_weight_checks(report: SectionReport, compression_report: SectionReport,
                      material: Material, buckling: Check, Q: float, K: float,
                      length_ft: float, w_klf: float, gamma_dc: float, phi_cs: float,
                      phi_y: float, phi_u: float
                      ) -> tuple[tuple[Check, ...], list[str], list[str]]:
    """The member's axial resistances with its own-weight bending: checks, assumptions and
    warnings (AASHTO LRFD 6.8.2.3 / 6.9.2.2, 4.5.3.2.2b [value from memory]).

    Compression: P_r = phi_c phi_s phi_c P_n of the buckling check ``buckling`` (a property
    of the whole member) and P_e = pi^2 E I_x / (K L)^2 with I_x of the section it was found
    at and K in the truss plane (``K``, at most 1.0: the member is held at both pins in that
    plane); at each location of ``compression_report`` (the section the buckling check used)
    M_r = phi_c phi_s phi_f Q F_y S_x there and the moment there. Tension: at each location
    of ``report`` P_r = phi_c phi_s x the lesser of yielding on the gross and fracture on the
    net section there (AASHTO LRFD 6.8.2.1 [value from memory]). Each check's phi_c phi_s phi
    R_n is the least axial force over the locations; its location the one that gives it.
    Only built-up members (their section modulus is known); a rolled shape gets a note."""
    m = report.member
    if report.kind == "rolled shape":
        return (), [f"member {m}: its bending under its own weight ({_num(w_klf * 1000.0)} "
                    "plf across it) is not checked: the Rolled sheet gives no section "
                    "modulus; the engineer should combine it with the axial force by hand "
                    "(AASHTO LRFD 6.9.2.2 [value from memory])"], []
    if report.kind != "built-up":
        return (), [], []
    M_mid = gamma_dc * own_weight_moment_kip_in(w_klf, length_ft)
    F_y = material.F_y
    out: list[Check] = []
    warnings: list[str] = []
    tension = [s for s in report.tension if _usable(s)]
    compression = [s for s in compression_report.compression if _usable(s)]
    S_top = max((s.properties.S_x_in3 for s in tension + compression), default=0.0)
    if not S_top or M_mid < NEGLIGIBLE * phi_cs * PHI_F * F_y * S_top:
        return (), [], []
    if buckling.R_n_kip > 0.0 and buckling.phi > 0.0 and compression:
        at = next((s for s in compression if s.location == buckling.location), None)
        I_x = (at.properties.I_x_in4 if at is not None
               else min(s.properties.I_x_in4 for s in compression))
        K_in = min(K, 1.0)
        P_e = math.pi**2 * material.E * I_x / (K_in * length_ft * 12.0) ** 2
        P_r = phi_cs * buckling.phi_R_n_kip
        found = [(axial_limit_kip(P_r, M_mid * moment_factor(s.location, length_ft),
                                  phi_cs * PHI_F * Q * F_y * s.properties.S_x_in3, P_e), s)
                 for s in compression]
        P_star, s = min(found, key=lambda t: t[0])
        out.append(_check(OWN_WEIGHT_CHECKS[0], buckling, buckling.phi, P_star, P_r, s,
                          M_mid, Q, F_y, phi_cs, gamma_dc, w_klf, length_ft,
                          f", P_e = {_num(P_e)} kip (in-plane K = {_num(K_in)}; moment "
                          "magnified by delta_b = C_m / (1 - P/P_e), C_m = 1.0, LRFD "
                          "4.5.3.2.2b)", "6.9.2.2, Eqs. 6.9.2.2-1/-2", P_e))
        if P_star == 0.0:
            warnings.append(_too_heavy(m, M_mid, s, phi_cs * PHI_F * Q * F_y))
    if tension:
        found_t = []
        for s in tension:
            y = phi_y * float(yielding_nominal(s.A_g_in2, F_y))
            f = phi_u * float(fracture_nominal(s.A_n_in2, material.F_u, s.shear_lag_U))
            phi, name = (phi_y, "yielding on the gross section") if y <= f else (
                phi_u, "fracture on the net section")
            P_r = phi_cs * min(y, f)
            if P_r <= 0.0:
                continue
            P_star = axial_limit_kip(P_r, M_mid * moment_factor(s.location, length_ft),
                                     phi_cs * PHI_F * F_y * s.properties.S_x_in3)
            found_t.append((P_star, s, phi, name, P_r))
        if found_t:
            P_star, s, phi, name, P_r = min(found_t, key=lambda t: t[0])
            base = Check(name, Sense.TENSION, phi, 0.0, "", s.location)
            out.append(_check(OWN_WEIGHT_CHECKS[1], base, phi, P_star, P_r, s, M_mid, 1.0,
                              F_y, phi_cs, gamma_dc, w_klf, length_ft, "",
                              "6.8.2.3, Eqs. 6.8.2.3-1/-2"))
            if P_star == 0.0 and not warnings:
                warnings.append(_too_heavy(m, M_mid, s, phi_cs * PHI_F * F_y))
    return tuple(out), [OWN_WEIGHT_NOTE] if out else [], warnings


def _usable(s: SectionAtLocation) -> bool:
    return s.properties is not None and s.properties.A_in2 > 0.0


def _check(name: str, base: Check, phi: float, P_star: float, P_r: float,
           s: SectionAtLocation, M_mid: float, Q: float, F_y: float, phi_cs: float,
           gamma_dc: float, w_klf: float, length_ft: float, magnified: str,
           equations: str, P_e: float | None = None) -> Check:
    """One own-weight check: phi_c phi_s phi R_n = ``P_star`` at the location ``s``; its
    text gives the terms and the interaction worked at ``P_star`` (``P_e``: compression, the
    moment magnified)."""
    k = moment_factor(s.location, length_ft)
    S = s.properties.S_x_in3
    M_r = phi_cs * PHI_F * Q * F_y * S
    M_u = M_mid * k
    where = "at mid-length" if k >= 1.0 - 1e-12 else (
        f"at {_num(s.location.station_ft)} ft, {_num(k)} of its mid-length value")
    delta = magnifier(P_star, P_e) if P_e is not None else 1.0
    d_txt = f"{_num(delta)} x " if P_e is not None else ""
    if P_r > 0.0 and M_r > 0.0 and P_star / P_r >= 0.2:
        worked = (f"P/P_r + 8/9 x {'delta_b x ' if P_e is not None else ''}M_u/M_r = "
                  f"{_num(P_star)} kip / {_num(P_r)} kip + 8/9 x {d_txt}{_num(M_u)} kip-in / "
                  f"{_num(M_r)} kip-in = {interaction(P_star, M_u, P_r, M_r, P_e):.3f}")
    elif P_r > 0.0 and M_r > 0.0:
        worked = (f"P/(2 P_r) + {'delta_b x ' if P_e is not None else ''}M_u/M_r = "
                  f"{_num(P_star)} kip / (2 x {_num(P_r)} kip) + {d_txt}{_num(M_u)} kip-in / "
                  f"{_num(M_r)} kip-in = {interaction(P_star, M_u, P_r, M_r, P_e):.3f}")
    else:
        worked = "no axial force is left"
    detail = (f"with {base.name}: P_r = {_num(P_r)} kip; M_u = {_num(M_u)} kip-in "
              f"({where}; gamma_DC {gamma_dc:g} x w L^2/8 = {_num(M_mid)} kip-in, w = "
              f"{_num(w_klf * 1000.0)} plf across the member, L = {_num(length_ft)} ft); M_r = "
              f"{_num(M_r)} kip-in (phi_c phi_s {_num(phi_cs)} x phi_f {PHI_F:g}"
              f"{f' x Q {Q:.3f}' if Q < 1.0 else ''} x F_y x S_x, S_x = {_num(S)} in3 here)"
              f"{magnified}; the interaction reaches 1.0 at P = {_num(P_star)} kip: {worked} "
              "(P is shown as phi_c phi_s phi R_n; R_n is that over phi_c phi_s phi)")
    prov = (f"AASHTO LRFD {equations} [value from memory]; own weight across a pin-ended "
            "member [common practice]")
    return Check(name, base.sense, phi, P_star / (phi_cs * phi), prov, s.location, detail)


def _too_heavy(member: str, M_mid: float, s: SectionAtLocation, per_S: float) -> str:
    return (f"member {member}: its own-weight moment alone (M_u = {_num(M_mid)} kip-in at "
            f"mid-length) reaches its first-yield resistance (M_r = "
            f"{_num(per_S * s.properties.S_x_in3)} kip-in at {s.location.describe()}): by the "
            "interaction of AASHTO LRFD 6.8.2.3 / 6.9.2.2 [value from memory] it can carry no "
            "axial force; check its section, unit weight and detail allowance")

