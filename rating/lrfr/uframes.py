"""A pony truss's compression chord held out of its plane by U-frames: the effective length of
each top chord and end post, for their buckling resistance (rating.capacity).

The chord is the path from one bearing up the end post, along the top chord and down the other
end post; each of its inner joints with a vertical (or hanger) down to a floorbeam is held by
that U-frame, a spring (rating.analysis.uframe). The axial forces are those of the dead load,
whose distribution along the chord is the one the live load gives it too, near enough for an
effective length (common practice).
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

from rating.analysis.uframe import chord_buckling, uframe_stiffness_kip_per_in
from rating.capacity.member import MemberCapacity
from rating.model import DeckPosition, MemberRole, TrussGeometry

UFRAME_ASSUMPTION = "Pony truss on its U-frames:"
"""The start of the assumption that says the chord was rated on its U-frames."""

_CHORD = (MemberRole.TOP_CHORD, MemberRole.END_POST)
_UPRIGHT = (MemberRole.VERTICAL, MemberRole.HANGER)


@dataclass(frozen=True)
class PonyChord:
    """The U-frame analysis of a pony truss's chord: each chord member's effective length out
    of the truss plane (ft, never less than K L), each inner joint's U-frame spring (kip/in)
    with the upright that makes it, and the words for the report."""

    lengths_ft: Mapping[str, float]
    springs: Mapping[str, tuple[str, float]]
    multiplier: float
    assumption: str


def _chord_path(g: TrussGeometry) -> list[tuple[str, str]] | None:
    """The chord's members from the left bearing to the right one, each with the joint it
    ends at: None where the top chord and end posts do not make one such path."""
    chord = [m for m in g.members if m.role in _CHORD]
    supports = sorted((s.joint for s in g.supports), key=lambda j: g.joint(j).x_ft)
    if not chord or len(supports) < 2:
        return None
    at = supports[0]
    left = set(m.label for m in chord)
    path: list[tuple[str, str]] = []
    while left:
        nxt = [m for m in chord if m.label in left and at in (m.start, m.end)]
        if len(nxt) != 1:
            return None
        m = nxt[0]
        left.discard(m.label)
        at = m.end if m.start == at else m.start
        path.append((m.label, at))
    return path if at == supports[-1] else None


def pony_chord(g: TrussGeometry, capacities: Mapping[str, MemberCapacity],
               compression_kip: Mapping[str, float], truss_spacing_ft: float,
               floorbeam_I_in4: float, K_of: Mapping[str, float] | None = None
               ) -> PonyChord | None:
    """The U-frame analysis of a pony truss (None for another deck position, or where the
    chord is not one path from bearing to bearing). ``compression_kip``: each chord member's
    dead-load compression (positive); ``K_of``: each member's K (its K L is the least length
    kept).

    U-frame spring: statics of the elastic U-frame; chord: linear buckling on elastic
    supports (rating.analysis.uframe) [common practice]; AASHTO LRFD 6.14.2.9 for the
    U-frames of half-through trusses [value from memory].
    """
    if g.deck_position is not DeckPosition.PONY:
        return None
    path = _chord_path(g)
    if path is None:
        return None
    deck = set(g.deck_joints)
    lengths, EI, N, springs = [], [], [], {}
    for lab, _ in path:
        cap = capacities[lab]
        s_ = cap.summary
        lengths.append(g.member_length_ft(lab) * 12.0)
        EI.append(s_.E * s_.A_g_in2 * s_.r_out_of_plane_in ** 2)
        N.append(max(compression_kip.get(lab, 0.0), 0.0))
    for _, joint in path[:-1]:
        upright = [m for m in g.members_at(joint) if m.role in _UPRIGHT
                   and (m.end if m.start == joint else m.start) in deck]
        c, who = 0.0, ""
        for m in upright:
            s_ = capacities[m.label].summary
            I_v = s_.A_g_in2 * s_.r_out_of_plane_in ** 2
            c_m = uframe_stiffness_kip_per_in(g.member_length_ft(m.label) * 12.0,
                                              truss_spacing_ft * 12.0, s_.E, I_v,
                                              floorbeam_I_in4)
            if c_m > c:
                c, who = c_m, m.label
        springs[joint] = (who, c)
    if not all(x > 0 for x in EI):
        return None  # (a member with nothing left to bend: no column to speak of)
    b = chord_buckling(lengths, EI, N, [springs[j][1] for _, j in path[:-1]])
    out = {}
    for (lab, _), le_in, L_in in zip(path, b.effective_length_in, lengths, strict=True):
        K = (K_of or {}).get(lab, capacities[lab].summary.K)
        out[lab] = max(K * L_in, le_in if math.isfinite(le_in) else K * L_in) / 12.0
    return PonyChord(out, springs, b.multiplier, _words(path, out, springs, floorbeam_I_in4,
                                                      truss_spacing_ft))


def _words(path: Sequence[tuple[str, str]], lengths: Mapping[str, float],
           springs: Mapping[str, tuple[str, float]], I_fb: float, spacing_ft: float) -> str:
    """The assumption the report lists."""
    frames = "; ".join(f"{j}: {who} {c:.3g} kip/in" if who else f"{j}: none"
                       for j, (who, c) in springs.items())
    kl = ", ".join(f"{lab} {lengths[lab]:.2f} ft" for lab, _ in path)
    return (f"{UFRAME_ASSUMPTION} the top chord and end posts are rated out of the truss "
            "plane as one column held at the bearings and by the U-frames of the verticals and "
            f"floorbeams (floorbeam I = {I_fb:.4g} in4 over {spacing_ft:.4g} ft; each upright's "
            "own section "
            "after loss, its length as its height): U-frame springs "
            f"{frames} (a U-frame's spring 1 / (h^3 / (3 E I_v) + h^2 b / (2 E I_fb)), the "
            "chords moving apart; statics, common practice). Elastic buckling of that column "
            "under the dead-load forces (beam elements on the springs, common practice; "
            "AASHTO LRFD 6.14.2.9 for half-through trusses [value from memory]) gives the "
            f"effective lengths out of plane: {kl} (never less than K L). The U-frames' own "
            "members (the verticals in bending, the floorbeam connections) are not checked for "
            "the force that holds the chord, nor is the chord's initial crookedness.")
