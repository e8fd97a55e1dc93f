"""The searches over every vehicle position work a block of positions at a time on a large
truss (rating.arrays.blocks): the blocks must not change a rating. Here the samples are
rated with blocks so small that every search is split into many, against the usual run,
where none is (the positions are independent of each other within each search)."""

from __future__ import annotations

from pathlib import Path

import pytest

import rating.arrays as arrays_module
from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge

SAMPLES = Path(__file__).resolve().parents[2] / "sample_inventory"


def _ratings(rated) -> dict[tuple[str, str, str], float]:
    out = {("member", m, c): r.rf for (m, c), r in rated.ratings.items()}
    out.update({("pin", p.joint, c): r.rf for p in rated.pins for c, r in p.ratings.items()})
    return out


@pytest.mark.parametrize("book", ["tc0417_pratt_1898.xlsx", "tc0622_parker_1907.xlsx"])
def test_small_blocks_change_no_rating(book, monkeypatch):
    bridge = read_workbook(SAMPLES / book).bridge
    usual = _ratings(rate_bridge(bridge, what_if=False))
    calls = []
    real = arrays_module.blocks

    def counted(*args, **kwargs):
        out = real(*args, **kwargs)
        calls.append(len(out))
        return out

    monkeypatch.setattr(arrays_module, "BLOCK_ELEMENTS", 30_000)
    for module in ("rating.lrfr.pins", "rating.lrfr.multiplier"):
        monkeypatch.setattr(f"{module}.blocks", counted)
    small = _ratings(rate_bridge(bridge, what_if=False))
    assert max(calls) > 5  # (the searches were split)
    assert small.keys() == usual.keys()
    for key, rf in usual.items():
        assert small[key] == pytest.approx(rf, rel=1e-12, abs=1e-12), key
