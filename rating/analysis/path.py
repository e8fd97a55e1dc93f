"""Proportional loading of a truss with tension-only members: the exact load path.

Under loads P(lam) = P_dead + lam * P_live the member forces are piecewise linear in lam: on an
interval where the set of slack members does not change they follow the linear truss of that
set. :func:`load_path` walks those intervals in order of lam (each found exactly from where an
active tension-only member reaches zero force or a slack one starts to be stretched), so that
a caller can find the lam at which a member or a pin reaches its resistance with the active set
that is consistent at that load level (documented in docs/tension-only.md).
"""

from __future__ import annotations

from collections.abc import Callable, Hashable, Iterable, Iterator
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
    g = family.geometry
    t_only = family.tension_only_mask
    labels = family.labels
    dead_memo = dead_solutions if dead_solutions is not None else {}
    lam = 0.0
    state = dead_state if dead_state is not None else solve_tension_only(g, P_dead,
                                                                         family=family)
    scale = max(float(np.abs(P_dead).max()), float(np.abs(P_live).max()), 1.0)
    live_now: tuple[frozenset[str], np.ndarray, np.ndarray] | None = None
    for _ in range(max_segments):
        lt = family.solver(state.slack)
        dead_here = dead_memo.get(state.slack)
        if dead_here is None:
            dead_here = dead_memo[state.slack] = lt.forces_and_elongations(P_dead)
        N_d, el_d = dead_here
        if live_now is not None and live_now[0] == state.slack:
            N_l, el_l = live_now[1], live_now[2]
        else:
            N_l, el_l = lt.forces_and_elongations(P_live)
        slack_mask = member_mask(g, state.slack)
        forced = member_mask(g, state.forced_compression)
        ends = [lam_max]
        # an active tension-only member whose force falls to zero ends the segment
        act = t_only & ~slack_mask & ~forced & (N_l < -1e-12 * scale)
        if act.any():
            ends.extend((-N_d[act] / N_l[act]).tolist())
        # a slack member that starts to be stretched ends it too
        sl_m = slack_mask & (el_l > 1e-15)
        if sl_m.any():
            ends.extend((-el_d[sl_m] / el_l[sl_m]).tolist())
        ends_arr = np.array(ends)
        ends_arr = ends_arr[ends_arr > lam * (1 + 1e-12) + 1e-12]
        lam_end = float(ends_arr.min()) if ends_arr.size else lam_max
        yield PathSegment(lam, lam_end, state.slack, state.forced_compression, N_d, N_l)
        if lam_end >= lam_max:
            return
        lam = lam_end
        nudge = lam * (1 + 1e-7) + 1e-9
        P_now = P_dead + nudge * P_live
        # the first trial of the new state is the current piece itself, by superposition
        state = solve_tension_only(g, P_now, initial_slack=state.slack, family=family,
                                   trial=(N_d + nudge * N_l, el_d + nudge * el_l))
        # A member that has just reached zero force and is still unloading lies within the
        # iteration's round-off tolerance at the nudge point: release it now (its counter
        # coming in), or the next piece would carry it into compression.
        n_now = state.solution.member_forces_kip
        n_rate, el_rate = family.solver(state.slack).forces_and_elongations(P_live)
        live_now = (state.slack, n_rate, el_rate)
        slack_now = member_mask(g, state.slack)
        forced_now = member_mask(g, state.forced_compression)
        tol = 1e-6 * max(float(np.abs(n_now).max()), 1.0)
        going = {labels[i] for i in np.nonzero(
            t_only & ~slack_now & ~forced_now & (n_rate < -1e-12 * scale) & (n_now <= tol))[0]}
        if going:
            start = (state.slack | going) - {p for m in going for p in family.partners(m)
                                             if p in state.slack}
            if family.is_stable(start):
                state = solve_tension_only(g, P_now, initial_slack=start, family=family)
    raise ConvergenceError(
        f"the load path changed its set of slack members more than {max_segments} times")


class LazyPath:
    """A load path followed only as far as someone has asked: iterating it yields the pieces
    found so far, then follows the path further (each piece is found once)."""

    def __init__(self, pieces: Iterator[PathSegment]) -> None:
        self._source: Iterator[PathSegment] | None = pieces
        self._found: list[PathSegment] = []

    def __iter__(self) -> Iterator[PathSegment]:
        k = 0
        while True:
            if k < len(self._found):
                yield self._found[k]
                k += 1
                continue
            if self._source is None:
                return
            nxt = next(self._source, None)
            if nxt is None:
                self._source = None
                return
            self._found.append(nxt)


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

    def live_loads(self, key: Hashable, make: Callable[[], np.ndarray]) -> np.ndarray:
        """The live-load vector of one position, made once per key."""
        hit = self._loads.get(key)
        if hit is None:
            hit = self._loads[key] = make()
        return hit

    def segments(self, key: Hashable, P_dead: np.ndarray, P_live: np.ndarray,
                 dead_state: ActiveSetSolution | None = None) -> LazyPath:
        hit = self._paths.get(key)
        if hit is None:
            memo = self._dead.setdefault(np.ascontiguousarray(P_dead, dtype=float).tobytes(),
                                         {})
            hit = LazyPath(load_path(self.family, P_dead, P_live, self.lam_max,
                                     dead_state=dead_state, dead_solutions=memo))
            self._paths[key] = hit
        return hit


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
                lam = (capacity_kip - n0) / slope if slope > 0 else -np.inf
                return float(lam), seg
        a, b = sense * seg.N_dead[i], sense * seg.N_live[i]
        if b > 0:
            lam = (capacity_kip - a) / b
            if seg.lam_start - 1e-9 <= lam <= seg.lam_end:
                return float(max(lam, 0.0)), seg
    assert first is not None
    return float("inf"), first
