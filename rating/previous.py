"""An earlier rating of the same bridge, read from its results file, and this rating compared
with it: what changed since the previous inspection (rating.results.SincePrevious).

The engineer re-rates after every inspection, and the owner's first question is what changed
and why: which postings moved, which members and pins rate lower, and the findings behind
them. The previous rating is read from the results file (``*.rating.json``) that pintruss
wrote then, in whichever unit system it was written; nothing in it is trusted without a
check, and every problem names the file and the place in it (``posting.TYPE-3.rf``).

Sits between the results and the report: it reads rating.results and rating.units only.
"""

from __future__ import annotations

import dataclasses
import datetime as dt
import json
import math
import re
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from rating.errors import InputError
from rating.results import (
    CLOSURE_FIRST,
    DISPLAY_UNITS,
    EMERGENCY,
    ElementChange,
    RatingResults,
    SincePrevious,
    VehicleChange,
    reported_rf,
    to_plain,
)
from rating.units import from_core, to_core

RF_CHANGE = 0.02
"""A member's or pin's lowest RF has moved since the previous rating where it differs from the
previous one by more than this fraction of it. RFs are printed to two decimals, so a smaller
move is round-off at the printed scale or the program's own refinements between versions,
not a change of the bridge: a threshold of judgement (common practice for a screen)."""

_ACTION_RANK = {"none": 0, "post": 1, "close": 2}


@dataclass(frozen=True)
class PreviousCase:
    """One rating case of the previous rating: its controlling RF, member, action, safe
    posting load (tons, core units; None unless posted) and a permit's verdict."""

    rf: float
    member: str
    action: str
    posting_tons: float | None
    permit: str = ""
    alike: tuple[str, ...] = ()  # members and pins rated the same (a symmetric truss's mirror)


@dataclass(frozen=True)
class PreviousRating:
    """What this rating is compared with, from an earlier results file, in core units."""

    file: str  # the file's name (not its folder: the results stay the same wherever it lies)
    bridge_id: str
    inspection_date: str | None
    generator: str
    method: str
    provision_set: str
    system: str  # "US" or "SI": the units it was written in
    weight_unit: str  # the unit its posting loads were posted in ("ton" or "tonne")
    cases: Mapping[str, PreviousCase]
    elements: Mapping[str, Mapping[str, float]]  # member id or "pin at J" -> case -> RF
    findings: tuple[Mapping[str, Any], ...]  # the findings echo, as written (its units)
    recommendation: str = ""  # its recommendation, as it read


# ------------------------------------------------------------------ reading the file


class _Reader:
    """Typed look-ups in a results file, each failure an InputError naming the file and the
    place in it."""

    def __init__(self, path: Path) -> None:
        self.path = path

    def fail(self, where: str, message: str) -> InputError:
        place = f" at {where}" if where else ""
        return InputError(f"the previous results file{place}: {message}", where=str(self.path))

    def obj(self, parent: Mapping[str, Any], key: str, where: str) -> Mapping[str, Any]:
        value = parent.get(key) if isinstance(parent, Mapping) else None
        if not isinstance(value, Mapping):
            raise self.fail(_join(where, key), "expected an object "
                            f"{'but it is missing' if value is None else 'here'}")
        return value

    def items(self, parent: Mapping[str, Any], key: str, where: str, optional: bool = False
              ) -> list[Any]:
        value = parent.get(key)
        if value is None and optional:
            return []
        if not isinstance(value, list):
            raise self.fail(_join(where, key), "expected a list "
                            f"{'but it is missing' if value is None else 'here'}")
        return value

    def text(self, parent: Mapping[str, Any], key: str, where: str, optional: bool = False
             ) -> str | None:
        value = parent.get(key)
        if value is None and optional:
            return None
        if not isinstance(value, str):
            raise self.fail(_join(where, key), "expected text "
                            f"{'but it is missing' if value is None else f'not {value!r}'}")
        return value

    def rf(self, parent: Mapping[str, Any], key: str, where: str) -> float:
        """A rating factor: a number, "inf" or "-inf" as the results file writes them (null,
        a NaN, is read as no rating: inf)."""
        value = parent.get(key, "missing")
        if value is None:
            return math.inf
        if isinstance(value, str) and value in ("inf", "-inf"):
            return float(value)
        if isinstance(value, bool) or not isinstance(value, int | float) \
                or not math.isfinite(value):
            raise self.fail(_join(where, key), f"expected a rating factor, not {value!r} "
                            "(results files write a number, \"inf\" or \"-inf\")")
        return float(value)

    def number(self, parent: Mapping[str, Any], key: str, where: str) -> float | None:
        """A finite number, or None where it is null or missing."""
        value = parent.get(key)
        if value is None:
            return None
        if isinstance(value, bool) or not isinstance(value, int | float) \
                or not math.isfinite(value):
            raise self.fail(_join(where, key), f"expected a number, not {value!r}")
        return float(value)


