"""The rating-vehicle library: the shipped vehicles as data, owner vehicles, rating loads.

A :class:`~rating.model.vehicles.Vehicle` is the unit an owner defines (axles, spacings, an
optional lane load). A :class:`RatingLoad` is what gets rated: one or more :class:`LoadModel`
alternatives whose larger effect governs member by member, e.g. HL-93 = the larger of
(design truck + design lane) and (design tandem + design lane). Every vehicle, shipped or
owner-defined, can be wrapped as a rating load with :func:`as_rating_load`.

The shipped data live in ``vehicles.json`` beside this module (loaded with importlib.resources,
so they work from an installed wheel). Each entry names its source and how sure we are of it.
"""

from __future__ import annotations

import json
import math
from collections.abc import Sequence
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

from rating.errors import InputError
from rating.model.vehicles import AxleSpacing, Vehicle, VehicleCategory
from rating.units import core_unit_of, known_units, to_core

DATA_FILE = "vehicles.json"


@dataclass(frozen=True)
class LoadModel:
    """One way to apply a rating load: a vehicle's axles (IM applies) plus a lane load (no IM).

    ``axles`` is ``None`` for a lane load alone. ``lane_load_klf`` is the uniform load placed on
    every segment of the influence line that adds to the effect. With
    ``neglect_opposing_axles`` an axle standing where the line has the opposite sign is left
    off (AASHTO LRFD 3.6.1.3.1 for the design vehicles).
    """

    name: str
    axles: Vehicle | None
    lane_load_klf: float = 0.0
    neglect_opposing_axles: bool = False

    @property
    def vehicle_id(self) -> str:
        return self.axles.id if self.axles is not None else ""

    @property
    def axle_count(self) -> int:
        return 0 if self.axles is None else self.axles.axle_count


@dataclass(frozen=True)
class RatingLoad:
    """A load that gets a rating factor: the governing of its ``models``, member by member.

    ``gross_weight_tons`` is W for the rating in tons and posting. ``min_span_ft``: the load
    applies only to spans longer than this (the lane-type legal load).
    """

    id: str
    name: str
    category: VehicleCategory
    models: tuple[LoadModel, ...]
    gross_weight_tons: float
    min_span_ft: float | None = None
    source: str = ""
    tag: str = ""
    gamma_ll: float | None = None  # the owner's live-load factor for it (None: by category)
    im: float | None = None  # the owner's dynamic load allowance for it (None: as settings)
    wheel_gauge_ft: float | None = None  # its own wheel gauge (None: 6 ft)

    @property
    def weight_ratio_kip_per_ft(self) -> float:
        """The permit weight ratio GVW / AL: gross weight (kip) over the distance from the
        first axle to the last at the longest spacings (ft) of its first vehicle; inf for one
        axle (MBE Table 6A.4.5.4.2a-1 [value from memory])."""
        axles = next((m.axles for m in self.models if m.axles is not None), None)
        length = axles.axle_length_ft if axles is not None else 0.0
        return 2.0 * self.gross_weight_tons / length if length > 0 else math.inf

    def applies_to(self, span_ft: float) -> bool:
        """True when the load is to be rated on a span of ``span_ft`` (compared to a millionth
        of a foot: an SI span is a converted number, and 60.96 m is 200 ft exactly)."""
        return self.min_span_ft is None or round(span_ft, 6) > self.min_span_ft


# ---------------------------------------------------------------------------------------------
# the shipped data


def _vehicle_from_record(rec: dict, where: str) -> Vehicle:
    return make_vehicle(
        id=rec["id"],
        name=rec["name"],
        category=VehicleCategory(rec["category"]),
        axle_loads=rec["axle_loads_kip"],
        spacings=[tuple(s) for s in rec["spacings_ft"]],
        gross_weight=rec["gross_weight_tons"],
        lane_load=rec.get("lane_load_klf", 0.0),
        axle_scale=rec.get("axle_scale", 1.0),
        min_span=rec.get("min_span_ft"),
        source=rec.get("source", ""),
        tag=rec.get("tag", ""),
        where=where,
    )


@lru_cache(maxsize=1)
def _data() -> tuple[tuple[Vehicle, ...], tuple[RatingLoad, ...]]:
    text = resources.files("rating.vehicles").joinpath(DATA_FILE).read_text(encoding="utf-8")
    raw = json.loads(text)
    vehicles = tuple(_vehicle_from_record(r, f"{DATA_FILE}:{r['id']}") for r in raw["vehicles"])
    by_id = {v.id: v for v in vehicles}
    loads = []
    for r in raw["rating_loads"]:
        models = []
        for m in r["models"]:
            axles = by_id[m["axles"]] if m.get("axles") else None
            lane = by_id[m["lane"]].lane_load_klf if m.get("lane") else 0.0
            if axles is not None:
                lane += axles.lane_load_klf
            models.append(LoadModel(m["name"], axles, lane,
                                    bool(m.get("neglect_opposing_axles", False))))
        loads.append(RatingLoad(r["id"], r["name"], VehicleCategory(r["category"]),
                                tuple(models), float(r["gross_weight_tons"]),
                                r.get("min_span_ft"), r.get("source", ""), r.get("tag", "")))
    return vehicles, tuple(loads)


