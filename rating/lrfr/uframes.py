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


UFRAME_FORCE_KLF = 0.30
"""The lateral force per foot of truss, applied at the top chord's panel points, that the
verticals, floorbeams and their connections of a half-through truss are to resist (AASHTO
LRFD 6.14.2.9 [value from memory])."""


@dataclass(frozen=True)
class UFrame:
    """One inner joint of the chord: the upright that makes its U-frame ("" for none, with
    ``why``), its spring (kip/in), and the force of :data:`UFRAME_FORCE_KLF` over the joint's
    share of the chord (kip) with its moment at the upright's foot (kip-in) and the stress
    that moment makes there (ksi) against the upright's F_y."""

    upright: str
    spring_kip_per_in: float
    why: str = ""
    force_kip: float = 0.0
    moment_kip_in: float = 0.0
    stress_ksi: float = 0.0  # M / S_y of the upright's least section (0: not known)
    F_y_ksi: float = 0.0


@dataclass(frozen=True)
class PonyChord:
    """The U-frame analysis of a pony truss's chord: each chord member's effective length out
    of the truss plane (ft, never less than K L; inf for a mechanism), each inner joint's
    U-frame, the buckling multiplier of the dead-load forces (0 for a mechanism), and the
    words for the report (with what the other assumption at the hips would give)."""

    lengths_ft: Mapping[str, float]
    frames: Mapping[str, UFrame]
    multiplier: float
    assumption: str
    hips: tuple[str, ...] = ()  # the joints where the end posts meet the top chord


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
               floorbeam_I_in4: float, K_of: Mapping[str, float] | None = None,
               S_y_in3: Mapping[str, float] | None = None,
               height_ft: float | None = None,
               hinged_at_hips: bool = False) -> PonyChord | None:
    """The U-frame analysis of a pony truss (None for another deck position, where the chord
    is not one path from bearing to bearing, where a chord member has nothing left to bend,
    or where no inner joint has a U-frame: a chord held by inclined frames alone is not
    analysed). ``compression_kip``: each chord member's dead-load compression (positive);
    ``K_of``: each member's K (its K L is the least length kept); ``S_y_in3``: each upright's
    least section modulus out of plane, after loss; ``height_ft``: the U-frames' height,
    floorbeam to top chord (None: each upright's length); ``hinged_at_hips``: the chord
    hinged out of plane where the end posts meet the top chord (else continuous there).

    U-frame spring: statics of the elastic U-frame; chord: linear buckling on elastic
    supports, continuous out of plane through its joints (rating.analysis.uframe) [common
    practice]; AASHTO LRFD 6.14.2.9 for the U-frames of half-through trusses [value from
    memory].
    """
    if g.deck_position is not DeckPosition.PONY:
        return None
    path = _chord_path(g)
    if path is None:
        return None
    deck = set(g.deck_joints)
    lengths, EI, N = [], [], []
    for lab, _ in path:
        s_ = capacities[lab].summary
        lengths.append(g.member_length_ft(lab) * 12.0)
        EI.append(s_.E * s_.A_g_in2 * s_.r_out_of_plane_in ** 2)
        N.append(max(compression_kip.get(lab, 0.0), 0.0))
    if not all(x > 0 for x in EI):
        return None
    frames: dict[str, UFrame] = {}
    for i, (_, joint) in enumerate(path[:-1]):
        # the joint's share of the chord, along the deck: half of each member's run
        share_ft = 0.5 * sum(abs(g.joint(a).x_ft - g.joint(b).x_ft)
                             for lab in (path[i][0], path[i + 1][0])
                             for a, b in [(g.member(lab).start, g.member(lab).end)])
        best = UFrame("", 0.0, "no vertical or hanger down to a floorbeam")
        for m in g.members_at(joint):
            if m.role not in _UPRIGHT or (m.end if m.start == joint else m.start) not in deck:
                continue
            s_ = capacities[m.label].summary
            I_v = s_.A_g_in2 * s_.r_out_of_plane_in ** 2
            h_in = (height_ft if height_ft else g.member_length_ft(m.label)) * 12.0
            c = uframe_stiffness_kip_per_in(h_in, truss_spacing_ft * 12.0, s_.E, I_v,
                                            floorbeam_I_in4)
            if c > best.spring_kip_per_in:
                F = UFRAME_FORCE_KLF * share_ft
                S = (S_y_in3 or {}).get(m.label, 0.0)
                best = UFrame(m.label, c, "", F, F * h_in, F * h_in / S if S > 0 else 0.0,
                              s_.F_y)
            elif not best.upright:
                best = UFrame("", 0.0, f"{m.label}, of bars or rods, has no bending "
                                       "stiffness out of the truss plane")
        frames[joint] = best
    if not any(f.spring_kip_per_in > 0 for f in frames.values()):
        return None
    springs = [frames[j].spring_kip_per_in for _, j in path[:-1]]
    hips = [i + 1 for i in range(len(path) - 1)
            if MemberRole.END_POST in (g.member(path[i][0]).role,
                                       g.member(path[i + 1][0]).role)]
    b = chord_buckling(lengths, EI, N, springs, hinged=hips if hinged_at_hips else ())
    other = (chord_buckling(lengths, EI, N, springs,
                            hinged=() if hinged_at_hips else hips).multiplier if hips
             else b.multiplier)
    out = {}
    for (lab, _), le_in, L_in in zip(path, b.effective_length_in, lengths, strict=True):
        K = (K_of or {}).get(lab, capacities[lab].summary.K)
        # (a mechanism out of plane: no length holds it, the chord has no buckling strength)
        out[lab] = (math.inf if b.multiplier <= 0 else
                    max(K * L_in, le_in if math.isfinite(le_in) else K * L_in) / 12.0)
    hip_joints = [path[i - 1][1] for i in hips]
    return PonyChord(out, frames, b.multiplier,
                     _words(path, out, frames, floorbeam_I_in4, truss_spacing_ft,
                            hip_joints, b.multiplier, other, hinged_at_hips, height_ft),
                     tuple(hip_joints))