def _join(where: str, key: str) -> str:
    return f"{where}.{key}" if where else key


def read_previous(path: Path) -> PreviousRating:
    """The previous rating of a bridge from the results file pintruss wrote for it (any unit
    system). Raises InputError, naming the file and the place in it, for a file that cannot be
    read or is not such a results file."""
    path = Path(path)
    r = _Reader(path)
    try:
        raw = path.read_bytes()
    except FileNotFoundError:
        raise r.fail("", "there is no such file") from None
    except IsADirectoryError:
        raise r.fail("", "it is a folder, not a results file") from None
    except OSError as exc:
        raise r.fail("", f"it cannot be read ({exc.strerror or exc})") from None
    if raw.startswith(b"PK\x03\x04"):  # (the zip container of .xlsx files)
        raise r.fail("", "it is a workbook (or another zip file), not a results file: give "
                     "the previous rating's *.rating.json")
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise r.fail("", "it is not a results file written by pintruss: not UTF-8 "
                     "text") from None
    try:
        data = json.loads(text)
    except json.JSONDecodeError as exc:
        raise r.fail("", f"it is not a results file written by pintruss: not valid JSON "
                     f"(line {exc.lineno}, column {exc.colno}: {exc.msg})") from None
    except RecursionError:  # (lists or objects nested thousands deep)
        raise r.fail("", "it is not a results file written by pintruss: nested too "
                     "deep") from None
    if not isinstance(data, dict) or "schema_version" not in data or "posting" not in data:
        raise r.fail("", "it is not a results file written by pintruss (*.rating.json): "
                     "it has no schema_version or no posting")
    version = r.text(data, "schema_version", "")
    if str(version).split(".")[0] != "1":
        raise r.fail("schema_version", f"written in results schema {version}; this pintruss "
                     "reads schema 1")
    units = r.obj(data, "units", "")
    weight_unit = r.text(units, "weight", "units") or ""
    if weight_unit not in DISPLAY_UNITS["weight"]:
        raise r.fail("units.weight", f"unknown weight unit {weight_unit!r}")
    bridge = r.obj(data, "bridge", "")
    cases = {}
    for case, entry in r.obj(data, "posting", "").items():
        where = f"posting.{case}"
        if not isinstance(entry, Mapping):
            raise r.fail(where, "expected an object here")
        posting = r.number(entry, "posting_tons", where)
        action = r.text(entry, "action", where) or ""
        if action not in _ACTION_RANK:
            raise r.fail(_join(where, "action"), f"unknown action {action!r}")
        if action == "post" and posting is None:
            raise r.fail(_join(where, "posting_tons"), "the action is post but no safe "
                         "posting load is given")
        alike = r.items(entry, "alike", where, optional=True)
        cases[case] = PreviousCase(
            r.rf(entry, "rf", where), r.text(entry, "member", where) or "", action,
            None if posting is None else to_core(posting, weight_unit),
            r.text(entry, "permit", where, optional=True) or "",
            tuple(a for a in alike if isinstance(a, str)))
    elements: dict[str, dict[str, float]] = {}
    for kind, key, label in (("members", "id", "{}"), ("pins", "joint", "pin at {}")):
        for i, item in enumerate(r.items(data, kind, "")):
            where = f"{kind}[{i}]"
            if not isinstance(item, Mapping):
                raise r.fail(where, "expected an object here")
            name = label.format(r.text(item, key, where))
            ratings = r.obj(item, "ratings", where)
            elements[name] = {case: r.rf(rating, "rf", f"{where}.ratings.{case}")
                              for case, rating in ratings.items()
                              if isinstance(rating, Mapping)}
    findings = []
    for i, f in enumerate(r.items(data, "findings", "", optional=True)):
        where = f"findings[{i}]"
        if not isinstance(f, Mapping):
            raise r.fail(where, "expected an object here")
        for key in ("member", "component", "region", "bar_state"):
            if f.get(key) is not None:
                r.text(f, key, where)
        for key in ("station", "remaining_thickness", "percent_loss"):
            r.number(f, key, where)
        cr = f.get("condition_rating")
        if cr is not None and (isinstance(cr, bool) or not isinstance(cr, int)):
            raise r.fail(_join(where, "condition_rating"), f"expected a whole number, not "
                         f"{cr!r}")
        if f.get("estimated") not in (None, True, False):
            raise r.fail(_join(where, "estimated"), "expected true or false")
        findings.append(f)
    return PreviousRating(
        file=path.name, bridge_id=r.text(bridge, "id", "bridge") or "",
        inspection_date=r.text(bridge, "inspection_date", "bridge", optional=True),
        generator=r.text(data, "generator", "", optional=True) or "",
        method=r.text(data, "method", "", optional=True) or "",
        provision_set=r.text(data, "provision_set", "", optional=True) or "",
        system="SI" if weight_unit == DISPLAY_UNITS["weight"][1] else "US",
        weight_unit=weight_unit, cases=cases, elements=elements, findings=tuple(findings),
        recommendation=r.text(data, "recommendation", "", optional=True) or "")


