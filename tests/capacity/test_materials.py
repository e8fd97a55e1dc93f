"""Material strengths assumed by year of construction (MBE Table 6A.6.2.1-1 [value from
memory]) and for wrought iron."""

from __future__ import annotations

from rating.capacity.materials import default_material
from rating.model import MaterialKind


def test_steel_by_year_of_construction():
    # MBE Table 6A.6.2.1-1 [value from memory]: before 1905 26/52 ksi, 1905-1935 30/60,
    # 1936-1963 33/66, after 36/66; unknown year: the lowest
    cases = {1898: (26.0, 52.0), 1905: (30.0, 60.0), 1935: (30.0, 60.0), 1936: (33.0, 66.0),
             1964: (36.0, 66.0), None: (26.0, 52.0)}
    for year, (fy, fu) in cases.items():
        m = default_material(MaterialKind.STEEL, year).material
        assert (m.F_y, m.F_u) == (fy, fu) and m.assumed, year


def test_a_bridge_built_just_after_a_boundary_may_be_of_the_older_steel():
    """A bridge built in 1905 or 1906 gets the 1905-1935 row (30 ksi), but its steel may have
    been rolled before 1905 (26 ksi, about 15 % less): said with the older value (a
    reviewer's finding; common practice)."""
    near = default_material(MaterialKind.STEEL, 1906).assumption
    assert "within 3 years of the table's 1905 boundary" in near and "Fy = 26 ksi" in near
    assert "boundary" not in default_material(MaterialKind.STEEL, 1910).assumption
    assert "boundary" not in default_material(MaterialKind.STEEL, 1898).assumption
