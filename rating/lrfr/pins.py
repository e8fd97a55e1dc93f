"""Rating of pins with the concurrent forces of one vehicle position at a time.

For a pin at joint J the candidate positions are every position that is critical (max or min)
for any member meeting at J, in any active set; at each the forces of ALL members at J come
from the same loading (never a sum of separate maxima). Along the exact load path of factored
dead load + lam x factored (LL + IM) (docs/tension-only.md) the member forces are linear in lam
within each piece, and the pin's utilization (AASHTO LRFD 6.7.6.2.1 / 6.7.6.2.2 [value from
memory], see rating.capacity.pins) is driven to 1.0 piece by piece. The RF is the least lam.
Dead load on pins takes the maximum load factors (it adds to the pin forces; common practice).
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import numpy as np

from rating.analysis.moving import Extreme
from rating.analysis.path import load_path
from rating.analysis.truss import TrussFamily
from rating.capacity.pins import PinCheck, pin_actions, pin_check, pin_load_multiplier
from rating.lrfr.liveload import live_joint_loads
from rating.model import Pin, TrussGeometry


@dataclass(frozen=True)
class PinCaseRating:
    case: str
    rf: float
    check: str
    extreme: Extreme | None
    at_rating: PinCheck | None  # the pin check at the rating load level, for the report


@dataclass(frozen=True)
class PinRating:
    joint: str
    pin: Pin
    ratings: Mapping[str, PinCaseRating]
    dead_check: PinCheck | None
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]


def _external(g: TrussGeometry, joint: str, P: np.ndarray) -> tuple[float, float]:
    j = g.joint_index[joint]
    return float(P[j, 0]), float(P[j, 1])


def pin_multiplier_on_path(pin: Pin, g: TrussGeometry, family: TrussFamily,
                           P_dead: np.ndarray, P_live: np.ndarray, designs: Mapping,
                           lam_max: float = 1e3) -> tuple[float, PinCheck | None]:
    """Least lam at which the pin reaches its limit along the exact load path."""
    labels = [m.label for m in g.members]
    here = {m.label for m in g.members_at(pin.joint)}
    idx = [i for i, lab in enumerate(labels) if lab in here]
    ext_d = _external(g, pin.joint, P_dead)
    ext_l = _external(g, pin.joint, P_live)
    for seg in load_path(family, P_dead, P_live, lam_max):
        N0 = seg.forces(seg.lam_start)
        base = pin_actions(g, pin.joint, {labels[i]: float(N0[i]) for i in idx})
        added = pin_actions(g, pin.joint, {labels[i]: float(seg.N_live[i]) for i in idx})
        base_ext = (ext_d[0] + seg.lam_start * ext_l[0], ext_d[1] + seg.lam_start * ext_l[1])
        lam = pin_load_multiplier(pin, base, added, base_external_kip=base_ext,
                                  added_external_kip=ext_l, designs=designs,
                                  lam_max=max(seg.lam_end - seg.lam_start, 1e-12) * 1.000001)
        total = seg.lam_start + lam
        if math.isfinite(lam) and total <= seg.lam_end * (1 + 1e-9) + 1e-12:
            N = seg.forces(total)
            chk = pin_check(pin, pin_actions(g, pin.joint, {labels[i]: float(N[i]) for i in idx}),
                            external_kip=(ext_d[0] + total * ext_l[0],
                                          ext_d[1] + total * ext_l[1]), designs=designs)
            return total, chk
    return math.inf, None


def rate_pin(pin: Pin, g: TrussGeometry, family: TrussFamily, capacities, bridge, cases,
             configs: Sequence[frozenset[str]], env_cache, dead, dead_f, df: float) -> PinRating:
    """Rate one pin for every case (see the module docstring)."""
    designs = {d.member: d for d in bridge.member_designs}
    g_dc, g_dw = dead_f["gamma_dc_max"].value, dead_f["gamma_dw_max"].value
    P_dead = g_dc * dead.joint_loads_dc_kip + g_dw * dead.joint_loads_dw_kip
    members_here = [m.label for m in g.members_at(pin.joint)]
    # the pin under factored dead load alone, for the report and its warnings
    labels = [m.label for m in g.members]
    dead_check = pin_check(
        pin, pin_actions(g, pin.joint, {lab: float(g_dc * dead.member_forces_dc_kip[i]
                                                   + g_dw * dead.member_forces_dw_kip[i])
                                        for i, lab in enumerate(labels) if lab in members_here}),
        external_kip=_external(g, pin.joint, P_dead), designs=designs)
    ratings: dict[str, PinCaseRating] = {}
    for case in cases:
        im, g_ll = case.im.value, case.gamma_ll.value
        seen: set = set()
        best = PinCaseRating(case.id, math.inf, "not loaded by this vehicle", None, None)
        for c in configs:
            env = env_cache[(case.load.id, c)]
            for lab in members_here:
                me = env.of(lab)
                for e in (me.max, me.min):
                    key = (e.model, e.position, e.lane_segments_ft)
                    if key in seen or (e.position is None and not e.lane_segments_ft):
                        continue
                    seen.add(key)
                    P_live = g_ll * live_joint_loads(g, case.load, e, im, df)
                    lam, chk = pin_multiplier_on_path(pin, g, family, P_dead, P_live, designs)
                    if lam < best.rf:
                        what = "pin"
                        if chk is not None:
                            what = ("pin bearing" if chk.utilization_bearing
                                    >= chk.utilization_flexure_shear else
                                    f"pin flexure and shear at z = {chk.governing.z_in:.2f} in")
                        best = PinCaseRating(case.id, lam, what, e, chk)
        ratings[case.id] = best
    return PinRating(pin.joint, pin, ratings, dead_check, dead_check.warnings,
                     dead_check.assumptions)
