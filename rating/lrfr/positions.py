"""Vehicle positions tried on the exact load path, as panel-point loads for all at once.

Two kinds: the positions critical for the members' influence lines in any active set (the
envelope positions, each with its own load model, spacing and lane segments), and *runs*: one
vehicle of the rating load driven across in one direction with an axle over each deck panel
point in turn. Between two neighbouring positions of a run every axle stays within its
stringer span, so the panel-point loads, and every force of one active set, are linear in the
vehicle's station (statics of simple-span stringers, common practice); the load-multiplier
search uses that (rating.lrfr.multiplier, rating.lrfr.pins).
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass

import numpy as np

from rating.analysis.loading import axle_panel_loads, lane_panel_loads
from rating.analysis.moving import (
    BOTH_DIRECTIONS,
    Direction,
    Extreme,
    VehiclePosition,
    axle_offsets_ft,
    axle_stations,
    panel_point_fronts,
)
from rating.analysis.regions import PathStore
from rating.arrays import distinct_sorted, first_of_distinct_rows
from rating.vehicles.library import RatingLoad


def fixed_axles_only(load: RatingLoad) -> bool:
    """One load model of axles alone with fixed spacings (the legal loads, SHVs, NRL,
    emergency and owner vehicles)."""
    if len(load.models) != 1:
        return False
    mo = load.models[0]
    v = mo.axles
    return not (v is None or mo.lane_load_klf or any(sp.min_ft != sp.max_ft
                                                     for sp in v.spacings))


@dataclass(frozen=True)
class Run:
    """One vehicle of a rating load (model, axle spacings and lane segments fixed) driven
    across the bridge in one direction."""

    model: str
    vehicle_id: str
    direction: Direction
    spacings_ft: tuple[float, ...]
    lane_klf: float = 0.0
    lane_segments_ft: tuple[tuple[float, float], ...] = ()
    neglect_opposing_axles: bool = False
    window_ft: tuple[float, float] | None = None  # stations of the vehicle's middle searched

    def middle_ft(self, fronts_ft: np.ndarray) -> np.ndarray:
        """Station of the vehicle's middle (half way from front to rear axle)."""
        half = 0.5 * float(sum(self.spacings_ft))
        return fronts_ft - half if self.direction is Direction.FORWARD else fronts_ft + half

    def extreme(self, front_axle_ft: float) -> Extreme:
        return Extreme(0.0, 0.0, self.model, self.vehicle_id,
                       VehiclePosition(float(front_axle_ft), self.direction, self.spacings_ft),
                       self.lane_klf, self.lane_segments_ft, self.neglect_opposing_axles)


def runs_of(load: RatingLoad, extremes: Iterable[Extreme], reach_ft: float = 0.0
            ) -> list[Run]:
    """The runs to search for a load: its one vehicle both ways for a load of fixed-spacing
    axles alone; otherwise every vehicle (model, spacing, lane segments) among ``extremes``,
    both ways, over the stretch of deck within ``reach_ft`` of where it stands in them."""
    if fixed_axles_only(load):
        mo = load.models[0]
        spac = tuple(float(sp.min_ft) for sp in mo.axles.spacings)
        return [Run(mo.name, mo.axles.id, d, spac) for d in BOTH_DIRECTIONS]
    out: dict[tuple, Run] = {}
    for e in extremes:
        if e.position is None:
            continue
        # lane segments that differ by round-off (a zero crossing found from two lines)
        # are one loading
        segs = tuple((round(a, 6), round(b, 6)) for a, b in e.lane_segments_ft)
        spac = tuple(e.position.spacings_ft)
        here = Run(e.model, e.vehicle_id, e.position.direction, spac)
        mid = float(here.middle_ft(np.array([e.position.front_axle_ft]))[0])
        for d in BOTH_DIRECTIONS:
            key = (e.model, d, spac, segs)
            lo, hi = mid - reach_ft, mid + reach_ft
            if key in out and out[key].window_ft is not None:
                lo, hi = min(lo, out[key].window_ft[0]), max(hi, out[key].window_ft[1])
            out[key] = Run(e.model, e.vehicle_id, d, spac, e.lane_klf, tuple(e.lane_segments_ft),
                           e.neglect_opposing_axles, (lo, hi))
    return list(out.values())


def run_key(r: Run | Extreme) -> tuple:
    """What makes the loading of a run, or of an extreme on one, apart from its station."""
    if isinstance(r, Run):
        return (r.model, r.direction, r.spacings_ft, r.lane_klf if r.lane_segments_ft else 0.0,
                r.lane_segments_ft)
    pos = r.position
    return (r.model, pos.direction if pos else None, tuple(pos.spacings_ft) if pos else (),
            r.lane_klf if r.lane_segments_ft else 0.0, tuple(r.lane_segments_ft))