def same_bridge(a: str, b: str) -> bool:
    """Structure ids that name the same bridge (case and spacing aside)."""
    return bridge_key(a) == bridge_key(b)


def bridge_key(structure_id: str) -> str:
    """A structure id as :func:`same_bridge` compares it."""
    return " ".join(structure_id.split()).casefold()


_BRIDGE_ID = re.compile(r'"bridge"\s*:\s*\{\s*"id"\s*:\s*("(?:[^"\\]|\\.)*")')
"""The structure id near the start of a results file (pintruss writes ``bridge`` second, its
``id`` first)."""


def results_by_bridge(folder: Path) -> dict[str, tuple[str, ...]]:
    """The results files (``*.rating.json``) in ``folder`` and its sub-folders by the
    structure id they rate (:func:`bridge_key`), each read no further than its start: for a
    batch's bridges whose workbooks were renamed or moved since the earlier batch. A file
    whose start names no bridge is left out (read in full only if its name matches)."""
    out: dict[str, list[str]] = {}
    for path in sorted(Path(folder).rglob("*.rating.json")):
        try:
            with path.open("rb") as fh:
                head = fh.read(4096).decode("utf-8", errors="replace")
        except OSError:
            continue
        m = _BRIDGE_ID.search(head)
        if m is None:
            continue
        try:
            sid = json.loads(m.group(1))
        except ValueError:
            continue
        if isinstance(sid, str) and sid.strip():
            out.setdefault(bridge_key(sid), []).append(str(path))
    return {k: tuple(v) for k, v in out.items()}


# ------------------------------------------------------------------ the comparison


def compare(results: RatingResults, previous: PreviousRating) -> SincePrevious:
    """This rating beside the previous one: each case's controlling RF, member and action then
    and now; the trucks' single weight limit then and now over the trucks rated both times;
    the members and pins whose lowest RF over the cases rated both times moved by more than
    :data:`RF_CHANGE`, or whose findings changed, with the findings on them then and now; and
    notes on what makes the two differ besides the bridge (program, method, dates, cases)."""
    system = "SI" if results.units.get("force") == "kN" else "US"
    weight = DISPLAY_UNITS["weight"][1 if system == "SI" else 0]
    then_weight = previous.weight_unit
    category = {v.id: v.category for v in results.vehicles}
    level = {v.id: v.rating_level for v in results.vehicles}
    vehicles = []
    for v in results.vehicles:
        now = results.posting.get(v.id)
        if now is None:
            continue
        then = previous.cases.get(v.id)
        permit = level.get(v.id) == "permit"
        change = VehicleChange(
            vehicle=v.id,
            rf_before=None if then is None else then.rf, rf_now=now.rf,
            member_before="" if then is None else then.member, member_now=now.member,
            action_before="" if then is None else (then.permit if permit else then.action),
            action_now=now.permit if permit else now.action,
            posting_before=None if then is None else then.posting_tons,
            posting_now=now.posting_tons if now.action == "post" else None)
        alike = set(now.alike) | (set(then.alike) if then is not None else set())
        words = vehicle_change_words(change, weight, category.get(v.id, ""),
                                     level.get(v.id, ""), then_weight=then_weight,
                                     alike=alike)
        vehicles.append(dataclasses.replace(change, change=words))
    rated = [c for c in results.posting if level.get(c) == "legal"
             and category.get(c) != EMERGENCY]
    trucks = [c for c in rated if c in previous.cases]
    now_trucks = _trucks([(results.posting[c].action, results.posting[c].posting_tons)
                          for c in trucks])
    then_trucks = _trucks([(previous.cases[c].action, previous.cases[c].posting_tons)
                           for c in trucks])
    now_rfs = _element_rfs(results)
    notes = list(_notes(results, previous, now_rfs))
    every = _trucks([(results.posting[c].action, results.posting[c].posting_tons)
                     for c in rated])
    if every != now_trucks and now_trucks[0]:
        notes.append("The trucks' outcome then and now is compared over the trucks rated "
                     f"both times; with every truck rated now it is {truck_state(*every, weight)}"
                     ".")
    order = _date_order(results.bridge.inspection_date, previous.inspection_date)
    since = SincePrevious(
        file=previous.file, inspection_date=previous.inspection_date,
        generator=previous.generator, vehicles=tuple(vehicles),
        elements=_element_changes(results, previous, system, now_rfs), notes=tuple(notes),
        out_of_order=order == "later",
        trucks_before=then_trucks[0], limit_before=then_trucks[1],
        trucks_now=now_trucks[0], limit_now=now_trucks[1], weight_unit_before=then_weight,
        recommendation_before=previous.recommendation,
        closure_first_before=previous.recommendation.startswith(CLOSURE_FIRST),
        closure_first_now=results.recommendation.startswith(CLOSURE_FIRST))
    return dataclasses.replace(since, headline=headline(since, weight, level))


