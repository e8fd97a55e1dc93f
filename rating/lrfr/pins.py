"""Rating of pins with the concurrent forces of one vehicle position at a time.

For a pin at joint J the forces of ALL members at J come from the same loading (never a sum of
separate maxima). Along the exact load path of factored dead load + lam x factored (LL + IM)
(docs/tension-only.md) the member forces are linear in lam within each piece, and the pin's
utilization (AASHTO LRFD 6.7.6.2.1 / 6.7.6.2.2 [value from memory], see rating.capacity.pins)
is convex in lam there: the first piece whose end reaches the limit holds the crossing. The RF
is the least lam over every vehicle position searched for the load (rating.lrfr.positions:
the runs of panel-point positions and the envelope positions), and over the points between
two neighbouring positions where the active set at the pin's limit changes. Dead load on pins
takes the maximum load factors (it adds to the pin forces; common practice).
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, replace

import numpy as np

from rating.analysis.moving import Extreme
from rating.analysis.regions import LAM_MAX, PathStore, Pieces
from rating.arrays import blocks, distinct_sorted
from rating.capacity.pins import (
    PinCheck,
    PinModel,
    PinPrepared,
    PinStack,
    pin_actions,
    pin_check,
    prepare_pin,
    vector_lengths,
)
from rating.lrfr.equation import lower_beyond_round_off
from rating.lrfr.factors import factored_dw
from rating.lrfr.multiplier import first_of_least
from rating.lrfr.positions import LoadPaths
from rating.model import FindingRegion, Pin, RodEnd, RodSet, TrussGeometry

CHANGE_POINT_WINDOW = 1.1
"""Between two neighbouring positions the search for change points (where the pin reaches
its limit just as a bar of a counter panel passes zero) is made where the least lam at
either position is within this factor of the load's least: a window of judgement, not a
proven bound (common practice for a screen). On the bundled samples a window of 3.0 gives
the same ratings (tests/lrfr/test_pin_window.py)."""


KINK_GRID = 64
"""Intervals of the grid on which the pin check along a bar's zero line is searched for sign
changes between two neighbouring positions (:func:`_pin_kinks`), with the point where lam
reaches the least found so far in each cell the check is known at one end of. Two roots
within one cell are missed: a screen of judgement (common practice); on the bundled samples a
grid of 256 gives the same ratings within 1e-6, one of 1,024 within 0.05 % (16 missed 0.3 %;
tests/lrfr/test_pin_window.py)."""


@dataclass(frozen=True)
class PinCaseRating:
    """One pin's rating factor for one rating case, the check that governs it (flexure and
    shear, or bearing) and the vehicle position where the pin reaches its limit."""

    case: str
    rf: float
    check: str
    extreme: Extreme | None
    at_rating: PinCheck | None  # the full pin check at the rating load level; kept for the
    # pin's governing case only (the report shows that one)


@dataclass(frozen=True)
class PinRating:
    """One pin's ratings for every case, its check under factored dead load alone, and the
    warnings and assumptions of its checks."""

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


def _bar_zero_lines(store: PathStore, cols: np.ndarray, ia: np.ndarray, ib: np.ndarray,
                    ka: np.ndarray, kb: np.ndarray) -> tuple[np.ndarray, ...]:
    """For pairs of neighbouring positions ``ia``, ``ib`` of a run whose active sets at the
    pin's limit (``ka``, ``kb``) differ: in the set at either end, each bar whose state
    differs between the ends passes zero where (a + b t) lam + c = 0 (its force, or its
    stretch when slack); the forces at the joint (members ``cols`` (pairs, n) of each pair's
    pin) are N_dead + lam (N_a + t dN), t the station between the ends (0..1). Returns
    N_dead, N_a, dN (n, n_members), a, b, c (n,) of every such line and the pair it belongs
    to (n,)."""
    table, pc = store.table, store.pieces
    slack = table.slack_masks()
    lines = table.elongation_lines()
    Fd, Ed = table.dead(store.key, store.P_dead)
    q, j = np.nonzero(slack[ka] ^ slack[kb])
    cq = cols[q]
    out = []
    for k in (ka, kb):
        kq = k[q]
        n_d, n_a, n_b = Fd[kq], pc.L[kq, ia[q]], pc.L[kq, ib[q]]
        e_a = np.einsum("nms,sn->nm", lines[kq], store.p[:, ia[q]])
        e_b = np.einsum("nms,sn->nm", lines[kq], store.p[:, ib[q]])
        rows = np.arange(q.size)
        s_ = slack[kq, j]
        a = np.where(s_, e_a[rows, j], n_a[rows, j])
        b = np.where(s_, e_b[rows, j], n_b[rows, j]) - a
        c = np.where(s_, Ed[kq, j], n_d[rows, j])
        r_ = rows[:, None]
        out.append((n_d[r_, cq], n_a[r_, cq], (n_b - n_a)[r_, cq], a, b, c, q))
    return tuple(np.concatenate(parts) for parts in zip(*out, strict=True))


@dataclass(frozen=True, eq=False)
class _Joints:
    """Pins searched together: their checks (rating.capacity.pins.PinStack), the columns of
    the members at each joint (``cols`` (n_pins, n), padded with member 0) and each pin's
    projector padded to the stack's layout (``T`` (n_pins, n, K * 2): zero rows for the
    padded members, see :func:`_projector`)."""

    stack: PinStack
    cols: np.ndarray
    T: np.ndarray

    @classmethod
    def of(cls, models: list[PinModel], idx: list[list[int]], T: list[np.ndarray]
           ) -> _Joints:
        stack = PinStack(models)
        n = max(len(i) for i in idx)
        cols = np.zeros((len(idx), n), dtype=int)
        TT = np.zeros((len(idx), n, stack.K, 2))
        for i, (ii, Ti) in enumerate(zip(idx, T, strict=True)):
            cols[i, :len(ii)] = ii
            TT[i, :len(ii)] = stack.pad(i, Ti.reshape(len(ii), -1, 2))
        return cls(stack, cols, TT.reshape(len(idx), n, -1))

    def project(self, N: np.ndarray, which: np.ndarray) -> np.ndarray:
        """The pins' checked vectors (P, K, 2) of forces N (P, n) at the joints (state p at
        the joint of pin ``which[p]``): linear in the forces, one projection per pin."""
        out = np.empty((N.shape[0], self.T.shape[2]))
        if self.T.shape[0] == 1:
            out[:] = N @ self.T[0]
        elif which.size and (which[1:] >= which[:-1]).all():
            # states in order of pin (as the searches mostly make them): one slice per pin
            cut = (np.flatnonzero(which[1:] != which[:-1]) + 1).tolist()
            for s_, e_ in zip([0, *cut], [*cut, which.size], strict=True):
                np.matmul(N[s_:e_], self.T[which[s_]], out=out[s_:e_])
        else:
            for i in distinct_sorted(which).tolist():
                m = which == i
                out[m] = N[m] @ self.T[i]
        return out.reshape(N.shape[0], self.T.shape[2] // 2, 2)


def _pin_kinks(jn: _Joints, which: np.ndarray, Nd: np.ndarray, Na: np.ndarray,
               dN: np.ndarray, A: np.ndarray, B: np.ndarray, Cc: np.ndarray,
               below: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """For each line of :func:`_bar_zero_lines` (on the pin ``which`` (n,)), the stations t
    in (0, 1) where the pin reaches its limit just as the bar passes zero: the pin check
    minus one along the bar's zero is searched for sign changes on a grid of
    :data:`KINK_GRID`, all lines at once, and each bracket is closed by the Illinois regula
    falsi (all at once). Only
    points with lam below ``below`` (per line) are wanted. Returns (line, t) of each point
    found."""
    if not A.size:
        return np.zeros(0, dtype=int), np.zeros(0)
    GD, GA, GdN = jn.project(Nd, which), jn.project(Na, which), jn.project(dN, which)
    util = jn.stack.utilization

    def f(rows: np.ndarray, t: np.ndarray) -> np.ndarray:
        den = A[rows] + B[rows] * t
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            lam = np.where(den != 0, -Cc[rows] / np.where(den != 0, den, 1.0), -1.0)
        G = GD[rows] + lam[:, None, None] * (GA[rows] + t[:, None, None] * GdN[rows])
        u = util(G, which[rows])
        return np.where(lam > 0, u - 1.0, np.nan)

    grid = np.linspace(0.0, 1.0, KINK_GRID + 1)[1:-1]
    n, m = A.size, grid.size
    # the pin check is needed only where 0 < lam < ``below`` on the line (and at the grid
    # point next to such a stretch, to bracket a root near its end)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        lam_g = -Cc[:, None] / (A[:, None] + B[:, None] * grid[None, :])
    want = (lam_g > 0) & (lam_g < below[:, None])
    # lam = -c / (a + b t) is monotone in t between poles: where the line has none in
    # (0, 1) it stays below the larger end, else below ``below`` where wanted. Every checked
    # vector is then shorter than |GD| + lam_hi max(|GA|, |GA + GdN|) (triangle inequality;
    # the norm of GA + t GdN is convex in t), and the checks grow with the lengths: a line
    # on which those lengths stay within the limit cannot hold a wanted point
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        ends = -Cc / np.stack([A, A + B])
    pole = (A * (A + B) <= 0) | ~np.isfinite(ends).all(axis=0)
    lam_hi = np.where(pole, below, np.minimum(below, ends.max(axis=0)))
    reach = ~(lam_hi <= 0.0)  # (no bound where lam_hi is not finite)
    bounded = np.flatnonzero(reach & np.isfinite(lam_hi))
    lens = vector_lengths(GD[bounded]) + lam_hi[bounded, None] * np.maximum(
        vector_lengths(GA[bounded]), vector_lengths(GA[bounded] + GdN[bounded]))
    reach[bounded] = util(np.stack([lens, np.zeros_like(lens)], axis=-1),
                          which[bounded]) >= 1.0 - 1e-9
    want &= reach[:, None]
    want[:, 1:] |= want[:, :-1]
    want[:, :-1] |= want[:, 1:]
    v = np.full((n, m), np.nan)
    rr, kk = np.nonzero(want)
    v[rr, kk] = f(rr, grid[kk])
    ok = np.isfinite(v[:, :-1]) & np.isfinite(v[:, 1:]) & (np.sign(v[:, :-1])
                                                           != np.sign(v[:, 1:]))
    r, k = np.nonzero(ok)
    lo, hi, flo, fhi = grid[k], grid[k + 1], v[r, k], v[r, k + 1]
    # A cell with the check known at one end only: beyond the other end lam is past
    # ``below`` or past a pole of the line (lam = -c / (a + b t) runs to infinity there and
    # the check with it). Between the known end and the point where lam = ``below`` lam is
    # monotone and wanted, and a root there is bracketed by those two points (it was missed
    # with the grid's own points alone: a pin 5 % high, a reviewer found).
    one = np.isfinite(v[:, :-1]) != np.isfinite(v[:, 1:])
    r1, k1 = np.nonzero(one)
    if r1.size:
        left_known = np.isfinite(v[r1, k1])
        t_known = np.where(left_known, grid[k1], grid[k1 + 1])
        f_known = np.where(left_known, v[r1, k1], v[r1, k1 + 1])
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            t_b = (-Cc[r1] / below[r1] - A[r1]) / B[r1]
        inside = (np.isfinite(t_b) & (t_b > grid[k1]) & (t_b < grid[k1 + 1])
                  & np.isfinite(below[r1]))
        q = np.flatnonzero(inside)
        if q.size:
            f_b = f(r1[q], t_b[q])
            crosses = np.isfinite(f_b) & (np.sign(f_b) != np.sign(f_known[q]))
            sel, f_b = q[crosses], f_b[crosses]
            a_, b_ = np.minimum(t_b[sel], t_known[sel]), np.maximum(t_b[sel], t_known[sel])
            fa = np.where(t_b[sel] < t_known[sel], f_b, f_known[sel])
            fb = np.where(t_b[sel] < t_known[sel], f_known[sel], f_b)
            r = np.concatenate([r, r1[sel]])
            lo, hi = np.concatenate([lo, a_]), np.concatenate([hi, b_])
            flo, fhi = np.concatenate([flo, fa]), np.concatenate([fhi, fb])
    if not r.size:
        return r, np.zeros(0)
    slo, shi = flo.copy(), fhi.copy()  # Illinois-scaled values
    side = np.zeros(r.size, dtype=int)
    out = 0.5 * (lo + hi)
    live = np.arange(r.size)
    for _ in range(60):  # each bracket to 1e-8 of the interval (1e-7 ft on a 10 ft one)
        d = shi - slo
        with np.errstate(divide="ignore", invalid="ignore"):
            x = np.where(d != 0, hi - shi * (hi - lo) / np.where(d != 0, d, 1.0),
                         0.5 * (lo + hi))
        x = np.where((lo < x) & (x < hi), x, 0.5 * (lo + hi))
        fx = f(r[live], x)
        same = np.isfinite(fx) & (np.sign(fx) == np.sign(flo))
        slo = np.where(same, fx, np.where(side == -1, 0.5 * slo, slo))
        shi = np.where(same, np.where(side == 1, 0.5 * shi, shi), fx)
        lo, flo = np.where(same, x, lo), np.where(same, fx, flo)
        hi = np.where(same, hi, x)
        side = np.where(same, 1, -1)
        # Both ends of every bracket have 0 < lam (the check is finite only there), so the
        # line has no pole within it and lam is monotone across it: a bracket whose ends both
        # have lam beyond ``below`` (and round-off) holds no wanted point; it is dropped
        rl = r[live]
        with np.errstate(divide="ignore", invalid="ignore"):
            past = np.minimum(-Cc[rl] / (A[rl] + B[rl] * lo), -Cc[rl] / (A[rl] + B[rl] * hi)
                              ) >= below[rl] * (1.0 + 1e-9)
        done = (hi - lo <= 1e-8) | (fx == 0.0) | past
        out[live[done]] = np.where(fx[done] == 0.0, x[done], 0.5 * (lo[done] + hi[done]))
        if done.all():
            break
        keep = ~done
        live, lo, hi, flo, slo, shi, side = (v_[keep] for v_ in (live, lo, hi, flo, slo, shi,
                                                                  side))
    else:
        out[live] = 0.5 * (lo + hi)
    with np.errstate(divide="ignore", invalid="ignore"):
        lam = -Cc[r] / (A[r] + B[r] * out)
    keep = (lam > 0) & (lam < below[r])  # (a dropped bracket's middle is not)
    return r[keep], out[keep]


def _pin_crossings(jn: _Joints, pc: Pieces, src: np.ndarray, which: np.ndarray,
                   group: np.ndarray, linear: bool = False, near: float = 1.0,
                   intervals: np.ndarray | None = None, floor: np.ndarray | None = None
                   ) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """On each row's path (row x: the position ``src[x]`` of ``pc`` at the pin
    ``which[x]``), the least lam at which the pin reaches its limit: lam (X,) (inf where it
    does not up to the path's end), the forces of the members at the joint there (X, n),
    the piece it lies in (X,), -1 for none, and how far (lam) each row's path must be known
    to tell (X,), 0 where it is (rating.analysis.regions.Pieces.cover). The first piece
    whose end reaches the limit holds it (the utilization is convex in lam within a piece);
    0 where the factored dead load alone reaches it. ``linear``: no member at the joints
    depends on the active set, so the forces there are those of the first piece all along
    the path.

    Only the least over the rows of each group (``group``, (X,): one pin under one load) is
    needed, and the rows within the factor ``near`` of it with their neighbours
    (``intervals``, pairs of neighbouring rows): the others are shown not to be by bounds
    (``floor`` (X,), a lower bound of each row's lam, :func:`_gauge_floor`; then
    rating.capacity.pins.PinModel.multiplier_bounds), and get a lower bound for lam and no
    piece (-1); so are rows solved only as far as needed (:func:`_least_roots`)."""
    X = src.size
    stack = jn.stack
    k_src = pc.k[src]
    if linear:
        valid = k_src[:, :1] >= 0
        lo = np.zeros((X, 1))
        hi = np.where(valid, pc.hi[src, np.maximum((k_src >= 0).sum(axis=1) - 1, 0)]
                      [:, None], 0.0)
    else:
        valid = k_src >= 0
        lo = np.where(valid, pc.lo[src], 0.0)
        hi = np.where(valid, pc.hi[src], 0.0)
    r, j = np.nonzero(valid)  # by row, then piece: in order along each path
    lo_q, ln = lo[r, j], hi[r, j] - lo[r, j]
    m = pc.N_live.shape[2]
    flat = src[r] * pc.k.shape[1] + j
    w_q = which[r]
    cols_q = jn.cols[w_q]
    N_dead_f, N_live_f = pc.N_dead.reshape(-1, m), pc.N_live.reshape(-1, m)

    def forces(q: np.ndarray) -> tuple[np.ndarray, ...]:
        """Forces at the joint at the start of pieces ``q`` and their rate, and the pin's
        checked vectors of both (linear in the forces: one projection, :func:`_projector`)."""
        Nl = N_live_f[flat[q][:, None], cols_q[q]]
        N0 = N_dead_f[flat[q][:, None], cols_q[q]] + lo_q[q][:, None] * Nl
        return N0, Nl, jn.project(N0, w_q[q]), jn.project(Nl, w_q[q])

    groups, pos = np.unique(group, return_inverse=True)
    lam = np.full(X, np.inf)
    N_at = np.zeros((X, jn.cols.shape[1]))
    slot = np.full(X, -1)
    low = np.full(r.size, np.nan)
    up = np.full(r.size, np.nan)

    # (a piece's forces, checked vectors and the temporaries of their bounds)
    per_piece = 2 * jn.cols.shape[1] + 8 * jn.T.shape[2]

    def reached(sel: np.ndarray) -> tuple[np.ndarray, ...]:
        """Of the pieces ``sel`` (the whole paths of some positions, in order), the first
        of each position that reaches the limit, with its forces and checked vectors at its
        start and their rates."""
        ln_s = ln[sel]
        N0, Nl, G0, G1 = forces(sel)
        missing = np.isnan(low[sel])
        if missing.any():  # pieces the bounds did not need
            low[sel[missing]], up[sel[missing]] = stack.multiplier_bounds(
                G0[missing], G1[missing], w_q[sel[missing]])
        # a piece reaches the limit by its end where the bound says so, else where checked
        reach = up[sel] <= ln_s
        check = np.flatnonzero(~reach & (low[sel] <= ln_s))
        if check.size:
            reach[check] = stack.utilization(
                G0[check] + ln_s[check, None, None] * G1[check], w_q[sel[check]]) >= 1.0
        hit = np.flatnonzero(reach)
        rs = r[sel]
        q = hit[np.concatenate(([True], rs[hit[1:]] != rs[hit[:-1]]))] if hit.size else hit
        return sel[q], N0[q], Nl[q], G0[q], G1[q]

    def solve(rows: np.ndarray) -> None:
        """The exact crossing at the positions ``rows`` (bool, (X,)); the pieces a block of
        positions at a time (rating.arrays.blocks), the roots all at once."""
        sel = np.flatnonzero(rows[r])
        lam[rows] = np.inf
        if not sel.size:
            return
        found = [reached(sel[b]) for b in blocks(r[sel], per_piece)]
        pq, N0, Nl, G0, G1 = (found[0] if len(found) == 1 else
                              tuple(np.concatenate(v) for v in zip(*found, strict=True)))
        if not pq.size:
            return
        at, lo_s = r[pq], lo_q[pq]
        rel = _least_roots(stack, which[at], G0, G1, lo_s, low[pq],
                           np.minimum(up[pq], ln[pq]), group[at])
        lam[at] = lo_s + rel
        N_at[at] = N0 + rel[:, None] * Nl
        slot[at] = j[pq]

    # The most promising position of each load (by ``floor``, a lower bound of its lam) is
    # solved first: its lam bounds the least from above. Then bounds piece by piece along the
    # paths of the positions whose floor does not put them beyond it, as far as a piece can
    # still hold the least: past a piece that surely reaches the limit, or beyond the least
    # upper bound of the load, the rest of a path cannot matter (its start is the path's
    # lower bound).
    margin = max(near, 1.0 + 1e-9)
    floor = np.zeros(X) if floor is None else floor
    # a path the family covers only so far: the limit may lie beyond what is known
    short = pc.cover[src] < LAM_MAX * (1.0 - 1e-9)
    floor = np.where(short, np.minimum(floor, pc.cover[src]), floor)
    order = np.lexsort((floor, pos))
    lead = np.zeros(X, dtype=bool)
    lead[order[np.flatnonzero(np.concatenate(([True], pos[order][1:] != pos[order][:-1])))]] \
        = True
    lead &= np.isfinite(floor) & valid.any(axis=1)
    solve(lead)
    row_up = np.where(lead, lam, np.inf)
    least = np.full(groups.size, np.inf)
    np.minimum.at(least, pos, row_up)
    # (the floor is found by the same kind of root search: 1e-6 for its round-off)
    row_low = np.where(lead, lam, floor)
    settled = lead | (floor > least[pos] * margin * (1.0 + 1e-6) + 1e-12)
    for jj in range(int(j.max(initial=-1)) + 1):
        least = np.full(groups.size, np.inf)
        np.minimum.at(least, pos, row_up)
        here = np.flatnonzero((j == jj) & ~settled[r])
        if jj == 0:
            row_low[r[here]] = np.inf  # from the pieces' own bounds from here on
        beyond = lo_q[here] > least[pos[r[here]]] * margin + 1e-12
        gone = here[beyond]
        row_low[r[gone]] = np.minimum(row_low[r[gone]], lo_q[gone])
        settled[r[gone]] = True
        q = here[~beyond]
        for b in blocks(q, per_piece):
            low[q[b]], up[q[b]] = stack.multiplier_bounds(*forces(q[b])[2:], w_q[q[b]])
        if q.size:
            np.minimum.at(row_low, r[q], np.where(low[q] <= ln[q], lo_q[q] + low[q], np.inf))
            np.minimum.at(row_up, r[q], np.where(up[q] <= ln[q], lo_q[q] + up[q], np.inf))
            settled[r[q[up[q] <= ln[q]]]] = True
    row_low = np.maximum(row_low, floor)
    lam = np.where(lead, lam, row_low)
    least = np.full(groups.size, np.inf)
    np.minimum.at(least, pos, row_up)
    keep = (row_low <= least[pos] * margin + 1e-12) & ~lead
    solve(keep)
    if intervals is not None and intervals.size:
        # the neighbours of the positions near the least, for the search between them
        best = np.full(groups.size, np.inf)
        np.minimum.at(best, pos, lam)
        close = lam <= best[pos] * near
        a, b = intervals[:, 0], intervals[:, 1]
        more = np.zeros(X, dtype=bool)
        more[a[close[b]]] = True
        more[b[close[a]]] = True
        solve(more & ~(keep | lead))
    best = np.full(groups.size, np.inf)
    np.minimum.at(best, pos, lam)
    target = np.where(np.isfinite(best[pos]), best[pos] * near * (1.0 + 1e-6), LAM_MAX)
    return lam, N_at, slot, np.where(short & (slot < 0) & np.isinf(lam), target, 0.0)


class _Gauges:
    """Upper bounds of the gauges g(e_s) of :func:`_gauge_floor`: for each pin of ``jn``, each
    active set of the store's table and each unit panel load, worked out the first time a
    set is needed (:func:`_root_below`, with panel loads of the size searched, ``scale``)."""

    def __init__(self, jn: _Joints, store: PathStore, scale: float) -> None:
        self.jn, self.store, self.scale = jn, store, scale
        self.g = np.zeros((jn.T.shape[0], 0, store.p.shape[0]))
        self.known = np.zeros(0, dtype=bool)

    def of(self, used: np.ndarray) -> np.ndarray:
        """(n_pins, K, S): the gauges, those of the sets ``used`` known (others inf)."""
        jn, table = self.jn, self.store.table
        F = table.force_lines()
        K, S = F.shape[0], F.shape[2]
        if K > self.known.size:
            n_new = K - self.known.size
            self.g = np.concatenate([self.g, np.full((self.g.shape[0], n_new, S), np.inf)],
                                    axis=1)
            self.known = np.concatenate([self.known, np.zeros(n_new, dtype=bool)])
        todo = used[~self.known[used]]
        if not todo.size:
            return self.g
        Fd, _ = table.dead(self.store.key, self.store.P_dead)
        n_pins, Kp = jn.T.shape[0], jn.stack.K
        U = todo.size
        Gd = np.empty((n_pins, U, 1, Kp, 2))
        Q = np.empty((n_pins, U, S, Kp, 2))
        for i in range(n_pins):
            Gd[i] = (Fd[todo][:, jn.cols[i]] @ jn.T[i]).reshape(U, 1, Kp, 2)
            Q[i] = np.einsum("kns,nc->ksc", F[todo][:, jn.cols[i], :],
                             jn.T[i]).reshape(U, S, Kp, 2)
        lam = _root_below(jn.stack, np.repeat(np.arange(n_pins), U * S),
                          np.broadcast_to(Gd, Q.shape).reshape(-1, Kp, 2),
                          (self.scale * Q).reshape(-1, Kp, 2))
        # not reached by 1,000 such loads: the gauge is at most 1 / (1,000 scale)
        lam = np.minimum(lam, 1e3)
        with np.errstate(divide="ignore"):
            self.g[:, todo] = np.where(lam > 0, 1.0 / (lam * self.scale),
                                       np.inf).reshape(n_pins, U, S)
        self.known[todo] = True
        return self.g


def _gauge_floor(gauges: _Gauges, pc: Pieces, p: np.ndarray, src: np.ndarray,
                 which: np.ndarray, linear: bool) -> np.ndarray:
    """A lower bound (X,) of each row's lam at the pin's limit (row x: the position
    ``src[x]`` with panel loads ``p[:, src[x]]`` and path in ``pc``, at the pin
    ``which[x]``), from its panel loads.

    In one active set k the pin's forces are those of the dead load D_k plus lam times the
    live load; the states whose check stays within the limit form a convex set around D_k
    (the utilization is convex in the forces), and lam at the limit is 1 / g(L), g the gauge
    of that set, convex and positively homogeneous. The live load is a sum of panel loads
    p_s >= 0 times the unit panel loads e_s, so g(L) <= sum p_s g(e_s): lam >= 1 / (sum p_s
    g(e_s)), with g(e_s) bounded from above once per pin, set and panel point
    (:class:`_Gauges`). On the position's path the limit lies in one piece, in that
    piece's set and not before the piece starts: the least over the pieces that can hold it
    bounds its lam (the set of its first piece alone for a joint whose bars do not depend on
    the active set)."""
    used = distinct_sorted(pc.k[pc.k >= 0] if not linear else pc.k[:, 0][pc.k[:, 0] >= 0])
    g = gauges.of(used)
    kk = pc.k[src, :1] if linear else pc.k[src]
    vals = np.zeros(kk.shape)
    for i in distinct_sorted(which).tolist():
        rows = np.flatnonzero(which == i)
        with np.errstate(invalid="ignore"):  # (inf x 0: a set the dead load alone breaks)
            Gam = np.nan_to_num(g[i] @ p[:, src[rows]], nan=np.inf)  # (K, rows)
        ki = kk[rows]
        vals[rows] = np.where(ki >= 0, Gam[np.maximum(ki, 0),
                                           np.arange(rows.size)[:, None]], 0.0)
    with np.errstate(divide="ignore"):
        if linear:  # the first piece's set holds for the joint all along the path
            return 1.0 / vals.max(axis=1, initial=0.0)
        f = np.where(kk >= 0, 1.0 / vals, np.inf)
    # The limit lies in some piece j of the path, where the forces are those of its set:
    # lam >= max(lo_j, f_j) there, and a piece whose f_j is beyond its end (not the last
    # piece: the path may go on) cannot hold it
    lo, hi = pc.lo[src], pc.hi[src]
    last = np.arange(kk.shape[1])[None, :] == ((kk >= 0).sum(axis=1) - 1)[:, None]
    out = np.where((f > hi * (1.0 + 1e-9) + 1e-12) & ~last, np.inf, np.maximum(lo, f))
    return np.where(kk >= 0, out, np.inf).min(axis=1, initial=np.inf)


def _root_below(stack: PinStack, which: np.ndarray, G0: np.ndarray, G1: np.ndarray,
                steps: int = 4) -> np.ndarray:
    """A lower bound, within a fraction of a per cent, of the least lam >= 0 at which the
    utilization of G0 + lam G1 (P, K, 2) on the pins ``which`` (P,) reaches 1.0 (inf where
    it never does, 0 where G0 alone does): from the bounds of
    rating.capacity.pins.PinModel.multiplier_bounds, a few chords of the convex
    utilization, each crossing 1.0 before it does."""
    a, b = stack.multiplier_bounds(G0, G1, which)
    out = np.where(np.isfinite(b), a, np.inf)
    live = np.flatnonzero(np.isfinite(b) & (b > a))
    if not live.size:
        return out
    a, b, G0, G1, w = a[live], b[live], G0[live], G1[live], which[live]
    fa = stack.utilization(G0 + a[:, None, None] * G1, w) - 1.0
    fb = stack.utilization(G0 + b[:, None, None] * G1, w) - 1.0
    for _ in range(steps):
        with np.errstate(divide="ignore", invalid="ignore"):
            z = np.where(fb > fa, a - fa * (b - a) / (fb - fa), a)
        z = np.clip(z, a, b)
        fz = stack.utilization(G0 + z[:, None, None] * G1, w) - 1.0
        below = fz < 0.0
        a, fa = np.where(below, z, a), np.where(below, fz, fa)
        b, fb = np.where(below, b, z), np.where(below, fb, fz)
    out[live] = a
    return out


def _projector(model: PinModel, unit: np.ndarray) -> np.ndarray:
    """(n_members, K * 2): the checked vectors of the pin (rating.capacity.pins.PinModel)
    for a unit force in each member at the joint, with the pin kept in balance."""
    eye = np.eye(unit.shape[0])
    G = model.project(model.point_forces(eye, _balancing(unit, eye)))
    return G.reshape(unit.shape[0], -1)


def _least_roots(stack: PinStack, which: np.ndarray, G0: np.ndarray, G1: np.ndarray,
                 lo: np.ndarray, low: np.ndarray, high: np.ndarray, group: np.ndarray
                 ) -> np.ndarray:
    """For each row, the least lam in [0, high] where the utilization of G0 + lam G1 on the
    pin ``which`` reaches 1.0 (it has by ``high``; it is convex in lam; ``low`` is a lower
    bound): the root (to
    1e-12) where lo + lam can be the least of its group, a lower bound above that least
    elsewhere.

    The bracket of every root is narrowed by the Illinois regula falsi (as
    rating.capacity.pins.PinModel.multipliers); on the convex utilization the chord of the
    bracket crosses 1.0 before it does, so a row whose chord crossing is above the least
    bracket end of its group beyond round-off cannot hold the least and is dropped."""
    util = stack.utilization
    out = np.zeros(lo.size)
    b = high.astype(float).copy()
    fb = util(G0 + b[:, None, None] * G1, which) - 1.0
    a = np.clip(low * (1.0 - 1e-12), 0.0, b)
    fa = util(G0 + a[:, None, None] * G1, which) - 1.0
    redo = np.flatnonzero((fa >= 0.0) & (a > 0.0))
    if redo.size:  # round-off at the bound: from the start of the piece
        a[redo] = 0.0
        fa[redo] = util(G0[redo], which[redo]) - 1.0
    live = np.flatnonzero(fa < 0.0)  # else the limit is reached at once (out = 0)
    out[live] = b[live]
    a, fa, b, fb = a[live], fa[live], b[live], fb[live]
    G0l, G1l, lol, wl = G0[live], G1[live], lo[live], which[live]
    groups, pos = np.unique(group[live], return_inverse=True)
    sa, sb = fa.copy(), fb.copy()  # Illinois-scaled values
    side = np.zeros(live.size, dtype=int)
    for _ in range(100):
        if not live.size:
            break
        with np.errstate(divide="ignore", invalid="ignore"):
            chord = a - fa * (b - a) / (fb - fa)
        chord = np.where(np.isfinite(chord), np.clip(chord, a, b), a)
        least = np.full(groups.size, np.inf)
        np.minimum.at(least, pos, lol + b)
        keep = lol + chord <= least[pos] * (1.0 + 1e-9) + 1e-12
        if not keep.all():
            out[live[~keep]] = chord[~keep]  # a lower bound above the least
            live, a, fa, b, fb, sa, sb, side, G0l, G1l, lol, wl, pos = (
                v[keep] for v in (live, a, fa, b, fb, sa, sb, side, G0l, G1l, lol, wl, pos))
        d = sb - sa
        with np.errstate(divide="ignore", invalid="ignore"):
            x = np.where(d != 0.0, b - sb * (b - a) / np.where(d != 0.0, d, 1.0), 0.5 * (a + b))
        x = np.where((a < x) & (x < b), x, 0.5 * (a + b))
        f = util(G0l + x[:, None, None] * G1l, wl) - 1.0
        right = f >= 0.0
        sa = np.where(right & (side == 1), 0.5 * sa, sa)
        sb = np.where(~right & (side == -1), 0.5 * sb, sb)
        b, fb, sb = np.where(right, x, b), np.where(right, f, fb), np.where(right, f, sb)
        a, fa, sa = np.where(right, a, x), np.where(right, fa, f), np.where(right, sa, f)
        side = np.where(right, 1, -1)
        close = np.abs(f) < 1e-13
        done = close | (b - a <= 1e-12 * np.maximum(lol + b, 1.0))
        out[live[done]] = np.where(close[done], x[done], b[done])
        if done.any():
            live, a, fa, b, fb, sa, sb, side, G0l, G1l, lol, wl, pos = (
                v[~done] for v in (live, a, fa, b, fb, sa, sb, side, G0l, G1l, lol, wl, pos))
    out[live] = b
    return out


@dataclass(frozen=True, eq=False)
class _PinAtJoint:
    """One pin with what its search needs: the members at its joint (labels, columns, unit
    vectors from the joint), its vectorized model and projector, and its check under
    factored dead load alone."""

    pin: Pin
    members: list[str]
    idx: list[int]
    unit: np.ndarray
    model: PinModel
    T: np.ndarray
    dead_check: PinCheck
    linear: bool
    prepared: PinPrepared


def _pin_at_joint(pin: Pin, g: TrussGeometry, designs: Mapping, N_dead: np.ndarray,
                  dependent: frozenset[str]) -> _PinAtJoint:
    members_here = [m.label for m in g.members_at(pin.joint)]
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
    N_dead_here = N_dead[idx]
    prepared = prepare_pin(pin, members_here, dirs, designs=designs)
    dead_check = pin_check(
        pin, pin_actions(g, pin.joint, dict(zip(members_here, map(float, N_dead_here),
                                                strict=True))),
        external_kip=tuple(_balancing(unit, N_dead_here)), designs=designs,
        prepared=prepared)
    # (every state the rating checks is balanced by the external force, _balancing)
    model = PinModel(pin, members_here, dirs, designs=designs, prepared=prepared,
                     balanced=True)
    return _PinAtJoint(pin, members_here, idx, unit, model, _projector(model, unit),
                       dead_check, not (set(members_here) & dependent), prepared)


@dataclass(frozen=True, eq=False)
class _Found:
    """One pin's least lam at every position of the batch (``lam``, forces at the joint
    there ``N_at``) and at the points found between positions (``extra``, with their
    extremes and loads)."""

    lam: np.ndarray
    N_at: np.ndarray
    extra_lam: np.ndarray
    extra_N: np.ndarray
    extra: list[Extreme]
    extra_group: np.ndarray


def _search(here: list[_PinAtJoint], loads: LoadPaths, linear: bool) -> list[_Found]:
    """Every position of every load on its exact path, for the pins ``here`` at once (all
    linear, or none; see the module docstring)."""
    jn = _Joints.of([h.model for h in here], [h.idx for h in here], [h.T for h in here])
    batch, store = loads.positions, loads.paths
    X, n_pins, n_loads = batch.size, len(here), len(batch.sets)
    src = np.tile(np.arange(X), n_pins)
    which = np.repeat(np.arange(n_pins), X)
    group = which * n_loads + batch.group[src]
    intervals = (np.concatenate([batch.intervals + i * X for i in range(n_pins)])
                 if not linear else None)
    # (a panel load of the size searched)
    gauges = _Gauges(jn, store, max(float(np.abs(store.p).max(initial=0.0)), 1.0))
    while True:
        lam, N_at, slot, need = _pin_crossings(
            jn, store.pieces, src, which, group, linear,
            near=1.0 if linear else CHANGE_POINT_WINDOW,
            intervals=intervals,
            floor=_gauge_floor(gauges, store.pieces, store.p, src, which, linear))
        need_x = np.zeros(X)
        np.maximum.at(need_x, src, need)
        if not (need_x.any() and store.complete(need_x)):
            break
    pc = store.pieces
    extra: list[list[Extreme]] = [[] for _ in here]
    extra_lam = [np.zeros(0)] * n_pins
    extra_N = [np.zeros((0, jn.cols.shape[1]))] * n_pins
    extra_group = [np.zeros(0, dtype=int)] * n_pins
    if not linear and batch.intervals.size and np.isfinite(lam).any():
        # Between two neighbouring positions of a run the pin's multiplier in one active set
        # is least at an end (1 / a convex gauge of forces linear in the station); where the
        # active set at the limit changes between them it can dip, to where the pin reaches
        # its limit just as a bar of the changing panel passes zero. In the set at either end
        # that bar's zero gives lam as a function of the station, and the pin check along it
        # is searched (grid of 16, then bisection); each point found is followed on the
        # exact path like any other position.
        best = np.full(n_pins * n_loads, np.inf)
        np.minimum.at(best, group, lam)
        k_at = np.where(slot >= 0, np.take_along_axis(pc.k[src], np.maximum(slot, 0)[:, None],
                                                      axis=1)[:, 0], -1)
        ia, ib = intervals[:, 0], intervals[:, 1]
        ka, kb = k_at[ia], k_at[ib]
        ok = (ka >= 0) & (kb >= 0) & (np.minimum(lam[ia], lam[ib])
                                      <= CHANGE_POINT_WINDOW * best[group[ia]])
        slk = store.table.slack_masks()
        ok[ok] = (slk[ka[ok]] != slk[kb[ok]]).any(axis=1)
        sel = np.flatnonzero(ok)
        *line, owner = _bar_zero_lines(store, jn.cols[which[ia[sel]]], src[ia[sel]],
                                       src[ib[sel]], ka[sel], kb[sel])
        # on a bar's zero line lam = -c / (a + b t) is monotone in t: where it is at least
        # the least already found at both ends, no point on it can lower the least
        a_, b_, c_ = line[3], line[4], line[5]
        with np.errstate(divide="ignore", invalid="ignore"):
            ends = np.stack([-c_ / a_, -c_ / (a_ + b_)])
        low_end = np.where(ends > 0, ends, np.inf).min(axis=0)
        below = best[group[ia[sel][owner]]] * (1.0 - 1e-9)
        useful = low_end < below
        line = [v[useful] for v in line]
        owner = owner[useful]
        at, ts = _pin_kinks(jn, which[ia[sel][owner]], *line, below[useful])
        rows = intervals[sel[owner[at]]]
        if rows.size:
            pin_of = which[rows[:, 0]]
            found = distinct_sorted(pin_of).tolist()
            cols = []
            for i in found:  # (each pin's points between positions made distinct on their own)
                m = pin_of == i
                p_i, extra[i], extra_group[i] = batch.between(src[rows[m]], ts[m])
                cols.append(p_i)
            p_new = np.concatenate(cols, axis=1)
            w_new = np.concatenate([np.full(extra_group[i].size, i) for i in found])
            s_new = np.arange(w_new.size)
            pc_new = store.more(p_new)
            lam_new, N_new, _, _ = _pin_crossings(
                jn, pc_new, s_new, w_new,
                w_new * n_loads + np.concatenate([extra_group[i] for i in found]),
                floor=_gauge_floor(gauges, pc_new, p_new, s_new, w_new, linear))
            for i in found:
                extra_lam[i], extra_N[i] = lam_new[w_new == i], N_new[w_new == i]
    return [_Found(lam[i * X:(i + 1) * X], N_at[i * X:(i + 1) * X, :len(h.idx)],
                   extra_lam[i], extra_N[i][:, :len(h.idx)], extra[i], extra_group[i])
            for i, h in enumerate(here)]


def _stacks(pins: list[int], here: list[_PinAtJoint], spread: float = 1.3
            ) -> list[list[int]]:
    """The pins searched together: by the number of their checked vectors, each stack
    within ``spread`` of its smallest (a stack pads every pin to its largest)."""
    size = {i: here[i].T.shape[1] for i in pins}
    out: list[list[int]] = []
    for i in sorted(pins, key=lambda i: size[i]):
        if out and size[i] <= spread * size[out[-1][0]]:
            out[-1].append(i)
        else:
            out.append([i])
    return out


def rate_pins(pins: Sequence[Pin], g: TrussGeometry, bridge, dead, dead_f, loads: LoadPaths,
              dependent: frozenset[str]) -> tuple[PinRating, ...]:
    """Rate every pin for every case of every load (see the module docstring), the pins
    whose joints have no member depending on the active set searched together, the others
    together. ``loads``: the positions of the rating loads with their paths under the
    maximum dead-load factors."""
    designs = {d.member: d for d in bridge.member_designs}
    # (a measured wearing surface within DW takes its own factor)
    N_dead = (dead_f["gamma_dc_max"].value * dead.member_forces_dc_kip
              + factored_dw(dead.member_forces_dw_kip, dead.member_forces_dw_surface_kip,
                            dead_f, "max"))
    here = [_pin_at_joint(pin, g, designs, N_dead, dependent) for pin in pins]
    found: dict[int, _Found] = {}
    for linear in (True, False):
        for mine in _stacks([i for i, h in enumerate(here) if h.linear == linear], here):
            found.update(zip(mine, _search([here[i] for i in mine], loads, linear),
                             strict=True))
    rated = (_rate_one(here[i], found[i], g, designs, loads) for i in range(len(here)))
    return tuple(replace(r, warnings=r.warnings + _end_loss_notes(r.joint, g, bridge)
                         + _splice_notes(r.pin),
                         assumptions=r.assumptions + _support_notes(r.joint, g))
                 for r in rated)


END_REACH = 0.2
"""A finding at a member's head or connection within this fraction of its length from a
joint is taken to be at that joint's pin (a finding with no station, at both ends)."""


