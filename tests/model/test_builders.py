"""Geometry builders: labels, counts and arrangement of each form.

Determinacy count m + r = 2j for a simple truss (statics, common practice); the
double-intersection form is indeterminate by design.
"""

from __future__ import annotations

import pytest

from rating.errors import GeometryError
from rating.model import MemberRole
from rating.model.builders import build_truss


@pytest.mark.parametrize("form, n, h, degree", [
    ("pratt", 8, 24.0, 0),
    ("parker", 10, [18, 22, 25, 27, 28, 27, 25, 22, 18], 0),
    ("pennsylvania", 14, 30.0, 0),
    ("baltimore", 10, 30.0, 0),
    ("warren", 6, 14.0, 0),
    ("warren with verticals", 8, 16.0, 0),
    ("double intersection", 10, 24.0, 2),
])
def test_counts(form, n, h, degree):
    g = build_truss(form, n, 20.0, h)
    assert len(g.members) + 3 - 2 * len(g.joints) == degree
    assert g.deck_joints[0] == "L0" and g.deck_joints[-1] == f"L{n}"
    assert g.span_ft == pytest.approx(20.0 * n)


def test_pratt_labels_roles_and_counters():
    g = build_truss("pratt", 8, 20.0, 24.0, counter_panels=(4, 5))
    assert g.member("L0U1").role is MemberRole.END_POST
    assert g.member("L1U1").role is MemberRole.HANGER
    assert g.member("L2U2").role is MemberRole.VERTICAL
    assert g.member("U1L2").role is MemberRole.DIAGONAL
    assert g.member("L3U4").role is MemberRole.COUNTER and g.member("L3U4").tension_only
    assert g.member("U3L4").tension_only  # the main it crosses is an adjustable eyebar
    assert not g.member("U1L2").tension_only


def test_parker_heights_per_panel_point():
    h = [18, 22, 25, 27, 28, 27, 25, 22, 18]
    g = build_truss("parker", 10, 20.0, h)
    assert [g.joint(f"U{i}").y_ft for i in range(1, 10)] == h


def test_pony_and_deck():
    pony = build_truss("warren with verticals", 6, 15.0, 8.0, deck_position="pony")
    assert pony.deck_position.value == "pony" and pony.deck_joints[0] == "L0"
    deck = build_truss("pratt", 6, 20.0, 18.0, deck_position="deck")
    assert deck.deck_joints == tuple(f"U{i}" for i in range(7))
    assert deck.member("L0U0").role is MemberRole.END_POST


@pytest.mark.parametrize("kwargs, needle", [
    (dict(form="howe"), "unknown truss form"),
    (dict(panel_count=1), "at least 2 panels"),
    (dict(panel_length_ft=0.0), "panel length"),
    (dict(heights_ft=[20.0, 21.0]), "heights"),
    (dict(heights_ft=-3.0), "positive"),
    (dict(counter_panels=(9,)), "counter panel 9"),
    (dict(form="baltimore", panel_count=8), "6, 10, 14"),
])
def test_bad_builder_input(kwargs, needle):
    args = dict(form="pratt", panel_count=8, panel_length_ft=20.0, heights_ft=24.0)
    args.update(kwargs)
    with pytest.raises(GeometryError, match=needle):
        build_truss(**args)
