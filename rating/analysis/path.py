"""Proportional loading of a truss with tension-only members: the exact load path.

Under loads P(lam) = P_dead + lam * P_live the member forces are piecewise linear in lam: on an
interval where the set of slack members does not change they follow the linear truss of that
set. :func:`load_path` walks those intervals in order of lam (each found exactly from where an
active tension-only member reaches zero force or a slack one starts to be stretched), so that
a caller can find the lam at which a member or a pin reaches its resistance with the active set
that is consistent at that load level (documented in docs/tension-only.md).
"""

from __future__ import annotations

from collections.abc import Callable, Hashable, Iterable, Iterator, Sequence
from dataclasses import dataclass

import numpy as np

from rating.analysis.truss import (
    ActiveSetSolution,
    TrussFamily,
    member_mask,
    solve_tension_only,
)
from rating.errors import ConvergenceError


@dataclass(frozen=True, eq=False)
class PathSegment:
    """On lam_start <= lam <= lam_end the forces are N_dead + lam * N_live (kip)."""

    lam_start: float
    lam_end: float
    slack: frozenset[str]
    forced_compression: frozenset[str]
    N_dead: np.ndarray
    N_live: np.ndarray

    def forces(self, lam: float) -> np.ndarray:
        return self.N_dead + lam * self.N_live


def load_path(family: TrussFamily, P_dead: np.ndarray, P_live: np.ndarray,
              lam_max: float = 1e3, max_segments: int = 60,
              dead_state: ActiveSetSolution | None = None,
              dead_solutions: dict[frozenset[str], tuple[np.ndarray, np.ndarray]] | None = None
              ) -> Iterator[PathSegment]:
    """Yield the linear pieces of the load path from lam = 0 up to ``lam_max``.

    ``dead_state`` is the tension-only solution under ``P_dead`` when the caller has it
    already (it is the same for every vehicle position); ``dead_solutions`` keeps the linear
    solutions of ``P_dead`` by active set across paths (the same ``P_dead`` only).
    """
    walker = PathWalker(family, P_dead, P_live, lam_max, max_segments, dead_state,
                        dead_solutions)
    while not walker.ended:
        yield walker.step()