def _date_order(now: str | None, then: str | None) -> str:
    """How the previous inspection's date stands to this one's: "earlier", "same", "later",
    or "unknown" (either missing or not a date)."""
    try:
        a, b = dt.date.fromisoformat(str(then)), dt.date.fromisoformat(str(now))
    except ValueError:
        return "unknown"
    return "earlier" if a < b else "same" if a == b else "later"


def _trucks(cases: Sequence[tuple[str, float | None]]) -> tuple[str, float | None]:
    """The trucks' outcome from their (action, safe posting load): "close" where one calls for
    closing, else "post" with the least posting load (the single weight limit for trucks, as
    rating.results_build words it), else "none"; "" where no truck was rated."""
    if not cases:
        return "", None
    if any(a == "close" for a, _ in cases):
        return "close", None
    posted = [p for a, p in cases if a == "post" and p is not None]
    return ("post", min(posted)) if posted else ("none", None)


def truck_state(outcome: str, limit: float | None, weight: str, unit: str = "") -> str:
    """The trucks' outcome (:func:`_trucks`) in words: "no restriction", "a weight limit of 17
    tons", "a closing to consider"; "not rated" for "". ``unit``: the unit it was posted in,
    where not ``weight``."""
    return {"none": "no restriction", "close": "a closing to consider", "": "not rated"}.get(
        outcome, f"a weight limit of {posting_words(limit, weight, unit)}")


def _truck_rank(since: SincePrevious, weight: str) -> int:
    """-1 where the trucks' outcome is worse than then, +1 better, 0 the same (or unknown)."""
    b, n = since.trucks_before, since.trucks_now
    if not b or not n:
        return 0
    if b != n:
        return -1 if _ACTION_RANK[n] > _ACTION_RANK[b] else 1
    if b == "post" and since.limit_before is not None and since.limit_now is not None \
            and not _same_load(since.limit_before, since.limit_now, weight,
                               since.weight_unit_before or weight):
        return -1 if since.limit_now < since.limit_before else 1
    return 0


def truck_words(since: SincePrevious, weight: str) -> str:
    """The change of the trucks' outcome (:func:`_trucks`) in words; "" where it is the same
    (or where either rating rated no truck)."""
    rank = _truck_rank(since, weight)
    if not rank:
        return ""
    unit = since.weight_unit_before or weight
    b, n = since.trucks_before, since.trucks_now
    then = truck_state(b, since.limit_before, weight, unit)
    if b == n == "post":
        return (f"truck weight limit {'lowered' if rank < 0 else 'raised'} from "
                f"{_from(since.limit_before, weight, unit)} to "
                f"{posting_words(since.limit_now, weight)}")
    if n == "post":
        return f"trucks now to be posted at {posting_words(since.limit_now, weight)} (was {then})"
    if n == "close":
        return f"closing now to be considered for trucks (was {then})"
    return f"no restriction now indicated for trucks (was {then})"


