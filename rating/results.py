"""ONE results object for a rating; the JSON file and the report are views of it.

Values are held in the core units (kip, ft, in, in^2, ksi, tons). Each numeric field carries
metadata: its label, its dimension (for unit conversion at the edge) and, where one applies,
the provision; the JSON view converts to the bridge's declared unit system from that metadata.
Tension positive. Schema: docs/results-schema.md.
"""

from __future__ import annotations

import dataclasses
import functools
import json
import math
import re
from collections.abc import Callable, Iterable, Mapping
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Any

# the RF as printed (two decimals, rounded down), with RT and the posting load worked from
# it: part of the results' contract; the report and the batch summary take it from here
from rating.lrfr.reported import reported_rf as reported_rf
from rating.units import from_core

SCHEMA_VERSION = "1.0"

CLOSURE_FIRST = "Consider closing the bridge"
"""How a recommendation that leads with a closure to consider begins, outright ("Consider
closing the bridge: ...") or until a condition is confirmed (:data:`CLOSING_UNLESS`)."""

CLOSING_UNLESS = CLOSURE_FIRST + " unless "
"""How a recommendation begins whose closure rests on a condition not yet confirmed (a bent
member's acting, say): the closure first, the posting for the case it is confirmed after it
(rating.results_build.recommendation); such a recommendation, like one that begins "Only
if", rests on a condition (rating.batch.BridgeRow.conditional)."""

UNTIL_CONFIRMED = "Until "
"""How a recommendation begins whose lower postings (or withheld permits) apply until a
condition is confirmed, the rating's own outcome following for the case it is
(rating.results_build.recommendation); it rests on a condition
(rating.batch.BridgeRow.conditional)."""

DECISION_NOTE = (" This is a recommendation for the decision of the licensed engineer in "
                 "responsible charge; the owner's manual, policy and local codes govern.")
"""The sentence every bridge recommendation ends with (rating.results_build); the batch index,
whose caution heads the table and whose every page's footer says the same, leaves it out of
its narrow column."""



def bears_on_the_decision(warning: str) -> bool:
    """A warning that bears on the posting decision itself (a member left out of service, a
    bent counter the ratings rest on): the rating engine heads it with words in capitals
    ("OUT OF SERVICE: ..."); the report repeats it in the recommendation box."""
    head, sep, _ = warning.partition(":")
    return bool(sep) and _DECISION_HEAD.fullmatch(head) is not None


_DECISION_HEAD = re.compile(r"[A-Z][A-Z-]*(?: [A-Z][A-Z-]*)+")
"""Two or more words in capitals (a member label such as "L3U4" is one word)."""


# dimension -> (US unit, SI unit)
DISPLAY_UNITS: dict[str, tuple[str, str]] = {
    "force": ("kip", "kN"),
    "length": ("ft", "m"),
    "dimension": ("in", "mm"),
    "area": ("in2", "mm2"),
    "stress": ("ksi", "MPa"),
    "weight": ("ton", "tonne"),
    "line load": ("klf", "kN/m"),
    "moment": ("kip-in", "kN-m"),
}


def q(label: str, dimension: str | None = None, provision: str = "", **kw: Any) -> Any:
    """A field with its label, dimension and provision as metadata."""
    return field(metadata={"label": label, "dimension": dimension, "provision": provision}, **kw)


@dataclass(frozen=True)
class Position:
    """Where the vehicle stands for a critical effect."""

    front_axle_station: float = q("front axle station", "length")
    direction: str = q("direction of travel")  # "forward" (toward +x) or "reverse"
    spacings: tuple[float, ...] = q("axle spacings used", "length", default=())
    axle_stations: tuple[float, ...] = q("axle stations", "length", default=())
    axle_loads: tuple[float, ...] = q("axle loads", "force", default=())
    load_model: str = q("load model", default="")
    lane_segments: tuple[tuple[float, float], ...] = q("lane load segments", "length",
                                                      default=())


@dataclass(frozen=True)
class LiveLoadEffect:
    """Live-load axial force in one truss for one vehicle, after lateral distribution and
    multiple presence. ``max``/``min`` before IM; ``*_with_im`` with IM on axles only."""

    max: float = q("maximum live-load force", "force")
    min: float = q("minimum live-load force", "force")
    max_with_im: float = q("maximum LL+IM", "force")
    min_with_im: float = q("minimum LL+IM", "force")
    distribution_factor: float = q("distribution factor (lanes to one truss)")
    im: float = q("dynamic load allowance", provision="AASHTO LRFD 3.6.2.1")
    max_position: Position | None = None
    min_position: Position | None = None