class PathWalker:
    """One load path, advanced a piece at a time: alone (:meth:`step`) or together with
    other paths under the same dead load (:func:`advance`), with the same result."""

    def __init__(self, family: TrussFamily, P_dead: np.ndarray, P_live: np.ndarray,
                 lam_max: float = 1e3, max_segments: int = 60,
                 dead_state: ActiveSetSolution | None = None,
                 dead_solutions: dict[frozenset[str], tuple[np.ndarray, np.ndarray]]
                 | None = None) -> None:
        self.family = family
        self.P_dead = P_dead
        self.P_live = P_live
        self.lam_max = lam_max
        self.max_segments = max_segments
        self.dead_memo = dead_solutions if dead_solutions is not None else {}
        state = dead_state if dead_state is not None else solve_tension_only(
            family.geometry, P_dead, family=family)
        self.slack = state.slack
        self.forced = state.forced_compression
        self.scale = max(float(np.abs(P_dead).max()), float(np.abs(P_live).max()), 1.0)
        self.lam = 0.0
        self.live_now: tuple[frozenset[str], np.ndarray, np.ndarray] | None = None
        self.pieces = 0
        self.ended = False

    def _dead(self) -> tuple[np.ndarray, np.ndarray]:
        hit = self.dead_memo.get(self.slack)
        if hit is None:
            hit = self.dead_memo[self.slack] = self.family.solver(
                self.slack).forces_and_elongations(self.P_dead)
        return hit

    def _check_count(self) -> None:
        if self.pieces >= self.max_segments:
            raise ConvergenceError("the load path changed its set of slack members more than "
                                   f"{self.max_segments} times")

    def step(self) -> PathSegment:
        """The next piece of this path (and the state after it)."""
        self._check_count()
        N_d, el_d = self._dead()
        if self.live_now is not None and self.live_now[0] == self.slack:
            N_l, el_l = self.live_now[1], self.live_now[2]
        else:
            N_l, el_l = self.family.solver(self.slack).forces_and_elongations(self.P_live)
        g = self.family.geometry
        slack_mask = member_mask(g, self.slack)
        forced = member_mask(g, self.forced)
        ends = [self.lam_max]
        # an active tension-only member whose force falls to zero ends the segment
        act = (self.family.tension_only_mask & ~slack_mask & ~forced
               & (N_l < -1e-12 * self.scale))
        if act.any():
            ends.extend((-N_d[act] / N_l[act]).tolist())
        # a slack member that starts to be stretched ends it too
        sl_m = slack_mask & (el_l > 1e-15)
        if sl_m.any():
            ends.extend((-el_d[sl_m] / el_l[sl_m]).tolist())
        ends_arr = np.array(ends)
        ends_arr = ends_arr[ends_arr > self.lam * (1 + 1e-12) + 1e-12]
        lam_end = float(ends_arr.min()) if ends_arr.size else self.lam_max
        seg = PathSegment(self.lam, lam_end, self.slack, self.forced, N_d, N_l)
        self.pieces += 1
        if lam_end >= self.lam_max:
            self.ended = True
            return seg
        self.lam = lam_end
        nudge = lam_end * (1 + 1e-7) + 1e-9
        P_now = self.P_dead + nudge * self.P_live
        # the first trial of the new state is the current piece itself, by superposition
        state = solve_tension_only(g, P_now, initial_slack=self.slack, family=self.family,
                                   trial=(N_d + nudge * N_l, el_d + nudge * el_l))
        self._settle(state.slack, state.forced_compression, state.solution.member_forces_kip,
                     P_now)
        return seg

    def _settle(self, slack: frozenset[str], forced: frozenset[str], n_now: np.ndarray,
                P_now: np.ndarray,
                live: tuple[np.ndarray, np.ndarray] | None = None) -> None:
        """Take the state found just past a change of active set.

        A member that has just reached zero force and is still unloading lies within the
        iteration's round-off tolerance at the nudge point: release it now (its counter
        coming in), or the next piece would carry it into compression.
        """
        fam = self.family
        n_rate, el_rate = live if live is not None else fam.solver(
            slack).forces_and_elongations(self.P_live)
        self.live_now = (slack, n_rate, el_rate)
        self.slack, self.forced = slack, forced
        start = self._release_start(slack, n_now, n_rate)
        if start is not None:
            state = solve_tension_only(fam.geometry, P_now, initial_slack=start, family=fam)
            self.slack, self.forced = state.slack, state.forced_compression

    def _release_start(self, slack: frozenset[str], n_now: np.ndarray, n_rate: np.ndarray
                       ) -> frozenset[str] | None:
        """The set to re-solve from when an active tension-only member is at zero and still
        unloading (its counter coming in), if that set is stable; else None."""
        fam, g = self.family, self.family.geometry
        tol = 1e-6 * max(float(np.abs(n_now).max()), 1.0)
        going = {fam.labels[i] for i in np.nonzero(
            fam.tension_only_mask & ~member_mask(g, slack) & ~member_mask(g, self.forced)
            & (n_rate < -1e-12 * self.scale) & (n_now <= tol))[0]}
        if not going:
            return None
        start = (slack | going) - {p for m in going for p in fam.partners(m) if p in slack}
        return start if fam.is_stable(start) else None


def advance(walkers: Sequence[PathWalker]) -> list[PathSegment | None]:
    """The next piece of every walker that has not ended (None for those that have), found
    together: one solve per active set for all of them, and the change of active set at the
    end of each piece settled for all at once where it is the plain one (the release of the
    members that reached zero and the entry of those being stretched, consistent at the
    first re-solve); anything else goes through the one-path method. Same pieces as
    :meth:`PathWalker.step` walker by walker (to round-off). Each walker once."""
    out: list[PathSegment | None] = [None] * len(walkers)
    groups: dict[tuple[int, frozenset[str], frozenset[str]], list[int]] = {}
    for i, w in enumerate(walkers):
        if w.ended:
            continue
        w._check_count()
        groups.setdefault((id(w.dead_memo), w.slack, w.forced), []).append(i)
    for (_, slack, forced), idx in groups.items():
        ws = [walkers[i] for i in idx]
        if len(ws) == 1:
            out[idx[0]] = ws[0].step()
            continue
        fam = ws[0].family
        g = fam.geometry
        lt = fam.solver(slack)
        N_d, el_d = ws[0]._dead()
        n, m = len(ws), len(g.members)
        N_l, el_l = np.empty((n, m)), np.empty((n, m))
        need = []
        for j, w in enumerate(ws):
            ln = w.live_now
            if ln is not None and ln[0] == slack:
                N_l[j], el_l[j] = ln[1], ln[2]
            else:
                need.append(j)
        if need:
            nn, ee = lt.forces_and_elongations(np.stack([ws[j].P_live for j in need], axis=-1))
            N_l[need], el_l[need] = nn.T, ee.T
        slack_mask = member_mask(g, slack)
        act = fam.tension_only_mask & ~slack_mask & ~member_mask(g, forced)
        scale = np.array([w.scale for w in ws])
        lam = np.array([w.lam for w in ws])
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            # (ratios of the entries not selected may overflow; they are discarded)
            r1 = np.where(act[None, :] & (N_l < -1e-12 * scale[:, None]),
                          (-N_d)[None, :] / N_l, np.inf)
            r2 = np.where(slack_mask[None, :] & (el_l > 1e-15), (-el_d)[None, :] / el_l,
                          np.inf)
        r = np.concatenate([r1, r2], axis=1)
        r = np.where(r > (lam * (1 + 1e-12) + 1e-12)[:, None], r, np.inf)
        lam_end = np.minimum(r.min(axis=1), np.array([w.lam_max for w in ws]))
        moving = []
        for j, w in enumerate(ws):
            out[idx[j]] = PathSegment(w.lam, float(lam_end[j]), slack, forced, N_d, N_l[j])
            w.pieces += 1
            if lam_end[j] >= w.lam_max:
                w.ended = True
            else:
                w.lam = float(lam_end[j])
                moving.append(j)
        if moving:
            _change_of_active_set([ws[j] for j in moving], slack, N_d, el_d, N_l[moving],
                                  el_l[moving], lam_end[moving])
    return out