def _amount(value: float, weight: str) -> str:
    """A posting load (core tons) in ``weight`` units, without the unit: whole units as
    posted; one decimal where it was posted in the other system."""
    x = from_core(value, weight)
    return f"{math.floor(x + 1e-6) if abs(x - round(x)) < 1e-6 else round(x, 1):g}"


def posting_words(value: float | None, weight: str, unit: str = "") -> str:
    """A safe posting load (core tons) as it was posted, with its unit ("12 tons"); one posted
    in another unit (``unit``) as posted, with its value in ``weight`` beside it ("10 tons
    (9.1 tonnes)"); "-" for none."""
    if value is None:
        return "-"
    if unit and unit != weight:
        return f"{posting_words(value, unit)} ({posting_words(value, weight)})"
    text = _amount(value, weight)
    return f"{text} {weight}{'' if text == '1' else 's'}"


def _from(value: float | None, weight: str, unit: str) -> str:
    """The earlier load of "from X to Y tons": the number alone in the same unit."""
    return _amount(value or 0.0, weight) if unit == weight else posting_words(value, weight, unit)


def _same_load(a: float, b: float, weight: str, then_weight: str) -> bool:
    """Two safe posting loads (core tons), each rounded down to whole units of the system it
    was posted in: the same where their whole units are equal, in one system; across systems
    where they differ by less than one tonne (1.10 tons), the larger rounding step."""
    if then_weight == weight:
        return _amount(a, weight) == _amount(b, weight)
    return abs(a - b) < to_core(1.0, "tonne") - 1e-9


def vehicle_change_words(c: VehicleChange, weight: str, category: str = "", level: str = "",
                         then_weight: str = "", alike: set[str] | frozenset[str] = frozenset()
                         ) -> str:
    """One case's change since the previous rating, in words: its outcome (posting, closing,
    barring to be considered, a permit's verdict) first, else its controlling RF; then a
    change of the member or pin that controls (not to one rated the same, ``alike``: the
    mirror member of a symmetric truss). ``then_weight``: the unit the previous rating posted
    in, where not ``weight``."""
    if c.rf_before is None:
        return "not rated in the previous rating"
    unit = then_weight or weight
    words: list[str] = []
    what = "barring" if category == EMERGENCY else "closing"
    d = direction(c, level, weight, unit)
    if level == "permit":
        if not c.action_before:
            words.append("its permit verdict is not in the previous results file")
        elif c.action_before != c.action_now:
            words.append(f"permit now '{c.action_now}' (was '{c.action_before}')")
    elif level == "legal" and c.action_before != c.action_now:
        was = (f"was posted at {posting_words(c.posting_before, weight, unit)}"
               if c.action_before == "post" else f"was {what} to be considered"
               if c.action_before == "close" else "was not posted")
        if c.action_now == "post":
            words.append(f"now posted at {posting_words(c.posting_now, weight)} ({was})")
        elif c.action_now == "close":
            words.append(f"{what} now to be considered ({was})")
        elif c.action_before == "post":
            words.append(f"no longer posted ({was})")
        else:
            words.append(f"{what} no longer indicated")
    elif level == "legal" and c.action_now == "post" and d:
        words.append(f"posting {'lowered' if d < 0 else 'raised'} from "
                     f"{_from(c.posting_before, weight, unit)} to "
                     f"{posting_words(c.posting_now, weight)}")
    rf_words = _rf_move(c.rf_before, c.rf_now)
    if not words and rf_words:
        words.append(rf_words)
    if c.member_before and c.member_now and c.member_before != c.member_now \
            and c.member_before not in alike and c.member_now not in alike:
        words.append(f"now controlled by {c.member_now} (was {c.member_before})")
    return "; ".join(words) or "no change"


def _rf_move(before: float | None, now: float | None) -> str:
    """ "RF lower by 12 %" where the RF moved by more than RF_CHANGE, else ""."""
    if before is None or now is None or not moved(before, now):
        return ""
    if not (math.isfinite(before) and math.isfinite(now)) or before <= 0:
        return ("RF " + ("lower" if now < before else "higher") +
                f" ({_rf_text(before)} then, {_rf_text(now)} now)")
    pct = round(abs(now / before - 1.0) * 100.0)
    return f"RF {'lower' if now < before else 'higher'} by {pct} %"


