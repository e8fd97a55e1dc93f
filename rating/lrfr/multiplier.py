"""Live-load multipliers of members on the exact load path, over every vehicle position at once.

For the members whose force depends on the counters' active set the rating factor is the
least live-load multiplier lam (with gamma_LL = 1; the rating divides by gamma_LL) at which the
member reaches its factored resistance on the load path of factored dead load + lam x
(LL + IM), over every vehicle position (docs/tension-only.md, "Which vehicle positions"). The
paths come from :class:`rating.analysis.regions.RegionTable`; here they are searched:

* :func:`first_crossings`: on each position's path, the first piece where the member reaches
  its resistance, for every member, sense and position at once;
* :func:`kink_points`: between two neighbouring positions of a run (every axle within its
  stringer span) the forces in one active set are linear in the station t, so the multiplier
  (C - a) / (b_a + t db) in that set is monotone in t, and the set holds along it on one
  interval of t (each condition of the set, times the positive denominator, is linear in t).
  The least over the run is therefore at a position of the run or at an end of such an
  interval, where the set at the rating level changes: those ends, solved exactly, are the
  points to add.
"""

from __future__ import annotations

import numpy as np

from rating.analysis.regions import LAM_MAX, Pieces
from rating.arrays import blocks

_ROUND_OFF = 1e-9


def first_crossings(pc: Pieces, member: np.ndarray, sense: np.ndarray, capacity: np.ndarray
                    ) -> tuple[np.ndarray, np.ndarray]:
    """Least lam >= 0 at which sense x N reaches ``capacity`` on each position's path, for
    the requests (member index, sense +1/-1, capacity kip), each (R,): lam (X, R), inf where
    it never does; and the piece it lies in (X, R), -1 for none. Where the factored dead load
    alone is past the capacity, lam is the (negative) linear extrapolation on the first piece
    (-inf when the live load does not add to the effect).

    The crossing in a piece is one linear equation (MBE 6A.4.2.1 rearranged for the live-load
    multiplier [value from memory]); pieces hold on disjoint intervals of lam, so the least
    crossing that lies in its piece is the first one along the path.
    """
    X, J = pc.k.shape
    if X == 0:
        return np.zeros((0, member.size)), np.zeros((0, member.size), dtype=int)
    # (a position's temporaries: a few arrays of its pieces x requests)
    parts = [_first_crossings(pc, rows, member, sense, capacity)
             for rows in blocks(np.arange(X), 8 * J * member.size)]
    if len(parts) == 1:
        return parts[0]
    return np.concatenate([p[0] for p in parts]), np.concatenate([p[1] for p in parts])