def _change_of_active_set(ws: list[PathWalker], slack: frozenset[str], N_d: np.ndarray,
                          el_d: np.ndarray, N_l: np.ndarray, el_l: np.ndarray,
                          lam_end: np.ndarray) -> None:
    """The new state of walkers that left the active set ``slack`` at ``lam_end``: the first
    two iterations of :func:`solve_tension_only` for all at once (same tolerances), then the
    release check of :meth:`PathWalker._settle`; any walker whose state is not settled by
    then is re-solved by the one-path method from the same start."""
    fam = ws[0].family
    g = fam.geometry
    labels = fam.labels
    nudge = lam_end * (1 + 1e-7) + 1e-9
    P_now = [w.P_dead + nu * w.P_live for w, nu in zip(ws, nudge, strict=True)]
    Nt = N_d[None, :] + nudge[:, None] * N_l
    Et = el_d[None, :] + nudge[:, None] * el_l
    slack_mask = member_mask(g, slack)
    t_mask = fam.tension_only_mask

    def changes(N: np.ndarray, el: np.ndarray, P: list[np.ndarray], s_mask: np.ndarray
                ) -> tuple[np.ndarray, np.ndarray]:
        # the tests of solve_tension_only (tol_kip 1e-9), row by row
        tol_P = np.array([max(float(np.abs(p).max()), 1.0) * 1e-9 for p in P])
        tol_N = np.maximum(tol_P, 1e-8 * np.abs(N).max(axis=1))
        comp = t_mask[None, :] & ~s_mask[None, :] & (N < -tol_N[:, None])
        stre = s_mask[None, :] & (el > 1e-12 * np.maximum(np.abs(el).max(axis=1),
                                                           1e-30)[:, None])
        return comp, stre

    comp, stre = changes(Nt, Et, P_now, slack_mask)
    # per walker: (slack, forced) once settled here, None for the one-path method
    settled: dict[int, tuple[frozenset[str], frozenset[str]] | None] = {}
    forces: dict[int, np.ndarray] = {}
    kept: list[int] = []
    by_new: dict[frozenset[str], list[int]] = {}
    for j in range(len(ws)):
        if not comp[j].any() and not stre[j].any():
            kept.append(j)  # consistent as it was
            continue
        new = frozenset((slack - {labels[i] for i in np.flatnonzero(stre[j])})
                        | {labels[i] for i in np.flatnonzero(comp[j])})
        if fam.is_stable(new):
            by_new.setdefault(new, []).append(j)
        else:
            settled[j] = None
    if kept:
        nn, _ = fam.solver(slack).forces_and_elongations(
            np.stack([P_now[j] for j in kept], axis=-1))
        for c, j in enumerate(kept):
            settled[j], forces[j] = (slack, frozenset()), nn[:, c]
    for new, js in by_new.items():
        # the second iteration: re-solved on the new set, it must be consistent as it stands
        nn, ee = fam.solver(new).forces_and_elongations(
            np.stack([P_now[j] for j in js], axis=-1))
        comp2, stre2 = changes(nn.T, ee.T, [P_now[j] for j in js], member_mask(g, new))
        for c, j in enumerate(js):
            if comp2[c].any() or stre2[c].any():
                settled[j] = None
            else:
                settled[j], forces[j] = (new, frozenset()), nn[:, c]
    # the live-load forces on each new set, for the release check and the next piece
    live: dict[int, tuple[np.ndarray, np.ndarray]] = {}
    by_set: dict[frozenset[str], list[int]] = {}
    for j, done in settled.items():
        if done is not None:
            by_set.setdefault(done[0], []).append(j)
    for s_, js in by_set.items():
        nn, ee = fam.solver(s_).forces_and_elongations(
            np.stack([ws[j].P_live for j in js], axis=-1))
        for c, j in enumerate(js):
            live[j] = (nn[:, c], ee[:, c])
    # the release check of PathWalker._settle, the plain release re-solved for all at once
    releasing: dict[frozenset[str], list[int]] = {}
    for j, w in enumerate(ws):
        done = settled[j]
        if done is None:
            # not the plain change: the one-path method from the same start
            state = solve_tension_only(g, P_now[j], initial_slack=slack, family=fam,
                                       trial=(Nt[j], Et[j]))
            w._settle(state.slack, state.forced_compression,
                      state.solution.member_forces_kip, P_now[j])
            continue
        s_, f_ = done
        w.live_now = (s_, live[j][0], live[j][1])
        w.slack, w.forced = s_, f_
        start = w._release_start(s_, forces[j], live[j][0])
        if start is not None:
            releasing.setdefault(start, []).append(j)
    for start, js in releasing.items():
        nn, ee = fam.solver(start).forces_and_elongations(
            np.stack([P_now[j] for j in js], axis=-1))
        comp2, stre2 = changes(nn.T, ee.T, [P_now[j] for j in js], member_mask(g, start))
        plain = [c for c in range(len(js)) if not comp2[c].any() and not stre2[c].any()]
        if plain:
            nl, el = fam.solver(start).forces_and_elongations(
                np.stack([ws[js[c]].P_live for c in plain], axis=-1))
            for q, c in enumerate(plain):
                w = ws[js[c]]
                w.slack, w.forced = start, frozenset()
                w.live_now = (start, nl[:, q], el[:, q])
        for c, j in enumerate(js):
            if comp2[c].any() or stre2[c].any():
                state = solve_tension_only(g, P_now[j], initial_slack=start, family=fam)
                ws[j].slack, ws[j].forced = state.slack, state.forced_compression


