"""Load factors and dynamic load allowance for LRFR, as data with sources.

Every factor returned is a :class:`Factor` carrying its value, source and how sure we are of
it, so the results and the report can list it.
"""

from __future__ import annotations

import json
from collections.abc import Mapping
from dataclasses import dataclass
from enum import StrEnum
from functools import lru_cache
from importlib import resources

import numpy as np
from numpy.typing import ArrayLike

from rating.errors import InputError
from rating.model import RidingSurface, VehicleCategory


class RatingLevel(StrEnum):
    INVENTORY = "inventory"
    OPERATING = "operating"
    LEGAL = "legal"
    PERMIT = "permit"


@dataclass(frozen=True)
class Factor:
    """A load factor or dynamic load allowance: its symbol and value, the source it comes from
    and how sure we are of it (tag), so the results and the report can list it."""

    symbol: str
    value: float
    source: str
    tag: str

    def describe(self) -> str:
        return f"{self.symbol} = {self.value:g}: {self.source} ({self.tag})"


@lru_cache(maxsize=1)
def provisions() -> dict:
    return json.loads(resources.files("rating.lrfr").joinpath("provisions.json").read_text())


def provision_set_names() -> tuple[str, ...]:
    return tuple(provisions()["legal_sets"])


def dead_load_factors(wearing_surface_measured: bool = False) -> dict[str, Factor]:
    """Maximum and minimum dead-load factors; with the wearing surface's thickness field
    measured, also the maximum factor of the wearing surface (``gamma_dw_surface_max``; the
    rest of DW, the utilities, keeps ``gamma_dw_max``: see :func:`factored_dw`).

    AASHTO LRFD Table 3.4.1-2 [V]; gamma_DW = 1.25 for a measured wearing surface, MBE
    6A.4.2.2 [value from memory].
    """
    d = provisions()["dead_load"]
    src, tag = d["source"], d["tag"]
    out = {
        "gamma_dc_max": Factor("gamma_DC (max)", d["gamma_DC_max"], src, tag),
        "gamma_dc_min": Factor("gamma_DC (min)", d["gamma_DC_min"], src, tag),
        "gamma_dw_max": Factor("gamma_DW (max)", d["gamma_DW_max"], src, tag),
        "gamma_dw_min": Factor("gamma_DW (min)", d["gamma_DW_min"], src, tag),
    }
    if wearing_surface_measured:
        out["gamma_dw_surface_max"] = Factor(
            "gamma_DW (max, wearing surface of measured thickness)", d["gamma_DW_measured"],
            d["measured_source"], d["measured_tag"])
    return out


def factored_dw(dw: ArrayLike, dw_surface: ArrayLike, dead: Mapping[str, Factor],
                bound: str | None = None) -> np.ndarray | float:
    """gamma_DW x DW with the wearing surface and the rest of DW (utilities) factored apart:
    the surface by ``gamma_dw_surface_max`` where its thickness was measured (MBE 6A.4.2.2
    [value from memory]), the rest by ``gamma_dw_max``; each part takes its maximum factor
    where it adds to the effect (is positive) and the minimum where it relieves it
    (AASHTO LRFD 3.4.1, Table 3.4.1-2 [V]), or the ``bound`` ("max" or "min") given.
    ``dw`` is the whole DW, ``dw_surface`` the part of it that is the wearing surface."""
    dw = np.asarray(dw, dtype=float)
    surf = np.asarray(dw_surface, dtype=float)
    rest = dw - surf
    g_max = dead["gamma_dw_max"].value
    g_surf = dead.get("gamma_dw_surface_max", dead["gamma_dw_max"]).value
    g_min = dead["gamma_dw_min"].value
    if bound == "max":
        out = g_max * rest + g_surf * surf
    elif bound == "min":
        out = g_min * dw
    else:
        out = (np.where(rest > 0, g_max, g_min) * rest
               + np.where(surf > 0, g_surf, g_min) * surf)
    return out if out.ndim else float(out)


def legal_live_load_factor(adtt_one_direction: float | None,
                           provision_set: str = "MBE 2018") -> Factor:
    """Generalized live load factor for legal loads by ADTT, linear between the tabulated ADTT.

    MBE Table 6A.4.4.2.3a-1 (edition chosen by ``provision_set``). [value from memory]
    """
    sets = provisions()["legal_sets"]
    if provision_set not in sets:
        raise InputError(f"unknown provision set {provision_set!r}; known: "
                         + ", ".join(sets))
    s = sets[provision_set]
    if adtt_one_direction is None:
        return Factor("gamma_LL", s["unknown"], s["source"] + "; ADTT unknown",
                      s["tag"])
    if adtt_one_direction < 0:
        raise InputError(f"ADTT {adtt_one_direction} cannot be negative")
    x, y = zip(*s["points"], strict=True)
    value = float(np.interp(adtt_one_direction, x, y))
    return Factor("gamma_LL", round(value, 4),
                  f"{s['source']}; ADTT = {adtt_one_direction:g}", s["tag"])