def _rf_text(rf: float) -> str:
    if rf == math.inf:
        return "no live load"
    if rf == -math.inf:
        return "-inf"
    return f"{reported_rf(rf):.2f}"


def moved(before: float, now: float) -> bool:
    """Whether an RF moved since the previous rating (:data:`RF_CHANGE` of the previous one;
    an infinite one moved where it differs at all)."""
    if not (math.isfinite(before) and math.isfinite(now)):
        return before != now
    return abs(now - before) > RF_CHANGE * max(abs(before), 0.05)


def _element_rfs(results: RatingResults) -> dict[str, dict[str, float]]:
    out = {m.id: {c: r.rf for c, r in m.ratings.items()} for m in results.members}
    out.update({f"pin at {p.joint}": {c: r.rf for c, r in p.ratings.items()}
                for p in results.pins})
    return out


def _lowest(rfs: Mapping[str, float], cases: Sequence[str]) -> tuple[float, str]:
    """The lowest RF of ``cases`` (NaN skipped) and its case; inf and "" where there is none."""
    found = [(rfs[c], c) for c in cases if c in rfs and rfs[c] == rfs[c]]
    return min(found, key=lambda x: x[0]) if found else (math.inf, "")


def _element_changes(results: RatingResults, previous: PreviousRating, system: str,
                     now_rfs: Mapping[str, Mapping[str, float]]
                     ) -> tuple[ElementChange, ...]:
    """The members and pins whose lowest RF over the cases rated both times moved, the
    largest falls first, then those whose findings alone changed."""
    plain_now = [to_plain(f, system) for f in results.findings]
    words_now = _findings_by_member(plain_now, system)
    words_then = _findings_by_member(previous.findings, previous.system)
    keys_now = _finding_keys(plain_now, system)
    keys_then = _finding_keys(previous.findings, previous.system)
    out = []
    for name, rfs in now_rfs.items():
        then = previous.elements.get(name)
        if then is None:
            continue
        cases = [c for c in rfs if c in then]
        rf_now, case = _lowest(rfs, cases)
        rf_then, case_then = _lowest(then, cases)
        changed = keys_now.get(name, frozenset()) != keys_then.get(name, frozenset())
        rf_moved = bool(case) and moved(rf_then, rf_now)
        if rf_moved or (changed and case):
            out.append(ElementChange(name, case, rf_then, rf_now, words_then.get(name, ()),
                                     words_now.get(name, ()), case_before=case_then,
                                     moved=rf_moved, findings_changed=changed))
    return tuple(sorted(out, key=_drop))


def _drop(e: ElementChange) -> tuple[int, float, str]:
    """The largest falls first: by RF now over RF then (a rating lost, -inf, before all);
    members listed for their findings alone after those that moved."""
    if not e.moved:
        return (1, 0.0, e.element)
    if e.rf_now == -math.inf:
        return (0, -math.inf, e.element)
    if not (math.isfinite(e.rf_before) and math.isfinite(e.rf_now)) or e.rf_before <= 0:
        return (0, 0.0 if e.rf_now < e.rf_before else math.inf, e.element)
    return (0, e.rf_now / e.rf_before, e.element)


def _number_of(value: Any) -> float | None:
    return float(value) if isinstance(value, int | float) and not isinstance(value, bool) \
        else None


def _finding_keys(findings: Sequence[Mapping[str, Any]], system: str
                  ) -> dict[str, frozenset[tuple[Any, ...]]]:
    """Each member's findings as comparable values in core units (a finding written in mm
    then and in inches now is the same finding), for telling whether they changed."""
    dim = DISPLAY_UNITS["dimension"][1 if system == "SI" else 0]
    length = DISPLAY_UNITS["length"][1 if system == "SI" else 0]
    out: dict[str, set[tuple[Any, ...]]] = {}
    for f in findings:
        left, station = _number_of(f.get("remaining_thickness")), _number_of(f.get("station"))
        loss = _number_of(f.get("percent_loss"))
        key = (str(f.get("component") or ""), str(f.get("region") or ""),
               None if station is None else round(to_core(station, length), 2),
               None if left is None else round(to_core(left, dim), 3),
               None if loss is None else round(loss, 2),
               str(f.get("bar_state") or "sound"), f.get("condition_rating"),
               f.get("estimated") is True)
        out.setdefault(str(f.get("member") or ""), set()).add(key)
    return {m: frozenset(v) for m, v in out.items()}


