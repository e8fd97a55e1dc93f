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
from dataclasses import dataclass, replace
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
    at_rating: PinCheck | None  # the full pin check at the rating load level; kept for the
    # pin's governing case only (the report shows that one)


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
    # every candidate position of every case, searched together
    row_case: list[int] = []
    row_key: list[tuple] = []
    row_ext: list[Extreme] = []
    row_P: list[np.ndarray] = []
    # every distinct envelope row of the members here over the active sets, in search order
    rows_here = envs.distinct(members_here, configs)
    for ci, case in enumerate(cases):
        im = case.im.value
        unique: dict = {}
        for row, _ in rows_here:
            me = envs.of_row(case.load, im, row)
            for e in (me.max, me.min):
                if e.position is None and not e.lane_segments_ft:
                    continue
                unique.setdefault((e.model, e.position, e.lane_segments_ft), e)
        for key, e in unique.items():
            row_case.append(ci)
            row_key.append(key)
            row_ext.append(e)
            # gamma_LL = 1 here: one path serves every rating level of the load
            row_P.append(paths.live_loads((case.load.id, im, key), partial(
                live_joint_loads, g, case.load, e, im, df)))
    n_rows = len(row_P)
    lams = np.full(n_rows, np.inf)
    N_at = np.zeros((n_rows, len(idx)))  # member forces at the joint at lam, finite rows
    if n_rows and linear:
        # forces at this joint are linear in lam on the dead-load active set
        N_live = solver.solve(np.stack(row_P, axis=-1)).member_forces_kip[idx].T
        F_base = model.point_forces(N0, _balancing(unit, N0))
        lams = model.multipliers(F_base, model.point_forces(N_live, _balancing(unit, N_live)))
        fin = np.isfinite(lams)
        N_at[fin] = N0 + lams[fin, None] * N_live[fin]
    elif n_rows:
        # piecewise linear along each position's exact load path, followed piece by piece
        # for all positions together until each reaches the limit (or its path ends): the
        # first piece whose end reaches it holds the crossing
        path_keys = [(cases[ci].load.id, cases[ci].im.value, g_dc, g_dw, key)
                     for ci, key in zip(row_case, row_key, strict=True)]
        walks = {k: paths.segments(path_keys[k], P_dead, row_P[k], dead_state)
                 for k in range(n_rows)}
        picked: list[tuple[int, float, float, np.ndarray, np.ndarray, np.ndarray,
                           np.ndarray]] = []
        piece = 0
        while walks:
            PathCache.follow(list(walks.values()), piece)
            step = [(k, sg) for k, lp in walks.items() if (sg := lp.piece(piece)) is not None]
            if not step:
                break
            walks = {k: walks[k] for k, _ in step}
            n0a = np.array([sg.forces(sg.lam_start)[idx] for _, sg in step])
            n1a = np.array([sg.N_live[idx] for _, sg in step])
            ln = np.array([sg.lam_end - sg.lam_start for _, sg in step])
            F0a = model.point_forces(n0a, _balancing(unit, n0a))
            F1a = model.point_forces(n1a, _balancing(unit, n1a))
            reach = model.utilization(F0a + ln[:, None, None] * F1a) >= 1.0
            for i in np.nonzero(reach)[0]:
                k, sg = step[i]
                picked.append((k, sg.lam_start, float(ln[i]), F0a[i], F1a[i], n0a[i], n1a[i]))
                del walks[k]
            piece += 1
        if picked:
            ks = np.array([t[0] for t in picked])
            ln = np.array([t[2] for t in picked])
            rel = np.minimum(model.multipliers(np.stack([t[3] for t in picked]),
                                               np.stack([t[4] for t in picked]), upper=ln), ln)
            lams[ks] = np.array([t[1] for t in picked]) + rel
            N_at[ks] = np.stack([t[5] for t in picked]) + rel[:, None] * np.stack(
                [t[6] for t in picked])
    if n_rows:
        lams = lams / np.array([cases[ci].gamma_ll.value for ci in row_case])
        u_fs, u_b = model.utilization_parts(model.point_forces(N_at, _balancing(unit, N_at)))
    row_case_a = np.array(row_case, dtype=int)
    worst_k, worst_lam = -1, math.inf
    for ci, case in enumerate(cases):
        here = np.nonzero(row_case_a == ci)[0]
        if not here.size:
            ratings[case.id] = PinCaseRating(case.id, math.inf, "not loaded by this vehicle",
                                             None, None)
            continue
        low = float(lams[here].min())
        tol = 1e-9 * max(abs(low), 1.0) if math.isfinite(low) else 0.0
        k = int(here[np.flatnonzero(lams[here] <= low + tol)[0]])  # of ties, the first
        lam = float(lams[k])
        if not math.isfinite(lam):
            ratings[case.id] = PinCaseRating(case.id, math.inf, "not loaded by this vehicle",
                                             None, None)
            continue
        what = "pin bearing" if u_b[k] >= u_fs[k] else "pin flexure and shear"
        ratings[case.id] = PinCaseRating(case.id, lam, what, row_ext[k], None)
        if lam < worst_lam - 1e-9 * max(abs(worst_lam), 1.0) or worst_k < 0:
            worst_k, worst_lam = k, lam
    if worst_k >= 0:
        # the full pin check (sections, plates, balance) at the rating load level of the
        # governing case and position, for the report
        N_here = N_at[worst_k]
        chk = pin_check(pin, pin_actions(g, pin.joint, dict(zip(members_here,
                                                                map(float, N_here),
                                                                strict=True))),
                        external_kip=tuple(_balancing(unit, N_here)), designs=designs)
        cid = cases[row_case[worst_k]].id
        ratings[cid] = replace(ratings[cid], at_rating=chk)
    return PinRating(pin.joint, pin, ratings, dead_check, dead_check.warnings,
                     dead_check.assumptions)
