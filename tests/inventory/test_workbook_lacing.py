"""Findings on a built-up member's lacing or battens: read, rated, and refused where the
member has none. Invented test data (the small bridge of inventory_helpers)."""

from __future__ import annotations

from pathlib import Path

from inventory_helpers import cell, check, find, fresh

from rating.lrfr.engine import rate_bridge
from rating.model import BarState


def _with(*rows: dict) -> dict:
    d = fresh()
    d["tables"]["Findings"] = list(rows)
    return d


def test_lacing_findings_are_read_under_one_name(tmp_path: Path) -> None:
    # U1U2 is laced (section TC), L0U1 battened (section EP)
    r = check(tmp_path, _with(
        {"member": "U1U2", "component": "Lacing bars", "bar_state": "missing", "station": 6.0},
        {"member": "U2U3", "component": "lacing", "loss": 30.0, "remaining": 0.2},
        {"member": "L0U1", "component": "Batten plates", "bar_state": "bent"}))
    assert r.errors == ()
    got = [(f.member, f.component, f.bar_state) for f in r.bridge.findings]
    assert got == [("U1U2", "lacing", BarState.MISSING), ("U2U3", "lacing", BarState.SOUND),
                   ("L0U1", "battens", BarState.BENT)]


def test_connectors_a_member_does_not_have_are_refused_at_their_cell(tmp_path: Path) -> None:
    r = check(tmp_path, _with(
        {"member": "L0U1", "component": "lacing", "bar_state": "missing"},
        {"member": "U1U2", "component": "battens", "bar_state": "loose"},
        {"member": "L1L2", "component": "lacing", "bar_state": "loose"}))
    find(r, cell("Findings", 0, "component"),
         "member L0U1 has no lacing (its parts are joined by batten on the BuiltUp sheet)")
    find(r, cell("Findings", 1, "component"),
         "member U1U2 has no battens (its parts are joined by lacing on the BuiltUp sheet)")
    find(r, cell("Findings", 2, "component"), "component 'lacing' of member L1L2 is not "
         "understood")
    # a part name that is not there lists the lacing as a component it could name
    r = check(tmp_path, _with({"member": "U1U2", "component": "flange", "loss": 10.0}),
              name="w2.xlsx")
    find(r, cell("Findings", 0, "component"), "(or 'all', or 'lacing')")


def test_missing_lacing_rates_the_chord_as_open(tmp_path: Path) -> None:
    """End to end: a lacing bar recorded missing on a laced chord doubles the connector
    spacing in its modified slenderness (this chord's two halves, a web plate with its angles
    each, are joined by the lacing alone: doubly symmetric, no torsional check to open)."""
    sound = check(tmp_path, _with(), name="sound.xlsx").bridge
    out = check(tmp_path, _with({"member": "U1U2", "component": "lacing",
                                 "bar_state": "missing"}), name="out.xlsx").bridge
    a = rate_bridge(sound, ["OWN-1"], what_if=False).capacities["U1U2"]
    b = rate_bridge(out, ["OWN-1"], what_if=False).capacities["U1U2"]
    comp_a = next(c for c in a.checks if c.name.startswith("compression: f"))
    comp_b = next(c for c in b.checks if c.name.startswith("compression: f"))
    assert comp_b.R_n_kip < comp_a.R_n_kip
    assert any("twice the connector spacing" in w and "missing" in w for w in b.warnings)
    assert any("a = 28 in" in x for x in b.assumptions)  # 2 x 14 in
    assert any("a = 14 in" in x for x in a.assumptions)
    assert not any("the rating takes the lacing as closing" in w for w in b.warnings)


def test_a_loss_on_the_lacing_alone_is_said_not_to_be_rated(tmp_path: Path) -> None:
    sound = check(tmp_path, _with(), name="sound.xlsx").bridge
    lossy = check(tmp_path, _with({"member": "U1U2", "component": "lacing", "loss": 40.0}),
                  name="lossy.xlsx").bridge
    a = rate_bridge(sound, ["OWN-1"], what_if=False).capacities["U1U2"]
    b = rate_bridge(lossy, ["OWN-1"], what_if=False).capacities["U1U2"]
    assert [c.R_n_kip for c in a.checks] == [c.R_n_kip for c in b.checks]
    assert any("the loss recorded on its lacing" in x and "is not rated" in x
               for x in b.assumptions)