@dataclass(frozen=True)
class SectionSummary:
    """The governing section after section loss."""

    A_g: float = q("gross area", "area")
    A_n: float = q("net area", "area")
    F_y: float = q("yield strength", "stress")
    F_u: float = q("tensile strength", "stress")
    length: float = q("member length", "length")
    K: float | None = q("effective length factor", provision="AASHTO LRFD 4.6.2.5")
    KL_r: float | None = q("slenderness KL/r used")
    E: float = q("modulus of elasticity", "stress")


@dataclass(frozen=True)
class CheckSummary:
    """One resistance check of a member at its governing location: phi, the nominal resistance
    R_n and the factored resistance phi_c phi_s phi R_n (kip), with the provision, the location
    and the finding there, and the quantities it used (``detail``, words with their units)."""

    name: str
    sense: str  # "tension" | "compression"
    phi: float
    R_n: float = q("nominal resistance", "force")
    factored: float = q("factored resistance phi_c phi_s phi R_n", "force")
    provision: str = ""
    location: str = ""
    finding: str = ""
    detail: str = ""


@dataclass(frozen=True)
class Resistance:
    """Governing factored resistances phi_c * phi_s * phi * R_n (None: not applicable)."""

    tension: float | None = q("factored tension resistance", "force")
    compression: float | None = q("factored compression resistance", "force")
    checks: tuple[CheckSummary, ...] = ()


@dataclass(frozen=True)
class Factors:
    """The factors used in one member rating: gamma_DC, gamma_DW, gamma_LL, the dynamic load
    allowance IM, the resistance factor phi, the condition factor phi_c and the system factor
    phi_s."""

    gamma_dc: float
    gamma_dw: float
    gamma_ll: float
    im: float
    phi: float
    phi_c: float
    phi_s: float


@dataclass(frozen=True)
class Rating:
    """The controlling rating of a member (or pin) for one vehicle."""

    rf: float = q("rating factor", provision="MBE 6A.4.2.1")
    sense: str = ""  # "tension" | "compression" | "pin"
    check: str = ""
    factors: Factors | None = None
    method: str = "linear"  # "linear" | "load multiplier" (tension-only / pins) | "dead load alone"
    position: Position | None = None
    finding: str = ""
    # a member rated on the load path: its factored dead-load force and its LL + IM (with the
    # distribution factor, gamma_LL = 1) in the sense rated, with the tension-only members
    # slack as they are at the rating level; RF = (C - D) / (gamma_LL L)
    dead_at_rating: float | None = q("factored dead-load force at the rating level", "force",
                                     default=None)
    live_at_rating: float | None = q("LL + IM at the rating level (gamma_LL = 1)", "force",
                                     default=None)
    slack_at_rating: tuple[str, ...] = q("tension-only members slack at the rating level",
                                         default=())


@dataclass(frozen=True)
class MemberResult:
    """The results of one truss member: role, end joints, dead-load force in one truss (DC, DW;
    kip), live-load effects, governing section, resistances, warnings, and the controlling
    rating of each vehicle (rating case)."""

    id: str
    role: str
    joints: tuple[str, str]
    tension_only: bool
    dead_load: Mapping[str, float] = q("dead-load force (DC, DW)", "force")
    live_load: Mapping[str, LiveLoadEffect] = field(default_factory=dict)
    section: SectionSummary | None = None
    resistance: Resistance | None = None
    ratings: Mapping[str, Rating] = field(default_factory=dict)
    warnings: tuple[str, ...] = ()


@dataclass(frozen=True)
class PackingRow:
    """One plate on a pin, in order along the pin: the member it belongs to (None: a filler or
    spacer), its thickness and the clear gap before it (in)."""

    member: str | None
    thickness: float = q("plate thickness", "dimension")
    gap_before: float = q("gap before", "dimension")


