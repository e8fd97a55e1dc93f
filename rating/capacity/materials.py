"""Default material strengths when the owner has no tests or mill records, as data with sources.

Every default returned here is an assumption the report must list.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

from rating.model import Material, MaterialKind


@dataclass(frozen=True)
class MaterialDefault:
    """A material assumed when there are no tests or mill records, with the assumption text the
    report must list."""

    material: Material
    assumption: str


@lru_cache(maxsize=1)
def _table() -> dict:
    return json.loads(resources.files("rating.capacity").joinpath("materials.json").read_text())


def default_material(kind: MaterialKind, year_built: int | None) -> MaterialDefault:
    """Material strengths assumed from material and year of construction.

    MBE Table 6A.6.2.1-1 (steel by year of construction). [value from memory]
    """
    t = _table()
    if kind is MaterialKind.WROUGHT_IRON:
        w = t["wrought_iron"]
        mat = Material(kind, F_y=w["F_y"], F_u=w["F_u"], E=t["wrought_iron_E"]["E"],
                       unit_weight_pcf=w["unit_weight_pcf"], basis="default for wrought iron",
                       assumed=True)
        text = (f"Wrought iron assumed Fy = {w['F_y']:g} ksi, Fu = {w['F_u']:g} ksi, "
                f"E = {mat.E:g} ksi ({w['tag']}); {w['source']}. Coupon tests are advised.")
        return MaterialDefault(mat, text)
    s = t["steel_by_year"]
    if year_built is None:
        row = s["unknown_year"]
        when = "year of construction unknown"
    else:
        row = next(r for r in s["rows"]
                   if r["built_before"] is None or year_built < r["built_before"])
        when = f"built {year_built}"
    mat = Material(MaterialKind.STEEL, F_y=row["F_y"], F_u=row["F_u"], E=t["steel"]["E"],
                   unit_weight_pcf=t["steel"]["unit_weight_pcf"],
                   basis=f"default by year ({when})", assumed=True)
    text = (f"Steel of unknown grade ({when}) assumed Fy = {row['F_y']:g} ksi, "
            f"Fu = {row['F_u']:g} ksi from {s['source']} ({s['tag']}).")
    rows = s["rows"]
    k = rows.index(row) if year_built is not None else 0
    if k > 0 and year_built - rows[k - 1]["built_before"] < NEAR_BOUNDARY_YEARS:
        # a bridge built just after a boundary of the table may be of the older steel
        # (rolled, or ordered, before it): common practice
        prev = rows[k - 1]
        text += (f" Built within {NEAR_BOUNDARY_YEARS} years of the table's {prev['built_before']}"
                 f" boundary: its steel may be older (Fy = {prev['F_y']:g} ksi before it); "
                 "coupon tests, or the older value, where the rating depends on it.")
    return MaterialDefault(mat, text)


def older_steel(year_built: int | None) -> tuple[Material, int] | None:
    """The steel of the row before a boundary of the steel-by-year table where the bridge was
    built within :data:`NEAR_BOUNDARY_YEARS` after it, with that boundary year; else None.

    MBE Table 6A.6.2.1-1 [value from memory]; the nearness, common practice.
    """
    if year_built is None:
        return None
    t = _table()
    rows = t["steel_by_year"]["rows"]
    for prev in rows[:-1]:
        edge = prev["built_before"]
        if edge is not None and 0 <= year_built - edge < NEAR_BOUNDARY_YEARS:
            mat = Material(MaterialKind.STEEL, F_y=prev["F_y"], F_u=prev["F_u"],
                           E=t["steel"]["E"], unit_weight_pcf=t["steel"]["unit_weight_pcf"],
                           basis=f"default by year, the steel before {edge}", assumed=True)
            return mat, edge
    return None


NEAR_BOUNDARY_YEARS = 3
"""Years after a boundary of the steel-by-year table within which a bridge's steel may be of
the older kind (rolled or ordered before the boundary; common practice)."""
