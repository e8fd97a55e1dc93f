"""Read and validate an inspection workbook into a :class:`rating.model.Bridge`.

Every problem is collected (the reader never stops at the first) with its ``Sheet!Cell`` and a
sentence a bridge engineer can act on. Defaults the reader assumes are listed as assumptions
and as warnings. The workbook is opened read-only and is never modified.
"""

from __future__ import annotations

import dataclasses
import datetime as dt
import re
from collections import Counter
from collections.abc import Iterable, Mapping
from pathlib import Path

from rating.capacity.materials import MaterialDefault, default_material
from rating.capacity.pins import FLOORBEAM
from rating.capacity.pins import MAX_CLEARANCE_IN as MAX_PIN_CLEARANCE_IN
from rating.capacity.sections import (
    gross_area_as_built_in2,
    part_reference_thickness_in,
    section_kind,
    validate_section,
)
from rating.errors import GeometryError, InputError, InstabilityError
from rating.inventory import schema as sc
from rating.inventory.book import Book, open_book
from rating.inventory.problems import ProblemLog, WorkbookReading
from rating.inventory.tables import Row, read_form, read_table
from rating.model import (
    CONNECTOR_WORDS,
    AnglePart,
    AxleSpacing,
    BarState,
    Bridge,
    BridgeInfo,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    CrossSection,
    DeadLoadBasis,
    DeadLoadItem,
    DeadLoadKind,
    DeckPosition,
    EyebarSet,
    Finding,
    FindingRegion,
    Joint,
    Material,
    MaterialKind,
    Member,
    MemberDesign,
    MemberRole,
    PackingItem,
    Part,
    Pin,
    PlatePart,
    RatingSettings,
    RidingSurface,
    RodEnd,
    RodSet,
    RodShape,
    RolledShape,
    Section,
    Support,
    SupportKind,
    TrussGeometry,
    UnitSystem,
    Vehicle,
    VehicleCategory,
    connector_component,
)
from rating.model.builders import build_truss, counters_not_built
from rating.units import si_text
from rating.vehicles.library import known_ids, rating_loads

__all__ = ["read_workbook", "WorkbookReading"]

_TOL_IN = 1e-6
_LABEL_PAIR = re.compile(r"^([A-Za-z]+\d+)([A-Za-z]+\d+)$")
_BAR = re.compile(r"^(?:bar|eyebar|rod)\s*(?:no\.?|#)?\s*(\d+)$", re.IGNORECASE)


def read_workbook(path: Path) -> WorkbookReading:
    """Read, check and convert one inspection workbook.

    Raises :class:`rating.errors.InputError` only when the file itself cannot be opened;
    everything wrong inside it is returned as problems (``bridge`` is then ``None``).
    """
    path = Path(path)
    book = open_book(path, sheets_read(), rows_read())
    log = ProblemLog()
    reading = _Reading(book, log)
    bridge = reading.bridge()
    _unseen(book, log)
    lock = open_elsewhere(path)
    if lock is not None:
        log.warning(path.name, f"{UNSAVED_EDITS}: the workbook seems to be open in a spreadsheet "
                    f"program (its lock file {lock.name} is beside it): what is read is the "
                    "file as last saved; edits not yet saved are not in this rating.")
    problems, assumptions = tuple(log.problems), tuple(log.assumptions)
    if getattr(reading, "si", False):
        # the messages quote core units; an SI workbook reads them in SI
        problems = tuple(dataclasses.replace(p, message=si_text(p.message)) for p in problems)
        assumptions = tuple(si_text(a) for a in assumptions)
    return WorkbookReading(None if log.has_errors else bridge, problems, assumptions)


def _unseen(book: Book, log: ProblemLog) -> None:
    """What is read without being seen, or seen without being read: rows and sheets hidden in
    the spreadsheet that hold something (read like any other), and sheets that are not the
    workbook's own (not read at all: an older copy of a sheet, a scratch sheet)."""
    for g in book.grids.values():
        full = [r for r in book.hidden_rows.get(g.name, ())
                if any(v is not None and v != "" for v in (g.rows[r - 1] if r <= len(g.rows)
                                                            else ()))]
        if full:
            many = len(full) > 1
            log.warning(f"{g.name}!A{full[0]}", f"row{'s' if many else ''} "
                        f"{_listing([str(r) for r in full])} of sheet {g.name} "
                        f"{'are' if many else 'is'} hidden in the spreadsheet and "
                        f"{'are' if many else 'is'} read like any other: unhide "
                        f"{'them' if many else 'it'} to see what is rated")
    own = {book.find(n) for n in (sc.INSTRUCTIONS_SHEET, *sheets_read())} - {None}
    for name in book.sheet_names:
        if name in book.hidden_sheets and name in own:
            log.warning(f"{name}!A1", f"sheet {name} is hidden in the spreadsheet and is read "
                        "like any other: unhide it to see what is rated")
        elif name not in own:
            log.warning(f"{name}!A1", f"sheet {name} is not one of the workbook's own sheets "
                        "and is not read (an older copy of a sheet, or notes?): what it holds "
                        "is not in the rating")


UNSAVED_EDITS = "UNSAVED EDITS POSSIBLE"
"""Head of the warning that the workbook is open elsewhere: it bears on the decision (the
rating may not be of the workbook the engineer sees), so it is headed in capitals
(rating.results.bears_on_the_decision)."""
NO_DEAD_LOAD = "NO DECK DEAD LOAD"
DAMAGE_IN_NOTE = "DAMAGE IN A NOTE"
NO_PINS = "PINS NOT RATED"


def _first_entry(spec: sc.TableSheet) -> str:
    """The cell where a table's first entry goes (below its example rows): where a warning
    about a sheet that lists nothing, or too little, points the user."""
    return f"{spec.name}!A{sc.FIRST_DATA_ROW + len(spec.examples)}"


def _on_a_pin(design: MemberDesign | None) -> bool:
    """Whether a member's bars hang on pins by their form: eyebars, and rods with loop
    ends."""
    if design is None:
        return False
    sec = design.section
    return isinstance(sec, EyebarSet) or (isinstance(sec, RodSet) and sec.end is RodEnd.LOOP)


def open_elsewhere(path: Path) -> Path | None:
    """The lock file a spreadsheet program keeps beside a workbook it has open ("~$name",
    "~$" in place of the name's first two letters, or ".~lock.name#"), if there is one."""
    for name in (f"~${path.name}", f"~${path.name[2:]}", f".~lock.{path.name}#"):
        try:
            if path.with_name(name).is_file():
                return path.with_name(name)
        except OSError:  # (a folder we may not look into: no notice)
            continue
    return None


def sheets_read() -> dict[str, int]:
    """The sheets the reader reads, with the number of columns read on each."""
    wanted = {sc.BRIDGE.name: 3, sc.SETTINGS.name: 3}
    wanted.update({t.name: len(t.columns) + 12 for t in sc.TABLES})
    return wanted


def rows_read() -> int:
    """The rows read on each sheet (one more is looked at, to say a sheet is too long)."""
    return sc.MAX_ROWS + sc.HEADER_SEARCH_ROWS


# --- small typed accessors ---------------------------------------------------------------


_SINGLE_ANGLE = re.compile(r"\s*(?:L\s*\d|angle\b)", re.IGNORECASE)
"""A designation that names one angle ("L 4 x 4 x 1/2", "angle 3 x 3"), not two ("2L ...")."""


def _rolled_torsion_consistent(r: Row, sid: str, des: str, area: float, rx: float,
                               ry: float, rz: float | None, J: float | None,
                               Cw: float | None, xo: float | None, yo: float | None,
                               log: ProblemLog) -> bool:
    """A rolled shape's least radius and torsion properties: what each needs with it, and a
    J no section could have. False where any is wrong (a cell already refused included: a
    value missing because its cell was bad is not said missing again)."""
    keys = ("r_z", "J", "C_w", "x_o", "y_o")
    ok = not any(k in r.bad for k in keys)
    if rz is None and "r_z" not in r.bad and _SINGLE_ANGLE.match(des):
        # its geometric axes are not principal: rated on r_x and r_y it buckles far too high
        log.error(r.ref("r_z"), f"section {sid} is an angle ({des!r}): give its least radius "
                  "of gyration r_z (about its principal axis), which its buckling takes; r_x "
                  "and r_y about its legs overstate it")
        ok = False
    if rz is not None and rz > min(rx, ry) * (1.0 + 1e-3) + _TOL_IN:
        log.error(r.ref("r_z"), f"the least radius of gyration r_z of section {sid} "
                  f"({_g(rz)} in) exceeds the lesser of r_x and r_y ({_g(min(rx, ry))} in); "
                  "r_z is the least of all axes (leave it blank where x and y are principal "
                  "axes)")
        ok = False
    if rz is None and xo and yo:
        log.error(r.ref("r_z"), f"section {sid} has its shear centre off both x and y (x_o "
                  "and y_o not 0: an angle, or another shape with no axis of symmetry), so x "
                  "and y are not its principal axes: give its least radius r_z (its torsional "
                  "buckling is then left to the engineer)")
        ok = False
    if Cw is not None and J is None and "J" not in r.bad:
        log.error(r.ref("C_w"), f"section {sid} gives the warping constant C_w without the "
                  "torsional constant J; give J too, or leave both blank")
        ok = False
    if J is not None:
        for key, v in (("x_o", xo), ("y_o", yo)):
            if v is None and key not in r.bad:
                log.error(r.ref(key), f"section {sid} gives J but not the shear centre's "
                          f"distance {key} from the centroid, which the flexural-torsional "
                          "check needs: give it (0 on an axis of symmetry)")
                ok = False
        polar = area * (rx * rx + ry * ry)  # no section's J exceeds it (a circle's equals it)
        if J > polar * (1.0 + 1e-3):
            log.error(r.ref("J"), f"the torsional constant J of section {sid} ({_g(J)} in4) "
                      f"exceeds its polar moment of inertia A (r_x^2 + r_y^2) = "
                      f"{polar:.4g} in4, which no section's J can; check the value and its "
                      "unit")
            ok = False
        if rz is not None and ok:
            log.warning(r.ref("J"), f"section {sid} gives r_z, so its principal axes are not x "
                        "and y: its J, C_w and shear centre are not used, and its torsional "
                        "buckling is left to the engineer (said in the member's notes)")
    return ok


