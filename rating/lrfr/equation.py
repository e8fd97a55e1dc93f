"""The LRFR rating equation for one member, one sense, one live-load effect."""

from __future__ import annotations

import math
from dataclasses import dataclass

from rating.capacity.factors import combined_factor
from rating.lrfr.factors import Factor, factored_dw


@dataclass(frozen=True)
class SenseLoads:
    """Forces in the sense being rated, positive when they act in that sense (kip).

    For a tension check these are the tension components; for a compression check the
    compressive ones (compression taken positive).
    """

    DC: float
    DW: float
    LL_IM: float  # factored later by gamma_LL; includes IM on axles, lane without IM
    P: float = 0.0
    DW_surface: float = 0.0  # the part of DW that is the wearing surface (its own factor)


@dataclass(frozen=True)
class RatingFactorResult:
    """The rating factor from the LRFR equation with the terms used: the dead-load factors
    chosen, gamma_LL, the capacity C and the factored dead load (kip)."""

    rf: float
    gamma_dc: float
    gamma_dw: float
    gamma_ll: float
    capacity_kip: float
    factored_dead_kip: float


def rating_factor(C: float, loads: SenseLoads, gamma_ll: float,
                  dead: dict[str, Factor], gamma_p: float = 0.0) -> RatingFactorResult:
    """RF = (C - gDC*DC - gDW*DW +/- gP*P) / (gLL*(LL + IM)); a wearing surface of measured
    thickness within DW takes its own factor (rating.lrfr.factors.factored_dw).

    MBE 6A.4.2.1, Eq. 6A.4.2.1-1 [value from memory; terms as Khan 2010, p. 187, read].
    A dead load that adds to the effect takes the maximum factor; one that relieves it the
    minimum (AASHTO LRFD 3.4.1, Table 3.4.1-2 [V]). A live effect of zero in this sense gives
    RF = +inf (the vehicle does not load the member this way).
    """
    g_dc = dead["gamma_dc_max"].value if loads.DC > 0 else dead["gamma_dc_min"].value
    g_dw = dead["gamma_dw_max"].value if loads.DW > 0 else dead["gamma_dw_min"].value
    dw = g_dw * loads.DW
    if loads.DW_surface:
        # the wearing surface and the utilities factored apart: gamma_DW is their weighted
        # value, so that gamma_DW x DW is what was taken off
        dw = factored_dw(loads.DW, loads.DW_surface, dead)
        g_dw = dw / loads.DW if loads.DW else g_dw
    factored_dead = g_dc * loads.DC + dw - gamma_p * loads.P
    if loads.LL_IM <= 0.0:
        rf = math.inf
    else:
        rf = (C - factored_dead) / (gamma_ll * loads.LL_IM)
    return RatingFactorResult(rf, g_dc, g_dw, gamma_ll, C, factored_dead)


def factored_capacity(phi_c: float, phi_s: float, phi: float, R_n: float,
                      floor: float = 0.85) -> float:
    """C = phi_c * phi_s * phi * R_n with phi_c * phi_s >= 0.85.

    MBE 6A.4.2.1, Eq. 6A.4.2.1-2 and -3 [Khan 2010, p. 187, read].
    """
    return combined_factor(phi_c, phi_s, floor) * phi * R_n


def lower_beyond_round_off(a: float, b: float) -> bool:
    """a < b by more than round-off: of ties (mirror members, pins or vehicle positions of a
    symmetric truss) the first found stays, never a pick by the last digit."""
    return a < b - 1e-9 * max(abs(b), 1.0) if math.isfinite(b) else a < b
