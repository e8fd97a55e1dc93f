"""The shipped vehicle library against the values and sources listed in the domain primer."""

from __future__ import annotations

import pytest

from rating.errors import InputError
from rating.model import VehicleCategory
from rating.vehicles import library, owner_vehicle, rating_load, rating_loads, vehicle

MEMORY = "value from memory"

# (id, axle loads kip, spacings ft (min, max), gross tons, tag). Values and tags copied from
# the domain primer: HL-93 [V AASHTO LRFD 3.6.1.2.2-3.6.1.2.4]; legal loads, SHVs, NRL and EVs
# [M, value from memory]; EV3 86,000 lb limit [V Kentucky Transportation Cabinet, Know Your
# Limits].
EXPECTED = [
    ("HL93-TRUCK", (8, 32, 32), ((14, 14), (14, 30)), 36.0, "read in"),
    ("HL93-TANDEM", (25, 25), ((4, 4),), 25.0, "read in"),
    ("TYPE-3", (16, 17, 17), ((15, 15), (4, 4)), 25.0, MEMORY),
    ("TYPE-3S2", (10, 15.5, 15.5, 15.5, 15.5), ((11, 11), (4, 4), (22, 22), (4, 4)), 36.0,
     MEMORY),
    ("TYPE-3-3", (12, 12, 12, 16, 14, 14), ((15, 15), (4, 4), (15, 15), (16, 16), (4, 4)),
     40.0, MEMORY),
    ("SU4", (12, 8, 17, 17), ((10, 10), (4, 4), (4, 4)), 27.0, MEMORY),
    ("SU5", (12, 8, 8, 17, 17), ((10, 10),) + ((4, 4),) * 3, 31.0, MEMORY),
    ("SU6", (11.5, 8, 8, 17, 17, 8), ((10, 10),) + ((4, 4),) * 4, 34.75, MEMORY),
    ("SU7", (11.5, 8, 8, 17, 17, 8, 8), ((10, 10),) + ((4, 4),) * 5, 38.75, MEMORY),
    ("NRL", (6, 8, 8, 17, 17, 8, 8, 8), ((6, 6),) + ((4, 4),) * 6, 40.0, MEMORY),
    ("EV2", (24, 33.5), ((15, 15),), 28.75, MEMORY),
    ("EV3", (24, 31, 31), ((15, 15), (4, 4)), 43.0, MEMORY),
]


@pytest.mark.parametrize("vid, loads, gaps, tons, tag", EXPECTED)
def test_vehicle_data(vid, loads, gaps, tons, tag):
    v = vehicle(vid)
    assert v.axle_loads_kip == pytest.approx(loads)
    assert tuple((g.min_ft, g.max_ft) for g in v.spacings) == gaps
    assert v.gross_weight_tons == pytest.approx(tons)
    assert v.gross_weight_tons == pytest.approx(sum(loads) / 2.0)  # 2 kip per short ton
    assert tag in v.tag
    assert v.source


def test_ev3_is_the_86_kip_emergency_limit():
    # 86,000 lb emergency-vehicle limit [V Kentucky Transportation Cabinet, Know Your Limits].
    assert sum(vehicle("EV3").axle_loads_kip) == pytest.approx(86.0)


def test_hl93_and_lane_type_legal_load():
    # HL-93: truck + lane or tandem + lane [M AASHTO LRFD 3.6.1.3.1]; lane 0.64 klf [V LRFD
    # 3.6.1.2.4]. Lane-type legal load: 0.75 x Type 3-3 + 0.2 klf, spans over 200 ft [M].
    hl = rating_load("hl-93")
    assert [m.vehicle_id for m in hl.models] == ["HL93-TRUCK", "HL93-TANDEM"]
    assert all(m.lane_load_klf == pytest.approx(0.64) for m in hl.models)
    assert all(m.neglect_opposing_axles for m in hl.models)
    assert MEMORY in hl.tag
    lane = rating_load("LEGAL-LANE")
    (m,) = lane.models
    assert m.axles.axle_scale == 0.75 and m.lane_load_klf == pytest.approx(0.2)
    assert not lane.applies_to(200.0) and lane.applies_to(200.5)
    # an SI span of 60.96 m is 200 ft: not over it, whatever the conversion's last digit
    assert not lane.applies_to(200.0 + 3e-14) and lane.applies_to(200.001)
    ids = [r.id for r in rating_loads()]
    assert ids[0] == "HL-93"
    assert "HL93-TRUCK" not in ids and "TYPE-3" in ids and "EV3" in ids
    assert {v.category for v in library()} >= {VehicleCategory.DESIGN, VehicleCategory.LEGAL,
                                               VehicleCategory.SPECIALIZED_HAULING,
                                               VehicleCategory.EMERGENCY}


def test_owner_vehicle_in_si():
    # Exact conversions (NIST SP 811, App. B): 1 kip = 4.4482216152605 kN, 1 ft = 0.3048 m,
    # 1 short ton = 0.90718474 tonne.
    v = owner_vehicle("CTY-7", "county dump truck", [44.482216152605, 88.96443230521],
                      [4.2672], gross_weight=13.607771, force_unit="kN", length_unit="m",
                      weight_unit="tonne", where="Vehicles!B4")
    assert v.axle_loads_kip == pytest.approx((10.0, 20.0))
    assert v.spacings[0].min_ft == pytest.approx(14.0)
    assert v.gross_weight_tons == pytest.approx(15.0, rel=1e-6)
    assert v.category is VehicleCategory.OWNER
    assert rating_load("cty-7", [v]).models[0].axles is v
    ranged = owner_vehicle("P1", "permit", [10, 20, 20], [12, (14, 30)])
    assert ranged.spacings[1].is_variable and ranged.gross_weight_tons == 25.0


@pytest.mark.parametrize("kwargs, needle", [
    (dict(axle_loads=[10, 20], spacings=[]), "needs 1 spacings"),
    (dict(axle_loads=[10, -2], spacings=[4]), "axle 2 load must be positive"),
    (dict(axle_loads=[10, "x"], spacings=[4]), "not a number"),
    (dict(axle_loads=[10, 20], spacings=[(8, 4)]), "min <= max"),
    (dict(axle_loads=[10, 20], spacings=[4], force_unit="lbf"), "not understood"),
])
def test_owner_vehicle_errors_name_vehicle_and_cell(kwargs, needle):
    with pytest.raises(InputError, match=needle) as err:
        owner_vehicle("OWN-1", "owner truck", where="Vehicles!C9", **kwargs)
    assert err.value.where == "Vehicles!C9"
    assert "OWN-1" in err.value.message


def test_unknown_id_lists_the_library():
    with pytest.raises(InputError, match="TYPE-3S2"):
        vehicle("HS-25")
    with pytest.raises(InputError, match="HL-93"):
        rating_load("HS-25")


def test_a_design_case_id_names_its_load():
    """The results name HL-93's cases HL-93-INV and HL-93-OPR: those ids, as printed, are
    taken for the load (both levels are rated, sharing its search); other suffixes are not."""
    from rating.vehicles.library import known_ids, rating_load

    assert rating_load("HL-93-INV").id == rating_load("hl-93-opr").id == "HL-93"
    assert {"hl-93-inv", "hl-93-opr", "hl-93", "type-3"} <= known_ids()
    with pytest.raises(InputError):
        rating_load("TYPE-3-INV")