def _f(row: Row, key: str) -> float | None:
    v = row.values.get(key)
    return float(v) if isinstance(v, int | float) else None


def _i(row: Row, key: str) -> int | None:
    v = row.values.get(key)
    return int(v) if isinstance(v, int | float) else None


def _s(row: Row, key: str) -> str | None:
    v = row.values.get(key)
    return v if isinstance(v, str) else None


def _b(row: Row, key: str) -> bool | None:
    v = row.values.get(key)
    return v if isinstance(v, bool) else None


def _g(x: float) -> str:
    """A value in a message: six significant digits, so that an SI workbook's value, held in
    US units, reads back as entered after rating.units.si_text (four digits of 40 mm held as
    1.575 in read 40.01 mm)."""
    return f"{x:.6g}"


def _listing(items: Iterable[str], limit: int = 12) -> str:
    items = list(items)
    shown = ", ".join(items[:limit])
    return shown + (f" and {len(items) - limit} more" if len(items) > limit else "")


def _a(noun: str) -> str:
    return ("an " if noun[:1].lower() in "aeiou" else "a ") + noun


def _reverse_label(label: str) -> str | None:
    m = _LABEL_PAIR.match(label)
    return m.group(2) + m.group(1) if m else None


_END_PLATE_WORDS = re.compile(r"\b(pin|end|reinforc\w*|bearing)\b", re.IGNORECASE)
"""Words in a plate's name that say it is at the member's ends only (a pin plate)."""