def _first_crossings(pc: Pieces, rows: slice, member: np.ndarray, sense: np.ndarray,
                     capacity: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """:func:`first_crossings` of the positions ``rows``."""
    a = sense * pc.N_dead[rows][:, :, member]  # (X, J, R)
    b = sense * pc.N_live[rows][:, :, member]
    C = capacity[None, None, :]
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        lam = np.where(b > 0, (C - a) / np.where(b > 0, b, 1.0), np.inf)
    ok = ((b > 0) & (lam >= pc.lo[rows][:, :, None] - _ROUND_OFF)
          & (lam <= pc.hi[rows][:, :, None]) & (pc.k[rows][:, :, None] >= 0))
    val = np.where(ok, np.maximum(lam, 0.0), np.inf)
    slot = np.argmin(val, axis=1)  # (X, R)
    best = np.take_along_axis(val, slot[:, None, :], axis=1)[:, 0, :]
    over = a[:, 0, :] >= C[0]
    best = np.where(over, np.where(b[:, 0, :] > 0, lam[:, 0, :], -np.inf), best)
    slot = np.where(over, 0, np.where(np.isfinite(best), slot, -1))
    return best, slot


def state_at(pc: Pieces, slot: np.ndarray, member: np.ndarray, sense: np.ndarray
             ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """For each position and request, the piece ``slot`` (X, R) of :func:`first_crossings`
    (-1: none): the member's factored dead-load force a and live-load force b (gamma_LL = 1)
    in the sense rated, in that piece's active set (X, R) (NaN for none), and the set's index
    in the table (X, R) (-1 for none). lam = (C - a) / b there: the rating equation (MBE
    6A.4.2.1 [value from memory]) with the forces of the active set at the rating level, so
    a reviewer can check it from these two numbers."""
    X = pc.k.shape[0]
    s_ = np.maximum(slot, 0)
    rows = np.arange(X)[:, None]
    a = sense * pc.N_dead[rows, s_, member[None, :]]
    b = sense * pc.N_live[rows, s_, member[None, :]]
    none = slot < 0
    k = np.where(none, -1, pc.k[rows, s_])
    return np.where(none, np.nan, a), np.where(none, np.nan, b), k


def kink_points(pc: Pieces, intervals: np.ndarray, member: np.ndarray, sense: np.ndarray,
                capacity: np.ndarray, best: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Points between neighbouring positions that can lower a request's least multiplier
    ``best`` ((R,), or (I, R) per interval): (interval index, t in (0, 1)) of each, where in
    some active set the member reaches its resistance just as a condition of that set reaches
    its limit (see the module docstring). Uses the sets on the paths at either end; the
    positions of ``intervals`` (I, 2) index the loadings of ``pc``."""
    if not intervals.size or not member.size:
        return np.zeros(0, dtype=int), np.zeros(0)
    xa, xb = intervals[:, 0], intervals[:, 1]
    # (no path is followed beyond LAM_MAX: nothing found past it can count)
    best = np.minimum(np.broadcast_to(best, (xa.size, member.size)), LAM_MAX)
    Kc = capacity[None, :] - sense[None, :] * pc.F_dead[:, member]  # (K, R)
    # in one set the multiplier along the interval is at least Kc / max(b_a, b_b) (it is
    # monotone), so only sets where an end is loaded beyond Kc / best can lower it: first
    # the intervals where some set is, then the sets
    with np.errstate(divide="ignore", invalid="ignore"):
        scale = np.where(Kc > 0, sense[None, :] / np.where(Kc > 0, Kc, 1.0), 0.0)  # (K, R)
    # the member's live force over Kc in each set, at its most over the sets (X, R); the
    # (K, X, R) array of them is made a block of positions at a time
    n_sets, n_pos = pc.L.shape[0], pc.L.shape[1]
    top = np.empty((n_pos, member.size))
    L_t = pc.L.transpose(0, 2, 1)  # (K, m, X): the order the table makes them in
    for cols in blocks(np.arange(n_pos), n_sets * member.size):
        top[cols] = (L_t[:, member, cols] * scale[:, :, None]).max(axis=0).T
    with np.errstate(invalid="ignore"):  # (0 x -inf for a request a load does not have)
        i, r = np.nonzero(np.maximum(top[xa], top[xb]) * best > 1.0 + _ROUND_OFF)
    if not i.size:
        return np.zeros(0, dtype=int), np.zeros(0)
    # the sets on the path at either end (an order of two changes of state can swap only
    # once between two positions, so a set that holds in between holds at an end too)
    ends = np.concatenate([pc.k[xa[i]], pc.k[xb[i]]], axis=1)  # (n, 2J)
    ks = np.maximum(ends, 0)
    m_, s_ = member[r][:, None], scale[ks, r[:, None]]
    hot = (ends >= 0) & (np.maximum(pc.L[ks, xa[i][:, None], m_] * s_,
                                    pc.L[ks, xb[i][:, None], m_] * s_)
                         * best[i, r][:, None] > 1.0 + _ROUND_OFF)
    hot[:, 1:] &= ends[:, 1:] != ends[:, :-1]  # (a set twice in a row at one end)
    q, c = np.nonzero(hot)
    k, i, r = ks[q, c], i[q], r[q]
    b0 = sense[r] * pc.L[k, xa[i], member[r]]
    b1 = sense[r] * pc.L[k, xb[i], member[r]] - b0
    K = Kc[k, r]
    # every condition of the set along lam = K / (b0 + t b1), times that positive
    # denominator, and the denominator itself, are linear in t: h0 + t h1, (C + 1, n) (the
    # extremes over the conditions then go element by element across the rows)
    C = pc.A.shape[1]
    At = pc.A.T[:, k]  # (C, n)
    Bt = pc.B.transpose(0, 2, 1)  # (K, C, X): the order the conditions are made in
    Ba, Bb = Bt[k, :, xa[i]].T, Bt[k, :, xb[i]].T
    h0, h1 = np.empty((C + 1, k.size)), np.empty((C + 1, k.size))
    np.add(At * b0, K * Ba, out=h0[:C])
    np.add(At * b1, K * (Bb - Ba), out=h1[:C])
    h0[C], h1[C] = b0, b1
    with np.errstate(divide="ignore", invalid="ignore"):
        root = -h0 / h1
    t1 = np.maximum(np.where(h1 > 0, root, -np.inf).max(axis=0), 0.0)
    t2 = np.minimum(np.where(h1 < 0, root, np.inf).min(axis=0), 1.0)
    never = ((h1 == 0) & (h0 < 0)).any(axis=0)
    feasible = ~never & (t1 <= t2)
    out_i, out_t = [], []
    for t in (t1, t2):
        den = b0 + t * b1
        with np.errstate(divide="ignore", invalid="ignore"):
            lam = np.where(den > 0, K / np.where(den > 0, den, 1.0), np.inf)
        keep = feasible & (t > 0.0) & (t < 1.0) & (lam < best[i, r] * (1.0 - _ROUND_OFF))
        out_i.append(i[keep])
        out_t.append(t[keep])
    return np.concatenate(out_i), np.concatenate(out_t)


def first_of_least(values: np.ndarray) -> int:
    """Index of the first value within round-off of the least (ties keep the first found:
    mirror positions of a symmetric truss never depend on the last digit)."""
    low = float(values.min())
    if not np.isfinite(low):
        return int(np.argmin(values))
    return int(np.flatnonzero(values <= low + _ROUND_OFF * max(abs(low), 1.0))[0])
