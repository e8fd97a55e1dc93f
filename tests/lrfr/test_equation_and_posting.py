"""The rating equation term by term, the posting equation and the load-factor tables.

Sources: rating equation and posting equation as in Khan, *Bridge and Highway Structure
Rehabilitation and Repair*, McGraw-Hill 2010, p. 187 [read]; dead-load factors AASHTO LRFD
Table 3.4.1-2 [read]; legal-load factors by ADTT: MBE Table 6A.4.4.2.3a-1 [value from memory].
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from rating.errors import InputError
from rating.lrfr.equation import SenseLoads, factored_capacity, rating_factor
from rating.lrfr.factors import (
    RatingLevel,
    dead_load_factors,
    dynamic_load_allowance,
    factored_dw,
    legal_live_load_factor,
    live_load_factor,
)
from rating.lrfr.posting import PostingAction, least_posting_load, posting, safe_posting_load
from rating.lrfr.reported import reported_rf
from rating.model import RidingSurface, VehicleCategory

DEAD = dead_load_factors()


def test_equation_hand_case_dead_load_adds():
    # C = 400 kip, DC = 100, DW = 20, LL+IM = 80, gamma_LL = 1.75 (inventory)
    # RF = (400 - 1.25*100 - 1.50*20) / (1.75*80) = 245 / 140 = 1.75
    r = rating_factor(400.0, SenseLoads(100.0, 20.0, 80.0), 1.75, DEAD)
    assert r.rf == pytest.approx(1.75)
    assert (r.gamma_dc, r.gamma_dw) == (1.25, 1.50)


def test_equation_dead_load_relieving_takes_minimum_factor():
    # dead load acts against the sense: DC = -50, DW = -10 -> 0.90 and 0.65 (Table 3.4.1-2)
    # RF = (100 + 0.90*50 + 0.65*10) / (1.30*60) = 151.5 / 78
    r = rating_factor(100.0, SenseLoads(-50.0, -10.0, 60.0), 1.30, DEAD)
    assert r.rf == pytest.approx(151.5 / 78.0)
    assert (r.gamma_dc, r.gamma_dw) == (0.90, 0.65)


def test_measured_wearing_surface_and_utilities_are_factored_apart():
    # MBE 6A.4.2.2 [value from memory]: gamma_DW = 1.25 for a wearing surface of measured
    # thickness; the utilities in DW keep 1.50 (AASHTO LRFD Table 3.4.1-2 [V]). Hand case:
    # C = 400, DC = 100, DW = 20 of which 15 is the wearing surface, LL+IM = 80, gamma_LL 1.75:
    # factored DW = 1.25*15 + 1.50*5 = 26.25; RF = (400 - 125 - 26.25) / 140 = 1.776786;
    # gamma_DW shown = 26.25 / 20 = 1.3125, so (400 - 1.25*100 - 1.3125*20) / 140 is the same.
    measured = dead_load_factors(wearing_surface_measured=True)
    r = rating_factor(400.0, SenseLoads(100.0, 20.0, 80.0, DW_surface=15.0), 1.75, measured)
    assert r.rf == pytest.approx(248.75 / 140.0)
    assert r.gamma_dw == pytest.approx(1.3125)
    # not measured: the whole DW at 1.50, as before
    assert rating_factor(400.0, SenseLoads(100.0, 20.0, 80.0, DW_surface=15.0), 1.75,
                         DEAD).rf == pytest.approx(1.75)
    # relieving: each part takes the minimum 0.65, whatever was measured
    r = rating_factor(100.0, SenseLoads(-50.0, -10.0, 60.0, DW_surface=-8.0), 1.30, measured)
    assert r.rf == pytest.approx(151.5 / 78.0) and r.gamma_dw == pytest.approx(0.65)
    # joint loads: bound "max" and "min" (every part of a downward load adds or relieves)
    assert factored_dw(np.array([-20.0]), np.array([-15.0]), measured, "max")[0] == \
        pytest.approx(-26.25)
    assert factored_dw(-20.0, -15.0, measured, "min") == pytest.approx(-13.0)
    # no wearing surface within DW: exactly the single-factor product
    assert factored_dw(20.0, 0.0, measured) == 1.5 * 20.0


def test_no_live_load_in_this_sense():
    assert math.isinf(rating_factor(100.0, SenseLoads(10.0, 0.0, 0.0), 1.75, DEAD).rf)


def test_capacity_floor_on_condition_times_system_factor():
    # phi_c * phi_s = 0.85 * 0.85 = 0.7225 is raised to 0.85 (Khan 2010 p. 187)
    assert factored_capacity(0.85, 0.85, 0.95, 100.0) == pytest.approx(0.85 * 0.95 * 100.0)
    assert factored_capacity(1.0, 0.9, 0.95, 100.0) == pytest.approx(0.9 * 0.95 * 100.0)


def test_posting_equation_khan_p187():
    # (W / 0.7)(RF - 0.3): W = 40 t, RF = 0.65 -> 20.0 t
    assert safe_posting_load(0.65, 40.0) == pytest.approx(20.0)
    p = posting(0.62, 40.0)
    assert p.action is PostingAction.POST
    assert p.posting_tons == math.floor(40 / 0.7 * 0.32)  # 18.28 -> 18 (rounded down)
    assert p.rating_tons == pytest.approx(24.8)
    assert posting(1.0, 40.0).action is PostingAction.NONE
    assert posting(0.29, 40.0).action is PostingAction.CLOSE
    # RF 0.30 gives (W / 0.7)(0) = 0: a posting of zero is a closure (common practice)
    assert posting(0.30, 40.0).posting_tons is None
    assert posting(0.30, 40.0).action is PostingAction.CLOSE


def test_posting_is_worked_from_the_rf_as_printed():
    # RF 0.4187 prints as 0.41 (rounded down); with W = 43 t the reviewer works
    # (43 / 0.7)(0.41 - 0.3) = 6.76 -> 6 t and RT = 0.41 x 43 = 17.63 t from the printed
    # numbers (Khan 2010 p. 187 for the equation); the unrounded RF would give 7 t and 18.0 t
    assert reported_rf(0.4187) == 0.41
    p = posting(0.4187, 43.0)
    assert p.rf == 0.4187  # kept as computed
    assert p.posting_tons == 6.0
    assert p.rating_tons == pytest.approx(0.41 * 43.0)
    assert reported_rf(0.996) == 0.99 and reported_rf(1.0) == 1.0
    assert posting(0.9999, 40.0).action is PostingAction.POST  # prints 0.99: posted
    # prints 0.30; (40 / 0.7)(0.30 - 0.3) = 0 (from 0.3049: 0.28 -> 0): consider closing
    zero = posting(0.3049, 40.0)
    assert zero.action is PostingAction.CLOSE and zero.posting_tons is None
    assert "is 0.00 tons, less than the 3 tons" in zero.reason
    assert "(2.72 tonnes)" in posting(0.32, 30.0, "tonne").reason  # 0.86 t


def test_a_posting_under_three_tons_is_a_closure():
    """MBE 6A.8.1 [value from memory]: a bridge not capable of carrying a gross live load of
    3 tons must be closed; so a safe posting load (W / 0.7)(RF - 0.3) under 3 tons is no
    posting (Eq. 6A.8.3-1, Khan 2010 p. 187). The safe load itself is compared with 3 tons
    (2.72 t), in either unit; only the sign is rounded down."""
    # (40 / 0.7)(0.32 - 0.3) = 1.14 tons: a closure (was "post for 1 ton")
    one = posting(0.32, 40.0)
    assert one.action is PostingAction.CLOSE and one.posting_tons is None
    assert "is 1.14 tons, less than the 3 tons" in one.reason
    assert "MBE 6A.8.1" in one.reason and "value from memory" in one.reason
    # (40 / 0.7)(0.35 - 0.3) = 2.86 tons: a closure; 0.36 -> 3.43 -> post for 3 tons
    assert posting(0.35, 40.0).action is PostingAction.CLOSE
    three = posting(0.36, 40.0)
    assert three.action is PostingAction.POST and three.posting_tons == 3.0
    # tonnes: (36.3 / 0.7)(0.05) = 2.59 t < 2.72 t: closure; (0.36) 3.11 t -> 3 t
    assert posting(0.35, 36.3, "tonne").action is PostingAction.CLOSE
    assert posting(0.36, 36.3, "tonne").posting_tons == 3.0
    # (39 / 0.7)(0.05) = 2.79 t = 3.07 tons: the bridge carries 3 tons and stays open, as
    # the same bridge in tons does (3.07 -> 3 tons); its sign is rounded down, 2 t (a
    # reviewer found SI closing it after rounding 2.79 down to 2 first)
    si = posting(0.35, 39.0, "tonne")
    assert si.action is PostingAction.POST and si.posting_tons == 2.0
    # a sign under 2.72 t says why the bridge is not closed (a reviewer asked)
    assert "2.79 tonnes, is at least the 3 tons (2.72 tonnes)" in si.reason
    assert "the sign is rounded down to whole tonnes" in si.reason
    assert posting(0.36, 40.0).reason == ""
    assert posting(0.35, 39.0 * 1.10231131, "ton").posting_tons == 3.0
    assert least_posting_load("ton") == 3.0
    assert least_posting_load("tonne") == pytest.approx(3.0 * 0.90718474)


def test_posting_edges_of_the_rf():
    assert reported_rf(math.inf) == math.inf and reported_rf(-math.inf) == -math.inf
    # a member that cannot carry its dead load (RF -inf): no rating, not an infinite one
    assert posting(-math.inf, 40.0).rating_tons == -math.inf
    assert posting(-math.inf, 40.0).action is PostingAction.CLOSE
    assert posting(math.inf, 40.0).action is PostingAction.NONE


@given(rf=st.floats(0.3, 0.9999), weight=st.floats(5.0, 60.0))
def test_posting_never_above_the_unrounded_rf_and_agrees_with_the_printed_rf(rf, weight):
    p = posting(rf, weight)
    printed = math.floor(rf * 100.0 + 1e-7) / 100.0  # as the report prints it
    whole = math.floor(weight / 0.7 * (printed - 0.3) + 1e-9)
    assert p.rating_tons == pytest.approx(printed * weight)
    if weight / 0.7 * (printed - 0.3) < 3.0 - 1e-9:  # under the least of MBE 6A.8.1
        # [value from memory]: a closure (the safe load itself is compared, not its sign)
        assert p.action is PostingAction.CLOSE and p.posting_tons is None
        return
    assert p.action is PostingAction.POST
    assert p.posting_tons == whole
    assert p.posting_tons <= math.floor(weight / 0.7 * (rf - 0.3) + 1e-6)


def test_legal_factors_by_adtt_interpolated():
    # value from memory: MBE 2011: 100 -> 1.40, 1000 -> 1.65, 5000 -> 1.80
    assert legal_live_load_factor(100, "MBE 2011").value == pytest.approx(1.40)
    assert legal_live_load_factor(550, "MBE 2011").value == pytest.approx(1.525)
    assert legal_live_load_factor(3000, "MBE 2011").value == pytest.approx(1.725)
    assert legal_live_load_factor(50, "MBE 2011").value == pytest.approx(1.40)
    assert legal_live_load_factor(None, "MBE 2011").value == pytest.approx(1.80)
    # value from memory: MBE 2018: <= 1000 -> 1.30, >= 5000 -> 1.45, unknown 1.45
    assert legal_live_load_factor(3000).value == pytest.approx(1.375)
    assert legal_live_load_factor(200).value == pytest.approx(1.30)
    assert legal_live_load_factor(None).value == pytest.approx(1.45)
    with pytest.raises(InputError, match="provision set"):
        legal_live_load_factor(100, "MBE 1900")


def test_design_emergency_and_im():
    d = VehicleCategory.DESIGN
    assert live_load_factor(d, RatingLevel.INVENTORY).value == 1.75  # LRFD Strength I [read]
    assert live_load_factor(d, RatingLevel.OPERATING).value == 1.35  # value from memory
    assert live_load_factor(VehicleCategory.EMERGENCY, RatingLevel.LEGAL).value == 1.30
    assert live_load_factor(VehicleCategory.LEGAL, RatingLevel.LEGAL, override=1.6).value == 1.6
    assert dynamic_load_allowance(d).value == 0.33
    # design load keeps 33% whatever the riding surface; legal loads may reduce it
    assert dynamic_load_allowance(d, RidingSurface.SMOOTH).value == 0.33
    assert dynamic_load_allowance(VehicleCategory.LEGAL, RidingSurface.SMOOTH).value == 0.10
    assert dynamic_load_allowance(VehicleCategory.LEGAL, RidingSurface.MINOR).value == 0.20
    # a measured wearing surface has its own maximum factor; the rest of DW keeps 1.50
    measured = dead_load_factors(wearing_surface_measured=True)
    assert measured["gamma_dw_surface_max"].value == 1.25
    assert measured["gamma_dw_max"].value == 1.50
    assert "gamma_dw_surface_max" not in dead_load_factors()