class PositionSet:
    """The positions of one rating load at one IM: panel-point loads (n_stations, X) with
    gamma_LL = 1, IM on the axles and the lateral distribution factor applied; the runs
    first, each in order of station (forward before reverse: the order in which the
    envelope search keeps the first of equal extremes), then the loose positions given that
    no run has (in the order given)."""

    def __init__(self, stations_ft: Sequence[float], load: RatingLoad, im: float, df: float,
                 loose: Sequence[Extreme], runs: Sequence[Run],
                 loose_loads: np.ndarray | None = None) -> None:
        """``loose_loads``: the panel-point loads of ``loose`` (n_stations, len(loose)) when
        the caller has them (:attr:`p` of a set of the same loose positions and no runs)."""
        self.stations = np.asarray(stations_ft, dtype=float)
        self.load = load
        self.im = im
        self.df = df
        self.runs = list(runs)
        self._models = {mo.name: mo for mo in load.models}
        cols, run_of, fronts, intervals = [], [], [], []
        self._extremes: list[Extreme | None] = []
        on_runs: dict[tuple, set[float]] = {}
        for r, run in enumerate(self.runs):
            x = panel_point_fronts(self.stations, run.spacings_ft, run.direction)
            if run.window_ft is not None:
                mid = run.middle_ft(x)
                x = x[(mid >= run.window_ft[0] - 1e-9) & (mid <= run.window_ft[1] + 1e-9)]
            start = len(run_of)
            cols.append(self.run_loads(run, x))
            run_of.extend([r] * x.size)
            fronts.extend(x.tolist())
            self._extremes.extend([None] * x.size)
            intervals.extend((start + i, start + i + 1) for i in range(x.size - 1))
            on_runs[run_key(run)] = set(np.round(x, 6).tolist())
        # the loose positions a run does not have already (same loading)
        kept = [k for k, e in enumerate(loose)
                if not (e.position is not None and round(e.position.front_axle_ft, 6)
                        in on_runs.get(run_key(e), ()))]
        if kept:
            cols.append(loose_loads[:, kept] if loose_loads is not None
                        else self._loads_of([loose[k] for k in kept]))
        for k in kept:
            e = loose[k]
            run_of.append(-1)
            fronts.append(e.position.front_axle_ft if e.position is not None else np.nan)
            self._extremes.append(e)
        self.p = (np.concatenate(cols, axis=1) if cols else np.zeros((self.stations.size, 0)))
        self.run = np.array(run_of, dtype=int)
        self.front_ft = np.array(fronts, dtype=float)
        self.intervals = np.array(intervals, dtype=int).reshape(-1, 2)

    @property
    def size(self) -> int:
        return self.p.shape[1]

    def _loads_of(self, extremes: Sequence[Extreme]) -> np.ndarray:
        """Panel-point loads (n_stations, n) of the loadings that gave the ``extremes`` (all
        axles as they stand, IM on them, the lane on its segments); the axles of one model
        and spacing found together, each lane once."""
        out = np.zeros((self.stations.size, len(extremes)))
        by_vehicle: dict[tuple, list[int]] = {}
        lanes: dict[tuple, list[int]] = {}
        for k, e in enumerate(extremes):
            mo = self._models.get(e.model)
            if mo is None:
                continue
            if mo.axles is not None and e.position is not None:
                by_vehicle.setdefault((e.model, tuple(e.position.spacings_ft)), []).append(k)
            if e.lane_klf and e.lane_segments_ft:
                lanes.setdefault((tuple(e.lane_segments_ft), e.lane_klf), []).append(k)
        for (model, _), ks in by_vehicle.items():
            out[:, ks] += self._axle_loads(
                model, np.array([axle_stations(extremes[k].position) for k in ks]))
        for (segs, klf), ks in lanes.items():
            out[:, ks] += lane_panel_loads(self.stations, segs, klf)[:, None]
        return self.df * out

    def _axle_loads(self, model: str, axle_stations_ft: np.ndarray) -> np.ndarray:
        """Panel-point loads (n_stations, n) of the model's axles standing at the stations
        (n, n_axles), IM on them (no lateral distribution yet)."""
        v = self._models[model].axles
        return (1.0 + self.im) * axle_panel_loads(
            self.stations, axle_stations_ft, np.asarray(v.axle_loads_kip) * v.axle_scale)

    def run_loads(self, run: Run, fronts_ft: np.ndarray) -> np.ndarray:
        """Panel-point loads (n_stations, n) of ``run`` with its front axle at each station."""
        d = axle_offsets_ft(run.spacings_ft)
        sign = 1.0 if run.direction is Direction.FORWARD else -1.0
        p = self._axle_loads(run.model,
                             np.asarray(fronts_ft, dtype=float)[:, None] - sign * d[None, :])
        if run.lane_klf and run.lane_segments_ft:
            p += lane_panel_loads(self.stations, run.lane_segments_ft, run.lane_klf)[:, None]
        return self.df * p

    def extreme(self, j: int) -> Extreme:
        """The loading of position ``j`` as an extreme (for the results and the report)."""
        e = self._extremes[j]
        if e is None:
            e = self._extremes[j] = self.runs[self.run[j]].extreme(self.front_ft[j])
        return e

    def between(self, pairs: np.ndarray, t: np.ndarray) -> tuple[np.ndarray, list[Extreme]]:
        """Positions at fraction ``t`` of the way between the neighbouring positions
        ``pairs`` (n, 2) of a run (front station rounded to 1e-9 ft), distinct: their
        panel-point loads (n_stations, n') and extremes."""
        xa, xb = self.front_ft[pairs[:, 0]], self.front_ft[pairs[:, 1]]
        x = np.round(xa + t * (xb - xa), 9)
        key = np.stack([self.run[pairs[:, 0]].astype(float), x], axis=1)
        first = first_of_distinct_rows(key)
        pa, pb, x = pairs[first, 0], pairs[first, 1], x[first]
        # between the two the loads are linear in the station (every axle stays within its
        # stringer span), so they follow from the ends exactly
        tt = (x - self.front_ft[pa]) / (self.front_ft[pb] - self.front_ft[pa])
        p = self.p[:, pa] + tt * (self.p[:, pb] - self.p[:, pa])
        return p, [self.runs[self.run[a]].extreme(v) for a, v in zip(pa.tolist(), x.tolist(),
                                                                   strict=True)]


