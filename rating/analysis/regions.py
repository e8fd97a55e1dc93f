"""The exact load path of many loadings at once, from the region where each active set holds.

Under P(lam) = P_dead + lam P_live the forces of a truss with tension-only members are piecewise
linear in lam (docs/tension-only.md); in one active set S they are N_d(S) + lam N_l(S). S is the
state of the truss exactly where it is consistent: no tension-only member active in S that
could let go carries compression (it could let go when its release, or its release with its
counter coming in, leaves a stable truss; one that cannot is in forced compression and stays),
and no slack member of S is stretched. Each of those conditions is linear in lam, so S holds
on one interval of lam for a given loading, and the intervals of the sets, in order, are the
pieces of the load path that :mod:`rating.analysis.path` walks one change of active set at a
time. Here they are found for every loading and every set of a family in one array
computation. Where the intervals of the family leave a gap before ``lam_max`` (the truss takes
a state outside the family there) the loading's path is walked by
:class:`rating.analysis.path.PathWalker` instead, so every path returned is exact.

Live loads are given as downward panel-point loads (kip) at the deck stations, one column per
loading: the only loads a vehicle puts on the truss (rating.analysis.loading).
"""

from __future__ import annotations

from collections.abc import Hashable, Sequence
from dataclasses import dataclass

import numpy as np

from rating.analysis.path import PathWalker
from rating.analysis.truss import ActiveSetSolution, TrussFamily

LAM_MAX = 1e3  # load paths are followed up to this live-load multiplier (gamma_LL = 1)
_TOL_REL = 1e-11  # consistency tolerance, relative to the largest dead-load force or stretch
_LAM_TOL = 1e-9  # pieces closer than this in lam are taken to meet


@dataclass(frozen=True, eq=False)
class Pieces:
    """The load paths of X loadings, padded to J pieces each (in order of lam).

    ``k`` (X, J): index of the active set of each piece in the :class:`RegionTable`, -1 for
    padding; ``lo``/``hi`` (X, J): its interval of lam (padding: inf); ``N_dead``/``N_live``
    (X, J, m): member forces N_dead + lam N_live on the piece (padding: 0). ``L`` (K, X, m):
    the live-load forces of every loading in every set of the table, ``F_dead`` (K, m) the
    dead-load forces, ``A`` (K, C) and ``B`` (K, X, C) the conditions of every set over the
    members ``conditioned`` (C,) (:meth:`RegionTable.conditions`), ``walked`` (X,): paths
    that left the family and were walked, ``cover`` (X,): how far each path is known (the
    table's ``lam_max``, or less for a path not walked where the family leaves a gap).
    """

    k: np.ndarray
    lo: np.ndarray
    hi: np.ndarray
    N_dead: np.ndarray
    N_live: np.ndarray
    L: np.ndarray
    F_dead: np.ndarray
    A: np.ndarray
    B: np.ndarray
    conditioned: np.ndarray
    walked: np.ndarray
    cover: np.ndarray

    @property
    def n_loadings(self) -> int:
        return self.k.shape[0]