def _splice_notes(pin: Pin) -> tuple[str, ...]:
    """A chord given as spliced through the pin's joint brings only the resultant of its two
    forces into the pin (rating.capacity.pins); the splice carries the rest, and is not rated
    here (common practice: a splice of ends milled to bear carries compression only)."""
    if pin.spliced_chord is None:
        return ()
    a, b = pin.spliced_chord
    return (f"pin at joint {pin.joint}: the chord {a}-{b} is given as spliced through the "
            "joint (Pins sheet), so the pin takes only the resultant of its two forces; the "
            "splice itself (its plates and rivets, or ends milled to bear, which carry "
            "compression only) is not rated here and must carry the chord's force: check it, "
            "or rate the pin with the chord butted on it where the splice is in doubt",)


def _end_loss_notes(joint: str, g: TrussGeometry, bridge) -> tuple[str, ...]:
    """The pin's bearing and packing use the thicknesses and gaps of the Packing sheet;
    section loss or pack rust recorded at a member's head or connection (a loop rod's loop)
    at this joint does not reach them (common practice: the bar's bearing face at the pin is
    what carries its force into the pin, and the gaps between the bars set the lever arms of
    the pin's bending)."""
    out = []
    losses: dict[tuple[str, str], list[str]] = {}  # (member, its end) -> the findings' places
    for m in g.members_at(joint):
        length = g.member_length_ft(m.label)
        near_start = m.start == joint
        d = bridge.design_of(m.label)
        # a loop rod's end is its loop, on the pin
        loop = d is not None and isinstance(d.section, RodSet) and d.section.end is RodEnd.LOOP
        at_pin = (FindingRegion.HEAD, FindingRegion.CONNECTION) + (
            (FindingRegion.THREAD,) if loop else ())
        for f in bridge.findings_for(m.label):
            if f.region not in at_pin:
                continue
            if f.station_ft is not None:
                from_here = f.station_ft if near_start else length - f.station_ft
                if from_here > END_REACH * length:
                    continue
            if f.pack_rust:
                # pack rust between the bars on a pin wedges them apart along it
                out.append(f"pin at joint {joint}: pack rust is recorded at member {m.label}'s "
                           f"{'loop' if f.region is FindingRegion.THREAD else f.region.value} "
                           f"({f.where or m.label}); it wedges the bars or plates apart along "
                           "the pin and lengthens the lever arms of its bending, while the pin "
                           "is rated with the plates and gaps of the Packing sheet: record the "
                           "measured gaps there (the gap before each plate)")
            if f.remaining_thickness_in is None and f.percent_loss is None:
                continue
            end = "loop" if f.region is FindingRegion.THREAD else f.region.value
            losses.setdefault((m.label, end), []).append(f.where or m.label)
    # (one note for each member's end, with every finding's place: the rods of one loop
    # member had a note each, the same words twice)
    out += [f"pin at joint {joint}: member {label} has section loss recorded at its {end} "
            f"({', '.join(dict.fromkeys(places))}); the pin's bearing and packing use the "
            "plate thicknesses of the Packing sheet, so record the remaining thickness there "
            "where the loss is at this pin's bearing" for (label, end), places in losses.items()]
    return tuple(dict.fromkeys(out))