@dataclass(frozen=True)
class PinResult:
    """The results of one pin: diameter (in), packing, the governing section (in words and as z,
    M, V in the governing case; the plate whose bearing governs, where it does) and the rating
    of each vehicle."""

    joint: str
    diameter: float = q("pin diameter", "dimension")
    packing: tuple[PackingRow, ...] = ()
    governing_section: str = ""
    ratings: Mapping[str, Rating] = field(default_factory=dict)
    warnings: tuple[str, ...] = ()
    governing_z: float | None = q("governing section from the first plate's outer face",
                                  "dimension", default=None)
    governing_M: float | None = q("moment at the governing section", "moment", default=None)
    governing_V: float | None = q("shear at the governing section", "force", default=None)
    governing_case: str = ""
    governing_item: int | None = None  # the packing item (numbered from 1, as in the
    # packing table) whose bearing governs in the governing case; None where flexure and
    # shear govern
    plate_forces: tuple[tuple[float, float], ...] = q(
        "force each packing item puts on the pin at the rating load of the governing case "
        "(horizontal, vertical)", "force", default=())
    mid_pin_force: tuple[float, float] = q(
        "force from outside the bars at mid-pin, where no floorbeam plate takes it "
        "(horizontal, vertical)", "force", default=(0.0, 0.0))


@dataclass(frozen=True)
class JointResult:
    """One joint (panel point) of the truss: coordinates x, y (ft), whether a floorbeam loads it
    (``deck``) and its support ("pin", "roller" or None)."""

    id: str
    x: float = q("x", "length")
    y: float = q("y", "length")
    deck: bool = False
    support: str | None = None


@dataclass(frozen=True)
class VehicleResult:
    """One rating case (a vehicle at a rating level): gross weight (tons), axle loads (kip),
    axle spacings (min, max; ft), lane load (klf), its source and tag, and the gamma_LL and IM
    used."""

    id: str
    name: str
    category: str
    gross_weight: float = q("gross weight", "weight")
    axle_loads: tuple[float, ...] = q("axle loads", "force")
    spacings: tuple[tuple[float, float], ...] = q("axle spacings (min, max)", "length")
    lane_load: float = q("lane load", "line load", default=0.0)
    source: str = ""
    tag: str = ""
    rating_level: str = ""  # inventory / operating / legal
    gamma_ll: float = 0.0
    im: float = 0.0


@dataclass(frozen=True)
class PostingResultEntry:
    """The posting outcome of one vehicle: the controlling RF and member (or pin), the rating
    RT = RF x W and the safe posting load (tons; None unless posted), both worked from the RF
    as printed (rating.lrfr.reported.reported_rf), the action and a note."""

    rf: float = q("controlling rating factor")
    rating_tons: float = q("rating in tons RT = RF x W", "weight")
    posting_tons: float | None = q("safe posting load", "weight",
                                   provision="MBE 6A.8.3, Eq. 6A.8.3-1")
    member: str = ""
    action: str = "none"  # "none" | "post" | "close"
    note: str = ""
    alike: tuple[str, ...] = q("members and pins rated the same within round-off",
                               default=())
    permit: str = ""  # a permit load's verdict ("can be carried", "not as requested", "not
    # over a bridge restricted for legal loads": rating.lrfr.engine.permit_verdict); ""
    # for any other load

    def not_posted_below_one(self, rating_level: str) -> bool:
        """A legal-level load rated below 1.0 (as printed) whose posting is none: a screening
        load (the NRL: FHWA SHV Q&A, March 2014) whose note says why. It reads "not posted",
        never "no restriction"."""
        return (self.action == "none" and rating_level == "legal" and math.isfinite(self.rf)
                and reported_rf(self.rf) < 1.0)


def permit_words(entry: PostingResultEntry) -> str:
    """What a permit load's rating says, in words for tables: its verdict (MBE 6A.4.5 [value
    from memory]; rating.lrfr.engine.permit_verdict). A permit is never posted."""
    return f"permit: {entry.permit}"


EMERGENCY = "emergency"
"""The category of the emergency vehicles (rating.vehicles: VehicleCategory.EMERGENCY)."""


def overall_action(actions: Iterable[tuple[str, str]]) -> str:
    """The bridge's action from each rated vehicle's (action, category): "close" where a truck
    calls for closing; "post" where one is posted, or where an emergency vehicle cannot be
    posted (it is barred, not the bridge closed: rating.results_build.recommendation);
    otherwise "none"."""
    pairs = list(actions)
    if any(a == "close" and c != EMERGENCY for a, c in pairs):
        return "close"
    return "post" if any(a in ("post", "close") for a, _ in pairs) else "none"


