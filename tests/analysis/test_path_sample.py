"""Regression on the bundled Pratt sample (invented data): where a main falls to zero under a
moving Type 3, the counter must take over at once, and the member multiplier must agree with an
independent brute-force analysis that steps the load and re-solves from scratch."""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from rating.analysis.path import load_path, member_load_multiplier
from rating.analysis.truss import TrussFamily, solve_tension_only
from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge
from rating.lrfr.liveload import live_joint_loads

SAMPLE = Path(__file__).resolve().parents[2] / "sample_inventory" / "tc0417_pratt_1898.xlsx"


@pytest.fixture(scope="module")
def case():
    bridge = read_workbook(SAMPLE).bridge
    r = rate_bridge(bridge, ["TYPE-3"])
    rating = r.ratings[("L3L4", "TYPE-3")]
    c = r.cases[0]
    P_dead = (rating.gamma_dc * r.dead.joint_loads_dc_kip
              + rating.gamma_dw * r.dead.joint_loads_dw_kip)
    P_live = live_joint_loads(r.geometry, c.load, rating.extreme, c.im.value,
                              r.distribution_factor, c.gamma_ll.value)
    return r, rating, P_dead, P_live


def test_counter_takes_over_when_the_main_reaches_zero(case):
    r, _, P_dead, P_live = case
    g = r.geometry
    fam = TrussFamily(g)
    segs = list(load_path(fam, P_dead, P_live, lam_max=10.0))
    t_only = np.array([m.tension_only for m in g.members])
    for seg in segs:
        mid = 0.5 * (seg.lam_start + seg.lam_end)
        N = seg.forces(mid)
        active = np.array([m.label not in seg.slack for m in g.members])
        assert np.all(N[t_only & active] >= -1e-6 * np.abs(N).max()), (seg.lam_start, seg.slack)
    first = segs[0]
    past = first.lam_end * (1 + 1e-3)
    state = solve_tension_only(g, P_dead + past * P_live)
    assert not state.forced_compression


def test_multiplier_against_brute_force_stepping(case):
    r, rating, P_dead, P_live = case
    g = r.geometry
    C = r.capacities["L3L4"].factored_resistance("tension")
    i = g.member_index["L3L4"]
    lam, _ = member_load_multiplier(TrussFamily(g), "L3L4", 1, C, P_dead, P_live)
    assert lam == pytest.approx(rating.rf, rel=1e-9)
    step = 0.005
    lam_bf = next(x for x in np.arange(0.0, 10.0, step)
                  if solve_tension_only(g, P_dead + x * P_live).solution.member_forces_kip[i]
                  >= C)
    assert lam_bf - step - 1e-9 <= lam <= lam_bf + 1e-9
