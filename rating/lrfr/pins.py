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
from functools import partial

import numpy as np

from rating.analysis.moving import Extreme
from rating.analysis.path import PathCache
from rating.analysis.truss import TrussFamily
from rating.capacity.pins import (
    PinCheck,
    PinModel,
    pin_actions,
    pin_check,
)
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


def _balancing(unit: np.ndarray, N: np.ndarray) -> np.ndarray:
    """The force the pin takes from outside the bars (floorbeam hanger, bearing shoe):
    minus the resultant of the bar forces on the joint, so the pin is in equilibrium.
    ``unit`` (n_here, 2) points from the joint along each member; ``N`` (..., n_here)."""
    return -(np.asarray(N)[..., :, None] * unit).sum(axis=-2)


def rate_pin(pin: Pin, g: TrussGeometry, family: TrussFamily, bridge, cases,
             configs: Sequence[frozenset[str]], envs, dead, dead_f, df: float,
             dead_states, dependent: frozenset[str], paths: PathCache) -> PinRating:
    """Rate one pin for every case (see the module docstring).

    Where no member at the joint depends on the counter panels' active set, the forces are
    linear in lam on the dead-load active set and one multiplier search per position does.
    """
    designs = {d.member: d for d in bridge.member_designs}
    g_dc, g_dw = dead_f["gamma_dc_max"].value, dead_f["gamma_dw_max"].value
    P_dead, dead_state = dead_states[(g_dc, g_dw)]
    members_here = [m.label for m in g.members_at(pin.joint)]
    linear = not (set(members_here) & dependent)
    ratings: dict[str, PinCaseRating] = {}
    idx = [g.member_index[lab] for lab in members_here]
    jt = g.joint(pin.joint)
    dirs = []
    for lab in members_here:
        m = g.member(lab)
        far = g.joint(m.end if m.start == pin.joint else m.start)
        dirs.append((far.x_ft - jt.x_ft, far.y_ft - jt.y_ft))
    unit = np.array(dirs, dtype=float)
    unit /= np.linalg.norm(unit, axis=1)[:, None]
    # the pin under factored dead load alone, for the report and its warnings
    N_dead_here = (g_dc * dead.member_forces_dc_kip + g_dw * dead.member_forces_dw_kip)[idx]
    dead_check = pin_check(
        pin, pin_actions(g, pin.joint, dict(zip(members_here, map(float, N_dead_here),
                                                strict=True))),
        external_kip=tuple(_balancing(unit, N_dead_here)), designs=designs)
    model = PinModel(pin, members_here, dirs, designs=designs)
    solver = family.solver(dead_state.slack)
    N0 = dead_state.solution.member_forces_kip[idx]
    ext_dead = _balancing(unit, N0)
    F_base = model.point_forces(N0, ext_dead)
    for case in cases:
        im, g_ll = case.im.value, case.gamma_ll.value
        unique: dict = {}
        for c in configs:
            for lab in members_here:
                if c != configs[0] and lab not in dependent:
                    continue  # the same envelope in every active set
                me = envs.of(case.load, im, lab, c)
                for e in (me.max, me.min):
                    if e.position is None and not e.lane_segments_ft:
                        continue
                    unique.setdefault((e.model, e.position, e.lane_segments_ft), e)
        keys = list(unique)
        best = PinCaseRating(case.id, math.inf, "not loaded by this vehicle", None, None)
        exts = list(unique.values())
        if not exts:
            ratings[case.id] = best
            continue
        P_lives = [paths.live_loads((case.id, key), partial(
            live_joint_loads, g, case.load, e, im, df, g_ll)) for key, e in unique.items()]
        P = np.stack(P_lives, axis=-1)  # (n_joints, 2, n_positions)
        if linear:
            # forces at this joint are linear in lam on the dead-load active set: all
            # positions in one vectorized search
            N_live = solver.solve(P).member_forces_kip[idx].T  # (n_positions, n_here)
            lams = model.multipliers(F_base, model.point_forces(N_live,
                                                                _balancing(unit, N_live)))
        else:
            # piecewise linear along each position's exact load path: every piece of every
            # path in one vectorized search, then the first piece that holds the crossing
            owner, starts, lengths, F0s, F1s = [], [], [], [], []
            for k, P_live in enumerate(P_lives):
                for seg in paths.segments((case.id, g_dc, g_dw, keys[k]), P_dead, P_live,
                                          dead_state):
                    owner.append(k)
                    starts.append(seg.lam_start)
                    lengths.append(seg.lam_end - seg.lam_start)
                    n0, n1 = seg.forces(seg.lam_start)[idx], seg.N_live[idx]
                    F0s.append(model.point_forces(n0, _balancing(unit, n0)))
                    F1s.append(model.point_forces(n1, _balancing(unit, n1)))
            F0a, F1a, ln = np.stack(F0s), np.stack(F1s), np.array(lengths)
            # the first piece of each path whose end reaches the limit holds the crossing
            u_end = model.utilization(F0a + ln[:, None, None] * F1a)
            pick: dict[int, int] = {}
            for i, (k, u) in enumerate(zip(owner, u_end, strict=True)):
                if k not in pick and u >= 1.0:
                    pick[k] = i
            lams = np.full(len(exts), np.inf)
            if pick:
                sel = np.array(list(pick.values()))
                rel = model.multipliers(F0a[sel], F1a[sel], upper=ln[sel])
                for k, i, r in zip(pick, sel, rel, strict=True):
                    lams[k] = starts[i] + min(r, ln[i])
        k = int(np.argmin(lams))
        lam = float(lams[k])
        if math.isfinite(lam):
            # the pin check at the rating load level of the governing position, for the report
            if linear:
                N_here = dead_state.solution.member_forces_kip[idx] + lam * N_live[k]
            else:
                seg_i = pick[k]
                seg_start = starts[seg_i]
                seg = next(sg for sg in paths.segments((case.id, g_dc, g_dw, keys[k]), P_dead,
                                                       P_lives[k], dead_state)
                           if sg.lam_start == seg_start)
                N_here = seg.forces(lam)[idx]
            chk = pin_check(pin, pin_actions(g, pin.joint, dict(zip(members_here,
                                                                    map(float, N_here),
                                                                    strict=True))),
                            external_kip=tuple(_balancing(unit, N_here)), designs=designs)
            what = ("pin bearing" if chk.utilization_bearing >= chk.utilization_flexure_shear
                    else "pin flexure and shear")
            best = PinCaseRating(case.id, lam, what, exts[k], chk)
        ratings[case.id] = best
    return PinRating(pin.joint, pin, ratings, dead_check, dead_check.warnings,
                     dead_check.assumptions)