@dataclass(frozen=True)
class FindingEcho:
    """An inspection finding used by the rating, echoed as recorded: station along the member
    (ft), remaining thickness (in), percent loss, bar state, condition rating, photo, note and
    workbook place."""

    member: str
    component: str
    region: str
    station: float | None = q("station along member", "length")
    remaining_thickness: float | None = q("remaining thickness", "dimension")
    percent_loss: float | None = None
    bar_state: str = "sound"
    condition_rating: int | None = None
    photo: str = ""
    note: str = ""
    where: str = ""
    estimated: bool = False  # the loss judged by eye, not measured


@dataclass(frozen=True)
class InfluenceLineData:
    """The influence line of a controlling member, for the drawings: its axial force (tension
    positive) for a unit load at each deck panel point (stations, ft)."""

    member: str
    stations: tuple[float, ...] = q("stations", "length")
    ordinates: tuple[float, ...] = q("force per unit load")


@dataclass(frozen=True)
class BridgeSummary:
    """The bridge as the results name it: identification and inspection, truss form and deck
    position, span, panel count, truss spacing and roadway width (ft), and the workbook read."""

    id: str
    name: str
    span: float = q("span", "length")
    location: str = ""
    owner: str = ""
    year_built: int | None = None
    inspection_date: str | None = None
    inspector: str = ""
    form: str = ""
    deck_position: str = ""
    panel_count: int = 0
    truss_spacing: float = q("truss spacing", "length", default=0.0)
    roadway_width: float = q("roadway width", "length", default=0.0)
    source_file: str = ""


@dataclass(frozen=True)
class VehicleChange:
    """One rating case compared with the previous rating of the bridge (rating.previous):
    its controlling RF, member and action then and now. ``rf_before`` None: not rated then."""

    vehicle: str
    rf_before: float | None = q("controlling RF of the previous rating", default=None)
    rf_now: float | None = q("controlling RF now", default=None)
    member_before: str = ""
    member_now: str = ""
    action_before: str = ""  # "none" | "post" | "close" ("" where not rated then)
    action_now: str = ""
    posting_before: float | None = q("safe posting load of the previous rating", "weight",
                                     default=None)
    posting_now: float | None = q("safe posting load now", "weight", default=None)
    change: str = ""  # the words of rating.previous.vehicle_change_words


@dataclass(frozen=True)
class ElementChange:
    """A member or pin whose lowest RF over the cases rated both times moved by more than
    rating.previous.RF_CHANGE since the previous rating, or whose findings changed, with the
    inspection findings on it then and now (in words)."""

    element: str  # member id, or "pin at J"
    case: str  # the case of its lowest RF now
    rf_before: float = q("lowest RF of the previous rating (cases rated both times)")
    rf_now: float = q("lowest RF now (the same cases)")
    findings_before: tuple[str, ...] = ()
    findings_now: tuple[str, ...] = ()
    case_before: str = ""  # the case of its lowest RF then
    moved: bool = True  # its lowest RF moved by more than RF_CHANGE (else listed for its
    # findings alone)
    findings_changed: bool = False  # the findings on it differ between the inspections


@dataclass(frozen=True)
class SincePrevious:
    """This rating compared with an earlier one of the same bridge (``pintruss rate
    --previous``): the file it came from (name only), its inspection date and program, each
    case's change, the members and pins whose ratings moved, and what the reader must know
    to weigh the comparison (``notes``)."""

    file: str
    inspection_date: str | None
    generator: str
    vehicles: tuple[VehicleChange, ...]
    elements: tuple[ElementChange, ...]
    notes: tuple[str, ...] = ()
    headline: str = ""
    out_of_order: bool = False  # the previous inspection is later than this one
    # the trucks' outcome then and now (legal loads other than emergency vehicles): "none",
    # "post" with the single weight limit (the least safe posting load), or "close"
    trucks_before: str = ""
    trucks_now: str = ""
    limit_before: float | None = q("single weight limit for trucks then", "weight",
                                   default=None)
    limit_now: float | None = q("single weight limit for trucks now", "weight", default=None)
    weight_unit_before: str = ""  # the unit the previous rating posted in ("ton", "tonne")
    recommendation_before: str = ""  # the previous rating's recommendation, as it read
    closure_first_before: bool = False  # its recommendation led with a closure to consider
    closure_first_now: bool = False  # this one's does ("Consider closing the bridge ...")