def permit_live_load_factor(category: VehicleCategory, adtt_one_direction: float | None,
                            weight_ratio_kip_per_ft: float) -> Factor:
    """Live load factor of a permit load by permit type, ADTT in one direction (linear between
    the tabulated ADTT; unknown ADTT takes the largest) and, for a routine permit, the permit
    weight ratio GVW / AL (gross weight over the distance from the first axle to the last,
    kip/ft; up to 2.0, between 2.0 and 3.0, 3.0 and over).

    MBE Table 6A.4.5.4.2a-1 [value from memory, uncertain].
    """
    d = provisions()["permit"]
    row = d[category.value]
    src, tag = d["source"], d["tag"]
    if "value" in row:
        return Factor("gamma_LL", row["value"], f"{src}; {category.value}: {row['lanes']}", tag)
    if adtt_one_direction is not None and adtt_one_direction < 0:
        raise InputError(f"ADTT {adtt_one_direction} cannot be negative")
    col = None
    words = f"{category.value}: {row['lanes']}"
    if "ratio_columns_kip_per_ft" in row:
        lo, hi = row["ratio_columns_kip_per_ft"]
        r = weight_ratio_kip_per_ft
        col = 0 if r <= lo else 1 if r < hi else 2
        words += (f"; GVW/AL = {r:.2f} kip/ft ("
                  + ("up to", "between", "at least")[col] + " "
                  + (f"{lo:g}", f"{lo:g} and {hi:g}", f"{hi:g}")[col] + ")")
    if adtt_one_direction is None:
        value = row["unknown"] if col is None else row["unknown"][col]
        return Factor("gamma_LL", value, f"{src}; {words}; ADTT unknown", tag)
    x = [pt[0] for pt in row["points"]]
    y = [pt[1] if col is None else pt[1][col] for pt in row["points"]]
    value = float(np.interp(adtt_one_direction, x, y))
    return Factor("gamma_LL", round(value, 4),
                  f"{src}; {words}; ADTT = {adtt_one_direction:g} (linear between the ADTT "
                  "values)", tag)


def live_load_factor(category: VehicleCategory, level: RatingLevel,
                     adtt_one_direction: float | None = None,
                     provision_set: str = "MBE 2018",
                     override: float | None = None,
                     weight_ratio_kip_per_ft: float = 0.0) -> Factor:
    """Live load factor gamma_LL for a vehicle category and rating level.

    Design load: AASHTO LRFD Table 3.4.1-1 Strength I (inventory) [V]; MBE Table 6A.4.2.2-1
    (operating) [value from memory]. Legal, specialized hauling and owner vehicles: the legal
    load factors [value from memory]. Emergency vehicles: MBE 6A.4.4.2.3 [value from memory].
    Permits: MBE Table 6A.4.5.4.2a-1 (:func:`permit_live_load_factor`) [value from memory].
    """
    if override is not None:
        if not 0.5 <= override <= 3.0:
            raise InputError(f"live load factor override {override} is outside 0.5..3.0")
        return Factor("gamma_LL", override, "owner override", "owner's value")
    if category.is_permit:
        return permit_live_load_factor(category, adtt_one_direction, weight_ratio_kip_per_ft)
    p = provisions()
    if category is VehicleCategory.DESIGN:
        d = p["design"]
        key = "inventory" if level is RatingLevel.INVENTORY else "operating"
        return Factor("gamma_LL", d[key], d[f"{key}_source"], d[f"{key}_tag"])
    if category is VehicleCategory.EMERGENCY:
        e = p["emergency"]
        return Factor("gamma_LL", e["gamma_LL"], e["source"], e["tag"])
    return legal_live_load_factor(adtt_one_direction, provision_set)


def dynamic_load_allowance(category: VehicleCategory,
                           riding_surface: RidingSurface | None = None,
                           override: float | None = None) -> Factor:
    """IM on axle loads (never on lane loads).

    AASHTO LRFD 3.6.2.1 (33%) [value from memory]; reduced legal-load IM by riding surface,
    MBE C6A.4.4.3 [value from memory].
    """
    if override is not None:
        if not 0.0 <= override <= 1.0:
            raise InputError(f"dynamic load allowance override {override} is outside 0..1")
        return Factor("IM", override, "owner override", "owner's value")
    im = provisions()["impact"]
    if category is not VehicleCategory.DESIGN and riding_surface is not None:
        return Factor("IM", im["reduced"][riding_surface.value],
                      f"{im['reduced_source']}; riding surface: {riding_surface.value}",
                      im["reduced_tag"])
    return Factor("IM", im["IM"], im["source"], im["tag"])