def _findings_by_member(findings: Sequence[Mapping[str, Any]], system: str
                        ) -> dict[str, tuple[str, ...]]:
    """Each member's findings in words ("bar 2 body: 18 % loss, condition 5"), from the
    findings echo as written in the results file (units of ``system``)."""
    unit = DISPLAY_UNITS["dimension"][1 if system == "SI" else 0]
    out: dict[str, list[str]] = {}
    for f in findings:
        parts = []
        loss, left = _number_of(f.get("percent_loss")), _number_of(f.get("remaining_thickness"))
        if loss is not None:
            parts.append(f"{loss:g} % loss")
        if left is not None:
            parts.append(f"{left:g} {unit} left")
        state = f.get("bar_state")
        if isinstance(state, str) and state and state != "sound":
            parts.append(state)
        cr = f.get("condition_rating")
        if isinstance(cr, int) and not isinstance(cr, bool):
            parts.append(f"condition {cr}")
        if f.get("estimated") is True:
            parts.append("estimated")
        where = " ".join(str(f.get(k) or "") for k in ("component", "region")).strip()
        text = f"{where}: {', '.join(parts)}" if where else ", ".join(parts)
        member = str(f.get("member") or "")
        if member and text:
            out.setdefault(member, []).append(text)
    return {m: tuple(v) for m, v in out.items()}


def _notes(results: RatingResults, previous: PreviousRating,
           now: Mapping[str, Mapping[str, float]]) -> tuple[str, ...]:
    """What makes the two ratings differ besides the bridge, for the reader to weigh."""
    notes = []
    date_now, date_then = results.bridge.inspection_date, previous.inspection_date
    order = _date_order(date_now, date_then)
    if order == "unknown":
        notes.append("The inspection date of " + ("this rating" if not _is_date(date_now) else
                                                  "the previous rating")
                     + " is not known: the order of the two ratings is the reader's to "
                     "confirm.")
    elif order == "same":
        notes.append(f"Both ratings are of the inspection of {date_now} (a re-rating: coupon "
                     "tests, corrected entries or another version of the program).")
    elif order == "later":
        notes.append(f"The previous rating's inspection ({date_then}) is later than this "
                     f"one's ({date_now}): the changes below run backwards in time.")
    if previous.generator and previous.generator != results.generator:
        notes.append(f"The previous rating was made with {previous.generator}, this one with "
                     f"{results.generator}: ratings may differ through the program's "
                     "changes as well as the bridge's.")
    if previous.provision_set and previous.provision_set != results.provision_set:
        notes.append(f"The previous rating used {previous.provision_set}, this one "
                     f"{results.provision_set}.")
    if previous.method and previous.method != results.method:
        notes.append("The rating method differs from the previous rating's "
                     f"({previous.method}).")
    new = [c for c in results.posting if c not in previous.cases]
    gone = [c for c in previous.cases if c not in results.posting]
    if new:
        notes.append("Rated now, not in the previous rating: " + ", ".join(new) + ".")
    if gone:
        notes.append("In the previous rating, not rated now: " + ", ".join(gone) + ".")
    added = [e for e in now if e not in previous.elements]
    lost = [e for e in previous.elements if e not in now]
    if added or lost:
        notes.append("Members and pins not in both ratings (compared only where in both): "
                     + "; ".join(part for part in (
                         "now only: " + ", ".join(added) if added else "",
                         "then only: " + ", ".join(lost) if lost else "") if part) + ".")
    if previous.system != ("SI" if results.units.get("force") == "kN" else "US"):
        notes.append("The previous results file is in "
                     f"{'SI' if previous.system == 'SI' else 'US customary'} units: its "
                     "posting loads are shown as posted then, with their value in this "
                     "report's units beside them, and a change is one beyond their rounding.")
    return tuple(notes)


def _is_date(text: str | None) -> bool:
    try:
        dt.date.fromisoformat(str(text))
    except ValueError:
        return False
    return True


_VERDICT_RANK = {"can be carried": 0, "not over a bridge restricted for legal loads": 1,
                 "not as requested": 1}
"""A permit's verdicts by outcome: carried, or not (MBE 6A.4.5 [value from memory]; either
"not" is as bad as the other for the permit's issue)."""