@dataclass(frozen=True)
class RatingResults:
    """Everything one rating of one bridge produced, in core units (see the module docstring):
    the one object that the JSON file and the report are views of."""

    schema_version: str
    bridge: BridgeSummary
    units: Mapping[str, str]
    method: str
    provision_set: str
    joints: tuple[JointResult, ...]
    vehicles: tuple[VehicleResult, ...]
    members: tuple[MemberResult, ...]
    pins: tuple[PinResult, ...]
    posting: Mapping[str, PostingResultEntry]
    recommendation: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    findings: tuple[FindingEcho, ...] = ()
    influence_lines: tuple[InfluenceLineData, ...] = ()
    distribution: Mapping[str, Any] = field(default_factory=dict)
    generator: str = ""
    previous: SincePrevious | None = None  # compared with an earlier rating (--previous)

    @property
    def decision_warnings(self) -> tuple[str, ...]:
        """The warnings that bear on the posting decision (:func:`bears_on_the_decision`)."""
        return tuple(w for w in self.warnings if bears_on_the_decision(w))

    def member(self, member_id: str) -> MemberResult:
        for m in self.members:
            if m.id == member_id:
                return m
        raise KeyError(member_id)


# ------------------------------------------------------------------ JSON view

def _convert(value: Any, dimension: str | None, system: str) -> Any:
    if value is None or dimension is None or system == "US":
        return value
    us, si = DISPLAY_UNITS[dimension]
    if isinstance(value, int | float):
        return from_core(float(value), si) if math.isfinite(value) else value
    if isinstance(value, tuple | list):
        return type(value)(_convert(v, dimension, system) for v in value)
    if isinstance(value, Mapping):
        return {k: _convert(v, dimension, system) for k, v in value.items()}
    return value


def _number(x: float) -> float | str | None:
    """JSON has no infinity: an unbounded RF is written as the string "inf"."""
    if isinstance(x, bool):
        return x
    if isinstance(x, float):
        if math.isinf(x):
            return "inf" if x > 0 else "-inf"
        if math.isnan(x):
            return None
        return round(x, 6) + 0.0
    return x


@functools.cache
def _fields_with_dimensions(cls: type) -> tuple[tuple[str, str | None], ...]:
    return tuple((f.name, f.metadata.get("dimension") if f.metadata else None)
                 for f in dataclasses.fields(cls))


@functools.cache
def dimensions(cls: type) -> Mapping[str, str | None]:
    """Field name -> dimension (``None``: no unit) of a results dataclass."""
    return MappingProxyType(dict(_fields_with_dimensions(cls)))


def to_plain(obj: Any, system: str = "US", dimension: str | None = None) -> Any:
    """Plain JSON-ready data from the results objects, converted to ``system`` units."""
    return _plain(obj, system, dimension, {})


def _plain(obj: Any, system: str, dimension: str | None, seen: dict[int, Any]) -> Any:
    # ``seen``: results objects met before in this call (the same position recurs for many
    # members and cases), by identity; they are immutable, so their plain form is too
    t = type(obj)
    if t is float:
        x = obj if dimension is None or system == "US" else _convert(obj, dimension, system)
        return round(x, 6) + 0.0 if math.isfinite(x) else _number(x)
    if t is int:
        return _number(_convert(obj, dimension, system))
    if t is str or t is bool or obj is None:
        return obj
    if dataclasses.is_dataclass(obj) and not isinstance(obj, type):
        hit = seen.get(id(obj))
        if hit is not None:
            return hit[0]
        out = {name: _plain(getattr(obj, name), system, dim, seen)
               for name, dim in _fields_with_dimensions(t)}
        seen[id(obj)] = (out, obj)
        return out
    if isinstance(obj, Mapping):
        return {str(k): _plain(v, system, dimension, seen) for k, v in obj.items()}
    if isinstance(obj, tuple | list):
        return [_plain(v, system, dimension, seen) for v in obj]
    if isinstance(obj, int | float) and not isinstance(obj, bool):
        return _number(_convert(obj, dimension, system))
    return obj


