"""Axial force that a member can still take while it bends under its own weight.

A truss member that is not vertical spans between its pins and carries its own weight
across its length: a moment M_u that is dead load only (the floor's loads reach the truss at
the panel points, so the live load adds no moment). Combined axial force and flexure are
checked by the interaction equations of AASHTO LRFD 6.8.2.3 (tension) and 6.9.2.2
(compression) [value from memory]:

    P_u / P_r < 0.2:   P_u / (2 P_r) + M_u / M_r <= 1.0        (Eq. 6.8.2.3-1, 6.9.2.2-1)
    P_u / P_r >= 0.2:  P_u / P_r + (8/9) M_u / M_r <= 1.0      (Eq. 6.8.2.3-2, 6.9.2.2-2)

In compression the moment is magnified by delta_b = C_m / (1 - P_u / (phi_K P_e)), C_m = 1.0
for a member with load between its supports and phi_K = 1.0 for steel (AASHTO LRFD
4.5.3.2.2b [value from memory]); in tension it is not (tension straightens the member; leaving
that out is conservative).

The moment does not depend on the live load, so the axial force P* at which the interaction
reaches 1.0 is one number for the member: its axial resistance as far as the rating is
concerned (the rating equation of MBE 6A.4.2.1 then takes C = P*, common practice).
"""

from __future__ import annotations

import math

PHI_F = 1.0
"""Resistance factor for flexure (AASHTO LRFD 6.5.4.2 [value from memory])."""

C_M = 1.0
"""Moment gradient factor of a member with load between its supports (AASHTO LRFD 4.5.3.2.2b
[value from memory])."""

PHI_K = 1.0
"""Stiffness reduction factor of steel members in the moment magnifier (AASHTO LRFD
4.5.3.2.2b [value from memory])."""


def own_weight_moment_kip_in(weight_klf: float, length_ft: float) -> float:
    """Mid-span moment of a uniform load across a simply supported length, w L^2 / 8, kip-in
    (statics; a pin-ended member, common practice)."""
    return weight_klf * length_ft**2 / 8.0 * 12.0


def magnifier(P_u_kip: float, P_e_kip: float, C_m: float = C_M, phi_K: float = PHI_K) -> float:
    """delta_b = C_m / (1 - P_u / (phi_K P_e)) >= 1.0 (AASHTO LRFD Eq. 4.5.3.2.2b-3 [value
    from memory]); inf at or past the elastic buckling load."""
    if P_u_kip >= phi_K * P_e_kip:
        return math.inf
    return max(C_m / (1.0 - P_u_kip / (phi_K * P_e_kip)), 1.0)


def interaction(P_u_kip: float, M_u_kip_in: float, P_r_kip: float, M_r_kip_in: float,
                P_e_kip: float | None = None) -> float:
    """The left side of AASHTO LRFD Eq. 6.8.2.3-1/-2 or 6.9.2.2-1/-2 [value from memory]
    (``P_e_kip`` given: compression, the moment magnified; None: tension)."""
    if P_r_kip <= 0.0:
        return math.inf
    M = M_u_kip_in * (magnifier(P_u_kip, P_e_kip) if P_e_kip is not None else 1.0)
    ratio_m = M / M_r_kip_in if M_r_kip_in > 0.0 else (0.0 if M == 0.0 else math.inf)
    if P_u_kip / P_r_kip < 0.2:
        return P_u_kip / (2.0 * P_r_kip) + ratio_m
    return P_u_kip / P_r_kip + 8.0 / 9.0 * ratio_m


def axial_limit_kip(P_r_kip: float, M_u_kip_in: float, M_r_kip_in: float,
                    P_e_kip: float | None = None) -> float:
    """The axial force P* (0 <= P* <= P_r) at which :func:`interaction` reaches 1.0 with the
    moment ``M_u_kip_in``; 0 where the moment alone reaches it. The interaction grows with P
    (both branches, and the magnifier), so P* is found by bisection to 1e-12 of P_r."""
    if P_r_kip <= 0.0 or interaction(0.0, M_u_kip_in, P_r_kip, M_r_kip_in, P_e_kip) >= 1.0:
        return 0.0
    if M_u_kip_in <= 0.0:
        return P_r_kip
    lo, hi = 0.0, P_r_kip
    while hi - lo > 1e-12 * P_r_kip:
        mid = 0.5 * (lo + hi)
        if interaction(mid, M_u_kip_in, P_r_kip, M_r_kip_in, P_e_kip) >= 1.0:
            hi = mid
        else:
            lo = mid
    return lo
