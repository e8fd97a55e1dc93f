"""Bad geometry gives a clear error naming the item (nothing silently dropped)."""

import pytest

from rating.errors import GeometryError
from rating.model import Joint, Member, MemberRole, Support, SupportKind, TrussGeometry

J = (Joint("L0", 0, 0), Joint("L1", 20, 0), Joint("U1", 20, 20))
M = (
    Member("L0L1", "L0", "L1", MemberRole.BOTTOM_CHORD),
    Member("L0U1", "L0", "U1", MemberRole.END_POST),
    Member("L1U1", "L1", "U1", MemberRole.VERTICAL),
)
S = (Support("L0", SupportKind.PIN), Support("L1", SupportKind.ROLLER))


def make(joints=J, members=M, supports=S, deck=("L0", "L1")):
    return TrussGeometry(joints, members, supports, deck)


def test_valid_triangle():
    g = make()
    assert g.span_ft == 20
    assert g.member_length_ft("L0U1") == pytest.approx(20 * 2**0.5)


@pytest.mark.parametrize(
    "kwargs, needle",
    [
        (dict(joints=J + (Joint("L0", 5, 5),)), "joint label 'L0' is used twice"),
        (dict(members=M + (Member("L0L1", "L1", "U1", MemberRole.VERTICAL),)), "used twice"),
        (dict(members=M + (Member("X", "L0", "L9", MemberRole.DIAGONAL),)), "'L9'"),
        (dict(supports=()), "no supports"),
        (dict(joints=(Joint("A", 0, 0), Joint("B", 10, 0), Joint("C", 20, 0)),
              members=(Member("AB", "A", "B", MemberRole.BOTTOM_CHORD),
                       Member("BC", "B", "C", MemberRole.BOTTOM_CHORD)),
              supports=(Support("A", SupportKind.PIN),), deck=("A", "C")), "one straight line"),
        (dict(joints=J + (Joint("U2", 20, 20.0000000001),)), "same point"),
        (dict(deck=("L1", "L0")), "increasing x"),
        (dict(members=M + (Member("L1L0", "L1", "L0", MemberRole.BOTTOM_CHORD),)), "both join"),
    ],
)
def test_bad_geometry_named(kwargs, needle):
    with pytest.raises(GeometryError, match=needle.replace("(", r"\(")):
        make(**kwargs)


def test_zero_length_member():
    j = J + (Joint("U9", 20, 20.0 + 1e-9),)
    with pytest.raises(GeometryError):
        make(joints=j)
