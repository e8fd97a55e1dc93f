"""Proportional loading of a truss with tension-only members: the exact load path.

Under loads P(lam) = P_dead + lam * P_live the member forces are piecewise linear in lam: on an
interval where the set of slack members does not change they follow the linear truss of that
set. :func:`load_path` walks those intervals in order of lam (each found exactly from where an
active tension-only member reaches zero force or a slack one starts to be stretched), so that
a caller can find the lam at which a member or a pin reaches its resistance with the active set
that is consistent at that load level (documented in docs/tension-only.md).
"""

from __future__ import annotations

from collections.abc import Iterable, Iterator
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