class LazyPath:
    """A load path followed only as far as someone has asked: iterating it yields the pieces
    found so far, then follows the path further (each piece is found once)."""

    def __init__(self, walker: PathWalker) -> None:
        self.walker = walker
        self._found: list[PathSegment] = []

    def __iter__(self) -> Iterator[PathSegment]:
        k = 0
        while True:
            if k < len(self._found):
                yield self._found[k]
                k += 1
                continue
            if self.walker.ended:
                return
            self._found.append(self.walker.step())

    def piece(self, k: int) -> PathSegment | None:
        """The k-th piece if it has been found (see :meth:`PathCache.follow`)."""
        return self._found[k] if k < len(self._found) else None

    def needs(self, k: int) -> bool:
        return len(self._found) <= k and not self.walker.ended


class PathCache:
    """Load paths kept by a caller's key: one vehicle position at one factor set is followed
    once, as far as any member or pin needs it, and shared by every member and pin rated
    with it."""

    def __init__(self, family: TrussFamily, lam_max: float = 1e3) -> None:
        self.family = family
        self.lam_max = lam_max
        self._paths: dict[Hashable, LazyPath] = {}
        self._loads: dict[Hashable, np.ndarray] = {}
        self._dead: dict[bytes, dict[frozenset[str], tuple[np.ndarray, np.ndarray]]] = {}
        self._solved: dict[tuple, tuple[np.ndarray, np.ndarray]] = {}

    def live_loads(self, key: Hashable, make: Callable[[], np.ndarray]) -> np.ndarray:
        """The live-load vector of one position, made once per key."""
        hit = self._loads.get(key)
        if hit is None:
            hit = self._loads[key] = make()
        return hit

    def solved(self, slack: frozenset[str], key: Hashable, P: np.ndarray
               ) -> tuple[np.ndarray, np.ndarray]:
        """Member forces and elongations of the loads ``P`` (named by ``key``) in the linear
        truss of one active set, solved once per (set, key)."""
        hit = self._solved.get((slack, key))
        if hit is None:
            hit = self._solved[(slack, key)] = self.family.solver(
                slack).forces_and_elongations(P)
        return hit

    def segments(self, key: Hashable, P_dead: np.ndarray, P_live: np.ndarray,
                 dead_state: ActiveSetSolution | None = None) -> LazyPath:
        hit = self._paths.get(key)
        if hit is None:
            memo = self._dead.setdefault(np.ascontiguousarray(P_dead, dtype=float).tobytes(),
                                         {})
            hit = LazyPath(PathWalker(self.family, P_dead, P_live, self.lam_max,
                                      dead_state=dead_state, dead_solutions=memo))
            self._paths[key] = hit
        return hit

    @staticmethod
    def follow(paths: Sequence[LazyPath], k: int) -> None:
        """Find piece ``k`` of every path that has not ended before it, all together."""
        while True:
            todo = list({id(p): p for p in paths if p.needs(k)}.values())
            if not todo:
                return
            for p, seg in zip(todo, advance([p.walker for p in todo]), strict=True):
                if seg is not None:
                    p._found.append(seg)


