"""Benchmark (not a test): exact moving-load envelopes against FE stepping.

A 12-panel Pratt through truss (panels 22 ft 3 in, 26 ft deep) with counters in every
interior panel (all bars taken as active, so the truss is internally indeterminate), the full
rating-vehicle library, both directions.

1. Times pintruss: influence lines (one factorization, all unit loads at once) plus the exact
   envelopes of every rating load (`rating.analysis.moving.envelope`, lanes, HL-93 models,
   neglected opposing axles as the library says) and, for a like-for-like comparison, the
   axle-only extremes of every vehicle with all axles counted (`axle_extremes`).
2. Times the way a general frame program finds the same axle envelopes: the truss built in
   anaStruct from the same joints and members, the vehicle stepped 0.5 ft at a time over the
   bridge in both directions, the axles turned into panel-point loads through simple-span
   stringers, one full FE solve per position. The HL-93 rear spacing is stepped at 14, 22 and
   30 ft (the exact search covers 14 to 30 ft). Prints the speed ratio and the largest
   difference of the extremes (the exact search must never be lower).
3. Scaling table for 6, 12, 24 and 48 panels: our time, and the FE stepping time extrapolated
   from a timed sample of solves at that size (measured in full at 12 panels).

Run:  python bench/moving_load.py            (full library in anaStruct, a few minutes)
      python bench/moving_load.py --subset   (HL-93 truck, Type 3S2, NRL in anaStruct;
                                              the full-library FE time is extrapolated)
"""

from __future__ import annotations

import argparse
import os
import platform
import time

import numpy as np

from rating.analysis.loading import axle_joint_loads
from rating.analysis.moving import axle_extremes, envelope
from rating.analysis.truss import influence_lines
from rating.model import AxleSpacing, SupportKind, TrussGeometry, Vehicle
from rating.model.builders import build_truss
from rating.vehicles import library, rating_loads

STEP_FT = 0.5
PANEL_FT = 22.25  # 22 ft 3 in, a period panel length that a 0.5 ft step does not divide
HEIGHT_FT = 26.0
TRUCK_SPACINGS_FT = (14.0, 22.0, 30.0)


def pratt(n: int) -> TrussGeometry:
    return build_truss("pratt", n, PANEL_FT, HEIGHT_FT, counter_panels=tuple(range(2, n)))


def axle_vehicles() -> list[Vehicle]:
    return [v for v in library() if v.axle_count > 0]


def fixed_variants(v: Vehicle) -> list[Vehicle]:
    """The vehicle as a frame-program user would run it: variable spacing at a few values."""
    var = [i for i, s in enumerate(v.spacings) if s.is_variable]
    if not var:
        return [v]
    out = []
    for value in TRUCK_SPACINGS_FT:
        gaps = list(v.spacings)
        gaps[var[0]] = AxleSpacing(value, value)
        out.append(Vehicle(f"{v.id}@{value:g}", v.name, v.category, v.axle_loads_kip,
                           tuple(gaps), v.gross_weight_tons, axle_scale=v.axle_scale))
    return out


# --------------------------------------------------------------------------- ours


def time_ours(g: TrussGeometry, repeat: int) -> dict[str, float]:
    vehicles = axle_vehicles()
    loads = rating_loads()
    t_il, t_env, t_axle = [], [], []
    for _ in range(repeat):
        t0 = time.perf_counter()
        lines = influence_lines(g)
        t1 = time.perf_counter()
        for r in loads:
            envelope(lines, r)
        t2 = time.perf_counter()
        for v in vehicles:
            axle_extremes(lines, v)
        t3 = time.perf_counter()
        t_il.append(t1 - t0)
        t_env.append(t2 - t1)
        t_axle.append(t3 - t2)
    return {"lines": min(t_il), "envelopes": min(t_env), "axle": min(t_axle)}


# --------------------------------------------------------------------------- anaStruct