class PositionBatch:
    """The positions of several rating loads side by side: one column of panel-point loads
    per position, load after load (``offsets``), so that the load paths of all of them are
    found in one computation."""

    def __init__(self, sets: Sequence[PositionSet]) -> None:
        self.sets = list(sets)
        sizes = [ps.size for ps in self.sets]
        self.offsets = np.concatenate(([0], np.cumsum(sizes))).astype(int)
        n_st = self.sets[0].stations.size if self.sets else 0
        self.p = (np.concatenate([ps.p for ps in self.sets], axis=1) if self.sets
                  else np.zeros((n_st, 0)))
        self.group = np.repeat(np.arange(len(self.sets)), sizes)
        self.intervals = (np.concatenate([ps.intervals + off for ps, off in
                                          zip(self.sets, self.offsets, strict=False)])
                          if self.sets else np.zeros((0, 2), dtype=int))

    @property
    def size(self) -> int:
        return int(self.offsets[-1])

    def rows(self, g: int) -> slice:
        return slice(int(self.offsets[g]), int(self.offsets[g + 1]))

    def extreme(self, j: int) -> Extreme:
        g = int(self.group[j])
        return self.sets[g].extreme(j - int(self.offsets[g]))

    def between(self, pairs: np.ndarray, t: np.ndarray
                ) -> tuple[np.ndarray, list[Extreme], np.ndarray]:
        """:meth:`PositionSet.between` for neighbouring positions of any load: the new
        positions' panel-point loads (n_stations, n), extremes and loads (n,)."""
        cols, exts, groups = [], [], []
        grp = self.group[pairs[:, 0]] if pairs.size else np.zeros(0, dtype=int)
        for g in distinct_sorted(grp).tolist():
            sel = grp == g
            p, e = self.sets[g].between(pairs[sel] - self.offsets[g], t[sel])
            cols.append(p)
            exts.extend(e)
            groups.extend([g] * len(e))
        n_st = self.p.shape[0]
        p = np.concatenate(cols, axis=1) if cols else np.zeros((n_st, 0))
        return p, exts, np.array(groups, dtype=int)


@dataclass(frozen=True, eq=False)
class LoadPaths:
    """The positions of the rating loads (one :class:`PositionSet` each, at its IM) with
    their load paths under one set of factored dead loads, and the rating cases of each
    load."""

    cases: tuple[tuple, ...]
    positions: PositionBatch
    paths: PathStore