def library() -> tuple[Vehicle, ...]:
    """Every shipped vehicle, in the order of the data file."""
    return _data()[0]


def vehicle(vehicle_id: str) -> Vehicle:
    """A shipped vehicle by id (case-insensitive); InputError naming the known ids if absent."""
    for v in library():
        if v.id.casefold() == vehicle_id.strip().casefold():
            return v
    known = ", ".join(v.id for v in library())
    raise InputError(f"no rating vehicle with id {vehicle_id!r}; the library has: {known}")


def rating_loads() -> tuple[RatingLoad, ...]:
    """The library's rating loads: HL-93 first, then every shipped vehicle except the HL-93
    components, each as its own rating load."""
    vehicles, combos = _data()
    parts = {m.vehicle_id for c in combos for m in c.models}
    parts |= {v.id for v in vehicles if v.category is VehicleCategory.DESIGN}
    return combos + tuple(as_rating_load(v) for v in vehicles if v.id not in parts)


def rating_load(load_id: str, owner_vehicles: Sequence[Vehicle] = ()) -> RatingLoad:
    """A rating load by id: a shipped combination (``HL-93``), any shipped vehicle, or one of
    ``owner_vehicles`` (owner ids take precedence so an owner can redefine a shipped one)."""
    key = load_id.strip().casefold()
    for v in owner_vehicles:
        if v.id.casefold() == key:
            return as_rating_load(v)
    for c in _data()[1]:
        if c.id.casefold() == key:
            return c
    for v in library():
        if v.id.casefold() == key:
            return as_rating_load(v)
    for level in ("-inv", "-opr"):  # a design load's case id, as the results name it
        if key.endswith(level):
            for c in _data()[1]:
                if c.id.casefold() == key.removesuffix(level) and \
                        c.category is VehicleCategory.DESIGN:
                    return c  # (both levels are rated: they share the load's search)
    known = ", ".join([c.id for c in _data()[1]] + [v.id for v in library()]
                      + [v.id for v in owner_vehicles])
    raise InputError(f"no rating load or vehicle with id {load_id!r}; known: {known}")


def known_ids() -> frozenset[str]:
    """Every id :func:`rating_load` takes without the owner's vehicles, case-folded: the
    shipped loads, their design cases (``hl-93-inv``, ``hl-93-opr``) and the vehicles."""
    loads = _data()[1]
    return frozenset([c.id.casefold() for c in loads]
                     + [f"{c.id.casefold()}{level}" for c in loads
                        if c.category is VehicleCategory.DESIGN for level in ("-inv", "-opr")]
                     + [v.id.casefold() for v in library()])


def as_rating_load(v: Vehicle, *, neglect_opposing_axles: bool = False) -> RatingLoad:
    """Wrap one vehicle (its axles and its own lane load) as a rating load with one model."""
    axles = v if v.axle_count else None
    model = LoadModel(v.name, axles, v.lane_load_klf, neglect_opposing_axles)
    return RatingLoad(v.id, v.name, v.category, (model,), v.gross_weight_tons, v.min_span_ft,
                      v.source, v.tag, v.gamma_ll, v.im, v.wheel_gauge_ft)


# ---------------------------------------------------------------------------------------------
# owner vehicles


def _unit_factor(unit: str, core: str, what: str, where: str) -> float:
    if unit not in known_units() or core_unit_of(unit) != core:
        ok = ", ".join(u for u in known_units() if core_unit_of(u) == core)
        raise InputError(f"{what} unit {unit!r} is not understood; use one of: {ok}", where)
    return to_core(1.0, unit)


def _number(x: object, what: str, where: str) -> float:
    try:
        val = float(x)  # type: ignore[arg-type]
    except (TypeError, ValueError):
        raise InputError(f"{what} is {x!r}, which is not a number", where) from None
    if not math.isfinite(val):
        raise InputError(f"{what} is {x!r}, which is not a finite number", where)
    return val