class FrameModel:
    """The truss in anaStruct, built once; each position is a full FE solve."""

    def __init__(self, g: TrussGeometry) -> None:
        from anastruct import SystemElements

        self.g = g
        ss = SystemElements()
        for m in g.members:
            a, b = g.joint(m.start), g.joint(m.end)
            ss.add_truss_element([[a.x_ft, a.y_ft], [b.x_ft, b.y_ft]], EA=m.area_in2 * 29000.0)
        node = {j.label: ss.find_node_id([j.x_ft, j.y_ft]) for j in g.joints}
        for s in g.supports:
            if s.kind is SupportKind.PIN:
                ss.add_support_hinged(node[s.joint])
            else:
                ss.add_support_roll(node[s.joint], direction="x")
        self.ss = ss
        self.node = [node[j.label] for j in g.joints]
        self.n_members = len(g.members)
        # a vertical load on a bearing goes straight into it (and anaStruct mishandles loads
        # on restrained nodes in later solves), so those are left out
        self.free = np.array([j.label not in {s.joint for s in g.supports} for j in g.joints])

    def solve(self, joint_loads: np.ndarray) -> np.ndarray:
        ss = self.ss
        ss.remove_loads()
        loaded = False
        for nid, free, (fx, fy) in zip(self.node, self.free, joint_loads, strict=True):
            if free and (fx or fy):
                ss.point_load(nid, Fx=float(fx), Fy=float(fy))
                loaded = True
        if not loaded:
            return np.zeros(self.n_members)
        ss.solve()
        return np.array([ss.get_element_results(i + 1)["Nmax"] for i in range(self.n_members)])


def positions(g: TrussGeometry, length_ft: float) -> list[tuple[float, int]]:
    s0, s1 = g.deck_stations_ft[0], g.deck_stations_ft[-1]
    fwd = np.arange(s0, s1 + length_ft + 1e-9, STEP_FT)
    rev = np.arange(s1, s0 - length_ft - 1e-9, -STEP_FT)
    return [(float(x), 1) for x in fwd] + [(float(x), -1) for x in rev]


