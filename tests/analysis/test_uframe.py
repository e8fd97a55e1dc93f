"""The pony truss chord on elastic U-frames: the U-frame's spring and the chord's buckling.

Checks against closed forms: Euler's column, the continuous beam over rigid supports
(each span buckles as a pinned column), and the beam on a continuous elastic foundation
(Timoshenko and Gere, Theory of Elastic Stability, 2.10 [value from memory]:
P = (pi^2 E I / L^2)(m^2 + beta L^4 / (m^2 pi^4 E I)), least over whole m); the U-frame's
spring against anaStruct, an independent general 2-D FE library (PyPI: anastruct).
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.analysis.uframe import chord_buckling, uframe_stiffness_kip_per_in

EI = 29000.0 * 400.0  # kip-in2 (E 29,000 ksi, I 400 in4: a chord of two 10 in channels)


def test_one_segment_is_eulers_column():
    # pinned both ends, no spring: P = pi^2 E I / L^2 (Euler, closed form); six cubic
    # elements to the span converge on it from above to about 0.01 %
    L = 240.0
    b = chord_buckling([L], [EI], [100.0], [])
    assert b.multiplier * 100.0 == pytest.approx(math.pi ** 2 * EI / L ** 2, rel=2e-4)
    assert b.multiplier * 100.0 >= math.pi ** 2 * EI / L ** 2
    assert b.effective_length_in[0] == pytest.approx(L, rel=1e-4)


def test_no_springs_is_the_whole_column():
    # five segments, springs of nothing: the whole 5a column buckles as one
    a = 200.0
    b = chord_buckling([a] * 5, [EI] * 5, [80.0] * 5, [0.0] * 4)
    assert b.multiplier * 80.0 == pytest.approx(math.pi ** 2 * EI / (5 * a) ** 2, rel=1e-4)
    assert all(le == pytest.approx(5 * a, rel=1e-4) for le in b.effective_length_in)


def test_rigid_springs_give_the_panel_length():
    # equal spans over rigid supports, equal force: each span a pinned column (closed form)
    a = 200.0
    b = chord_buckling([a] * 6, [EI] * 6, [150.0] * 6, [1e9] * 5)
    assert b.multiplier * 150.0 == pytest.approx(math.pi ** 2 * EI / a ** 2, rel=1e-3)
    assert all(le == pytest.approx(a, rel=1e-3) for le in b.effective_length_in)


def test_many_soft_springs_approach_the_elastic_foundation():
    # 40 panels of a = 150 in, springs c = 5 kip/in: beta = c / a; the continuous foundation's
    # least load over whole half-waves m (Timoshenko and Gere 2.10). Discrete springs five
    # or more to a half-wave give it within a few per cent.
    a, n, c = 150.0, 40, 5.0
    beta = c / a
    L = n * a
    P = min(math.pi ** 2 * EI / L ** 2 * (m * m + beta * L ** 4 / (m * m * math.pi ** 4 * EI))
            for m in range(1, 60))
    b = chord_buckling([a] * n, [EI] * n, [1.0] * n, [c] * (n - 1))
    assert b.multiplier == pytest.approx(P, rel=0.03)
    # and the half-wave is several panels long: Engesser's 2 sqrt(beta E I) is near too
    assert b.multiplier == pytest.approx(2.0 * math.sqrt(beta * EI), rel=0.05)


def test_uneven_forces_shorten_the_heavier_members_length():
    # a member with twice the force of its neighbours has the shorter effective length
    # (the same multiplier: pi sqrt(E I / (lam N)))
    b = chord_buckling([200.0] * 3, [EI] * 3, [50.0, 100.0, 50.0], [20.0, 20.0])
    le = b.effective_length_in
    assert le[1] == pytest.approx(le[0] / math.sqrt(2.0), rel=1e-9)


def test_a_member_in_tension_has_no_buckling_length():
    b = chord_buckling([200.0, 200.0], [EI, EI], [100.0, -20.0], [10.0])
    assert math.isfinite(b.effective_length_in[0]) and b.effective_length_in[1] == math.inf
    assert chord_buckling([200.0], [EI], [-5.0], []).multiplier == math.inf


@settings(max_examples=25, deadline=None)
@given(c=st.floats(0.1, 200.0), k=st.floats(1.01, 10.0))
def test_stiffer_u_frames_never_lower_the_buckling_load(c, k):
    soft = chord_buckling([180.0] * 5, [EI] * 5, [60.0, 90.0, 100.0, 90.0, 60.0], [c] * 4)
    stiff = chord_buckling([180.0] * 5, [EI] * 5, [60.0, 90.0, 100.0, 90.0, 60.0],
                           [k * c] * 4)
    assert stiff.multiplier >= soft.multiplier * (1.0 - 1e-9)
    # and never above the chord on rigid supports
    rigid = chord_buckling([180.0] * 5, [EI] * 5, [60.0, 90.0, 100.0, 90.0, 60.0], [1e9] * 4)
    assert stiff.multiplier <= rigid.multiplier * (1.0 + 1e-9)


def test_u_frame_spring_by_statics():
    # h 96 in, b 204 in, I_v 60 in4, I_fb 800 in4: P h^3/(3 E I_v) + P h^2 b/(2 E I_fb)
    E, h, b, Iv, Ifb = 29000.0, 96.0, 204.0, 60.0, 800.0
    c = uframe_stiffness_kip_per_in(h, b, E, Iv, Ifb)
    assert 1.0 / c == pytest.approx(h ** 3 / (3 * E * Iv) + h ** 2 * b / (2 * E * Ifb))
    assert uframe_stiffness_kip_per_in(h, b, E, 0.0, Ifb) == 0.0  # a bar: no U-frame


def test_u_frame_spring_against_anastruct():
    # the frame of two verticals on a floorbeam, the tops pushed apart by equal forces
    anastruct = pytest.importorskip("anastruct")
    E, h, b, Iv, Ifb = 29000.0, 96.0, 204.0, 60.0, 800.0
    ss = anastruct.SystemElements()
    big = 1e6  # axial stiffness: only bending moves the tops
    ss.add_element([[0.0, 0.0], [b, 0.0]], EA=big, EI=E * Ifb)
    ss.add_element([[0.0, 0.0], [0.0, h]], EA=big, EI=E * Iv)
    ss.add_element([[b, 0.0], [b, h]], EA=big, EI=E * Iv)
    left, right = ss.find_node_id([0.0, 0.0]), ss.find_node_id([b, 0.0])
    ss.add_support_hinged(left)
    ss.add_support_roll(right, direction="x")
    top_l, top_r = ss.find_node_id([0.0, h]), ss.find_node_id([b, h])
    P = 1.0
    ss.point_load(top_l, Fx=-P)
    ss.point_load(top_r, Fx=P)
    ss.solve()
    spread = (ss.get_node_displacements(top_r)["ux"] - ss.get_node_displacements(top_l)["ux"])
    # each top moves half the spread away from the other
    each = abs(spread) / 2.0
    assert P / each == pytest.approx(uframe_stiffness_kip_per_in(h, b, E, Iv, Ifb), rel=1e-3)


def test_a_hinge_on_a_spring_is_two_bars_held_by_it():
    # two stiff bars of length a, pinned at the ends, hinged together on a spring c: each
    # bar turning about its end, P delta = (c delta / 2) a, so P = c a / 2 (closed form,
    # Timoshenko and Gere 2.1); no spring: a mechanism, buckling at no load
    a, c = 200.0, 5.0
    b = chord_buckling([a, a], [EI, EI], [1.0, 1.0], [c], hinged=[1])
    assert b.multiplier == pytest.approx(c * a / 2.0, rel=1e-6)
    assert chord_buckling([a, a], [EI, EI], [1.0, 1.0], [0.0], hinged=[1]).multiplier == 0.0
    # a hinge on a rigid support: each span a pinned column, as continuous over it
    rigid = chord_buckling([a, a], [EI, EI], [100.0, 100.0], [1e9], hinged=[1])
    assert rigid.multiplier * 100.0 == pytest.approx(math.pi ** 2 * EI / a ** 2, rel=1e-3)
    # and a hinge never stiffens the chord
    cont = chord_buckling([a] * 4, [EI] * 4, [50.0, 80.0, 80.0, 50.0], [3.0] * 3)
    hinged = chord_buckling([a] * 4, [EI] * 4, [50.0, 80.0, 80.0, 50.0], [3.0] * 3,
                            hinged=[1, 3])
    assert hinged.multiplier <= cont.multiplier


def _ritz(lengths, EIs, Ns, springs, terms=40, pts=4000):
    """The least buckling multiplier by Rayleigh-Ritz with a sine series, w = sum a_n
    sin(n pi x / L) (held at both ends, free to turn): U = 1/2 int EI w''^2 + 1/2 sum c w^2,
    V = 1/2 int N w'^2 (Timoshenko and Gere, Theory of Elastic Stability, 2.11), piecewise EI
    and N integrated by the midpoint rule: a method apart from the beam elements."""
    import numpy as np

    L = float(sum(lengths))
    edges = np.concatenate([[0.0], np.cumsum(lengths)])
    x = (np.arange(pts) + 0.5) * L / pts
    seg = np.minimum(np.searchsorted(edges, x, side="right") - 1, len(lengths) - 1)
    EI_x, N_x = np.asarray(EIs)[seg], np.asarray(Ns)[seg]
    n = np.arange(1, terms + 1)[:, None]
    k = n * np.pi / L
    d2 = -(k ** 2) * np.sin(k * x)
    d1 = k * np.cos(k * x)
    dx = L / pts
    K = (d2 * EI_x) @ d2.T * dx
    for xj, c in zip(edges[1:-1], springs, strict=True):
        s = np.sin(k[:, 0] * xj)
        K += c * np.outer(s, s)
    G = (d1 * N_x) @ d1.T * dx
    mu = np.linalg.eigvals(np.linalg.solve(K, G)).real.max()
    return 1.0 / mu


def test_the_chord_against_rayleigh_ritz():
    # a pony chord's shape (long end posts, five top chords, uneven force, no spring at the
    # hips): the beam elements and an independent sine-series Rayleigh-Ritz agree
    lengths = [330.0, 126.0, 126.0, 126.0, 126.0, 126.0, 330.0]
    EIs = [EI * f for f in (1.0, 1.0, 1.1, 1.1, 1.1, 1.0, 1.0)]
    Ns = [60.0, 55.0, 70.0, 75.0, 70.0, 55.0, 60.0]
    springs = [0.0, 4.1, 4.1, 4.1, 4.1, 0.0]
    fe = chord_buckling(lengths, EIs, Ns, springs).multiplier
    assert fe == pytest.approx(_ritz(lengths, EIs, Ns, springs), rel=1e-3)