def _words(path: Sequence[tuple[str, str]], lengths: Mapping[str, float],
           frames: Mapping[str, UFrame], I_fb: float, spacing_ft: float,
           hips: Sequence[str], lam: float, other: float, hinged: bool,
           height_ft: float | None = None) -> str:
    """The assumption the report lists."""
    springs = "; ".join(
        f"{j}: {f.upright} {f.spring_kip_per_in:.5g} kip/in" if f.upright
        else f"{j}: none ({f.why})" for j, f in frames.items())
    forces = "; ".join(
        f"{j}: {f.force_kip:.4g} kip, {f.moment_kip_in:.4g} kip-in at the foot of {f.upright}"
        + (f" (M / S_y = {f.stress_ksi:.4g} ksi against F_y = {f.F_y_ksi:.4g} ksi)"
           if f.stress_ksi else "") for j, f in frames.items() if f.upright)
    kl = ("none: hinged at the hips, the chord is a mechanism out of plane and has no "
          "buckling strength" if lam <= 0 else
          ", ".join(f"{lab} {lengths[lab]:.3f} ft" for lab, _ in path))
    hip = ""
    where = f"at the hips ({', '.join(hips)})"
    if hips and hinged:
        hip = (f" The chord is taken as hinged out of plane {where}, as the Bridge sheet "
               "gives, and continuous through its other joints"
               + ("" if lam <= 0 else f"; continuous there too, it would buckle at "
                  f"{other / lam:.0%} of this load") + ".")
    elif hips:
        hip = (f" The chord is taken as continuous in bending out of plane through its joints; "
               f"hinged there {where}, as a butt joint on the pin without a splice would be, "
               "it would buckle "
               + ("as a mechanism, at no load: the rating rests on the hips' continuity, "
                  "which the engineer should confirm" if other <= 0 else
                  f"at {other / lam:.0%} of this load: the engineer should confirm the hips' "
                  "detail (the Bridge sheet can give the chord as hinged there)") + ".")
    return (f"{UFRAME_ASSUMPTION} the top chord and end posts are rated out of the truss "
            "plane as one column held at the bearings and by the U-frames of the verticals and "
            f"floorbeams (floorbeam I = {I_fb:.5g} in4 over {spacing_ft:.5g} ft, as given; each "
            "upright's own section after loss, "
            + (f"the frame's height {height_ft:.5g} ft as given" if height_ft else
               "its length as the frame's height") + ", its "
            "connection to the floorbeam rigid, its own axial load and its lacing's shear "
            f"ignored): U-frame springs {springs} (a U-frame's spring 1 / (h^3 / (3 E I_v) + "
            "h^2 b / (2 E I_fb)), the chords moving apart; statics, common practice). Elastic "
            "buckling of that column under the dead-load forces (beam elements on the "
            "springs, common practice; AASHTO LRFD 6.14.2.9 for half-through trusses [value "
            f"from memory]) gives the effective lengths out of plane: {kl} (never less than "
            f"K L).{hip} The U-frames' own members are not checked: AASHTO LRFD 6.14.2.9 "
            f"[value from memory] has the verticals, floorbeams and their connections resist "
            f"{UFRAME_FORCE_KLF:g} klf at the top chord's panel points, here {forces}. Nor is "
            "the chord's sweep in the field beyond what the column curve allows, or the "
            "brace force it makes.")
