"""The stretch of deck searched for loads with a lane part or a variable spacing on the load
path (rating.lrfr.engine.LANE_RUN_REACH_PANELS) is a screen of judgement, not a proven bound:
on the bundled samples the whole deck gives the same ratings (common practice: a screen is
checked against a wider one on the cases at hand)."""

from __future__ import annotations

from pathlib import Path

import pytest

import rating.lrfr.engine as engine_module
from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge

SAMPLES = Path(__file__).resolve().parents[2] / "sample_inventory"
LANE_LOADS = ["HL-93", "LEGAL-LANE"]


def rfs(rated) -> dict[tuple[str, str], float]:
    members = {key: r.rf for key, r in rated.ratings.items()}
    pins = {(p.joint, cid): r.rf for p in rated.pins for cid, r in p.ratings.items()}
    return members | pins


@pytest.mark.parametrize("book", ["tc0903_pony_1903_si.xlsx", "tc0417_pratt_1898.xlsx"])
def test_the_whole_deck_gives_the_same_ratings_of_lane_loads(book, monkeypatch):
    bridge = read_workbook(SAMPLES / book).bridge
    usual = rate_bridge(bridge, LANE_LOADS)
    assert usual.dependent_members, "the sample must have members rated on the load path"
    monkeypatch.setattr(engine_module, "LANE_RUN_REACH_PANELS", 1000.0)
    whole = rfs(rate_bridge(bridge, LANE_LOADS))
    assert whole.keys() == rfs(usual).keys()
    for key, rf in rfs(usual).items():
        assert whole[key] == pytest.approx(rf, rel=1e-12), key
