"""Exact live-load extremes of every member under moving axle series and lane loads.

An influence line here is piecewise linear between the deck panel points and zero off the
bridge (:class:`~rating.analysis.influence.InfluenceLines`). The summed effect of a series of
axles is then piecewise linear in the vehicle's position, with breaks only where some axle
stands over a breakpoint of the line, so its extremes lie in a finite candidate set: each axle
over each breakpoint, both directions of travel (common practice; any structural-analysis text
on moving loads and influence lines). Nothing is stepped.

How the search works, per direction (reverse travel is forward travel on the mirrored line):

* The candidate front-axle positions ``breakpoint + axle offset`` are shared by all members, so
  they are sorted once. Per member the effect's slope changes at a candidate by
  ``P_j x (kink of the line at the breakpoint)``, so the effect at every candidate follows from
  cumulative sums, vectorized over members x candidates: cost ~ members x panels x axles.
  The maximum and the minimum are the maxima of y and of -y. Both directions (and, for many
  members, every chunk of them) are stacked into one batch of searches; each row gets exactly
  the sums of a search of its own. For a rigid series with all axles counted, the sums for -y
  are those for y negated, exactly: one search gives both.
* A line that is not zero at an end of the bridge (e.g. the end vertical of a deck truss)
  jumps there. The supremum is then taken over the one-sided limits too; when a limit
  governs, the reported position is moved 1e-6 ft to that side so that
  :func:`concurrent_forces` reproduces the value.
* A variable axle spacing (the HL-93 rear spacing, 14 to 30 ft) is searched exactly: with the
  axles split into the group ahead of the variable gap (effect F) and the group behind it
  (effect G), the extreme of F(x) + G(u) over the strip lo <= gap <= hi lies at a vertex:
  either the gap at a limit (two rigid searches) or an axle of each group over a breakpoint
  (pairs, found with a vectorized running maximum of F over the admissible window).
* Axles that stand where the line has the opposite sign can be neglected (AASHTO LRFD
  3.6.1.3.1 for the design vehicles): the line is clipped to its adverse part, whose zero
  crossings are added to the breakpoints.
* A lane load goes on every segment of the line that adds to the effect, integrated exactly
  (segments split at their zero crossings).

Tension is positive. Forces are for one whole vehicle on one truss line; the lateral
distribution factor (:mod:`rating.analysis.distribution`) and the dynamic load allowance are
applied by the rating, IM to the axle part only.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from enum import StrEnum
from functools import cached_property
from itertools import accumulate

import numpy as np

from rating.analysis.influence import InfluenceLines
from rating.errors import InputError
from rating.model.vehicles import Vehicle
from rating.vehicles.library import LoadModel, RatingLoad, as_rating_load

NUDGE_FT = 1e-6
"""Distance a reported position is moved to the side of a one-sided limit (see module doc)."""

_MAX_CHUNK_ELEMENTS = 2_000_000
_PAD_FT = 1e300
"""Station of the padding breakpoints of a batch of searches (far beyond any bridge: any
candidate position plus _PAD_FT is _PAD_FT)."""
_SIDE_C, _SIDE_L, _SIDE_R = 0, 1, 2
_SIDE_SHIFT = np.array([0.0, -1.0, 1.0])


class Direction(StrEnum):
    """Direction of travel: FORWARD toward increasing station (+x), REVERSE toward -x."""

    FORWARD = "forward"
    REVERSE = "reverse"


BOTH_DIRECTIONS: tuple[Direction, ...] = (Direction.FORWARD, Direction.REVERSE)


@dataclass(frozen=True)
class VehiclePosition:
    """Where a vehicle stands: station of its front axle (ft), its direction of travel and the
    spacing of every gap front to rear (ft; the chosen value for a variable spacing)."""

    front_axle_ft: float
    direction: Direction
    spacings_ft: tuple[float, ...]


@dataclass(frozen=True)
class Extreme:
    """One extreme (max or min) of one member under one rating load, kip, tension positive.

    ``axle_kip`` is the axle part (IM applies to it), ``lane_kip`` the lane part (never IM);
    neither includes the lateral distribution factor. ``model`` and ``vehicle_id`` name the
    load model that governed; ``position`` is None when no position gives an effect of this
    sign. ``lane_segments_ft`` are the stretches of deck the lane load covers.
    """

    axle_kip: float
    lane_kip: float
    model: str
    vehicle_id: str
    position: VehiclePosition | None
    lane_klf: float = 0.0
    lane_segments_ft: tuple[tuple[float, float], ...] = ()
    neglect_opposing_axles: bool = False

    @property
    def value_kip(self) -> float:
        """Axle part plus lane part, without IM."""
        return self.axle_kip + self.lane_kip

    def total_kip(self, im: float) -> float:
        """(1 + IM) x axle part + lane part.

        AASHTO LRFD 3.6.2.1 and 3.6.1.2.4, IM on axles only, never on lane. [value from memory]
        """
        return (1.0 + im) * self.axle_kip + self.lane_kip


@dataclass(frozen=True)
class MemberEnvelope:
    """The live-load extremes of one member under one rating load: ``max`` the largest and
    ``min`` the smallest axial force (kip, tension positive), before distribution and IM."""

    member: str
    max: Extreme
    min: Extreme


@dataclass(frozen=True, eq=False)
class Envelope:
    """Max and min of every member under one rating load, in the order of the lines' members.

    ``im_for_comparison`` is the IM used only to choose the governing load model of a member
    (truck + lane against tandem + lane); the rating applies its own IM to ``axle_kip``.
    ``applies`` is False when the load is not to be rated on this span (e.g. the lane-type
    legal load on a span of 200 ft or less); the values are computed anyway.
    """

    load: RatingLoad
    span_ft: float
    im_for_comparison: float
    members: tuple[MemberEnvelope, ...]
    applies: bool = True

    def of(self, member: str) -> MemberEnvelope:
        for e in self.members:
            if e.member == member:
                return e
        raise KeyError(member)

    @property
    def member_labels(self) -> tuple[str, ...]:
        return tuple(e.member for e in self.members)

    def totals_kip(self, im: float) -> tuple[np.ndarray, np.ndarray]:
        """(max, min) of every member with IM on the axle part, arrays of shape (n_members,)."""
        mx = np.array([e.max.total_kip(im) for e in self.members])
        mn = np.array([e.min.total_kip(im) for e in self.members])
        return mx, mn


@dataclass(frozen=True, eq=False)
class AxleExtremes:
    """Vectorized axle-only extremes of one vehicle, index 0 = max, 1 = min.

    Arrays: ``value_kip`` (2, m); ``front_axle_ft`` (2, m); ``reverse`` (2, m) bool;
    ``spacings_ft`` (2, m, n_gaps); ``found`` (2, m) bool, False where no position gives an
    effect of that sign (value 0, position meaningless).
    """

    member_labels: tuple[str, ...]
    vehicle_id: str
    value_kip: np.ndarray
    front_axle_ft: np.ndarray
    reverse: np.ndarray
    spacings_ft: np.ndarray
    found: np.ndarray

    def position(self, sense: int, k: int) -> VehiclePosition | None:
        """Critical position of member ``k`` for ``sense`` 0 (max) or 1 (min)."""
        return self.positions[sense][k]

    @cached_property
    def positions(self) -> tuple[tuple[VehiclePosition | None, ...], ...]:
        """Every critical position, per sense and member (one object for equal positions)."""
        made: dict[tuple, VehiclePosition] = {}
        out = []
        for found, front, rev, spac in zip(self.found.tolist(), self.front_axle_ft.tolist(),
                                           self.reverse.tolist(), self.spacings_ft.tolist(),
                                           strict=True):
            row = []
            for f, x, r, sp in zip(found, front, rev, spac, strict=True):
                if not f:
                    row.append(None)
                    continue
                key = (x, r, tuple(sp))
                pos = made.get(key)
                if pos is None:
                    pos = made[key] = VehiclePosition(
                        x, Direction.REVERSE if r else Direction.FORWARD, key[2])
                row.append(pos)
            out.append(tuple(row))
        return tuple(out)


# ---------------------------------------------------------------------------------------------
# vehicle geometry


def axle_offsets_ft(spacings_ft: Sequence[float]) -> np.ndarray:
    """Distance of every axle behind the front axle, ft, shape (n_axles,)."""
    gaps = np.asarray(spacings_ft, dtype=float)
    d = np.zeros(gaps.size + 1)
    np.cumsum(gaps, out=d[1:])
    return d


def panel_point_fronts(stations_ft: Sequence[float], spacings_ft: Sequence[float],
                       direction: Direction) -> np.ndarray:
    """Front-axle stations (ft, increasing) of every position in ``direction`` with an axle
    exactly over a deck panel point.

    Between two such positions every axle stays within one stringer span, so the panel-point
    loads, and every force of one active set, are linear in the vehicle's station (statics
    of the simple-span stringers, common practice).
    """
    s = np.asarray(stations_ft, dtype=float)
    d = axle_offsets_ft(spacings_ft)
    tol = 1e-9 * max(1.0, float(s[-1] - s[0]) + float(d[-1]))
    sign = 1.0 if direction is Direction.FORWARD else -1.0
    # forward: axle i at x - d_i; reverse: at x + d_i
    x = (s[:, None] + sign * d[None, :]).ravel()
    x.sort()  # as np.unique; its exact repeats go with the others within tol
    keep = np.empty(x.size, dtype=bool)
    keep[:1] = True
    np.greater(x[1:] - x[:-1], tol, out=keep[1:])
    return x[keep]


def axle_stations(position: VehiclePosition) -> np.ndarray:
    """Station of every axle (ft), front to rear, for a vehicle standing at ``position``."""
    d = axle_offsets_ft(position.spacings_ft)
    if position.direction is Direction.FORWARD:
        return position.front_axle_ft - d
    return position.front_axle_ft + d


def _axle_loads(v: Vehicle) -> np.ndarray:
    return np.asarray(v.axle_loads_kip, dtype=float) * v.axle_scale


def _check_vehicle(v: Vehicle) -> None:
    if len(v.spacings) != max(v.axle_count - 1, 0):
        raise InputError(f"vehicle {v.id} has {v.axle_count} axles but {len(v.spacings)} "
                         "spacings; it needs one spacing per gap between axles", v.where or None)
    for i, s in enumerate(v.spacings):
        if not (0.0 <= s.min_ft <= s.max_ft) or not np.isfinite(s.max_ft):
            raise InputError(f"vehicle {v.id}: spacing {i + 1} must satisfy 0 <= min <= max",
                             v.where or None)


def _check_lines(lines: InfluenceLines) -> None:
    if lines.stations_ft.size < 2:
        raise InputError("an influence line needs at least two deck panel points")
    if not (np.isfinite(lines.ordinates).all() and np.isfinite(lines.stations_ft).all()):
        raise InputError("an influence line has an ordinate that is not a finite number")


# ---------------------------------------------------------------------------------------------
# evaluation of lines at points, with one-sided limits at the ends


def _eval_line(stations: np.ndarray, Y: np.ndarray, X: np.ndarray, side: np.ndarray | None,
               tol: float, clip: bool, ends_zero: bool = False) -> np.ndarray:
    """Ordinates of each row of ``Y`` at the points ``X`` (shape (m, a), one row per member).

    ``side`` (shape of X, or broadcast to it) picks the value exactly at X (0), the limit from
    below (1) or from above (2); they differ only at the ends of the bridge, where the line
    jumps to zero. None: the value exactly at X everywhere. ``ends_zero``: no row is above
    zero at an end of the bridge (with ``clip``; else not zero), so a point off the bridge,
    taken at the nearer end, gives zero anyway (perhaps -0.0).
    """
    s0, s1 = stations[0], stations[-1]
    n = stations.size
    flat = np.minimum(np.maximum(X, s0), s1).ravel()  # as np.clip
    # flat >= s0 = stations[0]: the index is never below 0
    idx = np.searchsorted(stations, flat, side="right")
    idx -= 1
    np.minimum(idx, n - 2, out=idx)
    s_i = stations[idx]
    t = (flat - s_i) / (stations[idx + 1] - s_i)
    at = np.repeat(np.arange(0, X.shape[0] * n, n), X.shape[1])
    at += idx
    Yf = Y.ravel()
    y = (Yf[at] * (1.0 - t) + Yf[at + 1] * t).reshape(X.shape)
    if ends_zero:
        return np.maximum(y, 0.0) if clip else y
    on = (X > s0 + tol) & (X < s1 - tol)
    if not on.all():
        at0 = np.abs(X - s0) <= tol
        at1 = np.abs(X - s1) <= tol
        if side is None:
            on |= at0 | at1
        else:
            on |= (at0 & (side != _SIDE_L)) | (at1 & (side != _SIDE_R))
        y = np.where(on, y, 0.0)
    return np.maximum(y, 0.0) if clip else y


def _adverse_grids(stations: np.ndarray, Y: np.ndarray, chunk: int,
                   tol: float) -> list[np.ndarray]:
    """For each chunk of ``chunk`` rows of ``Y``: the stations plus every zero crossing of
    every row of the chunk (the breakpoints of max(y, 0) for all of them), sorted."""
    n = stations.size
    R = Y.shape[0]
    n_chunks = -(-R // chunk)
    a, b = Y[:, :-1], Y[:, 1:]
    r, i = np.nonzero((a * b) < 0)
    ar, br = a[r, i], b[r, i]
    W = np.full((n_chunks, chunk * (n - 1)), _PAD_FT)
    W[r // chunk, (r % chunk) * (n - 1) + i] = stations[i] + np.diff(stations)[i] * ar / (ar - br)
    # the distinct crossings of each chunk, in order (np.unique), _PAD_FT after them
    W.sort(axis=1)
    W = W[:, :max(1, int(np.bincount(r // chunk).max(initial=0)))]
    keep = np.empty(W.shape, dtype=bool)
    keep[:, 0] = True
    np.not_equal(W[:, 1:], W[:, :-1], out=keep[:, 1:])
    # a crossing within round-off of a station is that station (the station is kept exactly,
    # on either side of it), and crossings within round-off of each other are one
    j = np.clip(np.searchsorted(stations, W), 1, n - 1)  # the nearest station: j - 1 or j
    keep &= np.minimum(np.abs(W - stations[j - 1]), np.abs(W - stations[j])) > tol
    W[~keep] = _PAD_FT
    W.sort(axis=1)
    near = np.diff(W, axis=1) <= tol
    W[:, 1:][near] = _PAD_FT
    B = np.concatenate((np.broadcast_to(stations, (n_chunks, n)), W), axis=1)
    B.sort(axis=1)
    nb = n + np.count_nonzero(W < _PAD_FT, axis=1)
    return [B[c, :nb[c]] for c in range(n_chunks)]


def _interp_chunks(stations: np.ndarray, Y: np.ndarray, grid: np.ndarray,
                   chunk_of: np.ndarray) -> np.ndarray:
    """Ordinates of each row of ``Y`` at the points of its chunk's row of ``grid``."""
    idx = np.clip(np.searchsorted(stations, grid, side="right") - 1, 0, stations.size - 2)
    t = (grid - stations[idx]) / (stations[idx + 1] - stations[idx])
    idx, t = idx[chunk_of], t[chunk_of]
    rows = np.arange(Y.shape[0])[:, None]
    return Y[rows, idx] * (1.0 - t) + Y[rows, idx + 1] * t