def _support_notes(joint: str, g: TrussGeometry) -> tuple[str, ...]:
    """At a bearing the force from outside the bars is the shoe's reaction together with the
    floorbeam's load; the pin check takes it where it takes the floorbeam's (the workbook has
    no place for the shoe's position along the pin)."""
    if not any(s.joint == joint for s in g.supports):
        return ()
    return (f"pin at joint {joint}: at this bearing the force from outside the bars (the "
            "shoe's reaction with the floorbeam's load) is taken at the floorbeam plates, or "
            "at mid-pin where there are none; where the shoe bears elsewhere along the pin its "
            "moments differ (the bearing check of the bars does not depend on it)",)


def _rate_one(h: _PinAtJoint, fd: _Found, g: TrussGeometry, designs: Mapping,
              loads: LoadPaths) -> PinRating:
    """One pin's rating of every case from the least lam of each position found."""
    batch = loads.positions
    pin, model, unit = h.pin, h.model, h.unit
    lam = np.concatenate([fd.lam, fd.extra_lam])
    N_at = np.concatenate([fd.N_at, fd.extra_N])
    ratings: dict[str, PinCaseRating] = {}
    worst: tuple[float, str, np.ndarray] | None = None
    picks: list[tuple[object, float, int]] = []
    for gi, group in enumerate(loads.cases):
        here = batch.rows(gi)
        rows = np.concatenate([np.arange(here.start, here.stop),
                               batch.size + np.flatnonzero(fd.extra_group == gi)])
        lam_g = lam[rows]
        for case in group:
            lam_c = lam_g / case.gamma_ll.value
            k = first_of_least(lam_c) if lam_c.size else -1
            if k < 0 or not math.isfinite(lam_c[k]):
                ratings[case.id] = PinCaseRating(case.id, math.inf,
                                                 "not loaded by this vehicle", None, None)
                continue
            picks.append((case, float(lam_c[k]), int(rows[k])))
    # which check governs at each position that rates a case (the cases of a load mostly
    # share their position): all such positions at once
    at = sorted({j for _, _, j in picks})
    if at:
        u_fs, u_b = model.utilization_parts(
            model.point_forces(N_at[at], _balancing(unit, N_at[at])))
        governs = {j: "pin bearing" if float(b) >= float(f) else "pin flexure and shear"
                   for j, f, b in zip(at, u_fs, u_b, strict=True)}
    for case, rf, j in picks:
        ext = batch.extreme(j) if j < batch.size else fd.extra[j - batch.size]
        ratings[case.id] = PinCaseRating(case.id, rf, governs[j], ext, None)
        if worst is None or lower_beyond_round_off(rf, worst[0]):
            worst = (rf, case.id, N_at[j])
    if worst is not None:
        # the full pin check (sections, plates, balance) at the rating load level of the
        # governing case and position, for the report
        _, cid, N_here = worst
        chk = pin_check(pin, pin_actions(g, pin.joint, dict(zip(h.members,
                                                                map(float, N_here),
                                                                strict=True))),
                        external_kip=tuple(_balancing(unit, N_here)), designs=designs,
                        prepared=h.prepared)
        ratings[cid] = replace(ratings[cid], at_rating=chk)
    return PinRating(pin.joint, pin, ratings, h.dead_check, h.dead_check.warnings,
                     h.dead_check.assumptions)
