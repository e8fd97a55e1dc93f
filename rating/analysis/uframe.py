"""Lateral stability of a pony truss's compression chord on the elastic U-frames that hold it.

A pony truss has no top lateral bracing: out of the truss plane its top chord and end posts
form one column held at the bearings and, at each panel point with a vertical, by the U-frame
of the two verticals and the floorbeam between them, a spring. The elastic buckling load of
that column under the chord's own distribution of axial force gives each member its effective
length out of the truss plane.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from rating.errors import InputError

ELEMENTS_PER_SEGMENT = 6
"""Beam elements between two joints of the chord: six to a span give the Euler load
pi^2 EI / a^2 to about 0.01 %, from above (tests/analysis/test_uframe.py)."""


def uframe_stiffness_kip_per_in(height_in: float, span_in: float, E_ksi: float,
                                I_vertical_in4: float, I_floorbeam_in4: float) -> float:
    """Lateral stiffness of one U-frame at the chord's level: a force P at the top of each of
    the two verticals, the two pushing the chords apart (or together), moves each by
    P h^3 / (3 E I_v) (the vertical a cantilever from the floorbeam) plus P h^2 b / (2 E I_fb)
    (the floorbeam bent by equal end moments P h, its ends turning by P h b / (2 E I_fb)); the
    stiffness is P over that movement, kip/in. The chords moving the same way bend the
    floorbeam in double curvature, stiffer: this is the lower of the two.

    Statics of the elastic U-frame (common practice; the same frame as AASHTO LRFD 6.14.2.9
    and Timoshenko and Gere, Theory of Elastic Stability, 2.11 [value from memory]). A vertical
    with no bending stiffness out of the truss plane (a bar or rod) gives 0.
    """
    if height_in <= 0 or span_in <= 0 or E_ksi <= 0:
        raise InputError("a U-frame needs a positive height, floorbeam span and E")
    if I_vertical_in4 <= 0 or I_floorbeam_in4 <= 0:
        return 0.0
    flex = (height_in ** 3 / (3.0 * E_ksi * I_vertical_in4)
            + height_in ** 2 * span_in / (2.0 * E_ksi * I_floorbeam_in4))
    return 1.0 / flex


@dataclass(frozen=True)
class ChordBuckling:
    """The elastic buckling of the compression chord out of its plane: ``multiplier`` times
    the axial forces given is the buckling load; ``effective_length_in`` of each segment,
    pi sqrt(E I / (multiplier N)) (inf where N is not compression)."""

    multiplier: float
    effective_length_in: tuple[float, ...]


def _beam(L: float, EI: float) -> np.ndarray:
    """Bending stiffness of a cubic beam element, DOFs (w1, theta1, w2, theta2)."""
    return EI / L ** 3 * np.array([[12.0, 6 * L, -12.0, 6 * L],
                                   [6 * L, 4 * L * L, -6 * L, 2 * L * L],
                                   [-12.0, -6 * L, 12.0, -6 * L],
                                   [6 * L, 2 * L * L, -6 * L, 4 * L * L]])


def _geometric(L: float, N: float) -> np.ndarray:
    """Consistent geometric stiffness of a cubic beam element under compression N (its
    destabilizing part, to be multiplied by the load factor)."""
    return N / (30.0 * L) * np.array([[36.0, 3 * L, -36.0, 3 * L],
                                      [3 * L, 4 * L * L, -3 * L, -L * L],
                                      [-36.0, -3 * L, 36.0, -3 * L],
                                      [3 * L, -L * L, -3 * L, 4 * L * L]])


def chord_buckling(lengths_in: Sequence[float], EI_kip_in2: Sequence[float],
                   compression_kip: Sequence[float], springs_kip_per_in: Sequence[float],
                   *, hinged: Sequence[int] = (),
                   per_segment: int = ELEMENTS_PER_SEGMENT) -> ChordBuckling:
    """Elastic buckling of a column of segments (lengths, bending stiffness E I out of plane,
    axial compression each) laid end to end, held laterally at both ends and by a spring at
    each of the joints between segments (``springs_kip_per_in``, one per inner joint; 0 for
    none), free to turn everywhere, and continuous in bending through every inner joint but
    those ``hinged`` (numbered from 1, the first inner joint): the least load multiplier and
    each segment's effective length. A chord that is a mechanism (a hinge with no spring)
    buckles at 0.

    Linear buckling of a beam on elastic supports by cubic beam elements with their consistent
    geometric stiffness (Timoshenko and Gere, Theory of Elastic Stability, 2.10-2.11; the
    closed forms it reproduces are in tests/analysis/test_uframe.py) [common practice].
    """
    n = len(lengths_in)
    if not (len(EI_kip_in2) == len(compression_kip) == n and len(springs_kip_per_in) == n - 1):
        raise InputError("chord buckling: one length, E I and force per segment and one spring "
                         "per inner joint are needed")
    N = np.maximum(np.asarray(compression_kip, dtype=float), 0.0)
    if not (N > 0).any():
        return ChordBuckling(math.inf, tuple(math.inf for _ in range(n)))
    k = per_segment
    nodes = n * k + 1
    # DOFs: each node's lateral movement w and turn theta; a hinged joint has a second turn,
    # that of the segment to its right
    hinge = sorted({int(j) for j in hinged if 0 < int(j) < n})
    extra = {j: 2 * nodes + i for i, j in enumerate(hinge)}
    size = 2 * nodes + len(hinge)
    K = np.zeros((size, size))
    G = np.zeros((size, size))
    for s_ in range(n):
        h = float(lengths_in[s_]) / k
        ke, ge = _beam(h, float(EI_kip_in2[s_])), _geometric(h, float(N[s_]))
        for e in range(k):
            a = s_ * k + e
            turn = extra[s_] if e == 0 and s_ in extra else 2 * a + 1
            dofs = np.array([2 * a, turn, 2 * a + 2, 2 * a + 3])
            K[np.ix_(dofs, dofs)] += ke
            G[np.ix_(dofs, dofs)] += ge
    for j, c in enumerate(springs_kip_per_in, start=1):
        K[2 * j * k, 2 * j * k] += float(c)
    free = np.ones(size, dtype=bool)
    free[[0, 2 * (nodes - 1)]] = False  # the bearings hold the chord's ends laterally
    Kf, Gf = K[np.ix_(free, free)], G[np.ix_(free, free)]
    # K is positive definite where the chord is held (else a mechanism: it buckles at 0); the
    # largest mu of G x = mu K x is 1 / lam: with K = C C^T, the largest eigenvalue of
    # C^-1 G C^-T (numpy alone: scipy.linalg's import costs a one-workbook run more than this
    # whole analysis)
    try:
        C = np.linalg.cholesky(Kf)
    except np.linalg.LinAlgError:
        return ChordBuckling(0.0, tuple(math.inf for _ in range(n)))
    Ci = np.linalg.inv(C)
    A = Ci @ Gf @ Ci.T
    mu = float(np.linalg.eigvalsh(0.5 * (A + A.T))[-1])
    lam = 1.0 / mu if mu > 0 else math.inf
    if lam < 1e-9 * float(np.min(np.asarray(EI_kip_in2)) / max(
            float(np.sum(lengths_in)), 1.0) ** 2 / float(N.max())):
        return ChordBuckling(0.0, tuple(math.inf for _ in range(n)))  # (a near mechanism)
    EI = np.asarray(EI_kip_in2, dtype=float)
    with np.errstate(divide="ignore"):
        le = np.where(N > 0, math.pi * np.sqrt(EI / (lam * np.where(N > 0, N, 1.0))), math.inf)
    return ChordBuckling(lam, tuple(float(x) for x in le))