def direction(c: VehicleChange, level: str, weight: str, then_weight: str = "") -> int:
    """-1 where the case's outcome is worse than in the previous rating (posted, posted lower,
    closing or barring now to be considered; a permit no longer carried), +1 where better, 0
    where the same or not known (a design load's RF is not an outcome: 0). ``then_weight``:
    the unit the previous rating posted in, where not ``weight``."""
    if c.rf_before is None:
        return 0
    if level == "permit":
        before = _VERDICT_RANK.get(c.action_before)
        now = _VERDICT_RANK.get(c.action_now)
        if before is None or now is None or before == now:
            return 0
        return -1 if now > before else 1
    if level != "legal":
        return 0
    before, now = _ACTION_RANK.get(c.action_before, 0), _ACTION_RANK.get(c.action_now, 0)
    if now != before:
        return -1 if now > before else 1
    if c.action_now == "post" and c.posting_before is not None and c.posting_now is not None \
            and not _same_load(c.posting_before, c.posting_now, weight, then_weight or weight):
        return -1 if c.posting_now < c.posting_before else 1
    return 0


def closure_words(since: SincePrevious) -> str:
    """The change of the recommendation's lead in words: a closure to consider now put first
    (outright or until a condition is confirmed), or no longer; "" where it is the same."""
    if since.closure_first_now and not since.closure_first_before:
        return "the recommendation now leads with a closure to consider"
    if since.closure_first_before and not since.closure_first_now:
        return "the recommendation no longer leads with a closure to consider"
    return ""


def worse_since(since: SincePrevious, levels: Mapping[str, str], weight: str) -> bool:
    """Whether any outcome is worse than at the previous rating: the recommendation's (a
    closure now put first), a case's (:func:`direction`) or the trucks' (a weight limit
    lowered, a posting or closing now called for)."""
    unit = since.weight_unit_before or weight
    if since.closure_first_now and not since.closure_first_before:
        return True
    return _truck_rank(since, weight) < 0 or any(
        direction(c, levels.get(c.vehicle, ""), weight, unit) < 0 for c in since.vehicles)


def headline(since: SincePrevious, weight: str, levels: Mapping[str, str]) -> str:
    """The change since the previous rating in one sentence: a previous inspection later
    than this one first; then the trucks' outcome, the cases whose outcome is worse
    (:func:`direction`), those better, and how many members and pins rate lower and higher
    or carry changed findings."""
    date = since.inspection_date or "an unknown date"
    unit = since.weight_unit_before or weight
    worse, better = [], []
    for c in since.vehicles:
        d = direction(c, levels.get(c.vehicle, ""), weight, unit)
        if d:
            (worse if d < 0 else better).append(f"{c.vehicle} {c.change.split('; ')[0]}")
    rf_moved = [e for e in since.elements if e.moved]
    lower = sum(1 for e in rf_moved if e.rf_now < e.rf_before)
    higher = len(rf_moved) - lower
    findings = sum(1 for e in since.elements if e.findings_changed)
    parts = []
    lead = closure_words(since)
    if lead:
        parts.append(lead)
    trucks = truck_words(since, weight)
    if trucks:
        parts.append(trucks)
    if worse:
        parts.append("worse: " + "; ".join(worse))
    if better:
        parts.append("better: " + "; ".join(better))
    if not worse and not better and not trucks and not lead:
        parts.append("no posting, closing or permit verdict changed")
    parts.append(f"{_count(lower, 'member or pin', 'members or pins')} "
                 f"{'rates' if lower == 1 else 'rate'} lower and {higher} higher by more than "
                 f"{RF_CHANGE * 100:g} %")
    if findings:
        parts.append(f"the findings changed on {_count(findings, 'member', 'members')}")
    text = f"Since the rating of the inspection of {date}: " + "; ".join(parts) + "."
    if since.out_of_order:
        text = ("CHECK THE FILE GIVEN: the previous rating's inspection is later than this "
                "one's. " + text)
    return text


def _count(n: int, one: str, many: str) -> str:
    return f"{n} {one if n == 1 else many}"


def previous_for(results: RatingResults, path: Path) -> tuple[RatingResults | None, str]:
    """``results`` with the comparison with the previous results file at ``path``, and ""; or
    None and why not (a file that cannot be read, or the rating of another bridge)."""
    try:
        previous = read_previous(path)
    except InputError as exc:
        return None, str(exc)
    if not same_bridge(previous.bridge_id, results.bridge.id):
        return None, (f"{path}: the previous results file is the rating of bridge "
                      f"{previous.bridge_id!r}, not of {results.bridge.id!r}")
    return dataclasses.replace(results, previous=compare(results, previous)), ""