def make_vehicle(
    id: str,
    name: str,
    axle_loads: Sequence[float],
    spacings: Sequence[float | tuple[float, float]],
    gross_weight: float | None = None,
    *,
    category: VehicleCategory = VehicleCategory.OWNER,
    lane_load: float = 0.0,
    axle_scale: float = 1.0,
    min_span: float | None = None,
    force_unit: str = "kip",
    length_unit: str = "ft",
    weight_unit: str = "ton",
    line_load_unit: str = "klf",
    source: str = "",
    tag: str = "",
    where: str = "",
    gamma_ll: float | None = None,
    im: float | None = None,
) -> Vehicle:
    """Build and check a vehicle; owner vehicles from the workbook come through here.

    Axle loads front to rear; one spacing per gap, a number or a ``(min, max)`` range. SI is
    accepted through ``rating.units`` (e.g. ``force_unit="kN", length_unit="m",
    weight_unit="tonne", line_load_unit="kN/m"``). ``gross_weight`` defaults to the sum of the
    axles. ``gamma_ll``: the owner's live-load factor for the vehicle; ``im`` its dynamic load
    allowance (a fraction). Every problem raises InputError naming the vehicle and ``where``
    (its Sheet!Cell).
    """
    label = f"vehicle {id!r}" if id else "a vehicle"
    if not str(id).strip():
        raise InputError("a vehicle has no id", where)
    kf = _unit_factor(force_unit, "kip", f"{label}: axle load", where)
    lf = _unit_factor(length_unit, "ft", f"{label}: spacing", where)
    wf = _unit_factor(weight_unit, "ton", f"{label}: gross weight", where)
    qf = _unit_factor(line_load_unit, "klf", f"{label}: lane load", where)
    loads = tuple(_number(p, f"{label}: axle {i + 1} load", where) * kf
                  for i, p in enumerate(axle_loads))
    for i, p in enumerate(loads):
        if p <= 0:
            raise InputError(f"{label}: axle {i + 1} load must be positive, got {p:g} kip", where)
    lane = _number(lane_load, f"{label}: lane load", where) * qf
    if lane < 0:
        raise InputError(f"{label}: lane load must not be negative", where)
    if not loads and lane == 0:
        raise InputError(f"{label} has neither axles nor a lane load", where)
    n_gaps = max(len(loads) - 1, 0)
    if len(spacings) != n_gaps:
        raise InputError(f"{label} has {len(loads)} axles, so it needs {n_gaps} spacings; "
                         f"{len(spacings)} were given", where)
    gaps = []
    for i, s in enumerate(spacings):
        what = f"{label}: spacing {i + 1} (axle {i + 1} to {i + 2})"
        if isinstance(s, (tuple, list)):
            if len(s) != 2:
                raise InputError(f"{what} must be a number or a (min, max) pair", where)
            lo, hi = (_number(s[0], what, where) * lf, _number(s[1], what, where) * lf)
        else:
            lo = hi = _number(s, what, where) * lf
        if lo < 0 or hi < lo:
            raise InputError(f"{what} must satisfy 0 <= min <= max, got {lo:g} to {hi:g} ft",
                             where)
        gaps.append(AxleSpacing(lo, hi))
    scale = _number(axle_scale, f"{label}: axle scale", where)
    if scale <= 0:
        raise InputError(f"{label}: axle scale must be positive", where)
    if gross_weight is None:
        w_tons = sum(loads) / 2.0  # kip -> short tons (2 kip per ton)
    else:
        w_tons = _number(gross_weight, f"{label}: gross weight", where) * wf
    if w_tons < 0 or (loads and w_tons == 0):
        raise InputError(f"{label}: gross weight must be positive", where)
    span = None if min_span is None else _number(min_span, f"{label}: min span", where) * lf
    if gamma_ll is not None:
        gamma_ll = _number(gamma_ll, f"{label}: live-load factor", where)
        if not 0.5 <= gamma_ll <= 3.0:
            raise InputError(f"{label}: live-load factor {gamma_ll:g} is outside 0.5 to 3.0",
                             where)
    if im is not None:
        im = _number(im, f"{label}: dynamic load allowance", where)
        if not 0.0 <= im <= 1.0:
            raise InputError(f"{label}: dynamic load allowance {im:g} is outside 0 to 1",
                             where)
    return Vehicle(id=str(id).strip(), name=str(name).strip() or str(id).strip(),
                   category=category, axle_loads_kip=loads, spacings=tuple(gaps),
                   gross_weight_tons=w_tons, lane_load_klf=lane, axle_scale=scale,
                   min_span_ft=span, source=source, tag=tag, where=where, gamma_ll=gamma_ll,
                   im=im)


def owner_vehicle(
    id: str,
    name: str,
    axle_loads: Sequence[float],
    spacings: Sequence[float | tuple[float, float]],
    gross_weight: float | None = None,
    **kwargs: object,
) -> Vehicle:
    """An owner-defined vehicle (category OWNER); same checks and units as :func:`make_vehicle`."""
    kwargs.setdefault("category", VehicleCategory.OWNER)
    kwargs.setdefault("source", "owner-defined vehicle")
    kwargs.setdefault("tag", "owner's data")
    return make_vehicle(id, name, axle_loads, spacings, gross_weight, **kwargs)  # type: ignore[arg-type]
