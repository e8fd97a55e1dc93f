"""What rating.results_build relies on to convert each wording once: an SI bridge's
"member X: words" lines convert as their two parts (no quantity reaches across ": "); an SI
bridge's posting in whole tonnes."""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge
from rating.lrfr.posting import posting
from rating.results_build import build_results
from rating.units import TON_PER_TONNE, si_text

PONY_SI = Path(__file__).resolve().parents[1] / "sample_inventory" / "tc0903_pony_1903_si.xlsx"

# pieces that make quantities (and near misses) in the wording of warnings and assumptions
PIECES = st.sampled_from([
    "2.24803 in", "26 ksi", "-3.5 kip", "12 ft", "0.5 in2", "1/32 in", "'3 in'", "in", "ft",
    "tons", "10 tons", "kip-in", "1e-3 in", "-", ":", ": ", " ", "x", "(", ")", "2", "L2U3",
    "12in", "phi_c = 0.95", "B5", "5 ", "in:", "ft: ", "3:", "^2", "²",
])
WORDS = st.lists(PIECES, max_size=12).map("".join)


@settings(max_examples=400, deadline=None)
@given(label=WORDS, words=WORDS)
def test_member_line_converts_as_its_two_parts(label: str, words: str) -> None:
    line = f"member {label}: {words}"
    head, sep, rest = line.partition(": ")  # as build_results splits it
    assert si_text(line) == si_text(head + sep) + si_text(rest)


@pytest.fixture(scope="module")
def pony_rating():
    return rate_bridge(read_workbook(PONY_SI).bridge)


def test_si_posting_under_one_tonne_is_a_closure(pony_rating):
    """Type 3, W = 25 tons = 22.68 t, RF 0.33: (25 / 0.7)(0.03) = 1.07 -> 1 ton, but
    (22.68 / 0.7)(0.03) = 0.97 -> 0 tonnes (MBE 6A.8.3, equation as in Khan 2010 p. 187).
    An SI report rounds down once, in tonnes, and a posting of zero is a closure; the
    bridge-level recommendation says so rather than "post for 0 tonnes"."""
    cp = pony_rating.postings["TYPE-3"]
    edge = replace(cp, rf=0.33, result=posting(0.33, 25.0))
    assert edge.result.posting_tons == 1.0  # in tons
    rating = replace(pony_rating, postings={**pony_rating.postings, "TYPE-3": edge})
    res = build_results(rating)
    entry = res.posting["TYPE-3"]
    assert entry.action == "close" and entry.posting_tons is None
    assert "less than one tonne" in entry.note
    assert res.recommendation.startswith("Consider closing the bridge")
    assert "rounds down to zero for AASHTO legal load Type 3 (RF 0.33" in res.recommendation


def test_si_posting_in_whole_tonnes_rounded_once(pony_rating):
    """Every posted load of the SI sample is (W_t / 0.7)(RF - 0.3) rounded down once, W in
    tonnes, RF as printed (not tons rounded down, converted and rounded again)."""
    res = build_results(pony_rating)
    posted = 0
    for case in pony_rating.cases:
        entry = res.posting[case.id]
        if entry.action != "post":
            continue
        posted += 1
        printed = math.floor(entry.rf * 100.0 + 1e-7) / 100.0
        tonnes = case.load.gross_weight_tons / TON_PER_TONNE
        assert entry.posting_tons / TON_PER_TONNE == pytest.approx(
            math.floor(tonnes / 0.7 * (printed - 0.3) + 1e-6)), case.id
    assert posted


def test_notes_of_members_and_of_pins_fold_by_their_text() -> None:
    from rating.results_build import group_member_notes

    lines = ["member A: rusty", "pin at joint L1: shared", "member B: rusty",
             "pin at joint L2: shared", "pin at joint L3: other", "plain note",
             "members C, D: already grouped"]
    assert group_member_notes(lines) == (
        "members A, B: rusty", "pins at joints L1, L2: shared", "pin at joint L3: other",
        "plain note", "members C, D: already grouped")
