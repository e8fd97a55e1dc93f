"""2-D pin-jointed truss by the direct stiffness method; one inverse, many load cases.

Each member is a two-force bar of axial stiffness E*A/L (the classical truss element, e.g.
McGuire, Gallagher & Ziemian, *Matrix Structural Analysis*, 2nd ed., Ch. 2 — common practice).
E is taken equal for all members, so forces depend only on the relative areas; for a
statically determinate truss they do not depend on stiffness at all.

Loads are arrays of shape (n_joints, 2) or (n_joints, 2, n_cases) in kip, in the joint order of
the geometry, x to the right and y up (gravity is -y). Member forces are kip, tension positive.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping
from dataclasses import dataclass
from functools import cached_property

import numpy as np

from rating.analysis.influence import InfluenceLines
from rating.errors import ConvergenceError, InstabilityError
from rating.model import Member, SupportKind, TrussGeometry

# relative size of the smallest eigenvalue of the scaled stiffness below which the truss is
# a mechanism; scaled stiffness has unit diagonal so this is scale-free.
_MECHANISM_TOL = 1e-9


@dataclass(frozen=True, eq=False)
class _Topology:
    """Member direction cosines, lengths and DOF map of a geometry (shared by active sets)."""

    ends: np.ndarray  # (n_members, 2) joint indices
    cos: np.ndarray  # (n_members, 2) unit vector start -> end
    length_ft: np.ndarray
    area_in2: np.ndarray
    free_dofs: np.ndarray
    fixed_dofs: np.ndarray


def _topology(g: TrussGeometry) -> _Topology:
    xy = np.array([(j.x_ft, j.y_ft) for j in g.joints])
    ends = np.array([(g.joint_index[m.start], g.joint_index[m.end]) for m in g.members])
    vec = xy[ends[:, 1]] - xy[ends[:, 0]]
    length = np.hypot(vec[:, 0], vec[:, 1])
    fixed: list[int] = []
    for s in g.supports:
        j = g.joint_index[s.joint]
        fixed.append(2 * j + 1)
        if s.kind is SupportKind.PIN:
            fixed.append(2 * j)
    fixed_arr = np.array(sorted(fixed), dtype=int)
    is_fixed = np.zeros(2 * len(g.joints), dtype=bool)
    is_fixed[fixed_arr] = True
    free = np.flatnonzero(~is_fixed)  # (np.setdiff1d would import numpy.ma: 25 ms)
    return _Topology(ends, vec / length[:, None], length,
                     np.array([m.area_in2 for m in g.members]), free, fixed_arr)


def _compatibility(t: _Topology, n_dof: int) -> np.ndarray:
    """B (n_members, n_dof): member elongation = B @ u."""
    n_m = t.ends.shape[0]
    B = np.zeros((n_m, n_dof))
    rows = np.arange(n_m)
    for k, sign in ((0, -1.0), (1, 1.0)):
        j = t.ends[:, k]
        B[rows, 2 * j] = sign * t.cos[:, 0]
        B[rows, 2 * j + 1] = sign * t.cos[:, 1]
    return B


@dataclass(frozen=True)
class TrussSolution:
    """Results of one or more load cases; trailing axis = load case when several."""

    member_forces_kip: np.ndarray  # (n_members, ...) tension positive
    reactions_kip: np.ndarray  # (n_joints, 2, ...) zero where not supported
    displacements: np.ndarray  # (n_joints, 2, ...) in units of kip*ft/(E*in^2), relative


class LinearTruss:
    """A truss with a fixed set of active members, inverted once.

    ``inactive`` members (slack tension-only members) are left out of the stiffness.
    Raises :class:`InstabilityError` naming a joint and the free direction if the active
    members do not make a stable truss.
    """

    def __init__(self, geometry: TrussGeometry, inactive: Iterable[str] = (),
                 shared: tuple[_Topology, np.ndarray] | None = None) -> None:
        """``shared``: the topology and compatibility matrix of ``geometry`` when the caller
        has them (they do not depend on the active set)."""
        self.geometry = geometry
        self.inactive = frozenset(inactive)
        unknown = self.inactive - set(geometry.member_index)
        if unknown:
            raise KeyError(f"unknown members {sorted(unknown)}")
        if shared is None:
            t = _topology(geometry)
            shared = (t, _compatibility(t, 2 * len(geometry.joints)))
        self._t, self._B = shared
        active = np.array([m.label not in self.inactive for m in geometry.members])
        self.active_mask = active
        k_axial = np.where(active, self._t.area_in2 / self._t.length_ft, 0.0)
        self._k_axial = k_axial
        K = self._B.T @ (k_axial[:, None] * self._B)
        f = self._t.free_dofs
        K_ff = K[np.ix_(f, f)]
        self._check_stability(K_ff)
        # The free stiffness is small (two rows per joint) and solved many times over: its
        # inverse, formed once, turns every later solve into one matrix product.
        self._K_inv = np.linalg.inv(K_ff)

    def _free_dof_name(self, dof: int) -> tuple[str, str]:
        joint = self.geometry.joints[dof // 2].label
        return joint, "horizontal (x)" if dof % 2 == 0 else "vertical (y)"

    def _check_stability(self, K_ff: np.ndarray) -> None:
        f = self._t.free_dofs
        diag = np.diag(K_ff)
        if np.any(diag <= 0):
            dof = int(f[np.argmax(diag <= 0)])
            joint, direction = self._free_dof_name(dof)
            raise InstabilityError(
                f"joint {joint} is loose: no member or support restrains it in the "
                f"{direction} direction", joint, direction)
        scale = 1.0 / np.sqrt(diag)
        S = K_ff * scale[:, None] * scale[None, :]
        # Cholesky pivots never fall below the least eigenvalue, and a singular truss gives a
        # round-off pivot; only a small pivot calls for the eigen-solution (which names the
        # free joint or confirms the truss is merely ill-conditioned).
        try:
            L = np.linalg.cholesky(S)
            if float(np.min(np.diag(L)) ** 2) >= _MECHANISM_TOL:
                return
        except np.linalg.LinAlgError:
            pass
        w, v = np.linalg.eigh(S)
        if w[0] < _MECHANISM_TOL * max(w[-1], 1.0):
            mode = np.zeros(2 * len(self.geometry.joints))
            mode[f] = v[:, 0] * scale
            self._raise_mechanism(mode)

    def _raise_mechanism(self, mode: np.ndarray) -> None:
        """Name the joint where the mechanism hinges: the joint whose members turn by the most
        different amounts in the mechanism mode (inside a rigid part all members turn alike)."""
        t = self._t
        u = mode.reshape(-1, 2)
        rel = u[t.ends[:, 1]] - u[t.ends[:, 0]]
        omega = (rel[:, 1] * t.cos[:, 0] - rel[:, 0] * t.cos[:, 1]) / t.length_ft
        omega = np.where(self.active_mask, omega, np.nan)
        nj = len(self.geometry.joints)
        hi = np.full(nj, -np.inf)
        lo = np.full(nj, np.inf)
        for k in (0, 1):
            np.fmax.at(hi, t.ends[:, k], omega)
            np.fmin.at(lo, t.ends[:, k], omega)
        spread = np.where(np.isfinite(hi - lo), hi - lo, 0.0)
        moved = np.abs(np.where(self.active_mask[:, None], rel, 0.0)).max(initial=0.0)
        if moved < 1e-6 * np.abs(u).max() and self.geometry.supports:
            # the whole truss moves as one body: its supports, not its members, let it
            j = self.geometry.joint_index[self.geometry.supports[0].joint]
            ux, uy = u.mean(axis=0)
            ang = float(np.degrees(np.arctan2(uy, ux))) % 180.0
            direction = ("horizontal (x)" if ang < 10 or ang > 170 else "vertical (y)"
                         if 80 < ang < 100 else f"at {ang:.0f} degrees to the horizontal")
            how = {"horizontal (x)": "horizontally", "vertical (y)": "vertically"}.get(
                direction, direction)
            raise InstabilityError(
                f"the supports do not hold the truss: it can slide {how} as a whole "
                "without stretching any member; give one bearing a pin (the Joints sheet's "
                "support column: one pin and one roller for a simple span)",
                self.geometry.joints[j].label, direction)
        j = int(np.argmax(spread)) if spread.max() > 0 else int(
            np.argmax(np.hypot(u[:, 0], u[:, 1])))
        joint = self.geometry.joints[j].label
        ux, uy = u[j]
        if np.hypot(ux, uy) < 1e-6 * np.abs(u).max():
            direction = "rotation of its members"
            what = f"the members at joint {joint} can turn about it"
        else:
            ang = float(np.degrees(np.arctan2(uy, ux))) % 180.0
            if ang < 10 or ang > 170:
                direction = "horizontal (x)"
            elif 80 < ang < 100:
                direction = "vertical (y)"
            else:
                direction = f"at {ang:.0f} degrees to the horizontal"
            what = f"joint {joint} can move {direction}"
        raise InstabilityError(
            f"the truss is a mechanism: {what} without stretching any member "
            "(a missing diagonal, member or support?)", joint, direction)

    def solve(self, joint_loads_kip: np.ndarray) -> TrussSolution:
        """Solve for loads of shape (n_joints, 2) or (n_joints, 2, n_cases)."""
        P = np.asarray(joint_loads_kip, dtype=float)
        nj = len(self.geometry.joints)
        single = P.ndim == 2
        P2 = P.reshape(2 * nj, -1)
        f = self._t.free_dofs
        u = np.zeros_like(P2)
        u[f] = self._K_inv @ P2[f]
        elong = self._B @ u
        N = without_round_off(self._k_axial[:, None] * elong)
        R = self._B.T @ N - P2  # internal nodal forces minus applied = support reactions
        R[f] = 0.0
        shape = (nj, 2) if single else (nj, 2, P2.shape[1])
        N_out = N[:, 0] if single else N
        return TrussSolution(N_out, R.reshape(shape), u.reshape(shape))

    def forces_and_elongations(self, joint_loads_kip: np.ndarray
                               ) -> tuple[np.ndarray, np.ndarray]:
        """Member forces (kip) and elongations of every member (slack ones included) under
        loads (n_joints, 2) -> (m,), or (n_joints, 2, k) -> (m, k): :meth:`solve` without the
        reactions, for the load path."""
        P = np.asarray(joint_loads_kip, dtype=float)
        f = self._t.free_dofs
        if P.ndim == 2:
            P1 = P.reshape(-1)
            u = np.zeros_like(P1)
            u[f] = self._K_inv @ P1[f]
            elong = self._B @ u
            return without_round_off(self._k_axial * elong), elong
        P2 = P.reshape(-1, P.shape[-1])
        u = np.zeros_like(P2)
        u[f] = self._K_inv @ P2[f]
        elong = self._B @ u
        return without_round_off(self._k_axial[:, None] * elong), elong

    @cached_property
    def redundancy(self) -> np.ndarray:
        """For each active member, k b' K^-1 b (0 for slack members): 1 where the truss
        needs the member (leaving it out is a mechanism), less than 1 where others can take
        its part (the rank-one update of the stiffness, common practice)."""
        f = self._t.free_dofs
        Bf = self._B[:, f]
        return self._k_axial * np.einsum("ij,jk,ik->i", Bf, self._K_inv, Bf)

    def elongation(self, displacements: np.ndarray) -> np.ndarray:
        """Member elongations (all members, active or not) for a displacement field."""
        nj = len(self.geometry.joints)
        return self._B @ np.asarray(displacements).reshape(2 * nj, -1)

    @cached_property
    def unit_load_lines(self) -> tuple[np.ndarray, np.ndarray]:
        """Member forces (kip) and elongations of every member, slack ones included, for a
        1-kip downward load at each deck panel point: two arrays (n_members, n_deck_points)."""
        g = self.geometry
        nj = len(g.joints)
        P = np.zeros((nj, 2, len(g.deck_joints)))
        for k, label in enumerate(g.deck_joints):
            P[g.joint_index[label], 1, k] = -1.0
        return self.forces_and_elongations(P)

    @cached_property
    def influence_lines(self) -> InfluenceLines:
        """Member forces for a 1-kip downward load at each deck panel point (all at once)."""
        g = self.geometry
        return InfluenceLines(
            member_labels=tuple(m.label for m in g.members),
            stations_ft=np.array(g.deck_stations_ft, dtype=float),
            ordinates=self.unit_load_lines[0],
        )


ROUND_OFF = 1e-10
"""A member force within this fraction of the largest member force of its loading is zero:
the solve leaves about 1e-15 of it in a member that carries nothing (a zero-force member, a
vertical that a unit load does not reach), and a rating divided by it would be 1e15 or a
sign picked by round-off."""


def without_round_off(N: np.ndarray) -> np.ndarray:
    """Member forces (m,) or (m, k) of one loading per column with the round-off of the solve
    set to zero (:data:`ROUND_OFF`)."""
    scale = np.abs(N).max(axis=0, initial=0.0)
    return np.where(np.abs(N) <= ROUND_OFF * scale, 0.0, N)


def influence_lines(geometry: TrussGeometry, inactive: Iterable[str] = ()) -> InfluenceLines:
    """Influence lines of every member for the given set of slack (inactive) members."""
    return LinearTruss(geometry, inactive).influence_lines


def joint_load_array(geometry: TrussGeometry, loads: Mapping[str, tuple[float, float]]
                     ) -> np.ndarray:
    """(n_joints, 2) array from {joint label: (Fx, Fy) kip}; unknown labels are an error."""
    P = np.zeros((len(geometry.joints), 2))
    for label, (fx, fy) in loads.items():
        P[geometry.joint_index[label]] = (fx, fy)
    return P


def member_mask(geometry: TrussGeometry, labels: Iterable[str]) -> np.ndarray:
    """Boolean array over the members, True for the given labels."""
    mask = np.zeros(len(geometry.members), dtype=bool)
    idx = [geometry.member_index[lab] for lab in labels]
    if idx:
        mask[idx] = True
    return mask


def members_cross(g: TrussGeometry, a: Member, b: Member) -> bool:
    """True when two members share no joint and cross inside a panel (a main and its counter)."""
    if {a.start, a.end} & {b.start, b.end}:
        return False
    p1, p2 = g.joint(a.start), g.joint(a.end)
    p3, p4 = g.joint(b.start), g.joint(b.end)

    def orient(p, q, r) -> float:
        return (q.x_ft - p.x_ft) * (r.y_ft - p.y_ft) - (q.y_ft - p.y_ft) * (r.x_ft - p.x_ft)

    d1, d2 = orient(p3, p4, p1), orient(p3, p4, p2)
    d3, d4 = orient(p1, p2, p3), orient(p1, p2, p4)
    return d1 * d2 < 0 and d3 * d4 < 0


class TrussFamily:
    """One geometry with its solved trusses cached by the set of slack members.

    The rating solves the same truss many times with only a few distinct active sets; each
    set is inverted once. Unstable sets are remembered too.
    """

    def __init__(self, geometry: TrussGeometry, excluded: Iterable[str] = ()) -> None:
        """``excluded``: members out of service (every bar loose, missing or broken), left out
        of every active set."""
        self.geometry = geometry
        self.excluded = frozenset(excluded)
        self._solvers: dict[frozenset[str], LinearTruss | InstabilityError] = {}
        self._partners: dict[str, frozenset[str]] | None = None
        self.labels = tuple(m.label for m in geometry.members)
        self.tension_only_labels = frozenset(m.label for m in geometry.members
                                             if m.tension_only)
        self.tension_only_mask = np.array([m.tension_only for m in geometry.members],
                                          dtype=bool)
        t = _topology(geometry)
        self._shared = (t, _compatibility(t, 2 * len(geometry.joints)))

    def partners(self, member: str) -> frozenset[str]:
        """Tension-only members crossing ``member`` in its panel (its counter or main)."""
        if self._partners is None:
            t = [m for m in self.geometry.members if m.tension_only]
            self._partners = {m.label: frozenset(o.label for o in t if o is not m
                                                 and members_cross(self.geometry, m, o))
                              for m in t}
        return self._partners.get(member, frozenset())

    def solver(self, slack: Iterable[str] = ()) -> LinearTruss:
        key = slack if type(slack) is frozenset else frozenset(slack)
        if self.excluded:
            key = key | self.excluded
        hit = self._solvers.get(key)
        if hit is None:
            try:
                hit = LinearTruss(self.geometry, key, self._shared)
            except InstabilityError as exc:
                hit = exc
            self._solvers[key] = hit
        if isinstance(hit, InstabilityError):
            raise hit
        return hit

    def is_stable(self, slack: Iterable[str]) -> bool:
        try:
            self.solver(slack)
        except InstabilityError:
            return False
        return True


@dataclass(frozen=True)
class ActiveSetSolution:
    """Tension-only analysis of one load state.

    ``slack``: tension-only members found slack (carry nothing). ``forced_compression``:
    tension-only members that would have to carry compression because without them the truss
    is a mechanism; their (compressive) force is reported, never hidden.
    """

    solution: TrussSolution
    slack: frozenset[str]
    forced_compression: frozenset[str]
    iterations: int


def solve_tension_only(
    geometry: TrussGeometry,
    joint_loads_kip: np.ndarray,
    initial_slack: Iterable[str] = (),
    max_iterations: int = 50,
    tol_kip: float = 1e-9,
    family: TrussFamily | None = None,
    trial: tuple[np.ndarray, np.ndarray] | None = None,
) -> ActiveSetSolution:
    """Active-set solution for a truss with tension-only members under one load state.

    Method (documented in docs/tension-only.md): start from ``initial_slack``; solve the
    linear truss of the active members; then (a) a tension-only member in compression is made
    slack, the most compressed first if releasing all at once would make a mechanism, and (b) a
    slack member whose ends move apart (it would be stretched) is made active again; when a
    release alone would leave a mechanism, the slack members crossing the released one (its
    counter) come in with it. Repeat until no member changes. A member whose release would
    make a mechanism stays active and is reported in ``forced_compression``. Cycling or no
    convergence within ``max_iterations`` raises :class:`ConvergenceError`.

    ``trial``: the member forces and elongations of the ``initial_slack`` set under these
    loads when the caller has them already (by superposition); the first solve is skipped.
    """
    P = np.asarray(joint_loads_kip, dtype=float)
    fam = family if family is not None else TrussFamily(geometry)
    t_only = fam.tension_only_labels
    slack = frozenset(initial_slack) & t_only
    forced: set[str] = set()
    seen: set[frozenset[str]] = set()
    labels = fam.labels
    t_mask = fam.tension_only_mask
    scale = max(float(np.abs(P).max()), 1.0) * tol_kip
    for it in range(1, max_iterations + 1):
        seen.add(slack)
        lt = fam.solver(slack)
        sol: TrussSolution | None = None
        if it == 1 and trial is not None:
            N, el = trial
        else:
            sol = lt.solve(P)
            N = sol.member_forces_kip
            el = lt.elongation(sol.displacements)[:, 0]
        slack_mask = member_mask(geometry, slack)
        forced_mask = member_mask(geometry, forced)
        # compression beyond round-off of the forces themselves (a member at a change of
        # active set carries a few parts in 1e9 of the largest force either way)
        tol_N = max(scale, 1e-8 * float(np.abs(N).max()))
        compressed = [labels[i] for i in np.flatnonzero(
            t_mask & ~slack_mask & ~forced_mask & (N < -tol_N))]
        stretched = {labels[i] for i in np.flatnonzero(
            slack_mask & (el > 1e-12 * max(float(np.abs(el).max()), 1e-30)))}
        if not compressed and not stretched:
            return ActiveSetSolution(sol if sol is not None else lt.solve(P), slack,
                                     frozenset(forced), it)
        new = (slack - stretched) | set(compressed)
        if not fam.is_stable(new):
            # a compressed main can only go slack together with its counter coming in
            swap = new - {p for c in compressed for p in fam.partners(c) if p in slack}
            if swap != new and fam.is_stable(swap):
                new = swap
        if not fam.is_stable(new):
            # release only the most compressed member (by stress) if that is stable
            idx = {lab: i for i, lab in enumerate(labels)}
            ordered = sorted(compressed, key=lambda lab: N[idx[lab]] / geometry.member(lab)
                             .area_in2)
            new = slack - stretched
            for lab in ordered:
                if not fam.is_stable(new | {lab}):
                    forced.add(lab)
                    continue
                new = new | {lab}
                break
        new = frozenset(new)
        if new in seen and new != slack:
            raise ConvergenceError(
                "the tension-only (counter) analysis cycles between active sets "
                f"{sorted(slack)} and {sorted(new)}; check the counters and mains of this panel")
        slack = new
    raise ConvergenceError(
        f"the tension-only (counter) analysis did not settle in {max_iterations} iterations")