def member_load_multiplier(family: TrussFamily, member: str, sense: int, capacity_kip: float,
                           P_dead: np.ndarray, P_live: np.ndarray,
                           lam_max: float = 1e3,
                           dead_state: ActiveSetSolution | None = None,
                           segments: Iterable[PathSegment] | None = None
                           ) -> tuple[float, PathSegment]:
    """Smallest lam >= 0 at which sense * N_member(P_dead + lam P_live) reaches capacity.

    Returns (lam, the segment it lies in); lam = inf when the member never reaches it (it goes
    slack, or the live load unloads it). When the factored dead load alone already exceeds the
    capacity, lam is the (negative) linear extrapolation on the dead-load active set.
    ``segments``: the path already followed (see :class:`PathCache`).
    """
    i = family.geometry.member_index[member]
    first: PathSegment | None = None
    path = segments if segments is not None else load_path(family, P_dead, P_live, lam_max,
                                                            dead_state=dead_state)
    for seg in path:
        if first is None:
            first = seg
            n0 = sense * seg.N_dead[i]
            if n0 >= capacity_kip:
                slope = sense * seg.N_live[i]
                with np.errstate(over="ignore"):  # a vanishing slope: -inf, as it should
                    lam = (capacity_kip - n0) / slope if slope > 0 else -np.inf
                return float(lam), seg
        a, b = sense * seg.N_dead[i], sense * seg.N_live[i]
        if b > 0:
            lam = (capacity_kip - a) / b
            if seg.lam_start - 1e-9 <= lam <= seg.lam_end:
                return float(max(lam, 0.0)), seg
    assert first is not None
    return float("inf"), first


def member_load_multipliers(requests: Sequence[tuple[LazyPath, int, int, float]]
                            ) -> list[tuple[float, PathSegment | None]]:
    """:func:`member_load_multiplier` for many (path, member index, sense, capacity) at once:
    the paths are followed together, piece by piece (:meth:`PathCache.follow`), each only
    as far as its own crossing, and the crossing is tested for all in one step per piece.
    Same multipliers, request by request, each with the piece it lies in (None where the
    member never reaches its capacity)."""
    n = len(requests)
    lam_out = [float("inf")] * n
    seg_out: list[PathSegment | None] = [None] * n
    member = np.array([r[1] for r in requests], dtype=int)
    sense = np.array([r[2] for r in requests], dtype=float)
    cap = np.array([r[3] for r in requests], dtype=float)
    active = np.arange(n)
    k = 0
    while active.size:
        PathCache.follow([requests[r][0] for r in active], k)
        pieces = [requests[r][0].piece(k) for r in active]
        keep = np.array([sg is not None for sg in pieces], dtype=bool)
        active = active[keep]  # a path that ended before: the member never got there
        segs = [sg for sg in pieces if sg is not None]
        if not segs:
            break
        i = member[active]
        a = sense[active] * np.array([sg.N_dead[j] for sg, j in zip(segs, i, strict=True)])
        b = sense[active] * np.array([sg.N_live[j] for sg, j in zip(segs, i, strict=True)])
        C = cap[active]
        start = np.array([sg.lam_start for sg in segs])
        end = np.array([sg.lam_end for sg in segs])
        res = np.full(active.size, np.inf)
        done = np.zeros(active.size, dtype=bool)
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            lam = np.where(b > 0, (C - a) / np.where(b > 0, b, 1.0), np.inf)
        if k == 0:
            # the factored dead load alone past the capacity: the (negative) extrapolation
            over = a >= C
            res[over] = np.where(b[over] > 0, lam[over], -np.inf)
            done |= over
        hit = ~done & (b > 0) & (start - 1e-9 <= lam) & (lam <= end)
        res[hit] = np.maximum(lam[hit], 0.0)
        done |= hit
        for q in np.flatnonzero(done):
            lam_out[active[q]] = float(res[q])
            seg_out[active[q]] = segs[q]
        active = active[~done]
        k += 1
    return list(zip(lam_out, seg_out, strict=True))
