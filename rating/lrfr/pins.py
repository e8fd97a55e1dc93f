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
from rating.lrfr.equation import lower_beyond_round_off
from rating.lrfr.liveload import position_key, position_live_loads
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


def _station_key(e: Extreme) -> tuple | None:
    """A position of a fixed-spacing load by its model, direction and front station to
    1e-6 ft (the spacings are the load's own)."""
    if e.position is None or e.lane_segments_ft:
        return None
    pos = e.position
    return (e.model, pos.direction, round(pos.front_axle_ft, 6))


def _bar_zero_lines(family: TrussFamily, idx: list[int], P_dead: np.ndarray,
                    Pa: np.ndarray, Pb: np.ndarray,
                    states: tuple[frozenset[str], frozenset[str]], paths: PathCache,
                    keys: tuple) -> list[tuple]:
    """For two panel-point positions (live loads ``Pa``, ``Pb``) whose active sets at the
    rating level differ: in the set at either end, each bar whose state differs between the
    ends passes zero where (a + b t) lam + c = 0 (its force, or its stretch when slack); the
    forces at the joint are N_dead + lam (N_a + t dN), t the station between the ends (0..1).
    Returns (N_dead, N_a, dN, a, b, c) for each."""
    out = []
    labels = family.labels
    for S in states:
        n_d, e_d = paths.solved(S, keys[0], P_dead)
        n_a, e_a = paths.solved(S, keys[1], Pa)
        n_b, e_b = paths.solved(S, keys[2], Pb)
        for lab in sorted(states[0] ^ states[1]):
            j = labels.index(lab)
            abc = ((e_a[j], e_b[j] - e_a[j], e_d[j]) if lab in S
                   else (n_a[j], n_b[j] - n_a[j], n_d[j]))
            out.append((n_d[idx], n_a[idx], (n_b - n_a)[idx], *abc))
    return out


def _pin_kinks(model: PinModel, unit: np.ndarray, lines: list[tuple]) -> list[list[float]]:
    """For each line of :func:`_bar_zero_lines`, the stations t in (0, 1) where the pin
    reaches its limit just as the bar passes zero: the pin check minus one along the bar's
    zero is searched for sign changes on a grid of 16, all lines at once, and each bracket is
    closed by bisection (all at once)."""
    if not lines:
        return []
    Nd = np.array([ln[0] for ln in lines])
    Na = np.array([ln[1] for ln in lines])
    dN = np.array([ln[2] for ln in lines])
    A = np.array([ln[3] for ln in lines])
    B = np.array([ln[4] for ln in lines])
    Cc = np.array([ln[5] for ln in lines])

    def f(rows: np.ndarray, t: np.ndarray) -> np.ndarray:
        den = A[rows] + B[rows] * t
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            lam = np.where(den != 0, -Cc[rows] / np.where(den != 0, den, 1.0), -1.0)
        N = Nd[rows] + lam[:, None] * (Na[rows] + t[:, None] * dN[rows])
        u = model.utilization(model.point_forces(N, _balancing(unit, N)))
        return np.where(lam > 0, u - 1.0, np.nan)

    grid = np.linspace(0.0, 1.0, 17)[1:-1]
    n, m = len(lines), grid.size
    rows = np.repeat(np.arange(n), m)
    v = f(rows, np.tile(grid, n)).reshape(n, m)
    ok = np.isfinite(v[:, :-1]) & np.isfinite(v[:, 1:]) & (np.sign(v[:, :-1])
                                                           != np.sign(v[:, 1:]))
    r, k = np.nonzero(ok)
    out: list[list[float]] = [[] for _ in lines]
    if not r.size:
        return out
    lo, hi, flo = grid[k], grid[k + 1], v[r, k]
    for _ in range(18):  # to 1/16/2^18 of the interval
        mid = 0.5 * (lo + hi)
        fm = f(r, mid)
        same = np.isfinite(fm) & (np.sign(fm) == np.sign(flo))
        lo, flo = np.where(same, mid, lo), np.where(same, fm, flo)
        hi = np.where(same, hi, mid)
    for q, tq in zip(r, 0.5 * (lo + hi), strict=True):
        out[q].append(float(tq))
    return out