def fe_stepping(model: FrameModel, v: Vehicle, limit: int | None = None
                ) -> tuple[np.ndarray, np.ndarray, int, float]:
    d = np.concatenate(([0.0], np.cumsum([s.min_ft for s in v.spacings])))
    P = np.asarray(v.axle_loads_kip) * v.axle_scale
    pos = positions(model.g, float(d[-1]))
    if limit is not None:
        pos = pos[:: max(1, len(pos) // limit)][:limit]
    mx = np.zeros(model.n_members)
    mn = np.zeros(model.n_members)
    t0 = time.perf_counter()
    for x, sign in pos:
        N = model.solve(axle_joint_loads(model.g, x - sign * d, P))
        mx = np.maximum(mx, N)
        mn = np.minimum(mn, N)
    return mx, mn, len(pos), time.perf_counter() - t0


def n_positions(g: TrussGeometry, v: Vehicle) -> int:
    return len(positions(g, sum(s.min_ft for s in v.spacings)))


# --------------------------------------------------------------------------- main


def machine() -> str:
    cpu = "unknown CPU"
    try:
        with open("/proc/cpuinfo") as f:
            for line in f:
                if line.startswith("model name"):
                    cpu = line.split(":", 1)[1].strip()
                    break
    except OSError:
        pass
    return f"{cpu}; nproc {os.cpu_count()}; Python {platform.python_version()}; " \
           f"numpy {np.__version__}"


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--subset", action="store_true",
                    help="run anaStruct for a representative subset and extrapolate")
    ap.add_argument("--repeat", type=int, default=5, help="repeats of our timing (best taken)")
    args = ap.parse_args()
    print(f"machine: {machine()}")

    g = pratt(12)
    ours = time_ours(g, args.repeat)
    lines = influence_lines(g)
    fe_vehicles = [w for v in axle_vehicles() for w in fixed_variants(v)]
    print(f"\n12-panel Pratt, {len(g.members)} members, {len(g.deck_joints)} deck panel points, "
          f"{len(axle_vehicles())} axle vehicles, {len(rating_loads())} rating loads")
    print(f"ours: influence lines {ours['lines'] * 1e3:.2f} ms; all rating-load envelopes "
          f"(lanes, HL-93 models) {ours['envelopes'] * 1e3:.2f} ms; axle-only extremes of every "
          f"vehicle {ours['axle'] * 1e3:.2f} ms")

    model = FrameModel(g)
    subset_ids = {"HL93-TRUCK@14", "TYPE-3S2", "NRL"}
    run = [v for v in fe_vehicles if not args.subset or v.id in subset_ids]
    fe_time = 0.0
    fe_solves = 0
    exact = {v.id: axle_extremes(lines, v) for v in axle_vehicles()}
    fe_env: dict[str, tuple[np.ndarray, np.ndarray]] = {}
    for w in run:
        base = w.id.split("@")[0]
        mx, mn, n, t = fe_stepping(model, w)
        fe_time += t
        fe_solves += n
        if base in fe_env:  # envelope over the spacings tried
            mx, mn = np.maximum(mx, fe_env[base][0]), np.minimum(mn, fe_env[base][1])
        fe_env[base] = (mx, mn)
        print(f"  FE stepping {w.id:14s} {n:5d} solves {t:7.2f} s")
    worst_low = 0.0  # largest amount by which FE stepping exceeds ours (must be round-off)
    worst_high = 0.0  # largest amount by which ours exceeds FE stepping
    where_high = ""
    for base, (mx, mn) in fe_env.items():
        ex = exact[base].value_kip
        low = max(float((mx - ex[0]).max()), float((ex[1] - mn).max()))
        gap = np.maximum(ex[0] - mx, mn - ex[1])
        worst_low = max(worst_low, low)
        print(f"  {base:12s} ours - FE stepping: largest {float(gap.max()):8.4f} kip; "
              f"FE above ours by at most {low:.2e} kip")
        if float(gap.max()) > worst_high:
            k = int(np.argmax(gap))
            worst_high, where_high = float(gap.max()), f"{base}, member {lines.member_labels[k]}"
    per_solve = fe_time / fe_solves
    total_solves = sum(n_positions(g, w) for w in fe_vehicles)
    fe_full = per_solve * total_solves
    note = "measured" if not args.subset else (
        f"extrapolated from {fe_solves} timed solves ({per_solve * 1e3:.2f} ms each) to "
        f"{total_solves}")
    ratio_axle = fe_full / (ours["lines"] + ours["axle"])
    ratio_env = fe_full / (ours["lines"] + ours["envelopes"])
    print(f"\nFE stepping, full library ({total_solves} solves): {fe_full:.1f} s ({note})")
    print(f"speed ratio, same axle envelopes (incl. influence lines): {ratio_axle:,.0f}x")
    print(f"speed ratio against all rating-load envelopes incl. lanes: {ratio_env:,.0f}x")
    print(f"largest difference of extremes, ours - FE: {worst_high:.4f} kip "
          f"({where_high or 'none'}); FE above ours by at most {worst_low:.2e} kip "
          "(solver round-off)")

    print("\nscaling (ours: influence lines + all envelopes + axle extremes; FE: sampled)")
    print("panels  members  points  ours ms  ours ns per member*point*axle  FE s (extrap.)"
          "  ratio")
    n_axles = sum(v.axle_count for v in axle_vehicles())
    for n in (6, 12, 24, 48):
        gn = pratt(n)
        t = time_ours(gn, args.repeat)
        t_ours = t["lines"] + t["envelopes"] + t["axle"]
        m = len(gn.members)
        pts = len(gn.deck_joints)
        fm = FrameModel(gn)
        sample = 100
        _, _, k, ts = fe_stepping(fm, fe_vehicles[0], limit=sample)
        fe_n = sum(n_positions(gn, w) for w in fe_vehicles) * ts / k
        print(f"{n:6d}  {m:7d}  {pts:6d}  {t_ours * 1e3:7.1f}  "
              f"{t_ours / (m * pts * n_axles) * 1e9:29.1f}  {fe_n:14.1f}  "
              f"{fe_n / t_ours:,.0f}x")


if __name__ == "__main__":
    main()