# ---------------------------------------------------------------------------------------------
# the scan of one rigid axle series, several searches at once
#
# One search is one direction of travel and one chunk of rows (members x sense) with its own
# breakpoints. The searches of one vehicle are stacked row-wise into a batch: the small
# per-search work (sorting candidates) is one array operation for all, the work per row is
# done on each search's own block of rows, so that every row sees exactly the arithmetic of a
# search of its own. Breakpoints are padded at the end with _PAD_FT, far beyond any candidate,
# so that the padding sorts after every real candidate, in a tie group of its own.


@dataclass(frozen=True, eq=False)
class _Search:
    """One forward search: the line's stations (mirrored for reverse travel), its rows of
    ordinates and the breakpoints of the candidates (stations, plus zero crossings when
    opposing axles are neglected)."""

    stations: np.ndarray
    Y: np.ndarray
    B: np.ndarray
    mirrored: bool = False  # the rows are Y0 then -Y0 (the max and the min of the same lines)


@dataclass(frozen=True, eq=False)
class _Batch:
    """Searches stacked row-wise. Search p has the breakpoints ``B[p, :nb[p]]`` (the rest
    _PAD_FT), the rows ``rows[p]`` of ``V`` (the lines at B, padded with the last value)
    and of ``K``, the change of slope at each breakpoint (zero at the padding). ``jumps``:
    some line is not zero at an end of the bridge. ``runs``: the searches [k0, k1) on the
    same stations (one direction of travel). ``mirrored``: ``V`` holds the first half of each
    search's rows only (the other half is their negative, see :func:`_mirror`);
    ``out_rows[p]``: the rows of search p in the results."""

    B: np.ndarray  # (n_p, nb_max)
    nb: np.ndarray  # (n_p,)
    V: np.ndarray  # (R, nb_max)
    K: np.ndarray  # (R, nb_max)
    rows: tuple[slice, ...]
    pid: np.ndarray  # (R,) search of each row
    jumps: bool
    runs: tuple[tuple[int, int], ...]
    mirrored: bool
    out_rows: tuple[slice, ...]