class _Reading:
    """One pass over one workbook (a fresh instance per read; nothing is shared)."""

    def __init__(self, book: Book, log: ProblemLog) -> None:
        self.book = book
        self.log = log
        self.today = dt.date.today()
        self.broken: set[str] = set()  # section ids defined on a row with a problem
        self.joint_rows: dict[str, Row] = {}
        self.defaults: dict[tuple[MaterialKind, int | None], MaterialDefault] = {}

    # -- top level ------------------------------------------------------------------------

    UNITS_HINT_AFTER = 3
    """Values past their upper limits in US customary units from which the workbook's values
    are taken to be SI (metres, millimetres) with its units left at US."""

    def _units_hint(self, where: str, si: bool) -> None:
        """One error at the units cell where many values are too large for US customary
        units: SI values in a workbook whose units say US (each value has its own error)."""
        if si:
            return
        over = [p for p in self.log.problems
                if p.severity == "error" and "must be at most" in p.message
                and p.message.rstrip().endswith((" in", " ft"))]
        if len(over) >= self.UNITS_HINT_AFTER:
            self.log.error(where, f"{len(over)} lengths and thicknesses are beyond their limits "
                           "in US customary units (for example at "
                           f"{', '.join(p.where for p in over[:3])}); if the workbook's values "
                           "are in metres and millimetres, set 'Units of this workbook' to SI")
            # first in the list: it explains the errors after it
            self.log.problems.insert(0, self.log.problems.pop())

    REQUIRED_SHEETS = ("Findings", "Pins", "DeadLoads")
    """Sheets a rating cannot do without even when they hold no rows: a workbook without one
    is not a workbook of this program as made by ``pintruss template`` (its findings, pins or
    dead loads would be left out of the rating without a word)."""

    def bridge(self) -> Bridge | None:
        log = self.log
        for t in sc.TABLES:
            if self.book.find(t.name) is not None or t is sc.MEMBERS:
                continue
            if t.name in self.REQUIRED_SHEETS:
                log.error(f"{t.name}!A1", f"the sheet '{t.name}' ({t.title.lower()}) is "
                          "missing; copy it from a blank workbook made by 'pintruss template' "
                          "and fill it in (leave it without rows where there is nothing to "
                          "record)")
            else:
                log.warning(f"{t.name}!A1", f"the sheet '{t.name}' ({t.title.lower()}) is "
                            "missing; it is read as empty")
        b, si = read_form(self.book, sc.BRIDGE, None, log, units_key="units")
        self.b = b
        self.si = si
        settings_row, _ = read_form(self.book, sc.SETTINGS, si, log)
        t = {spec.name: read_table(self.book, spec, si, log, required=spec is sc.MEMBERS)
             for spec in sc.TABLES}
        self.t = t
        self._units_hint(b.ref("units"), si)
        info = self._info()
        geometry, member_rows = self._geometry()
        sections = self._sections()
        materials = self._materials()
        designs, geometry = self._member_designs(geometry, member_rows, sections, materials)
        if geometry is not None and geometry.form == "explicit" and not log.has_errors:
            self._stability(geometry)
        findings = self._findings(geometry, designs)
        pins = self._pins(geometry, designs, materials)
        cross = self._cross_section()
        dead = self._dead_loads()
        vehicles = self._vehicles()
        settings = self._settings(settings_row, vehicles)
        if log.has_errors or geometry is None or cross is None or info is None:
            return None
        return Bridge(info=info, geometry=geometry, cross_section=cross,
                      member_designs=designs, findings=findings, pins=pins, dead_loads=dead,
                      owner_vehicles=vehicles, settings=settings,
                      source_file=str(self.book.path))

    # -- bridge sheet ---------------------------------------------------------------------

    def _info(self) -> BridgeInfo | None:
        b = self.b
        year = _i(b, "year_built")
        if year is not None and year > self.today.year:
            self.log.error(b.ref("year_built"), f"Year built {year} is in the future")
        date = b.get("inspection_date")
        if isinstance(date, dt.date):
            if date > self.today:
                self.log.warning(b.ref("inspection_date"),
                                 f"Inspection date {date.isoformat()} is in the future")
            if year is not None and date.year < year:
                self.log.error(b.ref("inspection_date"),
                               f"Inspection date {date.isoformat()} is before the year built "
                               f"({year})")
        sid, name = _s(b, "structure_id"), _s(b, "name")
        if sid is None or name is None:
            return None
        return BridgeInfo(structure_id=sid, name=name, location=_s(b, "location") or "",
                          owner=_s(b, "owner") or "", year_built=year,
                          inspection_date=date if isinstance(date, dt.date) else None,
                          inspector=_s(b, "inspector") or "")

    def _deck_position(self) -> DeckPosition | None:
        v = _s(self.b, "deck_position")
        return DeckPosition(v) if v else None

    def _cross_section(self) -> CrossSection | None:
        b, log = self.b, self.log
        spacing, width = _f(b, "truss_spacing"), _f(b, "roadway_width")
        if spacing is None or width is None:
            return None
        curb = _f(b, "left_curb")
        pos = self._deck_position()
        between = pos in (DeckPosition.THROUGH, DeckPosition.PONY)
        if between and width > spacing + 1e-9:
            log.error(b.ref("roadway_width"),
                      f"Roadway width {_g(width)} ft is wider than the truss spacing "
                      f"{_g(spacing)} ft; the roadway of a {pos} truss runs between the trusses")
        elif between and curb is not None and curb + width > spacing + 1e-9:
            log.error(b.ref("left_curb"),
                      f"the roadway ({_g(curb)} ft from the left truss plus {_g(width)} ft "
                      f"wide) ends beyond the right truss at {_g(spacing)} ft")
        lanes = _i(b, "lane_count")
        if lanes is not None and lanes * 12.0 > width + 1e-9:
            log.warning(b.ref("lane_count"),
                        f"{lanes} lanes on a {_g(width)} ft roadway is less than 12 ft per lane; "
                        "please confirm the override")
        fb = _f(b, "floorbeam_I")
        for key, what in (("floorbeam_I", "the floorbeam's moment of inertia"),
                          ("uframe_height", "the U-frame height"),
                          ("chord_at_hips", "the top chord at the hips")):
            if b.get(key) is not None and pos is not None and pos is not DeckPosition.PONY:
                log.warning(b.ref(key), f"{what} is used for the U-frames of a pony truss "
                            f"only; this is a {pos} truss, so it is not used")
        hips = _s(b, "chord_at_hips")
        if fb is not None and pos is DeckPosition.PONY and hips is None:
            log.warning(b.ref("chord_at_hips"), "the top chord at the hips is not given: it is "
                        "taken as continuous out of plane there (spliced), which the U-frame "
                        "analysis leans on; confirm the detail in the field and give it")
        if _f(b, "uframe_height") is not None and fb is None:
            log.warning(b.ref("uframe_height"), "the U-frame height is used with the "
                        "floorbeam's moment of inertia, which is not given: it is not used")
        return CrossSection(truss_spacing_ft=spacing, roadway_width_ft=width, left_curb_ft=curb,
                            lane_count_override=lanes, deck_width_ft=_f(b, "deck_width"),
                            floorbeam_I_in4=fb, uframe_height_ft=_f(b, "uframe_height"),
                            chord_hinged_at_hips=None if hips is None else hips == "hinged")

    # -- geometry -------------------------------------------------------------------------

    def _geometry(self) -> tuple[TrussGeometry | None, dict[str, Row]]:
        """The truss, and the Members row of each member label (first row if repeated)."""
        members = self.t[sc.MEMBERS.name]
        rows: dict[str, Row] = {}
        for r in members.rows:
            label = _s(r, "member")
            if label is None:
                continue
            if label in rows:
                self.log.error(r.ref("member"), f"member {label} is listed twice (first at "
                               f"{rows[label].ref('member')}); a member has one row")
                continue
            rows[label] = r
        mode = _s(self.b, "geometry") or "generated"
        if not rows and members.present and mode != "generated":
            self.log.error(members.header_ref("member"),
                           "no members are listed; every member of the truss needs a row with "
                           "its section")
        if mode == "generated":
            return self._generated(rows), rows
        return self._explicit(rows), rows

    def _heights(self, n: int) -> float | list[float] | None:
        b, log = self.b, self.log
        table = self.t[sc.HEIGHTS.name]
        points: dict[int, tuple[float, Row]] = {}
        for r in table.rows:
            p, h = _i(r, "point"), _f(r, "height")
            if p is None or h is None:
                continue
            if p > n:
                log.error(r.ref("point"), f"panel point {p} does not exist: the truss has "
                          f"{n} panels (points 0 to {n})")
                continue
            if p in points:
                log.error(r.ref("point"), f"panel point {p} is listed twice (first at "
                          f"{points[p][1].ref('point')})")
                continue
            points[p] = (h, r)
        single = _f(b, "height")
        if not points:
            if single is None and "height" not in b.bad:
                log.error(b.ref("height"), "Truss height is needed to generate the geometry "
                          "(or list the height at each panel point on the Heights sheet)")
            return single
        if single is not None:
            log.warning(b.ref("height"), "the heights on the Heights sheet are used; the single "
                        "truss height here is not read")
        have = set(points)
        inner, full = set(range(1, n)), set(range(0, n + 1))
        if have == inner or have == full:
            return [points[k][0] for k in sorted(have)]
        want = inner if not have - inner else full
        missing = sorted(want - have)
        log.error(table.header_ref("point"),
                  f"heights are needed at panel points 1 to {n - 1} (or 0 to {n}); missing at "
                  f"{_listing(str(m) for m in missing)}")
        return None

    def _generated(self, rows: dict[str, Row]) -> TrussGeometry | None:
        b, log = self.b, self.log
        form = _s(b, "truss_form")
        n, p = _i(b, "panel_count"), _f(b, "panel_length")
        for key, value, what in (("truss_form", form, "Truss form"),
                                 ("panel_count", n, "Panel count"),
                                 ("panel_length", p, "Panel length")):
            if value is None and key not in b.bad:
                log.error(b.ref(key), f"{what} is needed to generate the geometry (or set "
                          "Geometry to explicit and list joints and members)")
        if self.t[sc.JOINTS.name].rows:
            log.warning(self.t[sc.JOINTS.name].rows[0].ref("joint"),
                        "the Joints sheet is not read because Geometry is 'generated'")
        pos = self._deck_position()
        if n is None or p is None or form is None or pos is None:
            return None
        heights = self._heights(n)
        if heights is None:
            return None
        counters = tuple(int(c) for c in (b.get("counter_panels") or ()))  # type: ignore[union-attr]
        bad_c = [c for c in counters if not 1 <= c <= n]
        if bad_c:
            log.error(b.ref("counter_panels"), f"counter panel {bad_c[0]} does not exist: the "
                      f"truss has panels 1 to {n}")
            return None
        if len(set(counters)) != len(counters):
            log.warning(b.ref("counter_panels"), "a counter panel is listed twice")
        try:
            skipped = counters_not_built(form, n, pos, counters)
        except ValueError:  # (an unknown form is said by build_truss below)
            skipped = ()
        if skipped:
            many = len(skipped) > 1
            log.warning(b.ref("counter_panels"), f"counter panel{'s' if many else ''} "
                        f"{_listing([str(c) for c in skipped])} get{'' if many else 's'} no "
                        "counter: " + (
                            "an end panel is crossed by the end post, not by a diagonal"
                            if form in ("pratt", "parker") else
                            f"counters are generated for Pratt and Parker trusses only; list "
                            f"the members of this {form} truss explicitly to give it "
                            "counters"))
        try:
            g = build_truss(form, n, p, heights, deck_position=pos,
                            counter_panels=tuple(sorted(set(counters))))
        except GeometryError as exc:
            log.error(b.ref("truss_form"), f"the {form} truss cannot be generated: "
                      f"{exc.message}")
            return None
        for label, r in rows.items():
            if label not in g.member_index:
                rev = _reverse_label(label)
                hint = (f"; it is labelled {rev} in the generated truss" if rev
                        and rev in g.member_index else "; members are named by their joints, "
                        "left to right for chords, e.g. L0L1, U1U2, L1U1, U1L2")
                log.error(r.ref("member"), f"member {label} is not in the generated {form} "
                          f"truss{hint}")
                continue
            m = g.member(label)
            ends = {_s(r, "start"), _s(r, "end")} - {None}
            if ends and not ends <= {m.start, m.end}:
                log.error(r.ref("start"), f"member {label} runs {m.start}-{m.end} in the "
                          f"generated truss, not {'-'.join(sorted(e for e in ends if e))}")
            role = _s(r, "role")
            if role and role != m.role.value:
                log.warning(r.ref("role"), f"member {label} is {_a(m.role.value)} in the "
                            f"generated truss; the role '{role}' given here is not used")
        missing = [m.label for m in g.members if m.label not in rows]
        if missing and rows:
            log.error(self.t[sc.MEMBERS.name].header_ref("member"),
                      f"the generated {form} truss has members with no row on Members (each "
                      f"needs its section): {_listing(missing, 40)}")
        elif missing and self.t[sc.MEMBERS.name].present:
            # (the names the user must type: they follow from the truss form and panels)
            log.error(self.t[sc.MEMBERS.name].header_ref("member"),
                      f"no members are listed; the generated {form} truss has these "
                      f"{len(missing)}, each needing a row with its section: "
                      f"{_listing(missing, 80)}")
        return g

    def _explicit(self, rows: dict[str, Row]) -> TrussGeometry | None:
        log = self.log
        jt = self.t[sc.JOINTS.name]
        joints: dict[str, tuple[Joint, Row]] = {}
        supports: list[Support] = []
        deck: list[Joint] = []
        for r in jt.rows:
            label, x, y = _s(r, "joint"), _f(r, "x"), _f(r, "y")
            if label is None:
                continue
            if label in joints:
                log.error(r.ref("joint"), f"joint {label} is listed twice (first at "
                          f"{joints[label][1].ref('joint')})")
                continue
            if x is None or y is None:
                continue
            j = Joint(label, x, y)
            joints[label] = (j, r)
            sup = _s(r, "support")
            if sup in ("pin", "roller"):
                supports.append(Support(label, SupportKind(sup)))
            if _b(r, "deck"):
                deck.append(j)
        self.joint_rows = {label: r for label, (_j, r) in joints.items()}
        if not jt.rows:
            log.error(jt.header_ref("joint"), "Geometry is 'explicit' but no joints are listed "
                      "on the Joints sheet")
            return None
        if not supports:
            log.error(jt.header_ref("support"), "no joint is marked as a support (pin or "
                      "roller); mark the two bearings")
        if len(deck) < 2:
            log.error(jt.header_ref("deck"), "mark at least two joints as deck panel points "
                      "(the panel points that carry floorbeams)")
        members: list[Member] = []
        for label, r in rows.items():
            start, end, role = _s(r, "start"), _s(r, "end"), _s(r, "role")
            ok = True
            for key, v, what in (("start", start, "Start joint"), ("end", end, "End joint"),
                                 ("role", role, "Role")):
                if v is None:
                    if key not in r.bad:
                        log.error(r.ref(key), f"{what} of member {label} is needed for explicit "
                                  "geometry")
                    ok = False
                elif key != "role" and v not in joints:
                    log.error(r.ref(key), f"{what} of member {label} is joint {v!r}, which is "
                              "not on the Joints sheet")
                    ok = False
            if ok and start is not None and end is not None and role is not None:
                members.append(Member(label, start, end, MemberRole(role),
                                      tension_only=bool(_b(r, "tension_only"))))
        if self.log.has_errors:
            return None
        pos = self._deck_position() or DeckPosition.THROUGH
        try:
            return TrussGeometry(
                tuple(j for j, _ in joints.values()), tuple(members), tuple(supports),
                tuple(j.label for j in sorted(deck, key=lambda j: j.x_ft)), form="explicit",
                deck_position=pos)
        except GeometryError as exc:
            where = self._locate(exc.message, joints, rows) or jt.header_ref("joint")
            log.error(where, f"the truss as listed is not valid: {exc.message}")
            return None

    def _stability(self, g: TrussGeometry) -> None:
        """A listed truss must be stable with all its members (the rating cannot start else)."""
        from numpy.linalg import LinAlgError

        from rating.analysis.truss import LinearTruss  # the solver's own stability test

        try:
            LinearTruss(g)
        except InstabilityError as exc:
            row = self.joint_rows.get(exc.joint)
            where = row.ref("joint") if row else self.t[sc.JOINTS.name].header_ref("joint")
            self.log.error(where, f"the truss as listed is not stable: {exc.message}")
        except LinAlgError:
            self.log.error(self.t[sc.JOINTS.name].header_ref("joint"), "the truss as listed is "
                           "not stable (its stiffness cannot be factorized); check the joints "
                           "and members for a missing diagonal or support")

    @staticmethod
    def _locate(message: str, joints: Mapping[str, tuple[Joint, Row]],
                members: Mapping[str, Row]) -> str | None:
        for token in re.findall(r"[^\s'\",;:()]+", message):
            if token in members:
                return members[token].ref("member")
            if token in joints:
                return joints[token][1].ref("joint")
        return None

    # -- sections -------------------------------------------------------------------------

    def _sections(self) -> dict[str, tuple[Section, Row, str]]:
        """Section id -> (section, its row, the sheet kind in words)."""
        log = self.log
        out: dict[str, tuple[Section, Row, str]] = {}
        first: dict[str, Row] = {}
        kinds: dict[str, str] = {}

        def claim(r: Row, kind: str) -> str | None:
            sid = _s(r, "section")
            if sid is None:
                return None
            if sid in first:
                log.error(r.ref("section"), f"section id {sid} is already used at "
                          f"{first[sid].ref('section')}; section ids must be unique across "
                          "Eyebars, Rods, BuiltUp and Rolled")
                return None
            first[sid] = r
            kinds[sid] = kind
            return sid

        for r in self.t[sc.EYEBARS.name].rows:
            sid = claim(r, "eyebar set")
            if sid is None:
                continue
            count, w, t = _i(r, "count"), _f(r, "width"), _f(r, "thickness")
            hd, hole = _f(r, "head_diameter"), _f(r, "hole_diameter")
            ht, beyond = _f(r, "head_thickness"), _f(r, "head_beyond_hole")
            if not r.ok or count is None or w is None or t is None or hd is None or hole is None:
                self.broken.add(sid)
                continue
            if hole >= hd:
                log.error(r.ref("hole_diameter"), f"the pin hole of section {sid} "
                          f"({_g(hole)} in) is not smaller than the head ({_g(hd)} in)")
            if hd <= w:
                log.error(r.ref("head_diameter"), f"the head of section {sid} ({_g(hd)} in) "
                          f"must be wider than the bar ({_g(w)} in)")
            if t > w:
                log.warning(r.ref("thickness"), f"the bars of section {sid} are thicker than "
                            "wide; are width and thickness swapped?")
            if ht is not None and ht < t - _TOL_IN:
                log.warning(r.ref("head_thickness"), f"the head of section {sid} is thinner "
                            "than the bar; please confirm")
            if beyond is not None and beyond > hd - hole + _TOL_IN:
                log.error(r.ref("head_beyond_hole"), f"the head of section {sid} extends "
                          f"{_g(beyond)} in beyond the hole, more than the head diameter less "
                          f"the hole ({_g(hd - hole)} in)")
                beyond = None
            out[sid] = (EyebarSet(count, w, t, hd, hole, ht, beyond), r, "eyebar set")

        for r in self.t[sc.RODS.name].rows:
            sid = claim(r, "rod set")
            if sid is None:
                continue
            count, d = _i(r, "count"), _f(r, "diameter")
            end_s, root = _s(r, "rod_end"), _f(r, "root_diameter")
            shape = RodShape(_s(r, "shape") or "round")
            if not r.ok or count is None or d is None or end_s is None:
                self.broken.add(sid)
                continue
            end = RodEnd(end_s)
            if end is RodEnd.THREADED and root is None and "root_diameter" not in r.bad:
                log.error(r.ref("root_diameter"), f"section {sid} has threaded ends: give the "
                          "thread root diameter (it governs tension)")
            if root is not None and root >= d:
                log.error(r.ref("root_diameter"), f"the thread root diameter of section {sid} "
                          f"({_g(root)} in) must be less than the rod ({_g(d)} in)")
            if root is not None and end is not RodEnd.THREADED:
                log.warning(r.ref("root_diameter"), f"section {sid} has {end.value} ends; the "
                            "thread root diameter is not used")
                root = None
            out[sid] = (RodSet(count, d, end, shape, root), r, "rod set")

        parts = self._parts()
        for r in self.t[sc.BUILTUP.name].rows:
            sid = claim(r, "built-up member")
            if sid is None:
                continue
            had_rows = sid in parts
            my_parts = parts.pop(sid, [])
            if not had_rows:
                log.error(r.ref("section"), f"built-up section {sid} has no plates, channels or "
                          "angles listed (Plates, Channels, Angles sheets)")
            kind_s = _s(r, "connectors")
            spacing, r_i = _f(r, "spacing"), _f(r, "r_i")
            conn = None
            if kind_s is not None:
                kind = ConnectorKind(kind_s)
                if kind is not ConnectorKind.SOLID and spacing is None and "spacing" not in r.bad:
                    log.error(r.ref("spacing"), f"section {sid} is {kind.value}d together: give "
                              "the spacing a between connectors (it sets the built-up "
                              "slenderness)" if kind is ConnectorKind.BATTEN else
                              f"section {sid} is laced: give the spacing a between lacing "
                              "points (it sets the built-up slenderness)")
                if kind is ConnectorKind.SOLID and spacing is not None:
                    log.warning(r.ref("spacing"), f"section {sid} is solid; the connector "
                                "spacing is not used")
                    spacing = None
                snug = _b(r, "snug_tight")
                if snug is None and kind is not ConnectorKind.SOLID and "snug_tight" not in r.bad:
                    self.log.assume(r.ref("snug_tight"), "lacing and batten connectors of "
                                    "built-up members taken as snug-tight where the workbook "
                                    "does not say (modified slenderness of Chen (ed.), "
                                    "Structural Engineering Handbook, 31.9)")
                conn = Connectors(kind, spacing, r_i, snug is not False)
            elif spacing is not None:
                log.error(r.ref("connectors"), f"section {sid} gives a connector spacing but "
                          "no connector type (lacing, batten or solid)")
            hole, holes = _f(r, "hole_diameter"), _i(r, "holes")
            if holes and hole is None and "hole_diameter" not in r.bad:
                log.error(r.ref("hole_diameter"), f"section {sid} deducts {holes} holes: give "
                          "the rivet hole diameter")
            if hole and holes is None and "holes" not in r.bad:
                log.error(r.ref("holes"), f"section {sid} gives a rivet hole diameter: give "
                          "the number of holes in the net section too")
            if not r.ok or not my_parts or len(my_parts) < len(
                    [1 for t in sc.PART_TABLES for pr in self.t[t.name].rows
                     if _s(pr, "section") == sid]):
                self.broken.add(sid)
                continue
            sec = BuiltUpSection(tuple(p for p, _ in my_parts), conn, hole or 0.0, holes or 0,
                                 _f(r, "U") or 1.0)
            out[sid] = (sec, r, "built-up member")
        for t_spec in sc.PART_TABLES:
            for pr in self.t[t_spec.name].rows:
                sid = _s(pr, "section")
                if sid is None or sid not in parts:
                    continue
                other = kinds.get(sid)
                if other == "built-up member":
                    continue  # a repeated BuiltUp id, reported there
                what = (f"section {sid} is {_a(other)}, not a built-up member" if other
                        else f"section {sid} is not on the BuiltUp sheet")
                log.error(pr.ref("section"), f"part {_s(pr, 'part')}: {what}")

        for r in self.t[sc.ROLLED.name].rows:
            sid = claim(r, "rolled shape")
            if sid is None:
                continue
            area, net = _f(r, "area"), _f(r, "net_area")
            rx, ry, des = _f(r, "r_x"), _f(r, "r_y"), _s(r, "designation")
            if area is None or rx is None or ry is None or des is None:
                self.broken.add(sid)
                continue
            ok = True
            if net is not None and net > area + _TOL_IN:
                log.error(r.ref("net_area"), f"the net area of section {sid} ({_g(net)} in2) "
                          f"exceeds its gross area ({_g(area)} in2)")
                ok = False
            rz, J, Cw = _f(r, "r_z"), _f(r, "J"), _f(r, "C_w")
            xo, yo = _f(r, "x_o"), _f(r, "y_o")
            if not (_rolled_torsion_consistent(r, sid, des, area, rx, ry, rz, J, Cw, xo, yo,
                                               log) and ok):
                # (said at its cell; the section's own check would say it again at the id)
                self.broken.add(sid)
                continue
            out[sid] = (RolledShape(des, area, rx, ry, net, _f(r, "U") or 1.0, rz, J, Cw, xo,
                                    yo), r, "rolled shape")
        for sid, (sec, r, kind) in list(out.items()):
            try:
                validate_section(sec, f"using section {sid}", r.ref("section"))
            except InputError as exc:
                log.error(r.ref("section"), f"{kind} {sid} cannot be used: {exc.message}")
                del out[sid]
                self.broken.add(sid)
        return out

    def _parts(self) -> dict[str, list[tuple[Part, Row]]]:
        log = self.log
        parts: dict[str, list[tuple[Part, Row]]] = {}
        labels: dict[tuple[str, str], Row] = {}

        def add(r: Row, part: Part | None) -> None:
            sid, label = _s(r, "section"), _s(r, "part")
            if sid is None or label is None:
                return
            if (sid, label.lower()) in labels:
                log.error(r.ref("part"), f"part {label} of section {sid} is already listed at "
                          f"{labels[(sid, label.lower())].ref('part')}; part names must be "
                          "unique within a section")
                return
            labels[(sid, label.lower())] = r
            if part is not None:
                parts.setdefault(sid, []).append((part, r))
            else:
                parts.setdefault(sid, [])

        for r in self.t[sc.PLATES.name].rows:
            x, y, w, t, along = (_f(r, "x"), _f(r, "y"), _f(r, "width"), _f(r, "thickness"),
                                 _s(r, "along"))
            part = None
            if r.ok and x is not None and y is not None and w is not None and t is not None:
                if t > w:
                    log.warning(r.ref("thickness"), f"plate {_s(r, 'part')} of section "
                                f"{_s(r, 'section')} is thicker than wide; are width and "
                                "thickness swapped?")
                part = PlatePart(str(_s(r, "part")), w, t, x, y, vertical=along == "y")
                if _END_PLATE_WORDS.search(part.label):
                    log.warning(r.ref("part"), f"plate {part.label} of section "
                                f"{_s(r, 'section')} is counted as running the member's whole "
                                "length (in its area, weight and buckling); pin plates and "
                                "other plates at the ends only belong on the Packing sheet, "
                                "not here")
            add(r, part)
        for r in self.t[sc.CHANNELS.name].rows:
            vals = [_f(r, k) for k in ("x", "y", "depth", "flange_width", "web_thickness",
                                       "flange_thickness")]
            toes = _s(r, "toes")
            part = None
            if r.ok and None not in vals and toes is not None:
                x, y, d, bf, tw, tf = (float(v) for v in vals)  # type: ignore[arg-type]
                name = f"channel {_s(r, 'part')} of section {_s(r, 'section')}"
                if 2 * tf >= d:
                    log.error(r.ref("flange_thickness"), f"the flanges of {name} are thicker "
                              f"than half its depth ({_g(d)} in)")
                elif tw >= bf:
                    log.error(r.ref("web_thickness"), f"the web of {name} is thicker than its "
                              f"flange is wide ({_g(bf)} in)")
                else:
                    part = ChannelPart(str(_s(r, "part")), d, bf, tw, tf, x, y, ChannelToes(toes))
            add(r, part)
        for r in self.t[sc.ANGLES.name].rows:
            vals = [_f(r, k) for k in ("x", "y", "leg_x", "leg_y", "thickness")]
            xd, yd = _s(r, "x_dir"), _s(r, "y_dir")
            part = None
            if r.ok and None not in vals and xd and yd:
                x, y, lx, ly, t = (float(v) for v in vals)  # type: ignore[arg-type]
                if t >= min(lx, ly):
                    log.error(r.ref("thickness"), f"angle {_s(r, 'part')} of section "
                              f"{_s(r, 'section')} is thicker than its shorter leg")
                else:
                    part = AnglePart(str(_s(r, "part")), lx, ly, t, x, y,
                                     1 if xd == "+x" else -1, 1 if yd == "+y" else -1)
            add(r, part)
        return parts

    # -- materials ------------------------------------------------------------------------

    def _default(self, kind: MaterialKind, where: str) -> Material:
        year = _i(self.b, "year_built")
        d = self.defaults.get((kind, year))
        if d is None:
            d = self.defaults[(kind, year)] = default_material(kind, year)
        self.log.assume(where, d.assumption)
        return d.material

    def _materials(self) -> dict[str, tuple[Material, Row]]:
        log = self.log
        out: dict[str, tuple[Material, Row]] = {}
        year = _i(self.b, "year_built")
        for r in self.t[sc.MATERIALS.name].rows:
            mid, kind_s = _s(r, "material"), _s(r, "kind")
            if mid is None:
                continue
            if mid in out:
                log.error(r.ref("material"), f"material {mid} is listed twice (first at "
                          f"{out[mid][1].ref('material')})")
                continue
            if kind_s is None:
                continue
            kind = MaterialKind(kind_s)
            base = default_material(kind, year).material
            fy, fu = _f(r, "F_y"), _f(r, "F_u")
            E = _f(r, "E") or base.E
            gamma = _f(r, "unit_weight") or base.unit_weight_pcf
            if fy is None and fu is None:
                if "F_y" in r.bad or "F_u" in r.bad:
                    continue
                m = self._default(kind, r.ref("F_y"))
                mat = dataclasses.replace(m, E=E, unit_weight_pcf=gamma)
            elif fy is None or fu is None:
                missing = "F_y" if fy is None else "F_u"
                if missing not in r.bad:
                    log.error(r.ref(missing), f"material {mid} gives only one of Fy and Fu; "
                              "give both, or neither to use the default for the year built")
                continue
            else:
                if fu < fy:
                    log.error(r.ref("F_u"), f"material {mid}: tensile strength Fu {_g(fu)} ksi "
                              f"is less than the yield strength Fy {_g(fy)} ksi")
                mat = Material(kind, fy, fu, E=E, unit_weight_pcf=gamma,
                               basis=_s(r, "basis") or "given on the Materials sheet")
            out[mid] = (mat, r)
        return out

    # -- members --------------------------------------------------------------------------

    def _member_designs(
        self, g: TrussGeometry | None, rows: dict[str, Row],
        sections: dict[str, tuple[Section, Row, str]],
        materials: dict[str, tuple[Material, Row]],
    ) -> tuple[tuple[MemberDesign, ...], TrussGeometry | None]:
        log, b = self.log, self.b
        designs: list[MemberDesign] = []
        used_sections: set[str] = set()
        used_materials: set[str] = set()
        no_material: list[str] = []
        bridge_kind = _s(b, "material")
        for label, r in rows.items():
            if g is not None and label not in g.member_index:
                continue
            sid = _s(r, "section")
            sec = None
            estimated_at = ""
            if sid is not None:
                if sid in sections:
                    sec, sec_row, _ = sections[sid]
                    used_sections.add(sid)
                    if _s(sec_row, "dims_from") == "estimated":
                        estimated_at = sec_row.ref("dims_from")
                elif sid in self.broken:
                    pass
                else:
                    log.error(r.ref("section"), f"section {sid} of member {label} is not on "
                              "Eyebars, Rods, BuiltUp or Rolled")
            mid = _s(r, "material")
            mat = None
            if mid is not None:
                if mid in materials:
                    mat = materials[mid][0]
                    used_materials.add(mid)
                else:
                    log.error(r.ref("material"), f"material {mid} of member {label} is not on "
                              "the Materials sheet")
            elif "material" not in r.bad:
                if bridge_kind is None:
                    no_material.append(label)
                else:
                    mat = self._default(MaterialKind(bridge_kind), b.ref("material"))
            if sec is not None and mat is not None:
                designs.append(MemberDesign(label, sec, mat, K=_f(r, "K"),
                                            condition_factor=_f(r, "phi_c"),
                                            system_factor=_f(r, "phi_s"),
                                            where=r.ref("member"), estimated_at=estimated_at))
        if no_material and "material" not in b.bad:
            log.error(b.ref("material"), "no truss material is given here and members "
                      f"{_listing(no_material)} have no material id; state the material "
                      "(steel or wrought iron) or give each member a material")
        for sid, (_sec, r, kind) in sections.items():
            if sid not in used_sections and r.ok:
                log.warning(r.ref("section"), f"{kind} {sid} is not used by any member")
        for mid, (_m, r) in materials.items():
            if mid not in used_materials and not any(
                    _s(p, "material") == mid for p in self.t[sc.PINS.name].rows):
                log.warning(r.ref("material"), f"material {mid} is not used by any member or pin")
        if g is None or log.has_errors:
            return tuple(designs), g
        by_label = {d.member: d for d in designs}
        areas: dict[int, float] = {}  # by section (members share them), while designs hold them
        new_members = []
        for m in g.members:
            r = rows[m.label]
            t_only = _b(r, "tension_only")
            section = by_label[m.label].section
            if t_only is False and isinstance(section, EyebarSet | RodSet):
                log.warning(r.ref("tension_only"), f"member {m.label} is marked not "
                            f"tension-only, but its section is {_a(section_kind(section))}, "
                            "which cannot push: it is rated as tension-only")
            area = areas.get(id(section))
            if area is None:
                area = areas[id(section)] = gross_area_as_built_in2(section)
            new_members.append(dataclasses.replace(
                m, area_in2=area, tension_only=m.tension_only if t_only is None else t_only))
        try:
            g2 = TrussGeometry(g.joints, tuple(new_members), g.supports, g.deck_joints,
                               form=g.form, deck_position=g.deck_position)
        except GeometryError as exc:  # a section with no area would land here
            log.error(self.t[sc.MEMBERS.name].header_ref("member"), exc.message)
            return tuple(designs), None
        order = {m.label: i for i, m in enumerate(g.members)}
        return tuple(sorted(designs, key=lambda d: order[d.member])), g2

    # -- findings -------------------------------------------------------------------------

    def _component(self, r: Row, member: str, section: Section) -> str | None:
        raw = _s(r, "component")
        if raw is None or raw.lower() == "all":
            return "all"
        where = r.ref("component")
        if isinstance(section, EyebarSet | RodSet):
            word = "bar" if isinstance(section, EyebarSet) else "rod"
            m = _BAR.match(raw)
            if not m:
                self.log.error(where, f"component {raw!r} of member {member} is not understood; "
                               f"name a {word} as '{word} 1' to '{word} {section.count}', or "
                               "'all'")
                return None
            k = int(m.group(1))
            if not 1 <= k <= section.count:
                self.log.error(where, f"member {member} has {section.count} "
                               f"{word}{'s' if section.count > 1 else ''}; there is no {word} {k}")
                return None
            return f"{word} {k}"  # as a reviewer calls it (the rating matches either)
        if isinstance(section, BuiltUpSection):
            names = [p.label for p in section.parts]
            for n in names:
                if n == raw or n.lower() == raw.lower():
                    return n
            joined = connector_component(section.connectors, raw)
            if joined is not None:
                return joined
            words = [w for ws in CONNECTOR_WORDS.values() for w in ws]
            if raw.strip().lower() in words:
                has = ("no connectors recorded" if section.connectors is None else
                       f"its parts are joined by {section.connectors.kind.value}")
                self.log.error(where, f"member {member} has no {raw.strip().lower()} ({has} "
                               "on the BuiltUp sheet)")
                return None
            kind = section.connectors.kind if section.connectors is not None else None
            also = (f", or {CONNECTOR_WORDS[kind][0]!r}" if kind in CONNECTOR_WORDS else "")
            self.log.error(where, f"member {member} has no part named {raw!r}; its parts are "
                           f"{_listing(names)} (or 'all'{also})")
            return None
        self.log.error(where, f"member {member} is a rolled shape without parts; the component "
                       "must be 'all'")
        return None

    def _findings(self, g: TrussGeometry | None,
                  designs: tuple[MemberDesign, ...]) -> tuple[Finding, ...]:
        log = self.log
        by_member = {d.member: d for d in designs}
        out: list[Finding] = []
        seen: dict[tuple[object, ...], Row] = {}
        for r in self.t[sc.FINDINGS.name].rows:
            member = _s(r, "member")
            if member is None:
                continue
            if g is not None and member not in g.member_index:
                rev = _reverse_label(member)
                hint = f"; did you mean {rev}?" if rev and rev in g.member_index else ""
                log.error(r.ref("member"), f"member {member} of this finding is not a member of "
                          f"the truss{hint}")
                continue
            design = by_member.get(member)
            region = FindingRegion(_s(r, "region") or "body")
            station = _f(r, "station")
            if g is not None and station is not None:
                length = g.member_length_ft(member)
                if station > length + 0.01:
                    log.error(r.ref("station"), f"distance {_g(station)} ft is beyond the end "
                              f"of member {member}, which is {_g(length)} ft long")
            remaining, loss = _f(r, "remaining"), _f(r, "loss")
            if loss is not None and loss >= 100.0:
                log.error(r.ref("loss"), f"100 % loss on member {member} means the bar or part "
                          "is gone; record Bar state as missing or broken instead")
            if remaining is not None and remaining <= 0.0:
                log.error(r.ref("remaining"), f"no metal left on member {member}: record Bar "
                          "state as missing or broken instead of a remaining thickness of 0")
            state = BarState(_s(r, "bar_state") or "sound")
            note = _s(r, "note") or ""
            said = damage_in_note(note) if state in (BarState.SOUND, BarState.BENT) else None
            if said is not None:
                log.warning(r.ref("bar_state"), f"{DAMAGE_IN_NOTE}: the note on member "
                            f"{member} speaks of {said!r} but the bar state is {state.value}: "
                            "the rating counts the bar or part as carrying its load; if it is "
                            "cracked or broken, record that bar state (it is then taken as "
                            "carrying none)")
            pack = bool(_b(r, "pack_rust"))
            cond = _i(r, "condition")
            if (remaining is None and loss is None and state is BarState.SOUND and not pack
                    and cond is None and not r.bad):
                log.warning(r.ref("member"), f"the finding on member {member} records no loss, "
                            "bar state, pack rust or condition rating; it does not change the "
                            "rating")
            # (without the member's section the component stays as written, so two bars of
            # it are not taken for the same one)
            component = (_s(r, "component") or "all") if design is None else "all"
            if design is not None:
                comp = self._component(r, member, design.section)
                if comp is None:
                    continue
                component = comp
                self._check_region(r, member, design.section, region)
                if remaining is not None and remaining > 0 and component not in (
                        ws[0] for ws in CONNECTOR_WORDS.values()):
                    self._check_remaining(r, member, design.section, component, region,
                                          remaining, loss)
            key = (member, component, region, station)
            if key in seen and (remaining is not None or loss is not None):
                log.warning(r.ref("member"), f"member {member}, {component}, {region.value}"
                            f"{'' if station is None else f' at {_g(station)} ft'} is already "
                            f"recorded at {seen[key].ref('member')}; both findings are kept")
            seen.setdefault(key, r)
            out.append(Finding(member=member, component=component, region=region,
                               station_ft=station, remaining_thickness_in=remaining,
                               percent_loss=loss, bar_state=state, pack_rust=pack,
                               condition_rating=cond, photo=_s(r, "photo") or "",
                               note=note, where=r.ref("member"),
                               estimated=_s(r, "how_found") == "estimated"))
        return tuple(out)

    def _check_region(self, r: Row, member: str, section: Section,
                      region: FindingRegion) -> None:
        if isinstance(section, EyebarSet) and region is FindingRegion.THREAD:
            self.log.error(r.ref("region"), f"member {member} is an eyebar set, which has no "
                           "thread; record the finding at the body or the head")
        elif isinstance(section, BuiltUpSection | RolledShape) and region in (
                FindingRegion.HEAD, FindingRegion.THREAD):
            self.log.error(r.ref("region"), f"member {member} is a riveted member, which has no "
                           f"{region.value}; record the finding at the body or the connection")

    def _check_remaining(self, r: Row, member: str, section: Section, component: str,
                         region: FindingRegion, remaining: float, loss: float | None) -> None:
        log = self.log
        where = r.ref("remaining")
        original: float | None
        what: str
        if isinstance(section, EyebarSet):
            head = region is not FindingRegion.BODY
            original = (section.head_thickness_in or section.thickness_in) if head else (
                section.thickness_in)
            what = "head thickness" if head else "bar thickness"
        elif isinstance(section, RodSet):
            at_end = region is not FindingRegion.BODY and section.root_diameter_in is not None
            original = section.root_diameter_in if at_end else section.diameter_in
            what = "thread root diameter" if at_end else "rod diameter"
        elif isinstance(section, BuiltUpSection):
            if component == "all":
                ts = {round(part_reference_thickness_in(p), 6) for p in section.parts}
                if len(ts) > 1:
                    log.error(where, f"the parts of member {member} differ in thickness, so a "
                              "remaining thickness for 'all' is ambiguous; name the part or give "
                              "a percent loss")
                    return
                original = ts.pop() if ts else None
            else:
                p = next(p for p in section.parts if p.label == component)
                original = part_reference_thickness_in(p)
            what = "thickness" if not isinstance(
                next((p for p in section.parts if p.label == component), None),
                ChannelPart) else "web thickness"
        else:
            if loss is None:
                log.error(where, f"member {member} is a rolled shape given by its properties; "
                          "give the loss as a percent, not as a remaining thickness")
            return
        if original is None:
            return
        if remaining > original + _TOL_IN:
            log.error(where, f"remaining thickness {_g(remaining)} in on member {member} is "
                      f"more than the original {what} of {_g(original)} in")
        elif loss is not None and abs(original * (1 - loss / 100.0) - remaining) > (
                0.02 * original + 0.005):
            log.error(r.ref("loss"), f"the remaining thickness {_g(remaining)} in and the loss "
                      f"{_g(loss)} % on member {member} disagree for the {_g(original)} in "
                      f"{what} as built; give one of them")
        elif remaining < 0.25 * original:
            # (a value typed in inches in an SI workbook reads as millimetres: 97 % loss)
            unit = "mm" if self.si else "inches"
            log.warning(where, f"remaining thickness {_g(remaining)} in on member {member} is "
                        f"less than a quarter of the {_g(original)} in {what} as built "
                        f"({100.0 * (1.0 - remaining / original):.0f} % loss); please confirm "
                        f"it, and that it is in {unit} as this workbook's units say")

    # -- pins -----------------------------------------------------------------------------

    def _pins(self, g: TrussGeometry | None, designs: tuple[MemberDesign, ...],
              materials: dict[str, tuple[Material, Row]]) -> tuple[Pin, ...]:
        log = self.log
        pin_rows: dict[str, Row] = {}
        pins: dict[str, tuple[float, Material | None]] = {}
        for r in self.t[sc.PINS.name].rows:
            joint, d = _s(r, "joint"), _f(r, "diameter")
            if joint is None:
                continue
            if joint in pin_rows:
                log.error(r.ref("joint"), f"joint {joint} already has a pin at "
                          f"{pin_rows[joint].ref('joint')}; one row per pin")
                continue
            pin_rows[joint] = r
            if g is not None and joint not in g.joint_index:
                log.error(r.ref("joint"), f"joint {joint} of this pin is not a joint of the "
                          f"truss (joints: {_listing(j.label for j in g.joints)})")
                continue
            mid = _s(r, "material")
            mat: Material | None = None
            if mid is not None:
                if mid in materials:
                    mat = materials[mid][0]
                else:
                    log.error(r.ref("material"), f"material {mid} of the pin at {joint} is not "
                              "on the Materials sheet")
            elif "material" not in r.bad:
                mat = self._default(MaterialKind.STEEL, r.ref("material"))
            if d is not None:
                pins[joint] = (d, mat)
        by_member = {d.member: d for d in designs}
        at_joint: dict[str, list[str]] = {}  # the labels of g.members_at(joint), in order
        for m in g.members if g is not None else ():
            for end in dict.fromkeys((m.start, m.end)):
                at_joint.setdefault(end, []).append(m.label)
        packing: dict[str, list[tuple[int, PackingItem, Row]]] = {}
        positions: dict[tuple[str, int], Row] = {}
        fit_said: set[tuple[str, str]] = set()
        for r in self.t[sc.PACKING.name].rows:
            joint, pos, t = _s(r, "joint"), _i(r, "position"), _f(r, "thickness")
            if joint is None or pos is None:
                continue
            if (joint, pos) in positions:
                log.error(r.ref("position"), f"position {pos} on the pin at {joint} is already "
                          f"taken at {positions[(joint, pos)].ref('position')}")
                continue
            positions[(joint, pos)] = r
            if joint not in pin_rows:
                if self.book.find(sc.PINS.name) is not None:  # (else one error for the sheet)
                    log.error(r.ref("joint"), f"there is no pin at joint {joint} on the Pins "
                              "sheet for this packing")
                continue
            member = _s(r, "member")
            if member is not None and member.strip().lower() == FLOORBEAM:
                member = FLOORBEAM
                if g is not None and joint not in g.deck_joints:
                    log.error(r.ref("member"), f"joint {joint} is not a deck panel point, so no "
                              "floorbeam hangs on its pin")
                    continue
            elif member is not None and g is not None:
                at = at_joint.get(joint, []) if joint in g.joint_index else []
                if member not in g.member_index:
                    log.error(r.ref("member"), f"member {member} on the pin at {joint} is not a "
                              "member of the truss (write 'floorbeam' for a floorbeam hanger, "
                              "or leave blank for a filler)")
                    continue
                if member not in at:
                    log.error(r.ref("member"), f"member {member} does not meet at joint {joint}; "
                              f"the members there are {_listing(at)}")
                    continue
                d = by_member.get(member)
                pin = pins.get(joint)
                if (d is not None and pin is not None and isinstance(d.section, EyebarSet)
                        and (member, joint) not in fit_said):
                    fit_said.add((member, joint))  # (once for each member's bars on a pin)
                    hole = d.section.pin_hole_diameter_in
                    if hole < pin[0] - _TOL_IN:
                        log.error(r.ref("member"), f"the eyebars of {member} have a {_g(hole)} in "
                                  f"pin hole, smaller than the {_g(pin[0])} in pin at {joint}")
                    elif hole - pin[0] > MAX_PIN_CLEARANCE_IN:
                        log.error(r.ref("member"), f"the eyebars of {member} have a {_g(hole)} in "
                                  f"pin hole, {_g(hole - pin[0])} in larger than the "
                                  f"{_g(pin[0])} in pin at {joint} (more than "
                                  f"{_g(MAX_PIN_CLEARANCE_IN)} in): check the pin or the hole")
            if t is None:
                continue
            packing.setdefault(joint, []).append(
                (pos, PackingItem(member, t, _f(r, "gap") or 0.0), r))
        out: list[Pin] = []
        no_sheet = self.book.find(sc.PACKING.name) is None
        if no_sheet and pin_rows:
            # one error for the missing sheet, not one for each pin
            log.error(next(iter(pin_rows.values())).ref("joint"), f"the {sc.PACKING.name} "
                      f"sheet is missing, so the {len(pin_rows)} pin(s) listed here cannot be "
                      "checked: list the bars on each pin in order on that sheet, or delete "
                      "the pin rows")
        for joint, r in pin_rows.items():
            if joint not in pins:
                continue
            items = sorted(packing.get(joint, []), key=lambda x: x[0])
            missing = sorted(set(range(1, max((k for k, _, _ in items), default=0) + 1))
                             - {k for k, _, _ in items})
            if missing and items:
                # (the plates are taken in the order of their positions: a gap may be a plate
                # left out, which would move every plate after it along the pin)
                log.warning(items[0][2].ref("position"), f"the packing of the pin at {joint} "
                            f"has no position {_listing(str(k) for k in missing)}; its plates "
                            "are taken in order of position with nothing between them; check "
                            "that no plate was left out")
            if not items and not no_sheet and not any(
                    _s(p, "joint") == joint for p in self.t[sc.PACKING.name].rows):
                log.error(r.ref("joint"), f"the pin at {joint} has no packing rows; list the bars "
                          "on it in order on the Packing sheet (the pin is checked from them), or "
                          "delete the pin row")
            if g is not None and items and joint in g.joint_index:
                on_pin = {it.member for _, it, _ in items}
                absent = [m for m in at_joint.get(joint, []) if m not in on_pin]
                if absent:
                    one = len(absent) == 1
                    log.error(r.ref("joint"), f"member{'' if one else 's'} {_listing(absent)} "
                              f"meet{'s' if one else ''} at {joint} but "
                              f"{'has' if one else 'have'} no plate in its packing; every bar "
                              "on the pin is needed to check it")
                plates = Counter(it.member for _, it, _ in items)
                for m_label in sorted(on_pin - {None, FLOORBEAM}):
                    d = by_member.get(str(m_label))
                    n_plates = plates[m_label]
                    if d is not None and isinstance(d.section, EyebarSet) and (
                            n_plates != d.section.count):
                        log.warning(r.ref("joint"), f"member {m_label} has {d.section.count} "
                                    f"eyebars but {n_plates} plates on the pin at {joint}; "
                                    "please confirm the packing")
            diameter, mat = pins[joint]
            out.append(Pin(joint, diameter, tuple(it for _, it, _ in items), mat,
                           where=r.ref("joint"),
                           spliced_chord=self._spliced(r, joint, g, by_member),
                           estimated_at=next(
                               (row.ref("dims_from") for row in (r, *(q for _, _, q in items))
                                if _s(row, "dims_from") == "estimated"), "")))
        if pin_rows and g is not None:
            # eyebars and loop rods hang on pins by their nature: a joint where they end with
            # no pin listed has a pin that is not rated (riveted joints have no such bars)
            pinned = [j.label for j in g.joints if j.label not in pin_rows and any(
                _on_a_pin(by_member.get(m.label)) for m in g.members_at(j.label))]
            if pinned:
                many = len(pinned) > 1
                log.warning(_first_entry(sc.PINS), f"{NO_PINS}: eyebars or loop rods end "
                            f"at joint{'s' if many else ''} {_listing(pinned)} but no pin is "
                            f"listed there, so {'those pins are' if many else 'that pin is'} "
                            "not rated; list each with its packing (pins often govern)")
        if not pin_rows and self.book.find(sc.PINS.name) is not None:
            log.warning(_first_entry(sc.PINS), f"{NO_PINS}: the Pins sheet "
                        "lists no pin, so no pin is rated; on a pin-connected truss the pins "
                        "often govern, so list each pin with its packing before relying on a "
                        "posting (where the joints are riveted, their gusset plates need a "
                        "rating of their own).")
        return tuple(out)

    # -- loads ----------------------------------------------------------------------------

    def _dead_loads(self) -> tuple[DeadLoadItem, ...]:
        log, b = self.log, self.b
        out: list[DeadLoadItem] = []
        bases = (("psf_deck", DeadLoadBasis.PSF_DECK), ("plf_bridge", DeadLoadBasis.PLF_BRIDGE),
                 ("plf_truss", DeadLoadBasis.PLF_TRUSS),
                 ("kip_floorbeam", DeadLoadBasis.KIP_PER_FLOORBEAM))
        for r in self.t[sc.DEADLOADS.name].rows:
            desc, comp = _s(r, "description"), _s(r, "component")
            given = [(k, basis, _f(r, k)) for k, basis in bases if r.has(k)]
            if any(k in r.bad for k, _ in bases):
                continue
            if not given:
                log.error(r.ref("description"), f"dead load '{desc}' has no intensity; fill "
                          "exactly one of the four load columns")
                continue
            if len(given) > 1:
                log.error(r.ref(given[1][0]), f"dead load '{desc}' has an intensity in more "
                          "than one load column; use one row per load")
                continue
            if desc is None or comp is None:
                continue
            _k, basis, value = given[0]
            if value is None:
                continue
            out.append(DeadLoadItem(desc, DeadLoadKind(comp), basis, value,
                                    offset_ft=_f(r, "offset") or 0.0, where=r.ref("description")))
        t = _f(b, "ws_thickness")
        if t:
            gamma = _f(b, "ws_unit_weight")
            if gamma is None and "ws_unit_weight" not in b.bad:
                gamma = sc.WEARING_SURFACE_UNIT_WEIGHT_PCF
                self.log.assume(b.ref("ws_unit_weight"), f"wearing surface unit weight "
                                f"{gamma:g} pcf ({sc.WEARING_SURFACE_SOURCE})")
            if gamma is not None:
                out.append(DeadLoadItem(f"wearing surface, {_g(t)} in", DeadLoadKind.DW,
                                        DeadLoadBasis.PSF_DECK, t / 12.0 * gamma,
                                        where=b.ref("ws_thickness")))
        elif _b(b, "ws_measured"):
            log.warning(b.ref("ws_measured"), "the wearing surface is marked as measured but "
                        "no thickness is given")
        if (not any(x.kind is DeadLoadKind.DC for x in out)
                and self.book.find(sc.DEADLOADS.name) is not None and not log.has_errors):
            # a truss always carries a deck and a floor system: no DC beyond the trusses' own
            # weight is a gap in the record, and it raises every rating
            units = ("kPa of deck, kN/m or kN per floorbeam" if self.si
                     else "psf of deck, plf or kip per floorbeam")
            log.warning(_first_entry(sc.DEADLOADS), f"{NO_DEAD_LOAD}: the "
                        "DeadLoads sheet lists no DC (deck, stringers, floorbeams, railings), "
                        "so the rating carries the trusses' own weight and any wearing surface "
                        f"only; list them ({units}) before relying on any rating factor or "
                        "posting.")
        return tuple(out)

    def _vehicles(self) -> tuple[Vehicle, ...]:
        log = self.log
        vrows: dict[str, Row] = {}
        library_ids: frozenset[str] | None = None
        for r in self.t[sc.VEHICLES.name].rows:
            vid = _s(r, "vehicle")
            if vid is None:
                continue
            if vid in vrows:
                log.error(r.ref("vehicle"), f"vehicle {vid} is listed twice (first at "
                          f"{vrows[vid].ref('vehicle')})")
                continue
            vrows[vid] = r
            if library_ids is None:
                library_ids = known_ids()
            if vid.casefold() in library_ids:
                log.warning(r.ref("vehicle"), f"vehicle {vid} has the id of a library vehicle; "
                            "the one on this sheet is used in its place")
        axles: dict[str, dict[int, Row]] = {}
        for r in self.t[sc.AXLES.name].rows:
            vid, k = _s(r, "vehicle"), _i(r, "axle")
            if vid is None or k is None:
                continue
            if vid not in vrows:
                log.error(r.ref("vehicle"), f"vehicle {vid} of this axle is not on the "
                          "Vehicles sheet")
                continue
            mine = axles.setdefault(vid, {})
            if k in mine:
                log.error(r.ref("axle"), f"axle {k} of vehicle {vid} is listed twice (first "
                          f"at {mine[k].ref('axle')})")
                continue
            mine[k] = r
        out: list[Vehicle] = []
        for vid, vr in vrows.items():
            mine = axles.get(vid, {})
            if not mine:
                log.error(vr.ref("vehicle"), f"vehicle {vid} has no axles on the Axles sheet")
                continue
            n = max(mine)
            gaps = [str(k) for k in range(1, n + 1) if k not in mine]
            if gaps:
                log.error(vr.ref("vehicle"), f"vehicle {vid} has axles up to {n} but axle "
                          f"{_listing(gaps)} is missing on the Axles sheet")
                continue
            loads: list[float] = []
            spacings: list[AxleSpacing] = []
            ok = True
            for k in range(1, n + 1):
                ar = mine[k]
                load, sp, mx = _f(ar, "load"), _f(ar, "spacing"), _f(ar, "max_spacing")
                if load is None:
                    ok = False
                    continue
                loads.append(load)
                if k == 1:
                    if sp is not None or mx is not None:
                        log.warning(ar.ref("spacing"), f"axle 1 of vehicle {vid} is the front "
                                    "axle; its spacing is not read")
                    continue
                if sp is None:
                    if "spacing" not in ar.bad:
                        log.error(ar.ref("spacing"), f"axle {k} of vehicle {vid} needs its "
                                  "spacing from the axle ahead")
                    ok = False
                    continue
                if mx is not None and mx < sp:
                    log.error(ar.ref("max_spacing"), f"the maximum spacing of axle {k} of "
                              f"vehicle {vid} ({_g(mx)} ft) is less than the spacing "
                              f"({_g(sp)} ft)")
                    ok = False
                    continue
                spacings.append(AxleSpacing(sp, mx if mx is not None else sp))
            name = _s(vr, "name")
            if not ok or not vr.ok or name is None:
                continue
            total_tons = sum(loads) / 2.0
            category = VehicleCategory(_s(vr, "category") or "owner")
            if len(loads) == 1 and category.is_permit:
                log.warning(vr.ref("vehicle"), f"permit {vid} has one axle: as a routine "
                            "permit its weight ratio (gross weight over the first-to-last axle "
                            "length) is infinite, the table's lightest factor; check the axles")
            elif len(loads) == 1:
                log.warning(vr.ref("vehicle"), f"vehicle {vid} has one axle: its safe posting "
                            "load is an axle load (a sign for the weight on one axle), not a "
                            "truck's gross weight, yet it is posted and counted in the single "
                            "weight limit for trucks like any truck; the engineer should post "
                            "it apart if at all")
            self._owner_factors(vr, vid, category)
            gross = _f(vr, "gross")
            if gross is not None and abs(gross - total_tons) > 0.02 * total_tons:
                if not _f(vr, "lane_load"):
                    # the RF comes from the axles and the posting load from W: a W above the
                    # axles' sum would post the bridge for more than it carries
                    log.error(vr.ref("gross"), f"the gross weight of vehicle {vid} "
                              f"({_g(gross)} tons) differs from the sum of its axles "
                              f"({_g(total_tons)} tons): the rating comes from the axles and "
                              "the posting load from the gross weight, so they must agree; "
                              "correct one of them, or leave the gross weight blank")
                else:
                    log.warning(vr.ref("gross"), f"the gross weight of vehicle {vid} "
                                f"({_g(gross)} tons) differs from the sum of its axles "
                                f"({_g(total_tons)} tons); with its lane load, the gross "
                                "weight given is used for its rating in weight (RT) and "
                                "posting")
            out.append(Vehicle(id=vid, name=name, category=category,
                               axle_loads_kip=tuple(loads), spacings=tuple(spacings),
                               gross_weight_tons=gross if gross is not None else total_tons,
                               lane_load_klf=_f(vr, "lane_load") or 0.0,
                               gamma_ll=_f(vr, "gamma_ll"),
                               im=None if _f(vr, "im") is None else _f(vr, "im") / 100.0,
                               wheel_gauge_ft=_f(vr, "wheel_gauge"),
                               source="owner's vehicle, inspection workbook",
                               tag="owner data", where=vr.ref("vehicle")))
        return tuple(out)

    def _spliced(self, r: Row, joint: str, g: TrussGeometry | None,
                 designs: Mapping[str, MemberDesign]) -> tuple[str, str] | None:
        """The two chord members spliced through the pin's joint, where the Pins sheet says
        so: the chord members (top or bottom chord, end post) that meet there; an error at
        the cell where there are not two, or where they are bars (eyebars and rods bear on
        the pin by their heads or loops: they are not spliced)."""
        if r.get("spliced") is not True or g is None or joint not in g.joint_index:
            return None
        for roles in ((MemberRole.TOP_CHORD, MemberRole.END_POST), (MemberRole.BOTTOM_CHORD,)):
            chord = [m.label for m in g.members_at(joint) if m.role in roles]
            if len(chord) == 2:
                bars = [lab for lab in chord if designs.get(lab) is not None
                        and isinstance(designs[lab].section, EyebarSet | RodSet)]
                if bars:
                    self.log.error(r.ref("spliced"), f"the chord at {joint} is given as "
                                   f"spliced through the joint, but {_listing(bars)} "
                                   f"{'is' if len(bars) == 1 else 'are'} of eyebars or rods, "
                                   "which bear on the pin by their heads or loops")
                    return None
                hip = any(g.member(lab).role is MemberRole.END_POST for lab in chord)
                if hip and _s(self.b, "chord_at_hips") == "hinged":
                    self.log.warning(r.ref("spliced"), f"the pin at the hip {joint} is given "
                                     "with its chord spliced through, but the Bridge sheet "
                                     "gives the top chord as hinged at the hips: the two "
                                     "disagree; check which is so")
                return chord[0], chord[1]
        self.log.error(r.ref("spliced"), f"the chord at {joint} is given as spliced through "
                       "the joint, but two members of one chord (top chord or end post, or "
                       "bottom chord) do not meet there: a splice joins two")
        return None

    def _owner_factors(self, vr: Row, vid: str, category: VehicleCategory) -> None:
        """A factor given with a vehicle replaces the one its category and the settings give:
        said at its cell, since a lower one raises the rating (and lifts a posting); an IM
        below the legal loads' belongs to an escorted permit held to a crawl (MBE 6A.4.5.5
        [value from memory]). A permit's lane load is placed like a legal load's."""
        log = self.log
        if _f(vr, "gamma_ll") is not None:
            log.warning(vr.ref("gamma_ll"), f"vehicle {vid} is rated with its own live-load "
                        f"factor {_g(_f(vr, 'gamma_ll'))} in place of the one its category "
                        "gives (see the provisions listed in the report): a lower one raises "
                        "its rating" + ("" if category.is_permit else " and its safe posting "
                                        "load") + "; confirm the owner's reason")
        im = _f(vr, "im")
        if im is not None and category is not VehicleCategory.PERMIT_ESCORTED:
            log.warning(vr.ref("im"), f"vehicle {vid} is rated with its own dynamic load "
                        f"allowance {_g(im)} % in place of the legal loads' (33 %, or less by "
                        "the riding surface); only an escorted permit held to a crawl is "
                        "rated without it (MBE 6A.4.5.5 [value from memory]): confirm the "
                        "owner's reason")
        if category.is_permit and _f(vr, "lane_load"):
            log.warning(vr.ref("lane_load"), f"permit {vid} has a lane load: it is placed like "
                        "a legal load's, on every part of the span where it adds to the "
                        "force, under the vehicle too (conservative); MBE places a permit's "
                        "lane load on longer spans only and off the vehicle [value from "
                        "memory], and an escorted permit has no other load on the bridge")

    # -- settings -------------------------------------------------------------------------

    def _settings(self, s: Row, vehicles: tuple[Vehicle, ...]) -> RatingSettings:
        b = self.b
        ids = s.get("vehicles")
        vehicle_ids: tuple[str, ...] | None = None
        if isinstance(ids, tuple) and ids:
            vehicle_ids = tuple(str(v) for v in ids)
            dup = {v for v in vehicle_ids if vehicle_ids.count(v) > 1}
            if dup:
                self.log.warning(s.ref("vehicles"), f"vehicle {sorted(dup)[0]} is listed "
                                 "twice; it is rated once")
                vehicle_ids = tuple(dict.fromkeys(vehicle_ids))
            known = known_ids()
            owner = {v.id.casefold() for v in vehicles}
            unknown = [v for v in vehicle_ids if v.casefold() not in owner | known]
            if unknown:
                shown = [r.id for r in rating_loads()] + [v.id for v in vehicles]
                self.log.error(s.ref("vehicles"), f"vehicle {unknown[0]} is neither in the "
                               "vehicle library nor on the Vehicles sheet (known: "
                               f"{_listing(shown, 30)})")
        im = _f(s, "im_override")
        da = _f(s, "detail_allowance")
        riding = _s(b, "riding_surface")
        if _f(b, "adtt") is None and b.ref("adtt"):
            self.log.warning(b.ref("adtt"), "the ADTT is not given: the legal loads (and "
                             "permits) take the live-load factor for an unknown ADTT, the "
                             "highest of their tables (MBE Tables 6A.4.4.2.3a-1 and "
                             "6A.4.5.4.2a-1 [value from memory]); give the ADTT from the "
                             "inventory record for a rating that may be less severe")
        return RatingSettings(
            vehicle_ids=vehicle_ids,
            provision_set=_s(s, "provision_set") or "MBE 2018",
            adtt_one_direction=_f(b, "adtt"),
            riding_surface=RidingSurface(riding) if riding else None,
            wearing_surface_measured=bool(_b(b, "ws_measured")),
            im_override=None if im is None else im / 100.0,
            gamma_ll_override=_f(s, "gamma_ll_override"),
            distribution_factor_override=_f(s, "df_override"),
            detail_allowance=0.15 if da is None else da / 100.0,
            detail_allowance_given=da is not None,
            units=UnitSystem.SI if self.si else UnitSystem.US,
        )


_DAMAGE_WORDS = re.compile(
    r"\b(crack\w*|fractur\w*|broken|break\w*|split\w*|sever\w*|opened|"
    r"separat\w*|parted)\b", re.IGNORECASE)
_DENIED = re.compile(r"\b(no|not|nor|without|free of|never)\b[\w\s-]{0,20}$", re.IGNORECASE)


def damage_in_note(note: str) -> str | None:
    """The first word of an inspector's note that speaks of a crack, a fracture or an opened
    weld (common practice: such a bar is not counted), unless the words just before it deny
    it ("no crack found"); None where there is none. A screen of the words, not a reading of
    the note: it only prompts a warning."""
    for m in _DAMAGE_WORDS.finditer(note):
        if _DENIED.search(note[max(0, m.start() - 24):m.start()]) is None:
            return m.group(0)
    return None
