"""Condition and system factors, the 0.85 floor on their product, owner overrides."""

from __future__ import annotations

import pytest

from rating.capacity.factors import (
    combined_factor,
    condition_factor,
    condition_from_rating,
    factor_tables,
    member_factors,
    system_factor,
    system_factor_row,
)
from rating.errors import InputError
from rating.model import (
    BuiltUpSection,
    EyebarSet,
    Finding,
    Material,
    MaterialKind,
    MemberDesign,
    PlatePart,
    RodSet,
)

STEEL = Material(MaterialKind.STEEL, 26.0, 52.0)
BARS = EyebarSet(2, 6.0, 1.0, 15.0, 5.03)


def test_condition_factor_table():
    # MBE Table 6A.4.2.3-1 [value from memory]: good/satisfactory 1.00, fair 0.95, poor 0.85
    assert condition_factor("good") == 1.00
    assert condition_factor("satisfactory") == 1.00
    assert condition_factor("fair") == 0.95
    assert condition_factor("poor") == 0.85
    with pytest.raises(InputError):
        condition_factor("splendid")


@pytest.mark.parametrize("rating, cond", [(9, "good or satisfactory"),
                                          (6, "good or satisfactory"), (5, "fair"),
                                          (4, "poor"), (0, "poor")])
def test_rating_mapping(rating, cond):
    # NBI 0-9 mapping: >= 6 good/satisfactory, 5 fair, <= 4 poor [common practice]
    assert condition_from_rating(rating) == cond


def test_bad_rating_names_cell():
    with pytest.raises(InputError) as ei:
        condition_from_rating(12, "Findings!H9")
    assert ei.value.where == "Findings!H9"


def test_system_factor_table_and_mapping():
    # MBE Table 6A.4.2.4-1 [value from memory] (domain.md section 4)
    v = factor_tables()["system_factor"]["values"]
    assert v["welded member in two-girder, truss or arch bridge"] == 0.85
    assert v["riveted member in two-girder, truss or arch bridge"] == 0.90
    assert v["multiple eyebar member in truss bridge"] == 0.90
    assert v["floorbeam spaced more than 12 ft, non-continuous stringers"] == 0.85
    assert v["redundant stringer subsystem between floorbeams"] == 1.00
    assert system_factor(system_factor_row(BARS, 2)) == 0.90
    assert system_factor(system_factor_row(BARS, 1)) == 0.85  # one bar left: non-redundant
    assert system_factor(system_factor_row(RodSet(1, 1.0), 1)) == 0.85
    assert system_factor(system_factor_row(BuiltUpSection((PlatePart("p", 1, 1),)), 1)) == 0.90


def test_product_floor():
    # Khan 2010, p. 187 [V]: phi_c phi_s >= 0.85
    assert combined_factor(0.85, 0.85) == 0.85
    assert combined_factor(1.0, 0.9) == pytest.approx(0.9)


def test_member_condition_from_lowest_rating_and_override():
    fs = (Finding("M", condition_rating=7), Finding("M", condition_rating=4, where="F!H3"),
          Finding("M", condition_rating=5))
    f = member_factors(MemberDesign("M", BARS, STEEL), fs, 2)
    assert f.condition_rating == 4 and f.phi_c == 0.85 and f.phi_s == 0.90
    assert f.phi_cs == pytest.approx(0.85) and f.floor_applied  # 0.765 raised to 0.85
    assert any("F!H3" in a for a in f.assumptions)
    o = member_factors(MemberDesign("M", BARS, STEEL, condition_factor=0.9, system_factor=1.0),
                       fs, 2)
    assert (o.phi_c, o.phi_s) == (0.9, 1.0)
    none = member_factors(MemberDesign("M", BARS, STEEL), (), 2)
    assert none.phi_c == 1.0 and any("no condition rating" in a for a in none.assumptions)
    low = member_factors(MemberDesign("M", BARS, STEEL), (Finding("M", condition_rating=2),), 2)
    assert any("serious or worse" in w for w in low.warnings)
    # NBI 3 or worse calls for a decision beyond the RF: headed in capitals for the reviewer
    from rating.results import bears_on_the_decision

    assert any(w.startswith("SERIOUS CONDITION: member M:") and bears_on_the_decision(w)
               for w in low.warnings)


def test_bad_owner_factor():
    with pytest.raises(InputError) as ei:
        member_factors(MemberDesign("M", BARS, STEEL, system_factor=1.3, where="Members!K4"),
                       (), 2)
    assert ei.value.where == "Members!K4" and "member M" in str(ei.value)


def test_a_bar_or_rod_says_why_it_takes_its_system_factor_row():
    """A single rod or bar takes the table's least factor (its row is the welded members'),
    two or more rods the multiple-eyebar row (our mapping, common practice): the assumption
    says why, so a reviewer does not read "welded member" as a mistake."""
    one = member_factors(MemberDesign("C", RodSet(1, 1.25), STEEL), (), 1)
    said = next(a for a in one.assumptions if "system factor" in a)
    assert "phi_s = 0.85 (welded member" in said and "a single rod" in said
    two = member_factors(MemberDesign("H", RodSet(2, 1.25), STEEL), (), 2)
    said = next(a for a in two.assumptions if "system factor" in a)
    assert "multiple eyebar member in truss bridge: two or more rods share" in said
    built = member_factors(MemberDesign("P", BuiltUpSection((PlatePart("p", 1, 1),)), STEEL),
                           (), 1)
    said = next(a for a in built.assumptions if "system factor" in a)
    assert "(riveted member in two-girder, truss or arch bridge; MBE" in said