def _batch(searches: Sequence[_Search], neglect: bool) -> _Batch:
    nb = np.array([s.B.size for s in searches])
    nb_max = int(nb.max())
    B = np.full((len(searches), nb_max), _PAD_FT)
    for p, s in enumerate(searches):
        B[p, :s.B.size] = s.B
    out_rows = _blocks([s.Y.shape[0] for s in searches])
    mirrored = not neglect and all(s.mirrored for s in searches)
    if mirrored:
        V = np.concatenate([s.Y[:s.Y.shape[0] // 2] for s in searches])
        # a line that jumps at an end: each sense searched on its own (its own sides)
        mirrored = not (V[:, 0].any() or V[:, -1].any())
    sizes = [s.Y.shape[0] // 2 if mirrored else s.Y.shape[0] for s in searches]
    pid = np.repeat(np.arange(len(searches)), sizes)
    rows = _blocks(sizes)
    runs = []
    k0 = 0
    for k in range(1, len(searches) + 1):
        if k == len(searches) or searches[k].stations is not searches[k0].stations:
            runs.append((k0, k))
            k0 = k
    if neglect:
        # each chunk's lines at its breakpoints; at the padding, the value at the last one
        grid = np.where(B < _PAD_FT, B, B[np.arange(B.shape[0]), nb - 1][:, None])
        V = np.concatenate([np.maximum(_interp_chunks(
            searches[k0].stations, np.concatenate([s.Y for s in searches[k0:k1]]),
            grid[k0:k1], pid[rows[k0].start:rows[k1 - 1].stop] - k0), 0.0)
            for k0, k1 in runs])
    elif not mirrored:
        V = np.concatenate([s.Y for s in searches]) if len(searches) > 1 else searches[0].Y
    jumps = bool(V[:, 0].any() or V[:, -1].any())
    return _Batch(B, nb, V, _kinks(B, V, pid), rows, pid, jumps, tuple(runs), mirrored,
                  out_rows)


def _blocks(sizes: Sequence[int]) -> tuple[slice, ...]:
    """Consecutive blocks of rows of the given sizes."""
    return tuple(slice(e - n, e) for n, e in zip(sizes, accumulate(sizes), strict=True))


def _kinks(B: np.ndarray, V: np.ndarray, pid: np.ndarray) -> np.ndarray:
    """Change of slope of every row of V at every breakpoint (zero at the padding)."""
    dB = (B[:, 1:] - B[:, :-1])[pid]
    dV = V[:, 1:] - V[:, :-1]
    sl = np.divide(dV, dB, out=np.zeros_like(dV), where=dB > 0)
    K = np.empty(V.shape)
    # the differences of (0, sl, 0)
    K[:, 0] = sl[:, 0]
    np.subtract(sl[:, 1:], sl[:, :-1], out=K[:, 1:-1])
    np.subtract(0.0, sl[:, -1], out=K[:, -1])
    return K


@dataclass(frozen=True, eq=False)
class _Candidates:
    """Sorted candidate front-axle positions of every search for axle offsets ``D``, as tie
    groups (candidates within ``tol`` of the previous one), one row per search. The real
    candidates of search p are its first ``nb[p] x a``; they form its first ``n_real[p]`` tie
    groups."""

    i_k: np.ndarray  # breakpoint index of each sorted candidate, (n_p, n_cand)
    P_k: np.ndarray  # axle load of each sorted candidate
    starts: np.ndarray  # first sorted candidate of each real tie group, (n_p, U)
    n_real: list[int]
    u: np.ndarray  # position of each tie group (front-axle station), _PAD_FT if none, (n_p, U)
    du: np.ndarray  # u[g + 1] - u[g] between real tie groups, else 0, (n_p, U - 1)
    ends: np.ndarray | None  # tie group of axle j over the first / last breakpoint, (n_p, 2a)


def _candidates(bt: _Batch, P: np.ndarray, D: np.ndarray, tol: float) -> _Candidates:
    n_p, nb_max = bt.B.shape
    a = D.size
    x = (bt.B[:, :, None] + D).reshape(n_p, nb_max * a)
    order = np.argsort(x, axis=1, kind="stable")
    p_all = np.arange(n_p)[:, None]
    xs = x[p_all, order]
    new = np.empty(xs.shape, dtype=bool)
    new[:, 0] = True
    np.greater(xs[:, 1:] - xs[:, :-1], tol, out=new[:, 1:])
    group_of = np.cumsum(new, axis=1)
    group_of -= 1
    n_real = group_of[:, -1] + (bt.nb == nb_max)  # the padding is the last group
    U = int(n_real.max())
    p_new, k_new = np.nonzero(new)
    g_new = group_of[p_new, k_new]
    starts = np.zeros((n_p, U + 1), dtype=np.intp)
    starts[p_new, g_new] = k_new
    u = np.full((n_p, U + 1), _PAD_FT)
    u[p_new, g_new] = xs[p_new, k_new]
    u = u[:, :U]
    du = u[:, 1:] - u[:, :-1]
    du[u[:, 1:] >= _PAD_FT] = 0.0
    ends = None
    if bt.jumps:
        # tie group of the candidates "axle j over the first (last) breakpoint"
        rank = np.argsort(order, axis=1)
        j = np.arange(a)
        k = np.concatenate((np.broadcast_to(j, (n_p, a)), (bt.nb[:, None] - 1) * a + j), axis=1)
        ends = group_of[p_all, rank[p_all, k]]
    return _Candidates(order // a, P[order % a], starts[:, :U], n_real.tolist(), u, du, ends)


@dataclass(frozen=True, eq=False)
class _Scan:
    """Effect of a rigid axle series at every tie group ``c.u`` of each row's search.

    ``EL`` (R, U): limit from below, -inf at the padding. Jumps happen only where an axle
    stands over an end of the bridge, at the tie groups ``jc`` (R, 2a) (``c.ends`` of the
    row's search): entering ``Jen`` and leaving ``Jex`` (G, R, 2a) for each axle group;
    None when no line jumps.
    """

    EL: np.ndarray
    jc: np.ndarray | None = None
    Jen: np.ndarray | None = None
    Jex: np.ndarray | None = None


def _scan(c: _Candidates, bt: _Batch, P: np.ndarray, groups: np.ndarray,
          n_groups: int) -> _Scan:
    R = bt.V.shape[0]
    U = c.u.shape[1]
    a = P.size
    S = np.zeros((R, U))
    for p, rows in enumerate(bt.rows):
        n_c = int(bt.nb[p]) * a
        dS = np.take(bt.K[rows], c.i_k[p, :n_c], axis=1)
        dS *= c.P_k[p, :n_c]
        n = c.n_real[p]
        # slope change of each tie group (a group of one candidate is that candidate)
        S[rows, :n] = dS if n == n_c else np.add.reduceat(dS, c.starts[p, :n], axis=1)
    slope = np.cumsum(S, axis=1)
    inc = S  # reused: the increment of the effect from each tie group to the next
    inc[:, 0] = 0.0
    for p, rows in enumerate(bt.rows):
        np.multiply(slope[rows, :-1], c.du[p], out=inc[rows, 1:])
    if not bt.jumps:
        sc = _Scan(np.cumsum(inc, axis=1))
    else:
        # the jumps of a tie group summed in the order of the sorted candidates
        jc = c.ends[bt.pid]
        Jen_d = np.zeros((n_groups, R, U))
        Jex_d = np.zeros((n_groups, R, U))
        gg = np.broadcast_to(groups, (R, a))
        rr = np.broadcast_to(np.arange(R)[:, None], (R, a))
        np.add.at(Jen_d, (gg, rr, jc[:, :a]), bt.V[:, :1] * P)
        np.add.at(Jex_d, (gg, rr, jc[:, a:]), -bt.V[:, -1:] * P)
        J = Jen_d.sum(axis=0) + Jex_d.sum(axis=0)
        sc = _Scan(np.cumsum(inc + J, axis=1) - J, jc,
                   np.take_along_axis(Jen_d, jc[None], axis=2),
                   np.take_along_axis(Jex_d, jc[None], axis=2))
    for p, rows in enumerate(bt.rows):
        if c.n_real[p] < U:
            sc.EL[rows, c.n_real[p]:] = -np.inf
    return sc


def _best_sides(sc: _Scan, combos: np.ndarray) -> tuple[np.ndarray, np.ndarray | None]:
    """Best value at every tie group over the allowed side combinations (R, U), -inf at the
    padding (``sc.EL``, overwritten), and the combination chosen at each jump tie group
    ``sc.jc`` (R, 2a); the closed state (combination 0) wins ties."""
    if sc.jc is None:
        return sc.EL, None
    rr = np.arange(sc.jc.shape[0])[:, None]
    EJ = sc.EL[rr, sc.jc]
    per = np.stack((sc.Jen, np.zeros_like(sc.Jen), sc.Jen + sc.Jex), axis=1)  # (G, 3, R, 2a)
    vals = np.broadcast_to(EJ, (combos.shape[0],) + EJ.shape).copy()
    for g in range(combos.shape[1]):
        vals += per[g, combos[:, g]]
    best = sc.EL  # a group listed twice in jc gets the same values twice
    best[rr, sc.jc] = vals.max(axis=0)
    return best, vals.argmax(axis=0)


def _choice_at(jc: np.ndarray | None, choice: np.ndarray | None, q: np.ndarray) -> np.ndarray:
    """Combination chosen at tie group q[r] of each row: 0 (closed) unless q is a jump."""
    if jc is None:
        return np.zeros(q.size, dtype=np.intp)
    at = jc == q[:, None]
    return np.where(at.any(axis=1), choice[np.arange(q.size), at.argmax(axis=1)], 0)


_COMBOS_1 = np.array([[_SIDE_C], [_SIDE_L], [_SIDE_R]])
_ORDER = np.array([1, 0, 2])  # rank of C, L, R along the station: L < C < R
_PAIRS = np.array([(s0, s1) for s0 in (_SIDE_C, _SIDE_L, _SIDE_R)
                   for s1 in (_SIDE_C, _SIDE_L, _SIDE_R)])
# gap at its lower limit may only grow: front group's side >= rear group's side
_COMBOS_LO = _PAIRS[_ORDER[_PAIRS[:, 0]] >= _ORDER[_PAIRS[:, 1]]]
_COMBOS_HI = _PAIRS[_ORDER[_PAIRS[:, 0]] <= _ORDER[_PAIRS[:, 1]]]


@dataclass
class _Best:
    """Per row: best value, front-axle position, variable-gap value, side of each group."""

    value: np.ndarray
    x: np.ndarray
    gap: np.ndarray
    sides: np.ndarray  # (R, 2) side of front group, rear group

    def take(self, other: _Best) -> None:
        better = other.value > self.value
        self.value = np.where(better, other.value, self.value)
        self.x = np.where(better, other.x, self.x)
        self.gap = np.where(better, other.gap, self.gap)
        self.sides = np.where(better[:, None], other.sides, self.sides)


def _rigid_best(bt: _Batch, P: np.ndarray, D: np.ndarray, groups: np.ndarray,
                combos: np.ndarray, gap_value: float, tol: float) -> _Best:
    c = _candidates(bt, P, D, tol)
    n_groups = combos.shape[1]
    sc = _scan(c, bt, P, groups, n_groups)
    best, choice = _best_sides(sc, combos)
    R = bt.V.shape[0]
    rows = np.arange(R)
    q = np.argmax(best, axis=1)
    if bt.mirrored:
        return _mirror(bt, c, best, q, gap_value)
    sides = combos[_choice_at(sc.jc, choice, q)]
    if n_groups == 1:
        sides = np.concatenate((sides, sides), axis=1)
    return _Best(best[rows, q], c.u[bt.pid, q], np.full(R, gap_value), sides)


def _mirror(bt: _Batch, c: _Candidates, best: np.ndarray, q: np.ndarray,
            gap_value: float) -> _Best:
    """The results of a mirrored batch (rows y searched, -y not; no jumps): every sum of the
    search of -y is the negative of that of y, exactly, so its maximum is at the first least
    tie group of y (argmin; argmax of the negatives gives the same)."""
    U = best.shape[1]
    for p, r in enumerate(bt.rows):
        if c.n_real[p] < U:
            best[r, c.n_real[p]:] = np.inf
    q_min = np.argmin(best, axis=1)
    # each search's rows: those of y, then the same for -y
    value, x = [], []
    for p, r in enumerate(bt.rows):
        rows = np.arange(r.start, r.stop)
        value += [best[rows, q[r]], -best[rows, q_min[r]]]
        x += [c.u[p, q[r]], c.u[p, q_min[r]]]
    R = 2 * best.shape[0]
    return _Best(np.concatenate(value), np.concatenate(x), np.full(R, gap_value),
                 np.zeros((R, 2), dtype=np.intp))


def _pair_best(bt: _Batch, P: np.ndarray, D_front: np.ndarray, D_rear: np.ndarray,
               n_front: int, lo: float, hi: float, tol: float) -> _Best:
    """Vertices with an axle of each group over a breakpoint and lo < gap < hi (strictly)."""
    R = bt.V.shape[0]
    pid = bt.pid
    PF, PG = P[:n_front], P[n_front:]
    cF = _candidates(bt, PF, D_front, tol)
    scF = _scan(cF, bt, PF, np.zeros(PF.size, dtype=int), 1)
    Fb, Fc = _best_sides(scF, _COMBOS_1)
    cG = _candidates(bt, PG, D_rear, tol)
    scG = _scan(cG, bt, PG, np.zeros(PG.size, dtype=int), 1)
    Gb, Gc = _best_sides(scG, _COMBOS_1)
    last_front = cF.u - D_front[-1]  # station of the last axle of the front group
    # np.searchsorted per search, as counts (last_front is sorted, its padding beyond all)
    lo_i = (last_front[:, None, :] <= (cG.u + lo + tol)[:, :, None]).sum(axis=2)[pid]
    hi_i = (last_front[:, None, :] < (cG.u + hi - tol)[:, :, None]).sum(axis=2)[pid]
    UF = cF.u.shape[1]
    UG = cG.u.shape[1]
    Fpad = np.concatenate((Fb, np.full((R, 1), -np.inf)), axis=1)
    idx = np.empty((R, 2 * UG), dtype=np.intp)
    idx[:, 0::2] = lo_i
    np.maximum(hi_i, lo_i, out=idx[:, 1::2])
    np.minimum(idx, UF, out=idx)
    idx += (np.arange(R) * (UF + 1))[:, None]
    # running maximum of F over each window: one reduceat over all rows (windows stay in
    # their row; the odd outputs, between windows, are not used)
    win = np.maximum.reduceat(Fpad.ravel(), idx.ravel()).reshape(R, 2 * UG)[:, 0::2]
    win[hi_i <= lo_i] = -np.inf
    tot = win + Gb
    kG = np.argmax(tot, axis=1)
    rows = np.arange(R)
    best = tot[rows, kG]
    cols = np.arange(UF)[None, :]
    inwin = (cols >= lo_i[rows, kG][:, None]) & (cols < hi_i[rows, kG][:, None])
    kF = np.argmax(np.where(inwin, Fb, -np.inf), axis=1)
    x = cF.u[pid, kF]
    gap = last_front[pid, kF] - cG.u[pid, kG]
    sides = np.stack((_COMBOS_1[_choice_at(scF.jc, Fc, kF), 0],
                      _COMBOS_1[_choice_at(scG.jc, Gc, kG), 0]), axis=1)
    ok = np.isfinite(best)
    return _Best(np.where(ok, best, -np.inf), x, np.where(ok, gap, lo), sides)


def _sup_forward(searches: Sequence[_Search], P: np.ndarray, lo: np.ndarray, hi: np.ndarray,
                 neglect: bool, tol: float, vehicle_id: str
                 ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Supremum over all forward positions (and spacings) of sum P_j y(x - d_j), per row of
    the searches stacked: (value, front-axle station, spacings)."""
    bt = _batch(searches, neglect)
    R = bt.out_rows[-1].stop
    a = P.size
    var = np.flatnonzero(hi - lo > tol)
    gaps = lo.copy()
    if var.size == 0:
        D = axle_offsets_ft(gaps)
        best = _rigid_best(bt, P, D, np.zeros(a, dtype=int), _COMBOS_1, 0.0, tol)
        gv = -1
    elif var.size == 1:
        gv = int(var[0])
        groups = (np.arange(a) > gv).astype(int)
        n_front = gv + 1
        gl = gaps.copy()
        best = _rigid_best(bt, P, axle_offsets_ft(gl), groups, _COMBOS_LO, lo[gv], tol)
        gl[gv] = hi[gv]
        best.take(_rigid_best(bt, P, axle_offsets_ft(gl), groups, _COMBOS_HI, hi[gv], tol))
        D_front = axle_offsets_ft(gaps[:gv])
        D_rear = axle_offsets_ft(gaps[gv + 1:])
        best.take(_pair_best(bt, P, D_front, D_rear, n_front, lo[gv], hi[gv], tol))
    else:
        raise InputError(
            f"vehicle {vehicle_id} has {var.size} variable axle spacings; the exact search "
            "handles one. Give the others as fixed values (one vehicle for each value that "
            "matters)")
    # one-sided limits: move the position to the side that governs
    shift = _SIDE_SHIFT[best.sides] * NUDGE_FT  # (R, 2): front group, rear group
    x = best.x + shift[:, 0]
    spac = np.empty((R, gaps.size))
    spac[:] = gaps
    # exact value at the winning position, evaluated directly (no accumulated sums)
    if gv >= 0:
        spac[:, gv] = best.gap + shift[:, 0] - shift[:, 1]
        D = np.concatenate((np.zeros((R, 1)), np.cumsum(np.where(
            np.arange(gaps.size)[None, :] == gv, best.gap[:, None], gaps[None, :]), axis=1)),
            axis=1)
        side = best.sides[:, groups]
    else:
        side = best.sides[:, :1] if best.sides.any() else None  # None: all at C
    X = best.x[:, None] - D  # rigid: the offsets searched, the same sums as row by row
    value = np.empty(R)
    for k0, k1 in bt.runs:
        # one evaluation for the searches on the same stations
        rows = slice(bt.out_rows[k0].start, bt.out_rows[k1 - 1].stop)
        Y = searches[k0].Y if k1 == k0 + 1 else np.concatenate([s.Y for s in searches[k0:k1]])
        y = _eval_line(searches[k0].stations, Y, X[rows], None if side is None else side[rows],
                       tol, neglect, not bt.jumps)
        for p in range(k0, k1):
            # one product per search: BLAS sums a row differently by its place in the matrix
            r = bt.out_rows[p]
            np.matmul(y[r.start - rows.start:r.stop - rows.start], P, out=value[r])
    return value, x, spac


def _batches(searches: Sequence[_Search], n_axles: int) -> list[list[_Search]]:
    """Consecutive searches in batches of about _MAX_CHUNK_ELEMENTS / 6 candidates x rows."""
    out: list[list[_Search]] = [[]]
    rows = width = 0
    for sr in searches:
        r, w = rows + sr.Y.shape[0], max(width, sr.B.size)
        if out[-1] and r * w * n_axles * 6 > _MAX_CHUNK_ELEMENTS:
            out.append([])
            r, w = sr.Y.shape[0], sr.B.size
        out[-1].append(sr)
        rows, width = r, w
    return out


def axle_extremes(lines: InfluenceLines, vehicle: Vehicle, *,
                  neglect_opposing_axles: bool = False,
                  directions: Sequence[Direction] = BOTH_DIRECTIONS) -> AxleExtremes:
    """Max and min of the summed axle effect of ``vehicle`` on every member, exact.

    Candidates: each axle over each breakpoint, both directions (common practice).

    A variable spacing is searched at its limits and where an axle of each group stands over
    a breakpoint. ``neglect_opposing_axles`` leaves off axles where the line has the opposite
    sign (AASHTO LRFD 3.6.1.3.1 for the design vehicles). Raises InputError for a vehicle
    with more than one variable spacing.
    """
    _check_lines(lines)
    _check_vehicle(vehicle)
    s = lines.stations_ft.astype(float)
    Y = lines.ordinates.astype(float)
    m = Y.shape[0]
    P = _axle_loads(vehicle)
    lo = np.array([g.min_ft for g in vehicle.spacings], dtype=float)
    hi = np.array([g.max_ft for g in vehicle.spacings], dtype=float)
    n_gaps = lo.size
    value = np.zeros((2, m))
    front = np.zeros((2, m))
    rev = np.zeros((2, m), dtype=bool)
    spac = np.empty((2, m, n_gaps))
    spac[:] = lo
    tol = _tolerance(lines, axle_offsets_ft(hi))
    if P.size and directions:
        dirs = tuple(Direction(d) for d in directions)
        best_v = np.full((2, m), -np.inf)
        C = max(1, s.size * (2 if neglect_opposing_axles else 1) * P.size)
        chunk = max(1, _MAX_CHUNK_ELEMENTS // (C * 6))
        if neglect_opposing_axles:
            # the zero crossings of a chunk's members join the breakpoints of that chunk only
            chunk = min(chunk, max(32, s.size))
        # the maxima of +Y and -Y (the max and the min) in one search, rows stacked; every
        # direction and chunk of rows is a search of its own, solved in few batches
        searches = []
        # a rigid series on the lines as they are: -Y needs no search of its own
        mirrored = not (neglect_opposing_axles or chunk < 2 * m or (hi - lo > tol).any())
        for d in dirs:
            st = s if d is Direction.FORWARD else -s[::-1]
            Yd = Y if d is Direction.FORWARD else Y[:, ::-1]
            Ys = np.concatenate((Yd, -Yd))
            Bs = (_adverse_grids(st, Ys, chunk, tol) if neglect_opposing_axles
                  else [st] * -(-2 * m // chunk))
            searches += [_Search(st, Ys[r0:r0 + chunk], B, mirrored)
                         for r0, B in zip(range(0, 2 * m, chunk), Bs, strict=True)]
        parts = [_sup_forward(b, P, lo, hi, neglect_opposing_axles, tol, vehicle.id)
                 for b in _batches(searches, P.size)]
        v_all, x_all, sp_found = (np.concatenate(z) if len(parts) > 1 else z[0]
                                  for z in zip(*parts, strict=True))
        bv, fr, rv = best_v.reshape(-1), front.reshape(-1), rev.reshape(-1)
        sp_all = spac.reshape(2 * m, n_gaps)
        for i, d in enumerate(dirs):
            rows = slice(2 * m * i, 2 * m * (i + 1))
            v, x = v_all[rows], x_all[rows]
            if d is Direction.REVERSE:
                x = -x
            better = v > bv + tol * 1e-3
            bv[:] = np.where(better, v, bv)
            fr[:] = np.where(better, x, fr)
            rv[:] = np.where(better, d is Direction.REVERSE, rv)
            sp_all[:] = np.where(better[:, None], sp_found[rows], sp_all)
        value[0] = best_v[0]
        value[1] = -best_v[1]
    scale = max(1.0, float(np.abs(Y).max(initial=0.0)) * float(P.sum(initial=0.0)))
    found = np.empty((2, m), dtype=bool)
    np.greater(value[0], 1e-12 * scale, out=found[0])
    np.less(value[1], -1e-12 * scale, out=found[1])
    value = np.where(found, value, 0.0)
    return AxleExtremes(lines.member_labels, vehicle.id, value, front, rev, spac, found)


# ---------------------------------------------------------------------------------------------
# lane loads


def adverse_areas(lines: InfluenceLines) -> tuple[np.ndarray, np.ndarray]:
    """Area (ft x kip/kip) of the positive and of the negative parts of every line.

    Exact integration of a piecewise-linear line, segments split at zero crossings (closed form).
    """
    h = np.diff(lines.stations_ft)
    a, b = lines.ordinates[:, :-1], lines.ordinates[:, 1:]
    same = a * b >= 0
    ap, bp = np.maximum(a, 0.0), np.maximum(b, 0.0)
    an, bn = np.minimum(a, 0.0), np.minimum(b, 0.0)
    denom = np.where(same, 1.0, np.abs(a) + np.abs(b))
    pos = np.where(same, 0.5 * (ap + bp), 0.5 * (ap**2 + bp**2) / denom) * h
    neg = np.where(same, 0.5 * (an + bn), -0.5 * (an**2 + bn**2) / denom) * h
    return pos.sum(axis=1), neg.sum(axis=1)


def adverse_segments(stations_ft: np.ndarray, y: np.ndarray,
                     sign: float) -> tuple[tuple[float, float], ...]:
    """Stretches of deck where the line ``y`` has the sign of ``sign`` (where a lane load goes).

    Ordinates within round-off of zero (1e-12 of the line's largest) count as zero: a
    member whose line is exactly zero over part of the deck gets no lane there from the last
    digits of the analysis."""
    return _adverse_segments_rows(stations_ft, np.asarray(y, dtype=float)[None, :], sign)[0]


def _adverse_segments_rows(stations_ft: np.ndarray, Y: np.ndarray,
                           sign: float) -> list[tuple[tuple[float, float], ...]]:
    """:func:`adverse_segments` of every row of ``Y``."""
    v = sign * np.asarray(Y, dtype=float)
    v = np.where(np.abs(v) <= 1e-12 * np.abs(v).max(axis=1, initial=0.0)[:, None], 0.0, v)
    s = np.asarray(stations_ft, dtype=float)
    a, b = v[:, :-1], v[:, 1:]
    with np.errstate(divide="ignore", invalid="ignore"):
        xc = s[:-1] + (s[1:] - s[:-1]) * a / (a - b)  # the zero crossing, where there is one
    x0 = np.where(a > 0, s[:-1], xc)
    x1 = np.where(b > 0, s[1:], xc)
    # the panels that add, in order along each row; each adds on to the stretch before when it
    # starts where that one ends (within round-off), else starts a stretch of its own
    r, i = np.nonzero((a > 0) | (b > 0))
    p, q = x0[r, i], x1[r, i]
    out: list[list[tuple[float, float]]] = [[] for _ in range(v.shape[0])]
    # a panel of no length that starts no stretch is left out: the rows with one, one by one
    odd = np.zeros(v.shape[0], dtype=bool)
    odd[r[q <= p]] = True
    for k in np.flatnonzero(odd).tolist():
        row: list[list[float]] = []
        on = r == k
        for pk, qk in zip(p[on].tolist(), q[on].tolist(), strict=True):
            if row and abs(row[-1][1] - pk) <= 1e-12 * max(1.0, abs(pk)):
                row[-1][1] = qk
            elif qk > pk:
                row.append([pk, qk])
        out[k] = [(pk, qk) for pk, qk in row]
    keep = ~odd[r]
    r, p, q = r[keep], p[keep], q[keep]
    joins = np.zeros(r.size, dtype=bool)
    joins[1:] = (r[1:] == r[:-1]) & (np.abs(q[:-1] - p[1:])
                                     <= 1e-12 * np.maximum(1.0, np.abs(p[1:])))
    first = np.flatnonzero(~joins)
    last = np.empty_like(first)
    last[:-1] = first[1:] - 1
    last[-1:] = r.size - 1
    for k, pk, qk in zip(r[first].tolist(), p[first].tolist(), q[last].tolist(), strict=True):
        out[k].append((pk, qk))
    return [tuple(row) for row in out]


def line_integrals(lines: InfluenceLines, start_ft: float, end_ft: float) -> np.ndarray:
    """Integral of every line from ``start_ft`` to ``end_ft`` (zero off the bridge), (m,)."""
    s = lines.stations_ft
    a, b = max(min(start_ft, end_ft), s[0]), min(max(start_ft, end_ft), s[-1])
    if b <= a:
        return np.zeros(len(lines.member_labels))
    inner = s[(s > a) & (s < b)]
    pts = np.concatenate(([a], inner, [b]))
    y = lines.evaluate(pts)
    return (0.5 * (y[:, :-1] + y[:, 1:]) * np.diff(pts)).sum(axis=1)


# ---------------------------------------------------------------------------------------------
# concurrent forces


def concurrent_forces(lines: InfluenceLines, vehicle: Vehicle,
                      position: VehiclePosition) -> np.ndarray:
    """Axle-load force in every member with ``vehicle`` at ``position``, kip, shape (m,).

    All axles count as they stand (physical forces of one vehicle position), scaled by the
    vehicle's ``axle_scale``; where an extreme neglected opposing axles, that member's own
    value may be larger. Statics of superposition on the influence lines (closed form).
    """
    _check_vehicle(vehicle)
    if vehicle.axle_count == 0:
        return np.zeros(len(lines.member_labels))
    if len(position.spacings_ft) != len(vehicle.spacings):
        raise InputError(f"the position has {len(position.spacings_ft)} spacings but vehicle "
                         f"{vehicle.id} has {len(vehicle.spacings)} gaps", vehicle.where or None)
    x = axle_stations(position)
    m = len(lines.member_labels)
    X = np.broadcast_to(x, (m, x.size))
    y = _eval_line(lines.stations_ft, lines.ordinates, X, np.zeros(X.shape, dtype=int),
                   _tolerance(lines, x), clip=False)
    return y @ _axle_loads(vehicle)


def _tolerance(lines: InfluenceLines, x: np.ndarray) -> float:
    s = lines.stations_ft
    return 1e-9 * max(1.0, float(s[-1] - s[0]) + float(x.max() - x.min()))  # as np.ptp


def concurrent_lane_forces(lines: InfluenceLines, lane_klf: float,
                           segments_ft: Sequence[tuple[float, float]]) -> np.ndarray:
    """Force in every member from a uniform lane load on the given stretches, kip, (m,).

    Exact integration of the piecewise-linear lines (closed form).
    """
    out = np.zeros(len(lines.member_labels))
    for a, b in segments_ft:
        out += line_integrals(lines, a, b)
    return lane_klf * out


def concurrent_with(lines: InfluenceLines, load: RatingLoad,
                    extreme: Extreme) -> tuple[np.ndarray, np.ndarray]:
    """(axle part, lane part) of every member's force in the loading that gives ``extreme``.

    The two parts stay apart because IM applies to the axle part only.
    """
    model = next((mo for mo in load.models if mo.name == extreme.model), None)
    m = len(lines.member_labels)
    if model is None:
        return np.zeros(m), np.zeros(m)
    axle = (concurrent_forces(lines, model.axles, extreme.position)
            if model.axles is not None and extreme.position is not None else np.zeros(m))
    lane = concurrent_lane_forces(lines, extreme.lane_klf, extreme.lane_segments_ft)
    return axle, lane


# ---------------------------------------------------------------------------------------------
# rating loads


def envelope(lines: InfluenceLines, load: RatingLoad | Vehicle, *, im: float = 0.33,
             directions: Sequence[Direction] = BOTH_DIRECTIONS) -> Envelope:
    """Max and min of every member under a rating load: each model's axles + lane, governing
    model chosen per member and sense by (1 + IM) x axle + lane.

    AASHTO LRFD 3.6.1.3.1, HL-93 = larger of truck + lane and tandem + lane. [value from memory]
    """
    _check_lines(lines)
    if isinstance(load, Vehicle):
        load = as_rating_load(load)
    if not load.models:
        raise InputError(f"rating load {load.id} has no load model")
    span = float(lines.stations_ft[-1] - lines.stations_ft[0])
    pos_area, neg_area = adverse_areas(lines)
    per_model: list[tuple[LoadModel, AxleExtremes | None, np.ndarray]] = []
    for mo in load.models:
        ax = (axle_extremes(lines, mo.axles, neglect_opposing_axles=mo.neglect_opposing_axles,
                            directions=directions) if mo.axles is not None else None)
        lane = mo.lane_load_klf * np.stack((pos_area, neg_area))  # (2, m)
        per_model.append((mo, ax, lane))
    totals = np.stack([
        (1.0 + im) * (ax.value_kip if ax is not None else 0.0) + lane
        for _, ax, lane in per_model])  # (n_models, 2, m)
    gov = np.stack((np.argmax(totals[:, 0], axis=0), np.argmin(totals[:, 1], axis=0))).tolist()
    # per model as plain lists: (model, axle values, positions, lane values), [sense][member]
    plain = [(mo, ax.value_kip.tolist() if ax is not None else None,
              ax.positions if ax is not None else None, lane.tolist())
             for mo, ax, lane in per_model]
    none = Extreme(0.0, 0.0, "", "", None, 0.0, ())  # immutable: one for every empty extreme
    segments = None
    if any(mo.lane_load_klf > 0 for mo in load.models):
        m = len(lines.member_labels)
        both = _adverse_segments_rows(  # -Y: the stretches of sign -1
            lines.stations_ft, np.concatenate((lines.ordinates, -lines.ordinates)), 1.0)
        segments = (both[:m], both[m:])
    members = []
    for k, label in enumerate(lines.member_labels):
        ext = []
        for sense in (0, 1):
            mo, axle, pos, lane = plain[gov[sense][k]]
            axle_v = axle[sense][k] if axle is not None else 0.0
            lane_v = lane[sense][k]
            if axle_v == 0.0 and lane_v == 0.0:
                ext.append(none)
                continue
            segs = segments[sense][k] if mo.lane_load_klf > 0 and lane_v != 0.0 else ()
            ext.append(Extreme(axle_v, lane_v, mo.name, mo.vehicle_id,
                               pos[sense][k] if pos is not None else None, mo.lane_load_klf,
                               segs, mo.neglect_opposing_axles))
        members.append(MemberEnvelope(label, ext[0], ext[1]))
    return Envelope(load, span, im, tuple(members), load.applies_to(span))
