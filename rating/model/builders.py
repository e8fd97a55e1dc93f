"""Geometry builders for the pin-connected truss forms, with trade joint labels.

Joints: L0..Ln lower chord, U.. upper chord (numbered by the panel point below them),
M.. mid-height points of subdivided panels. Members are labelled by their two joints
("L0L1", "U1U2", "L1U1", "U1L2"); a counter in panel i (between panel points i-1 and i,
1-based) crosses that panel's main diagonal. Tension is positive project-wide.

Forms (common practice; see any history of American truss types):
- Pratt: verticals, diagonals sloping down toward mid-span (tension under dead load).
- Parker: a Pratt with a polygonal top chord (one height per upper panel point).
- Baltimore: Pratt main panels of two sub-panels, main diagonal split at mid-height by a
  sub-hanger and a sub-strut. Pennsylvania: a Baltimore with a polygonal top chord.
- Warren: diagonals alternating, top joints over mid-panels; "warren with verticals": top
  joints over every interior panel point, verticals throughout.
- Double intersection: diagonals spanning two panels, crossing (statically indeterminate).
Through and pony trusses carry the deck on the lower chord; deck trusses on the upper chord,
with end verticals down to bearings at L0 and Ln.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from enum import StrEnum

from rating.errors import GeometryError
from rating.model.geometry import (
    DeckPosition,
    Joint,
    Member,
    MemberRole,
    Support,
    SupportKind,
    TrussGeometry,
)


class TrussForm(StrEnum):
    PRATT = "pratt"
    PARKER = "parker"
    BALTIMORE = "baltimore"
    PENNSYLVANIA = "pennsylvania"
    WARREN = "warren"
    WARREN_VERTICALS = "warren with verticals"
    DOUBLE_INTERSECTION = "double intersection"


@dataclass
class _Draft:
    """Mutable scratch pad used only while one builder runs."""

    joints: dict[str, Joint]
    members: list[Member]

    def joint(self, label: str, x: float, y: float) -> None:
        self.joints[label] = Joint(label, x, y)

    def member(self, a: str, b: str, role: MemberRole, tension_only: bool = False) -> None:
        self.members.append(Member(a + b, a, b, role, tension_only))


def _heights(heights_ft: float | Sequence[float], n: int, form: TrussForm) -> list[float]:
    """Height of the truss at each lower panel point 0..n (ends may be unused)."""
    if isinstance(heights_ft, int | float):
        h = [float(heights_ft)] * (n + 1)
    else:
        hs = [float(v) for v in heights_ft]
        if len(hs) == n + 1:
            h = hs
        elif len(hs) == n - 1:
            h = [hs[0], *hs, hs[-1]]
        else:
            raise GeometryError(
                f"{form.value} truss with {n} panels needs one height, or {n - 1} heights "
                f"(at U1..U{n - 1}), or {n + 1} heights (at panel points 0..{n}); got {len(hs)}"
            )
    for i, v in enumerate(h):
        if not v > 0:
            raise GeometryError(f"truss height at panel point {i} must be positive, got {v}")
    return h


def build_truss(
    form: TrussForm | str,
    panel_count: int,
    panel_length_ft: float,
    heights_ft: float | Sequence[float],
    deck_position: DeckPosition | str = DeckPosition.THROUGH,
    counter_panels: Sequence[int] = (),
    member_area_in2: float = 10.0,
) -> TrussGeometry:
    """Build the geometry of one truss of the given form (see the module docstring)."""
    try:
        form = TrussForm(str(form).strip().lower())
    except ValueError:
        raise GeometryError(
            f"unknown truss form {form!r}; known: {', '.join(f.value for f in TrussForm)}"
        ) from None
    deck_position = DeckPosition(str(deck_position).strip().lower())
    n = int(panel_count)
    if n < 2:
        raise GeometryError(f"a truss needs at least 2 panels, got {panel_count}")
    if not panel_length_ft > 0:
        raise GeometryError(f"panel length must be positive, got {panel_length_ft}")
    h = _heights(heights_ft, n, form)
    for c in counter_panels:
        if not 1 <= int(c) <= n:
            raise GeometryError(f"counter panel {c} is outside panels 1..{n}")
    d = _Draft({}, [])
    p = float(panel_length_ft)
    if form in (TrussForm.PRATT, TrussForm.PARKER):
        _pratt(d, n, p, h, deck_position, set(map(int, counter_panels)))
    elif form in (TrussForm.BALTIMORE, TrussForm.PENNSYLVANIA):
        if counter_panels:
            raise GeometryError("counters in subdivided (Baltimore/Pennsylvania) panels are "
                                "not generated; list the members explicitly")
        _baltimore(d, n, p, h, deck_position)
    elif form is TrussForm.WARREN:
        _warren(d, n, p, h[0], deck_position)
    elif form is TrussForm.WARREN_VERTICALS:
        _warren_verticals(d, n, p, h, deck_position)
    else:
        _double_intersection(d, n, p, h, deck_position)
    members = tuple(
        Member(m.label, m.start, m.end, m.role, m.tension_only, member_area_in2) for m in d.members
    )
    joints = tuple(sorted(d.joints.values(), key=lambda j: (j.label[0], _num(j.label))))
    deck_prefix = "U" if deck_position is DeckPosition.DECK else "L"
    deck = tuple(
        sorted((j.label for j in joints if j.label[0] == deck_prefix), key=_num)
    )
    supports = (Support("L0", SupportKind.PIN), Support(f"L{n}", SupportKind.ROLLER))
    return TrussGeometry(joints, members, supports, deck, form=form.value,
                         deck_position=deck_position)


def counters_not_built(form: TrussForm | str, panel_count: int,
                       deck_position: DeckPosition | str, counter_panels: Sequence[int]
                       ) -> tuple[int, ...]:
    """The listed counter panels that :func:`build_truss` gives no counter: the end panels of
    a through or pony Pratt or Parker (an end post, not a diagonal, crosses them), and every
    panel of the forms whose counters are not generated (Warren, Warren with verticals,
    double intersection: their diagonals are listed as they are)."""
    form = TrussForm(str(form).strip().lower())
    deck_position = DeckPosition(str(deck_position).strip().lower())
    listed = sorted(set(map(int, counter_panels)))
    if form not in (TrussForm.PRATT, TrussForm.PARKER):
        return tuple(listed) if form not in (TrussForm.BALTIMORE,
                                             TrussForm.PENNSYLVANIA) else ()
    if deck_position is DeckPosition.DECK:
        return ()
    return tuple(c for c in listed if c in (1, int(panel_count)))


def _num(label: str) -> int:
    return int(label[1:])


def _lower_and_upper(d: _Draft, n: int, p: float, h: list[float], deck: DeckPosition,
                     upper: Sequence[int]) -> None:
    """Lower chord L0..Ln and upper joints at ``upper`` indices.

    Deck trusses keep the upper chord straight at the greatest height (the deck) and drop the
    lower chord; through and pony trusses keep the lower chord straight at y = 0.
    """
    top = max(h)
    for i in range(n + 1):
        d.joint(f"L{i}", i * p, top - h[i] if deck is DeckPosition.DECK else 0.0)
    for i in upper:
        d.joint(f"U{i}", i * p, top if deck is DeckPosition.DECK else h[i])
    for i in range(n):
        d.member(f"L{i}", f"L{i + 1}", MemberRole.BOTTOM_CHORD)


def _pratt(d: _Draft, n: int, p: float, h: list[float], deck: DeckPosition,
           counters: set[int]) -> None:
    is_deck = deck is DeckPosition.DECK
    upper = range(0, n + 1) if is_deck else range(1, n)
    _lower_and_upper(d, n, p, h, deck, upper)
    ups = list(upper)
    for a, b in zip(ups, ups[1:], strict=False):
        d.member(f"U{a}", f"U{b}", MemberRole.TOP_CHORD)
    if is_deck:
        d.member("L0", "U0", MemberRole.END_POST)
        d.member(f"L{n}", f"U{n}", MemberRole.END_POST)
    else:
        d.member("L0", "U1", MemberRole.END_POST)
        d.member(f"L{n}", f"U{n - 1}", MemberRole.END_POST)
    for i in range(1, n):
        role = MemberRole.HANGER if (not is_deck and i in (1, n - 1)) else MemberRole.VERTICAL
        d.member(f"L{i}", f"U{i}", role)
    for i in range(1, n + 1):  # panel i between panel points i-1 and i
        if not is_deck and i in (1, n):
            continue  # the end posts
        left, right = i - 1, i
        mid2 = left + right  # twice the panel centre, in panel units
        down_right = (f"U{left}", f"L{right}")  # slopes down toward mid-span in the left half
        down_left = (f"L{left}", f"U{right}")
        if mid2 < n:
            main, counter = down_right, down_left
        elif mid2 > n:
            main, counter = down_left, down_right
        else:  # centre panel of an odd-panel truss: crossed tension diagonals
            d.member(*down_right, MemberRole.DIAGONAL, tension_only=True)
            d.member(*down_left, MemberRole.DIAGONAL, tension_only=True)
            continue
        if i in counters:
            d.member(*main, MemberRole.DIAGONAL, tension_only=True)
            d.member(*counter, MemberRole.COUNTER, tension_only=True)
        else:
            d.member(*main, MemberRole.DIAGONAL)


def _baltimore(d: _Draft, n: int, p: float, h: list[float], deck: DeckPosition) -> None:
    if deck is DeckPosition.DECK:
        raise GeometryError("subdivided deck trusses are not generated; list the members "
                            "explicitly")
    if n < 6 or (n - 2) % 4 != 0:
        raise GeometryError(
            f"a Baltimore/Pennsylvania truss is generated with an end panel each side and an "
            f"even number of two-sub-panel main panels: panel count 6, 10, 14, 18...; got {n}"
        )
    upper = range(1, n, 2)
    _lower_and_upper(d, n, p, h, deck, upper)
    ups = list(upper)
    for a, b in zip(ups, ups[1:], strict=False):
        d.member(f"U{a}", f"U{b}", MemberRole.TOP_CHORD)
    d.member("L0", "U1", MemberRole.END_POST)
    d.member(f"L{n}", f"U{n - 1}", MemberRole.END_POST)
    for i in ups:
        role = MemberRole.HANGER if i in (1, n - 1) else MemberRole.VERTICAL
        d.member(f"L{i}", f"U{i}", role)
    half = n / 2
    for k in range(2, n - 1, 2):  # sub-panel point k lies inside a main panel
        # mid-height point of the main diagonal of the main panel around k
        if k < half:
            top, low, strut_to = k - 1, k + 1, k + 1
        else:
            top, low, strut_to = k + 1, k - 1, k - 1
        d.joint(f"M{k}", k * p, h[k] / 2.0)
        d.member(f"U{top}", f"M{k}", MemberRole.DIAGONAL)
        d.member(f"M{k}", f"L{low}", MemberRole.DIAGONAL)
        d.member(f"L{k}", f"M{k}", MemberRole.HANGER)
        d.member(f"M{k}", f"U{strut_to}", MemberRole.SUB_STRUT)
    # the M point sits on the main diagonal only when chords are parallel; for a polygonal top
    # chord it sits at half the local height, which is how such trusses were laid out.


def _warren(d: _Draft, n: int, p: float, height: float, deck: DeckPosition) -> None:
    top = height
    for i in range(n + 1):
        d.joint(f"L{i}", i * p, 0.0)
    for i in range(1, n + 1):  # U_i over the middle of panel i
        d.joint(f"U{i}", (i - 0.5) * p, top)
    for i in range(n):
        d.member(f"L{i}", f"L{i + 1}", MemberRole.BOTTOM_CHORD)
    for i in range(1, n):
        d.member(f"U{i}", f"U{i + 1}", MemberRole.TOP_CHORD)
    for i in range(1, n + 1):
        role_a = MemberRole.END_POST if i == 1 else MemberRole.DIAGONAL
        role_b = MemberRole.END_POST if i == n else MemberRole.DIAGONAL
        d.member(f"L{i - 1}", f"U{i}", role_a)
        d.member(f"U{i}", f"L{i}", role_b)
    if deck is DeckPosition.DECK:
        raise GeometryError("a Warren deck truss without verticals has no deck panel points "
                            "on its upper chord at the floorbeams; use 'warren with verticals'")


def _warren_verticals(d: _Draft, n: int, p: float, h: list[float], deck: DeckPosition) -> None:
    if n % 2:
        raise GeometryError(f"a Warren truss with verticals needs an even panel count; got {n}")
    is_deck = deck is DeckPosition.DECK
    upper = range(0, n + 1) if is_deck else range(1, n)
    _lower_and_upper(d, n, p, h, deck, upper)
    ups = list(upper)
    for a, b in zip(ups, ups[1:], strict=False):
        d.member(f"U{a}", f"U{b}", MemberRole.TOP_CHORD)
    for i in range(1, n):
        role = MemberRole.HANGER if (not is_deck and i % 2 == 1) else MemberRole.VERTICAL
        d.member(f"L{i}", f"U{i}", role)
    if is_deck:
        d.member("L0", "U0", MemberRole.END_POST)
        d.member(f"L{n}", f"U{n}", MemberRole.END_POST)
    for i in range(1, n + 1):
        a, b = i - 1, i
        pair = (f"L{a}", f"U{b}") if i % 2 == 1 else (f"U{a}", f"L{b}")
        if is_deck and i % 2 == 1:
            pair = (f"U{a}", f"L{b}")
        elif is_deck:
            pair = (f"L{a}", f"U{b}")
        end = not is_deck and i in (1, n)
        d.member(*pair, MemberRole.END_POST if end else MemberRole.DIAGONAL)


def _double_intersection(d: _Draft, n: int, p: float, h: list[float],
                         deck: DeckPosition) -> None:
    if deck is DeckPosition.DECK:
        raise GeometryError("double-intersection deck trusses are not generated; list the "
                            "members explicitly")
    if n < 6:
        raise GeometryError(f"a double-intersection truss needs at least 6 panels; got {n}")
    upper = range(1, n)
    _lower_and_upper(d, n, p, h, deck, upper)
    for a in range(1, n - 1):
        d.member(f"U{a}", f"U{a + 1}", MemberRole.TOP_CHORD)
    d.member("L0", "U1", MemberRole.END_POST)
    d.member(f"L{n}", f"U{n - 1}", MemberRole.END_POST)
    for i in range(1, n):
        role = MemberRole.HANGER if i in (1, n - 1) else MemberRole.VERTICAL
        d.member(f"L{i}", f"U{i}", role)
    # the end panels next to the end posts get a single-panel diagonal to brace them
    d.member("U1", "L2", MemberRole.DIAGONAL)
    d.member(f"L{n - 2}", f"U{n - 1}", MemberRole.DIAGONAL)
    for i in range(1, n - 2):  # diagonals spanning two panels, i -> i+2
        mid2 = 2 * i + 2
        if mid2 <= n:
            d.member(f"U{i}", f"L{i + 2}", MemberRole.DIAGONAL)
        if mid2 >= n:
            d.member(f"L{i}", f"U{i + 2}", MemberRole.DIAGONAL)