def results_json(results: RatingResults) -> str:
    """Deterministic JSON text: same results, byte-identical file. Compact (no indentation):
    the file is for programs; ``python -m json.tool`` shows it indented.

    Written in one pass by :class:`_JsonText`, the same text as
    ``json.dumps(to_plain(results, system), separators=(",", ":"), ensure_ascii=False)``
    without building the plain structure first."""
    system = "SI" if results.units.get("force") == "kN" else "US"
    return _JsonText(system).value(results, None) + "\n"


_encode_str = json.encoder.encode_basestring  # the json module's own, ensure_ascii=False


def _dumps(value: Any) -> str:
    return json.dumps(value, separators=(",", ":"), ensure_ascii=False)


def _first_check(annotation: Any) -> str:
    """The type a field's value is tried as first, from its annotation ("float | None" ->
    float); only the order of the tests: every value still takes the branch of its type."""
    text = annotation if isinstance(annotation, str) else getattr(annotation, "__name__", "")
    head = text.split("|")[0].split("[")[0].strip()
    return head if head in ("float", "str", "tuple") else ""


# the text of one field's value, by the type tried first (``v``: the value, ``c``: the number
# cache of its dimension ``d``): the same branches as _JsonText.value, inline
_FIELD_TEXT = {
    "float": "(c{k}.get(v) or num(v, d{k}, c{k})) if v.__class__ is float else val(v, d{k})",
    "str": "(str_get(v) or enc(v)) if v.__class__ is str else val(v, d{k})",
    # a tuple, remembered by identity (results share the tuples of equal positions' parts)
    "tuple": "(h[0] if (h := t{k}.get(id(v))) else seq(v, d{k}, c{k}, t{k})) "
             "if v.__class__ is tuple else val(v, d{k})",
    # a results object, remembered or not (or None, or any other value)
    "": "'null' if v is None else h[0] if (h := memo_get(id(v))) else w(v) "
        "if (w := writer_of(v.__class__)) else val(v, d{k})",
}


# the results objects that recur within one results object (build_results shares equal
# positions and factors): their text is remembered by identity; other objects occur once
_SHARED = frozenset((Position, Factors))


@functools.cache
def _writer_factory(cls: type) -> Callable[..., Callable[[Any], str]]:
    """A function that makes the JSON writer of a results dataclass for one file: one
    generated function per class, field by field (a loop over the fields, tests and joins
    per value, took most of the time of a file). Compiled once per process."""
    names = _fields_with_dimensions(cls)
    first = [_first_check(f.type) for f in dataclasses.fields(cls)]
    shared = cls in _SHARED
    body = ["def write(o):"]
    if shared:
        body += ["    hit = memo_get(id(o))",
                 "    if hit is not None:",
                 "        return hit[0]"]
    for k, (name, _) in enumerate(names):
        body.append(f"    v = o.{name}")
        body.append(f"    s{k} = {_FIELD_TEXT[first[k]].format(k=k)}")
    parts = "".join(f"{{h{k}}}{{s{k}}}" + ("," if k < len(names) - 1 else "")
                    for k in range(len(names)))
    body.append(f"    text = f'{{{{{parts}}}}}'")
    if shared:
        body.append("    memo[id(o)] = (text, o)  # o kept alive with its id")
    body.append("    return text")
    params = ", ".join(["val", "seq", "num", "enc", "str_get", "memo", "memo_get", "writer_of",
                        *(f"h{k}, d{k}, c{k}, t{k}" for k in range(len(names)))])
    source = f"def make({params}):\n" + "\n".join("    " + line for line in body) \
        + "\n    return write\n"
    scope: dict[str, Any] = {}
    exec(compile(source, f"<json writer of {cls.__name__}>", "exec"), scope)
    return scope["make"]