def rate_pin(pin: Pin, g: TrussGeometry, family: TrussFamily, bridge, cases,
             configs: Sequence[frozenset[str]], envs, dead, dead_f, df: float,
             dead_states, dependent: frozenset[str], paths: PathCache,
             panel_points: Mapping[str, tuple[Extreme, ...]]) -> PinRating:
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
    row_vertex: list[int] = []  # index among the case's panel-point positions, else -1
    case_points: list[tuple[Extreme, ...]] = []  # panel-point positions of each case
    for ci, case in enumerate(cases):
        im = case.im.value
        unique: dict = {}
        for row, _ in rows_here:
            me = envs.of_row(case.load, im, row)
            for e in (me.max, me.min):
                if e.position is None and not e.lane_segments_ft:
                    continue
                unique.setdefault(position_key(e), e)
        pts = panel_points.get(case.load.id, ()) if not linear else ()
        # a critical position found by the envelope search stands on a panel-point position
        # to round-off: matched by its station to 1e-6 ft
        vertex = {_station_key(e): n for n, e in enumerate(pts)}
        case_points.append(pts)
        for key, e in unique.items():
            row_case.append(ci)
            row_key.append(key)
            row_ext.append(e)
            row_vertex.append(vertex.get(_station_key(e), -1) if vertex else -1)
            row_P.append(position_live_loads(paths, g, case.load, e, im, df))
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
        def walk(keys, Ps, cis):
            n = len(keys)
            lam_w, N_w = np.full(n, np.inf), np.zeros((n, len(idx)))
            slack_w: list = [None] * n
            walks = {k: paths.segments((cases[cis[k]].load.id, cases[cis[k]].im.value, g_dc,
                                        g_dw, keys[k]), P_dead, Ps[k], dead_state)
                     for k in range(n)}
            picked = []
            piece = 0
            while walks:
                PathCache.follow(list(walks.values()), piece)
                step = [(k, sg) for k, lp in walks.items()
                        if (sg := lp.piece(piece)) is not None]
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
                    picked.append((k, sg.lam_start, float(ln[i]), F0a[i], F1a[i], n0a[i],
                                   n1a[i]))
                    slack_w[k] = sg.slack
                    del walks[k]
                piece += 1
            if picked:
                ks = np.array([t[0] for t in picked])
                ln = np.array([t[2] for t in picked])
                rel = np.minimum(model.multipliers(np.stack([t[3] for t in picked]),
                                                   np.stack([t[4] for t in picked]),
                                                   upper=ln), ln)
                lam_w[ks] = np.array([t[1] for t in picked]) + rel
                N_w[ks] = np.stack([t[5] for t in picked]) + rel[:, None] * np.stack(
                    [t[6] for t in picked])
            return lam_w, N_w, slack_w

        lams, N_at, slack_at = walk(row_key, row_P, row_case)

        def add_rows(new_rows):
            nonlocal lams, N_at, slack_at
            keys, Ps, cis, exts, verts = [], [], [], [], []
            for ci, e, v in new_rows:
                case = cases[ci]
                keys.append(position_key(e))
                exts.append(e)
                cis.append(ci)
                verts.append(v)
                Ps.append(position_live_loads(paths, g, case.load, e, case.im.value, df))
            lam_x, N_x, slack_x = walk(keys, Ps, cis)
            lams = np.concatenate([lams, lam_x])
            N_at = np.concatenate([N_at, N_x])
            slack_at = slack_at + slack_x
            row_case.extend(cis)
            row_key.extend(keys)
            row_ext.extend(exts)
            row_vertex.extend(verts)
            return lam_x

        # On the load path the pin's multiplier is not a ratio of linear effects: the
        # panel-point positions beside the critical ones (two each side) that come within
        # 8 % of the case's least, where the least of the path lies (rating.lrfr.positions)
        for _ in range(4):  # until no position near the least is left unfollowed
            new_rows = []
            for ci, pts in enumerate(case_points):
                ks = [k for k in range(len(row_key)) if row_case[k] == ci]
                if not pts or not ks:
                    continue
                best = float(lams[ks].min())
                if not math.isfinite(best):
                    continue
                have = {row_vertex[k] for k in ks if row_vertex[k] >= 0}
                near = sorted({row_vertex[k] + d for k in ks
                               if row_vertex[k] >= 0 and lams[k] <= 1.08 * best
                               for d in range(-2, 3)})
                for n in near:
                    if 0 <= n < len(pts) and n not in have:
                        have.add(n)
                        new_rows.append((ci, pts[n], n))
            if not new_rows:
                break
            add_rows(new_rows)
        n_rows = len(row_key)
        # Between two neighbouring panel-point positions the pin's multiplier in one active
        # set is least at an end (1 / a convex gauge of forces linear in the station); where
        # the active set at the rating level changes between them it can dip, to where the
        # pin reaches its limit just as a bar of the changing panel passes zero. In the set
        # at either end that bar's zero gives lam as a function of the station, and the pin
        # check along it is searched (grid of 16, then bisection); each point found is
        # followed on the exact path like any other position.
        kink_rows, lines, where = [], [], []
        for ci in range(len(cases)):
            here = [k for k in range(n_rows) if row_case[k] == ci and row_vertex[k] >= 0]
            if not here:
                continue
            at = {row_vertex[k]: k for k in here}
            best = float(lams[[k for k in range(n_rows) if row_case[k] == ci]].min())
            if not math.isfinite(best):
                continue
            for v in sorted(at):
                ka, kb = at[v], at.get(v + 1)
                if kb is None or slack_at[ka] is None or slack_at[kb] is None:
                    continue
                if slack_at[ka] == slack_at[kb] or min(lams[ka], lams[kb]) > 1.1 * best:
                    continue
                im = cases[ci].im.value
                Pa = position_live_loads(paths, g, cases[ci].load, row_ext[ka], im, df)
                Pb = position_live_loads(paths, g, cases[ci].load, row_ext[kb], im, df)
                lkey = (cases[ci].load.id, cases[ci].im.value)
                for ln in _bar_zero_lines(family, idx, P_dead, Pa, Pb,
                                          (slack_at[ka], slack_at[kb]), paths,
                                          (("dead", g_dc, g_dw), (*lkey, row_key[ka]),
                                           (*lkey, row_key[kb]))):
                    lines.append(ln)
                    where.append((ci, row_ext[ka], row_ext[ka].position.front_axle_ft,
                                  row_ext[kb].position.front_axle_ft))
        seen_x: set = set()
        for (ci, e, xa, xb), ts in zip(where, _pin_kinks(model, unit, lines), strict=True):
            for t_k in ts:
                x = round(xa + t_k * (xb - xa), 9)
                if (ci, x, e.position.direction) in seen_x:
                    continue
                seen_x.add((ci, x, e.position.direction))
                kink_rows.append((ci, replace(e, position=replace(e.position,
                                                                  front_axle_ft=x)), -1))
        if kink_rows:
            add_rows(kink_rows)
        n_rows = len(row_key)
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
        if worst_k < 0 or lower_beyond_round_off(lam, worst_lam):
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