class RegionTable:
    """The active sets of one truss family with their unit-load lines and their conditions.

    Sets are added as they are met (:meth:`index`); the dead-load solutions are kept by the
    caller's key of the dead load (one per dead-load factor set).
    """

    def __init__(self, family: TrussFamily, sets: Sequence[frozenset[str]] = ()) -> None:
        self.family = family
        g = family.geometry
        self.deck_joint_index = np.array([g.joint_index[j] for j in g.deck_joints], dtype=int)
        self.slack: list[frozenset[str]] = []
        self._index: dict[frozenset[str], int] = {}
        self._force: list[np.ndarray] = []  # per set (m, s)
        self._elong: list[np.ndarray] = []
        self._pull: list[np.ndarray] = []  # per set (m,) bool: must not go into compression
        self._slack: list[np.ndarray] = []  # per set (m,) bool: must not be stretched
        self._dead: dict[Hashable, tuple[np.ndarray, list[np.ndarray], list[np.ndarray]]] = {}
        self._dead_stacked: dict[Hashable, tuple[np.ndarray, np.ndarray]] = {}
        self._arrays: tuple | None = None  # (K, and the arrays of _stacked) once stacked
        # what depends on the loadings and the sets only, for the next caller with the same
        # array (both dead-load factor sets search the same positions): by kind ("L", "B"),
        # the last two (p, K, array); p is held, so that it is that very array
        self._of_p: dict[str, list[tuple[np.ndarray, int, np.ndarray]]] = {"L": [], "B": []}
        for S in sets:
            self.index(S)

    # ---------------------------------------------------------------- the sets

    def index(self, slack: frozenset[str]) -> int:
        """Index of the active set with these slack members, added if new (it must be
        stable: raises rating.errors.InstabilityError otherwise)."""
        slack = frozenset(slack)
        hit = self._index.get(slack)
        if hit is not None:
            return hit
        fam = self.family
        lt = fam.solver(slack)
        F, E = lt.unit_load_lines
        t_only = fam.tension_only_mask.copy()
        for lab in fam.excluded:
            t_only[fam.geometry.member_index[lab]] = False
        in_s = np.array([lab in slack for lab in fam.labels], dtype=bool)
        pull = t_only & ~in_s
        for i in np.flatnonzero(pull):
            pull[i] = self._can_let_go(slack, fam.labels[i])
        self._index[slack] = len(self.slack)
        self.slack.append(slack)
        self._force.append(F)
        self._elong.append(E)
        self._pull.append(pull)
        self._slack.append(t_only & in_s)
        self._arrays = None
        for P, Fd, Ed in self._dead.values():
            Fd_k, Ed_k = lt.forces_and_elongations(P)
            Fd.append(Fd_k)
            Ed.append(Ed_k)
        return self._index[slack]

    def _can_let_go(self, slack: frozenset[str], member: str) -> bool:
        """An active tension-only member leaves the set at zero force when its release, or its
        release with its counter coming in, leaves a stable truss (as the active-set method
        of rating.analysis.truss.solve_tension_only decides); otherwise it is in forced
        compression when pushed and stays."""
        fam = self.family
        r = fam.solver(slack).redundancy[fam.geometry.member_index[member]]
        if r < 1.0 - 1e-6:
            return True  # the others take its part (no need to form the released truss)
        released = slack | {member}
        swapped = released - fam.partners(member)
        if swapped != released and fam.is_stable(swapped):
            return True
        return r < 1.0 - 1e-9 and fam.is_stable(released)

    def _stacked(self) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        """Force lines (K, m, s); then, over the members with a condition in some set (C of
        them, their indices last): the lines of each condition (K, C, s), must-not-push and
        must-not-stretch masks (K, C)."""
        if self._arrays is None or self._arrays[0] != len(self.slack):
            F, E = np.stack(self._force), np.stack(self._elong)
            pull, slk = np.stack(self._pull), np.stack(self._slack)
            cons = np.flatnonzero((pull | slk).any(axis=0))
            pull, slk = pull[:, cons], slk[:, cons]
            lines = np.where(pull[:, :, None], F[:, cons], np.where(slk[:, :, None],
                                                                    -E[:, cons], 0.0))
            self._arrays = (len(self.slack), F, lines, pull, slk, cons)
        return self._arrays[1:]

    def dead(self, key: Hashable, P_dead: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Member forces and elongations (K, m) of the dead load ``P_dead`` (named by ``key``)
        in every set."""
        hit = self._dead.get(key)
        if hit is None:
            Fd, Ed = [], []
            for S in self.slack:
                f, e = self.family.solver(S).forces_and_elongations(P_dead)
                Fd.append(f)
                Ed.append(e)
            hit = self._dead[key] = (np.asarray(P_dead, dtype=float), Fd, Ed)
        stacked = self._dead_stacked.get(key)
        if stacked is None or stacked[0].shape[0] != len(hit[1]):
            stacked = self._dead_stacked[key] = (np.stack(hit[1]), np.stack(hit[2]))
        return stacked

    def joint_loads(self, panel_loads_kip: np.ndarray) -> np.ndarray:
        """(n_joints, 2) joint loads of downward panel-point loads (n_stations,)."""
        P = np.zeros((len(self.family.geometry.joints), 2))
        P[self.deck_joint_index, 1] = -np.asarray(panel_loads_kip, dtype=float)
        return P

    # ---------------------------------------------------------------- the paths

    def live_forces(self, p: np.ndarray) -> np.ndarray:
        """Member forces (K, X, m) of the panel-point loads ``p`` (s, X) in every set (not to
        be written to: the same array serves each caller with this ``p``)."""
        return self._for_loadings("L", p)

    def _for_loadings(self, kind: str, p: np.ndarray) -> np.ndarray:
        """The live forces ("L", (K, X, m)) or the rates of the conditions ("B", (K, X, C))
        of the loadings ``p``, worked out once for each array ``p`` and set count."""
        K = len(self.slack)
        kept = self._of_p[kind]
        for q, k, a in kept:
            if q is p and k == K:
                return a
        lines = self._stacked()[0 if kind == "L" else 1]
        a = np.matmul(lines, p).transpose(0, 2, 1)
        # (an entry of fewer sets is never asked for again: the table only grows)
        kept[:] = [(p, K, a), *(e for e in kept[:1] if e[1] == K)]
        return a

    def force_lines(self) -> np.ndarray:
        """(K, m, s): member forces for a 1-kip downward load at each deck panel point, in
        each set."""
        return self._stacked()[0]

    def slack_masks(self) -> np.ndarray:
        """(K, m): the tension-only members slack in each set."""
        return np.stack(self._slack)

    def elongation_lines(self) -> np.ndarray:
        """(K, m, s): member elongations for a 1-kip downward load at each deck panel point,
        in each set."""
        return np.stack(self._elong)

    def conditions(self, key: Hashable, P_dead: np.ndarray, p: np.ndarray
                   ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """The consistency conditions A + lam B >= 0 of every set for every loading, over the
        members with a condition in some set (their indices, (C,)): A (K, C) (tolerance
        included) and B (K, X, C); a member without a condition in a set has A = 1, B = 0."""
        _, lines, pull, slk, cons = self._stacked()
        Fd, Ed = self.dead(key, P_dead)
        tol_f = _TOL_REL * max(float(np.abs(Fd).max(initial=0.0)), 1.0)
        tol_e = _TOL_REL * max(float(np.abs(Ed).max(initial=0.0)), 1e-30)
        A = np.where(pull, Fd[:, cons] + tol_f, np.where(slk, tol_e - Ed[:, cons], 1.0))
        return A, self._for_loadings("B", p), cons

    def pieces(self, key: Hashable, P_dead: np.ndarray, dead_state: ActiveSetSolution,
               p: np.ndarray, lam_max: float = LAM_MAX, walk: bool = True) -> Pieces:
        """The load path of every loading ``p`` (s, X) under ``P_dead`` + lam x loading, from
        lam = 0 to ``lam_max`` (``dead_state``: the tension-only solution of ``P_dead``).

        A path that leaves the family is walked (``walk``) or kept as far as the family
        covers it (``Pieces.cover``; :meth:`complete` walks it later, where needed)."""
        p = np.asarray(p, dtype=float)
        self.index(dead_state.slack)
        A, B, cons, lo, hi, kk, cover = self._paths(key, P_dead, p, lam_max)
        walked_paths: dict[int, list] = {}
        if walk:
            # the sets a walked path meets join the table, and the other paths with a gap
            # are tried again with them before they are walked too
            gap = np.flatnonzero(cover < lam_max * (1.0 - _LAM_TOL))
            while gap.size:
                x = int(gap[0])
                before = len(self.slack)
                walked_paths[x] = self._walk(P_dead, dead_state, p[:, x], lam_max)
                rest = gap[1:]
                if len(self.slack) > before and rest.size:
                    A, B, cons, lo, hi, kk, cover = self._paths(key, P_dead, p, lam_max)
                    rest = rest[cover[rest] < lam_max * (1.0 - _LAM_TOL)]
                gap = rest
        if A.shape[0] != len(self.slack):
            A, B, cons = self.conditions(key, P_dead, p)
        L = self.live_forces(p)
        Fd, _ = self.dead(key, P_dead)
        X, J = kk.shape
        valid = kk >= 0
        k_safe = np.where(valid, kk, 0)
        hi_p = np.where(valid, _gather(hi, k_safe), np.inf)
        lo_p = np.where(valid, _gather(lo, k_safe), np.inf)
        # (gathered, then padding zeroed in place: no second array of (X, J, m))
        N_dead = Fd[k_safe]
        N_dead[~valid] = 0.0
        N_live = L[k_safe, np.arange(X)[:, None]]
        N_live[~valid] = 0.0
        pc = Pieces(kk, lo_p, hi_p, N_dead, N_live, L, Fd, A, B, cons,
                    np.zeros(X, dtype=bool), np.minimum(cover, lam_max))
        return self._with_walks(pc, walked_paths) if walked_paths else pc

    def complete(self, pc: Pieces, need: np.ndarray, key: Hashable, P_dead: np.ndarray,
                 dead_state: ActiveSetSolution, p: np.ndarray, lam_max: float = LAM_MAX
                 ) -> Pieces:
        """``pc`` with the path of every loading known at least up to ``need`` (X,), lam
        (the same ``key``, dead load and loadings ``p`` as made ``pc``).

        A path the family does not cover that far is walked (to ``need``); the sets it
        meets join the table, and the other paths are tried again with them before they
        are walked too (a few walks usually teach the table every set that matters)."""
        need = np.minimum(need, lam_max)
        while True:
            todo = np.flatnonzero(pc.cover < need * (1.0 - _LAM_TOL))
            if not todo.size:
                return pc
            if pc.A.shape[0] < len(self.slack):
                # sets met since ``pc`` was made (on other paths) may cover these
                fresh = self.pieces(key, P_dead, dead_state, p, lam_max, walk=False)
                pc = fresh if not pc.walked.any() else self._keep_walks(fresh, pc)
                continue
            before = len(self.slack)
            walks: dict[int, list] = {}
            while todo.size:
                x = int(todo[0])
                n_sets = len(self.slack)
                walks[x] = self._walk(P_dead, dead_state, p[:, x], float(need[x]))
                rest = todo[1:]
                if len(self.slack) > n_sets and rest.size:
                    cover = self._paths(key, P_dead, p[:, rest], lam_max)[-1]
                    rest = rest[cover < need[rest] * (1.0 - _LAM_TOL)]
                todo = rest
            if len(self.slack) == before:
                return self._with_walks(pc, walks)
            # with the new sets the regions cover more: the paths again, and the walks kept
            # where they still know more
            pc = self._keep_walks(self.pieces(key, P_dead, dead_state, p, lam_max,
                                              walk=False), self._with_walks(pc, walks))

    def _keep_walks(self, fresh: Pieces, old: Pieces) -> Pieces:
        """``fresh`` with the walked paths of ``old`` where they know more."""
        rows = np.flatnonzero(old.walked & (old.cover > fresh.cover))
        if not rows.size:
            return fresh
        return _replaced(fresh, {int(x): (old.k[x], old.lo[x], old.hi[x], old.N_dead[x],
                                          old.N_live[x], float(old.cover[x])) for x in rows})

    def _walk(self, P_dead: np.ndarray, dead_state: ActiveSetSolution, p: np.ndarray,
              lam_max: float) -> list:
        """One loading's path, walked a change of active set at a time (its sets join the
        table)."""
        walker = PathWalker(self.family, P_dead, self.joint_loads(p), lam_max,
                            dead_state=dead_state)
        segs = []
        while not walker.ended:
            segs.append(walker.step())
        for sg in segs:
            self.index(sg.slack)
        return segs

    def _with_walks(self, pc: Pieces, walks: dict[int, list]) -> Pieces:
        """``pc`` with the paths of the loadings ``walks`` (index: its pieces) as walked."""
        return _replaced(pc, {
            x: (np.array([self._index[sg.slack] for sg in segs]),
                np.array([sg.lam_start for sg in segs]), np.array([sg.lam_end for sg in segs]),
                np.stack([sg.N_dead for sg in segs]), np.stack([sg.N_live for sg in segs]),
                segs[-1].lam_end)
            for x, segs in walks.items()})

    def _paths(self, key: Hashable, P_dead: np.ndarray, p: np.ndarray, lam_max: float
               ) -> tuple[np.ndarray, ...]:
        """The conditions (:meth:`conditions`), the intervals of every set (K, X), the sets
        of each path in order (X, J; -1 beyond its length) and how far each path is covered
        (X,)."""
        A, B, cons = self.conditions(key, P_dead, p)
        lo, hi = _intervals(A, B, lam_max)
        order, n_chain, cover = _chains(lo, hi)
        J = max(int(n_chain.max(initial=0)), 1)
        kk = order[:, :J].copy()
        kk[np.arange(J)[None, :] >= n_chain[:, None]] = -1
        return A, B, cons, lo, hi, kk, cover


def _replaced(pc: Pieces, paths: dict[int, tuple]) -> Pieces:
    """``pc`` with the paths of some loadings replaced by walked ones: index -> (sets, lo, hi,
    N_dead, N_live of its pieces, how far it is known); padded to the longest path."""
    J = max([pc.k.shape[1]] + [len(v[0]) for v in paths.values()])
    pad = ((0, 0), (0, J - pc.k.shape[1]))
    k = np.pad(pc.k, pad, constant_values=-1)
    lo = np.pad(pc.lo, pad, constant_values=np.inf)
    hi = np.pad(pc.hi, pad, constant_values=np.inf)
    N_dead = np.pad(pc.N_dead, pad + ((0, 0),))
    N_live = np.pad(pc.N_live, pad + ((0, 0),))
    walked, cover = pc.walked.copy(), pc.cover.copy()
    for x, (ks, los, his, nds, nls, known) in paths.items():
        n = len(ks)
        k[x], lo[x], hi[x] = -1, np.inf, np.inf
        N_dead[x] = N_live[x] = 0.0
        k[x, :n], lo[x, :n], hi[x, :n] = ks, los, his
        N_dead[x, :n], N_live[x, :n] = nds, nls
        walked[x], cover[x] = True, known
    return Pieces(k, lo, hi, N_dead, N_live, pc.L, pc.F_dead, pc.A, pc.B, pc.conditioned,
                  walked, cover)


def _gather(a: np.ndarray, k: np.ndarray) -> np.ndarray:
    """a (K, X) taken at k (X, J) -> (X, J); k may index sets added after ``a`` was made
    (those entries are never used: the caller masks them)."""
    K = a.shape[0]
    return np.take_along_axis(a.T, np.minimum(k, K - 1), axis=1)


_INTERVAL_BLOCK = 256
"""Loadings taken at a time by :func:`_intervals`: its temporaries (K, C, block) stay small
(a 16-panel truss with counters in every panel made them 100 MB each, and slower)."""


def _intervals(A: np.ndarray, B: np.ndarray, lam_max: float) -> tuple[np.ndarray, np.ndarray]:
    """Where A + lam B >= 0 holds for every member, for each set and loading: lo, hi (K, X);
    lo > hi where the set holds nowhere in [0, lam_max] (:func:`_intervals_of`, a block of
    loadings at a time)."""
    K, X = B.shape[0], B.shape[1]
    if X <= _INTERVAL_BLOCK:
        return _intervals_of(A, B, lam_max)
    lo, hi = np.empty((K, X)), np.empty((K, X))
    for s in range(0, X, _INTERVAL_BLOCK):
        lo[:, s:s + _INTERVAL_BLOCK], hi[:, s:s + _INTERVAL_BLOCK] = _intervals_of(
            A, B[:, s:s + _INTERVAL_BLOCK], lam_max)
    return lo, hi


def _intervals_of(A: np.ndarray, B: np.ndarray, lam_max: float
                  ) -> tuple[np.ndarray, np.ndarray]:
    """:func:`_intervals` of one block of loadings."""
    # over (K, C, X), the order :meth:`RegionTable.conditions` makes B in: the extremes over
    # the members are then taken element by element across the loadings (several times
    # faster than along the short last axis; the same numbers)
    Bt, At = B.transpose(0, 2, 1), A[:, :, None]
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        r = -At / Bt  # (a tiny B overflows to inf, where the condition holds all along)
    # (no member with a condition, C = 0: every set holds all along)
    lower = np.where(Bt > 0, r, -np.inf).max(axis=1, initial=-np.inf)
    upper = np.where(Bt < 0, r, np.inf).min(axis=1, initial=np.inf)
    never = ((Bt == 0) & (At < 0)).any(axis=1)
    lo = np.maximum(lower, 0.0)
    hi = np.minimum(upper, lam_max)
    lo = np.where(never, np.inf, lo)
    return lo, np.where(never, -np.inf, hi)


def _chains(lo: np.ndarray, hi: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The sets of each loading's path in order of lam, from lam = 0 while they meet.

    Returns the set order (X, K) by start, the number of sets on the path (X,) and how far
    the path is covered (X,)."""
    valid = lo <= hi * (1.0 + _LAM_TOL) + _LAM_TOL
    lo_t = np.where(valid, lo, np.inf).T  # (X, K)
    hi_t = np.where(valid, hi, -np.inf).T
    order = np.argsort(lo_t, axis=1, kind="stable")
    lo_s = np.take_along_axis(lo_t, order, axis=1)
    hi_s = np.take_along_axis(hi_t, order, axis=1)
    reach = np.maximum.accumulate(hi_s, axis=1)
    before = np.concatenate((np.zeros((lo_s.shape[0], 1)), reach[:, :-1]), axis=1)
    meets = lo_s <= before * (1.0 + _LAM_TOL) + _LAM_TOL
    on = np.logical_and.accumulate(meets & np.isfinite(lo_s), axis=1)
    n_chain = on.sum(axis=1)
    cover = np.where(n_chain > 0, np.take_along_axis(
        reach, np.maximum(n_chain - 1, 0)[:, None], axis=1)[:, 0], 0.0)
    return order, n_chain, cover


class PathStore:
    """The load paths of a batch of loadings under one dead load: found from the regions of
    the family, and walked further only where a caller needs them (:meth:`complete`)."""

    def __init__(self, table: RegionTable, key: Hashable, P_dead: np.ndarray,
                 dead_state: ActiveSetSolution, p: np.ndarray) -> None:
        self.table = table
        self.key = key
        self.P_dead = P_dead
        self.state = dead_state
        self.p = np.asarray(p, dtype=float)
        self.pieces = table.pieces(key, P_dead, dead_state, self.p, walk=False)

    def complete(self, need: np.ndarray) -> bool:
        """Know every path at least up to ``need`` (X,), lam (:meth:`RegionTable.complete`);
        True when a path had to be followed further."""
        before = self.pieces
        self.pieces = self.table.complete(before, need, self.key, self.P_dead, self.state,
                                          self.p)
        return self.pieces is not before

    def more(self, p: np.ndarray) -> Pieces:
        """The paths (walked in full) of other loadings ``p`` (s, X') under the same dead
        load."""
        return self.table.pieces(self.key, self.P_dead, self.state, p)