class _JsonText:
    """JSON text of results objects, as :func:`to_plain` + ``json.dumps`` would write it.

    One instance per file. It remembers the text of the results objects that recur (by
    identity: the same position recurs for many members and cases; the objects are
    immutable, so their text is too), of every number and string written (numbers per
    dimension), of tuple fields and each dataclass's writer."""

    def __init__(self, system: str) -> None:
        self.system = system
        self.plain: dict[float, str] = {}  # numbers written as they are
        # numbers of each dimension (converted in SI; in US units all share ``plain``)
        self.numbers: dict[str | None, dict[float, str]] = {None: self.plain}
        self.objects: dict[int, tuple[str, Any]] = {}
        self.writers: dict[type, Callable[[Any], str]] = {}
        # tuples written as fields, by identity, per dimension (all alike in US units)
        self.seqs: dict[str | None, dict[int, tuple[str, Any]]] = {}
        self.strings: dict[str, str] = {}  # the same words recur (checks, senses, models)

    def cache(self, dimension: str | None) -> dict[float, str]:
        c = self.numbers.get(dimension)
        if c is None:
            c = self.numbers[dimension] = self.plain if self.system == "US" else {}
        return c

    def number(self, x: float, dimension: str | None, cache: dict[float, str]) -> str:
        """A float: converted, rounded to 6 decimals; infinities as strings, NaN as null."""
        text = cache.get(x)
        return self.new_number(x, dimension, cache) if text is None else text

    def new_number(self, x: float, dimension: str | None, cache: dict[float, str]) -> str:
        """:meth:`number` for a float not in ``cache`` yet."""
        y = x if dimension is None or self.system == "US" else _convert(x, dimension,
                                                                          self.system)
        if 1e-4 <= abs(y) < 1e8:
            # repr(round(y, 6)) is these 6 decimals without trailing zeros: both round
            # the exact binary value correctly, and a decimal of at most 14 significant
            # digits is the shortest text of its double (DBL_DIG = 15); faster
            text = format(y, ".6f").rstrip("0")
            if text[-1] == ".":
                text += "0"
        elif math.isfinite(y):
            text = float.__repr__(round(y, 6) + 0.0)
        else:
            text = _dumps(_number(y))
        if x == x:  # NaN is never found again: not kept
            cache[x] = text
        return text

    def string(self, text: str) -> str:
        """A string's JSON text, remembered."""
        out = self.strings[text] = _encode_str(text)
        return out

    def seq(self, obj: tuple[Any, ...], dimension: str | None, cache: dict[float, str],
            memo: dict[int, tuple[str, Any]]) -> str:
        """A tuple field's text, remembered in ``memo`` (obj kept alive with its id)."""
        text = self.items(obj, dimension, cache)
        memo[id(obj)] = (text, obj)
        return text

    def items(self, obj: Any, dimension: str | None,
              cache: dict[float, str] | None = None) -> str:
        if cache is None:
            cache = self.cache(dimension)
        number, value = self.new_number, self.value
        return "[" + ",".join([cache.get(v) or number(v, dimension, cache)
                               if v.__class__ is float else value(v, dimension)
                               for v in obj]) + "]"

    def writer(self, cls: type) -> Callable[[Any], str]:
        """The writer of a dataclass for this file (its number caches, its objects)."""
        objects = self.objects
        args: list[Any] = [self.value, self.seq, self.new_number, self.string,
                           self.strings.get, objects, objects.get, self.writers.get]
        for name, dim in _fields_with_dimensions(cls):
            seqs = self.seqs.setdefault(None if self.system == "US" else dim, {})
            args += [_encode_str(name) + ":", dim, self.cache(dim), seqs]
        w = self.writers[cls] = _writer_factory(cls)(*args)
        return w

    def mapping(self, obj: Mapping[Any, Any], dimension: str | None) -> str:
        plain = {str(k): v for k, v in obj.items()}
        value, known, string = self.value, self.strings.get, self.string
        return "{" + ",".join([(known(k) or string(k)) + ":" + value(v, dimension)
                               for k, v in plain.items()]) + "}"

    def value(self, obj: Any, dimension: str | None) -> str:
        t = type(obj)
        w = self.writers.get(t)
        if w is not None:
            return w(obj)
        if t is float:
            return self.number(obj, dimension, self.cache(dimension))
        if t is str:
            return self.strings.get(obj) or self.string(obj)
        if obj is None:
            return "null"
        if t is tuple or t is list:
            return self.items(obj, dimension)
        if t is bool:
            return "true" if obj else "false"
        if t is dict:
            return self.mapping(obj, dimension)
        if dataclasses.is_dataclass(obj) and not isinstance(obj, type):
            return self.writer(t)(obj)
        if isinstance(obj, Mapping):
            return self.mapping(obj, dimension)
        if isinstance(obj, tuple | list):
            return self.items(obj, dimension)
        if isinstance(obj, int | float):
            return _dumps(_number(_convert(obj, dimension, self.system)))
        return _dumps(obj)


def units_block(system: str) -> dict[str, str]:
    k = 1 if system == "SI" else 0
    return {name: pair[k] for name, pair in DISPLAY_UNITS.items()}
