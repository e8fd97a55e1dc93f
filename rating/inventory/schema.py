"""The inspection workbook layout: every sheet, column, unit and closed list, in one place.

The template writer and the reader both work from these definitions, so what the template
asks for is exactly what the reader checks.

Layout of a *table* sheet (one row per item):
    row 1 title, row 2 what the sheet is for, row 3 column headers, data from row 4 on.
    Column A is the example marker: a row with ``example`` in column A is an example and is
    never read. Columns are found by their header words (the part before ``[``), so columns may
    be moved; the units in square brackets are checked against the workbook's unit system.
Layout of a *form* sheet (Bridge, Settings): one item per row, label in column A, value in
column B, notes and an example in column C; items are found by their label.

Units: headers show ``[US | SI]``. The workbook is read in US customary units unless
``Bridge`` → ``Units of this workbook`` says SI; then every value is read in the SI unit of its
header and converted once, at the edge, through :mod:`rating.units`.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum

from rating.model import (
    BarState,
    ChannelToes,
    ConnectorKind,
    DeadLoadKind,
    DeckPosition,
    FindingRegion,
    MaterialKind,
    MemberRole,
    RidingSurface,
    RodEnd,
    RodShape,
    VehicleCategory,
)
from rating.model.builders import TrussForm

TITLE_ROW = 1
HELP_ROW = 2
HEADER_ROW = 3
FIRST_DATA_ROW = 4
EXAMPLE_MARK = "example"
MARK_HEADER = "Example"
HEADER_SEARCH_ROWS = 10  # the header row is looked for in the first rows of a sheet
MAX_ROWS = 5000  # more data rows than this on one sheet is refused (a pasted column, a loop)


class Kind(StrEnum):
    TEXT = "text"
    LABEL = "label"  # a short identifier (member, joint, section id)
    NUMBER = "number"
    INTEGER = "whole number"
    CHOICE = "choice"
    YESNO = "yes/no"
    DATE = "date"
    INTLIST = "list of whole numbers"
    LABELLIST = "list of ids"


YES_NO = ("yes", "no")
HOW_FOUND = ("measured", "estimated")
DIMENSION_SOURCES = ("plans", "measured", "estimated")


@dataclass(frozen=True)
class Column:
    """One column of a table sheet, or one item of a form sheet.

    Bounds are in the US unit of the column (after any SI conversion): ``gt``/``ge``/``le``
    are hard limits (an error outside them), ``warn_below``/``warn_above`` soft limits
    (a warning: the value is unusual for a truss of this period, please confirm).
    """

    key: str
    title: str
    kind: Kind
    unit: str = ""
    si_unit: str = ""
    required: bool = False
    choices: tuple[str, ...] = ()
    gt: float | None = None
    ge: float | None = None
    le: float | None = None
    warn_below: float | None = None
    warn_above: float | None = None
    blank_means: str = ""
    help: str = ""
    width: float = 14.0
    max_length: int = 60
    list_source: str = ""  # "Sheet!$B$4:$B$500" for a reference dropdown (not enforced)

    @property
    def header(self) -> str:
        if not self.unit:
            return self.title
        if self.si_unit and self.si_unit != self.unit:
            return f"{self.title} [{self.unit} | {self.si_unit}]"
        return f"{self.title} [{self.unit}]"

    def unit_for(self, si: bool) -> str:
        return self.si_unit if (si and self.si_unit) else self.unit


@dataclass(frozen=True)
class TableSheet:
    """A sheet with one row per item."""

    name: str
    title: str
    purpose: str
    columns: tuple[Column, ...]
    examples: tuple[dict[str, object], ...] = ()
    data_rows: int = 300  # rows styled and given dropdowns in the template
    context: str = ""  # how a row is named in messages, e.g. "section {section}"

    def column(self, key: str) -> Column:
        return next(c for c in self.columns if c.key == key)

    @property
    def keys(self) -> tuple[str, ...]:
        return tuple(c.key for c in self.columns)


@dataclass(frozen=True)
class FormSheet:
    """A sheet with one item per row: label in A, value in B, notes in C."""

    name: str
    title: str
    purpose: str
    fields: tuple[Column, ...]
    examples: dict[str, object] = field(default_factory=dict)

    def field_of(self, key: str) -> Column:
        return next(c for c in self.fields if c.key == key)


def header_words(text: str) -> str:
    """Normalised header/label words: before any ``[``, lower case, single spaces (runs of
    white space as ``\\s+`` finds them, which are those ``str.split`` splits at)."""
    return " ".join(text.split("[", 1)[0].split()).lower()


LENGTH = ("ft", "m")
DIM = ("in", "mm")
AREA = ("in2", "mm2")
FORCE = ("kip", "kN")
STRESS = ("ksi", "MPa")
KLF = ("klf", "kN/m")
PLF = ("plf", "kN/m")
PSF = ("psf", "kPa")
PCF = ("pcf", "kN/m3")
TON = ("ton", "tonne")


def _c(key: str, title: str, kind: Kind, units: tuple[str, str] | None = None,
       **kw: object) -> Column:
    if units is not None:
        kw["unit"], kw["si_unit"] = units
    return Column(key, title, kind, **kw)  # type: ignore[arg-type]


def _dims_from() -> Column:
    """Where a section's dimensions come from (the same column on every section sheet)."""
    return Column("dims_from", "Dimensions from", Kind.CHOICE, choices=DIMENSION_SOURCES,
                  blank_means="plans or measured",
                  help="estimated: judged without plans or measurement. A member or pin "
                       "whose estimated dimensions set a posting is named in the warnings, to "
                       "be measured before the decision.")


def _pct(key: str, title: str, **kw: object) -> Column:
    return Column(key, title, Kind.NUMBER, unit="%", **kw)  # type: ignore[arg-type]


MEMBER_LIST = "Members!$B$4:$B$1000"
MATERIAL_LIST = "Materials!$B$4:$B$300"
VEHICLE_LIST = "Vehicles!$B$4:$B$300"

TRUSS_FORMS = tuple(f.value for f in TrussForm)
GEOMETRY_SOURCES = ("generated", "explicit")
ROLES = tuple(r.value for r in MemberRole)
SUPPORTS = ("none", "pin", "roller")
PROVISION_SETS = ("MBE 2018", "MBE 2011")
OWNER_CATEGORIES = tuple(c.value for c in VehicleCategory if c is not VehicleCategory.DESIGN)
PLATE_WIDTH_AXIS = ("x", "y")
ANGLE_X_DIRECTIONS = ("+x", "-x")
ANGLE_Y_DIRECTIONS = ("+y", "-y")

# ---------------------------------------------------------------------------------------------
# Form sheets
# ---------------------------------------------------------------------------------------------

BRIDGE = FormSheet(
    "Bridge",
    "The bridge",
    "One value per row in column B. Geometry is generated from the truss form unless "
    "'Geometry' says explicit (then list it on Joints and Members).",
    (
        _c("units", "Units of this workbook", Kind.CHOICE, choices=("US", "SI"),
           blank_means="US", help="US customary: the first unit in every header. SI: the "
           "second unit. Declared once here; every sheet is read in it."),
        _c("structure_id", "Structure id", Kind.LABEL, required=True,
           help="The owner's structure number."),
        _c("name", "Bridge name", Kind.TEXT, required=True, max_length=120),
        _c("location", "Location", Kind.TEXT, max_length=200),
        _c("owner", "Owner", Kind.TEXT, max_length=120),
        _c("year_built", "Year built", Kind.INTEGER, ge=1780, le=2100,
           help="Decides the default steel strength when no tests are on file."),
        _c("material", "Truss material", Kind.CHOICE, choices=tuple(k.value for k in MaterialKind),
           help="Used for every member without a material id (defaults by year, listed as "
           "assumptions)."),
        _c("geometry", "Geometry", Kind.CHOICE, choices=GEOMETRY_SOURCES,
           blank_means="generated",
           help="generated: from truss form, panels and heights below. explicit: from the "
           "Joints and Members sheets."),
        _c("truss_form", "Truss form", Kind.CHOICE, choices=TRUSS_FORMS),
        _c("deck_position", "Deck position", Kind.CHOICE, required=True,
           choices=tuple(d.value for d in DeckPosition),
           help="through and pony trusses carry the floor on the lower chord."),
        _c("panel_count", "Panel count", Kind.INTEGER, ge=2, le=40, warn_above=16),
        _c("panel_length", "Panel length", Kind.NUMBER, LENGTH, gt=0, le=100, warn_below=8,
           warn_above=40),
        _c("height", "Truss height (parallel chords)", Kind.NUMBER, LENGTH, gt=0, le=100,
           warn_below=4, warn_above=50,
           help="Chord centre to chord centre. For a polygonal top chord leave blank and list "
           "the height at each panel point on the Heights sheet."),
        _c("counter_panels", "Panels with counters", Kind.INTLIST,
           help="Panel numbers, 1 = first panel from the left end, separated by commas, "
           "e.g. 4, 5."),
        _c("truss_spacing", "Truss spacing", Kind.NUMBER, LENGTH, required=True, gt=0, le=60,
           warn_below=10, warn_above=30, help="Centre to centre of the two trusses."),
        _c("roadway_width", "Roadway width", Kind.NUMBER, LENGTH, required=True, gt=0, le=60,
           warn_below=8, help="Curb to curb."),
        _c("left_curb", "Left curb from left truss", Kind.NUMBER, LENGTH, ge=0, le=60,
           blank_means="roadway centred between the trusses"),
        _c("deck_width", "Deck width", Kind.NUMBER, LENGTH, gt=0, le=80,
           blank_means="roadway width", help="Width over which psf deck loads act."),
        _c("lane_count", "Lane count override", Kind.INTEGER, ge=1, le=4,
           blank_means="from the roadway width"),
        _c("floorbeam_I", "Floorbeam moment of inertia", Kind.NUMBER, ("in4", "mm4"), gt=0,
           le=50000, warn_below=50,
           blank_means="U-frames not analysed (a pony truss's top chord taken as held at each "
                       "panel point)",
           help="Of one floorbeam about its strong axis. For a pony truss: the floorbeams and "
                "verticals form the U-frames that hold the top chord out of the truss plane."),
        _c("uframe_height", "U-frame height", Kind.NUMBER, LENGTH, gt=0, le=40,
           blank_means="each vertical's length, chord to chord",
           help="Pony truss: from the floorbeam's centre to the top chord's, where the "
                "floorbeam hangs below (or sits above) the bottom chord."),
        _c("chord_at_hips", "Top chord at the hips, out of plane", Kind.CHOICE,
           choices=("continuous", "hinged"), blank_means="continuous",
           help="Pony truss: whether the end posts and the top chord are continuous in "
                "bending out of the truss plane where they meet (spliced), or hinged there "
                "(butted on the pin)."),
        _c("adtt", "ADTT, one direction", Kind.NUMBER, unit="trucks/day", ge=0, le=50000,
           blank_means="unknown (the provision set's value for unknown ADTT)"),
        _c("riding_surface", "Riding surface", Kind.CHOICE,
           choices=tuple(r.value for r in RidingSurface),
           blank_means="full dynamic load allowance"),
        _c("ws_thickness", "Wearing surface thickness", Kind.NUMBER, DIM, ge=0, le=12,
           warn_above=6, blank_means="no wearing surface",
           help="Adds a DW load over the deck width; do not repeat it on DeadLoads."),
        _c("ws_unit_weight", "Wearing surface unit weight", Kind.NUMBER, PCF, gt=0, le=200,
           warn_below=90, warn_above=160, blank_means="140 pcf (bituminous)"),
        _c("ws_measured", "Wearing surface thickness field-measured", Kind.YESNO,
           choices=YES_NO, blank_means="no"),
        _c("inspection_date", "Inspection date", Kind.DATE),
        _c("inspector", "Inspector", Kind.TEXT, max_length=120),
    ),
    examples={"structure_id": "e.g. 0417-022", "name": "e.g. Mill Race Road over Cold Creek",
              "year_built": "e.g. 1898", "panel_count": "e.g. 8", "panel_length": "e.g. 18",
              "height": "e.g. 20", "counter_panels": "e.g. 4, 5", "truss_spacing": "e.g. 17",
              "roadway_width": "e.g. 15", "adtt": "e.g. 40",
              "inspection_date": "e.g. 2024-05-14"},
)

SETTINGS = FormSheet(
    "Settings",
    "Rating settings",
    "The owner's choices for this rating. Leave a value blank to use the provision.",
    (
        _c("vehicles", "Vehicles to rate", Kind.LABELLIST,
           blank_means="the library's rating vehicles and every vehicle on the Vehicles sheet",
           help="Vehicle ids separated by commas."),
        _c("provision_set", "Provision set", Kind.CHOICE, choices=PROVISION_SETS,
           blank_means="MBE 2018", help="Live-load factors for legal loads by ADTT."),
        _pct("im_override", "Dynamic load allowance override", ge=0, le=100, warn_above=50,
             blank_means="by vehicle and riding surface",
             help="For the legal loads, SHVs, emergency, owner and permit vehicles; HL-93 "
                  "keeps 33 %."),
        _c("gamma_ll_override", "Live-load factor override", Kind.NUMBER, ge=0.5, le=3,
           warn_below=1.0, warn_above=2.0, blank_means="by vehicle, limit state and ADTT",
           help="For the legal loads, SHVs, emergency and owner vehicles; HL-93 keeps its "
                "inventory and operating factors, a permit its own (or the one given on the "
                "Vehicles sheet)."),
        _c("df_override", "Distribution factor override", Kind.NUMBER, unit="lanes per truss",
           gt=0, le=3, warn_above=1.5, blank_means="lever rule across the floorbeam"),
        _pct("detail_allowance", "Detail allowance on truss self-weight", ge=0, le=100,
             warn_above=40, blank_means="15 % (pins, lacing, rivets, plates)"),
    ),
    examples={"vehicles": "e.g. HL-93, TYPE-3, OWN-1", "gamma_ll_override": "e.g. 1.45"},
)

# ---------------------------------------------------------------------------------------------
# Table sheets
# ---------------------------------------------------------------------------------------------

HEIGHTS = TableSheet(
    "Heights", "Truss height at each panel point",
    "Only for a polygonal top chord (Parker, Pennsylvania, camelback). Panel point 0 is the "
    "left end. List 1 to n-1, or 0 to n.",
    (
        _c("point", "Panel point", Kind.INTEGER, required=True, ge=0, le=40),
        _c("height", "Height", Kind.NUMBER, LENGTH, required=True, gt=0, le=100, warn_below=4,
           warn_above=50),
    ),
    ({"point": 1, "height": 18.0}, {"point": 2, "height": 22.5}),
    data_rows=60,
    context="panel point {point}",
)

JOINTS = TableSheet(
    "Joints", "Joints (explicit geometry only)",
    "Panel points with coordinates. x along the span from the left bearing, y up. Mark the "
    "floorbeam panel points 'yes' in Deck panel point.",
    (
        _c("joint", "Joint", Kind.LABEL, required=True, width=10),
        _c("x", "x", Kind.NUMBER, LENGTH, required=True, ge=-1000, le=2000),
        _c("y", "y", Kind.NUMBER, LENGTH, required=True, ge=-200, le=200),
        _c("support", "Support", Kind.CHOICE, choices=SUPPORTS, blank_means="none"),
        _c("deck", "Deck panel point", Kind.YESNO, choices=YES_NO, blank_means="no"),
    ),
    ({"joint": "L0", "x": 0.0, "y": 0.0, "support": "pin", "deck": "yes"},
     {"joint": "U1", "x": 18.0, "y": 20.0, "support": "none", "deck": "no"}),
    data_rows=120,
    context="joint {joint}",
)

MEMBERS = TableSheet(
    "Members", "Members",
    "Every member of one truss, with its section and material. Start, End and Role are needed "
    "only for explicit geometry (for generated geometry they are checked if given).",
    (
        _c("member", "Member", Kind.LABEL, required=True, width=10),
        _c("start", "Start joint", Kind.LABEL, width=10),
        _c("end", "End joint", Kind.LABEL, width=10),
        _c("role", "Role", Kind.CHOICE, choices=ROLES, width=14),
        _c("tension_only", "Tension only", Kind.YESNO, choices=YES_NO,
           blank_means="as generated (counters), else no"),
        _c("section", "Section id", Kind.LABEL, required=True,
           help="An id on Eyebars, Rods, BuiltUp or Rolled."),
        _c("material", "Material id", Kind.LABEL, list_source=MATERIAL_LIST,
           blank_means="default for the truss material and year built"),
        _c("K", "Effective length factor K", Kind.NUMBER, gt=0, le=2.5, warn_below=0.5,
           warn_above=1.2, blank_means="by the provision for pinned ends"),
        _c("phi_c", "Condition factor override", Kind.NUMBER, gt=0, le=1.0, warn_below=0.85,
           blank_means="from the condition rating"),
        _c("phi_s", "System factor override", Kind.NUMBER, gt=0, le=1.2, warn_below=0.85,
           warn_above=1.0, blank_means="by member type"),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"member": "L0L1", "start": "L0", "end": "L1", "role": "bottom chord",
      "section": "EB-1", "material": "WI-1"},
     {"member": "U1U2", "start": "U1", "end": "U2", "role": "top chord", "section": "TC-1"}),
    data_rows=300,
    context="member {member}",
)

EYEBARS = TableSheet(
    "Eyebars", "Eyebar sets",
    "One row per set of identical forged eyebars side by side.",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("count", "Bars", Kind.INTEGER, required=True, ge=1, le=16, warn_above=8),
        _c("width", "Bar width", Kind.NUMBER, DIM, required=True, gt=0, le=16, warn_below=2,
           warn_above=10),
        _c("thickness", "Bar thickness", Kind.NUMBER, DIM, required=True, gt=0, le=4,
           warn_below=0.5, warn_above=2.5),
        _c("head_diameter", "Head diameter", Kind.NUMBER, DIM, required=True, gt=0, le=40),
        _c("hole_diameter", "Pin hole diameter", Kind.NUMBER, DIM, required=True, gt=0, le=14),
        _c("head_thickness", "Head thickness", Kind.NUMBER, DIM, gt=0, le=6,
           blank_means="bar thickness"),
        _c("head_beyond_hole", "Head beyond the hole", Kind.NUMBER, DIM, gt=0, le=20,
           blank_means="head concentric with the hole",
           help="Measured from the edge of the pin hole to the end of the head, along the bar."),
        _dims_from(),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"section": "EB-1", "count": 2, "width": 4.0, "thickness": 1.0, "head_diameter": 9.5,
      "hole_diameter": 3.53},),
    data_rows=150,
    context="section {section}",
)

RODS = TableSheet(
    "Rods", "Rod sets",
    "Hangers, counters and other rods. Upset ends: the body governs; threaded ends: give the "
    "root diameter of the thread.",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("count", "Rods", Kind.INTEGER, required=True, ge=1, le=8),
        _c("shape", "Shape", Kind.CHOICE, choices=tuple(s.value for s in RodShape),
           blank_means="round"),
        _c("diameter", "Diameter or side", Kind.NUMBER, DIM, required=True, gt=0, le=6,
           warn_below=0.5, warn_above=2.5),
        _c("rod_end", "End", Kind.CHOICE, required=True, choices=tuple(e.value for e in RodEnd)),
        _c("root_diameter", "Thread root diameter", Kind.NUMBER, DIM, gt=0, le=6,
           help="Needed for threaded ends."),
        _dims_from(),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"section": "R-1", "count": 2, "shape": "round", "diameter": 1.25, "rod_end": "upset"},),
    data_rows=150,
    context="section {section}",
)

BUILTUP = TableSheet(
    "BuiltUp", "Built-up members",
    "One row per built-up section; its plates, channels and angles go on Plates, Channels "
    "and Angles with the same section id.",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("connectors", "Connectors", Kind.CHOICE,
           choices=tuple(k.value for k in ConnectorKind), blank_means="none given",
           help="lacing or batten plates between open sides; solid for a continuous plate."),
        _c("spacing", "Connector spacing a", Kind.NUMBER, DIM, gt=0, le=240,
           help="Distance between lacing points or battens."),
        _c("r_i", "Component radius of gyration r_i", Kind.NUMBER, DIM, gt=0, le=20,
           blank_means="computed from the parts"),
        _c("snug_tight", "Snug-tight connectors", Kind.YESNO, choices=YES_NO,
           blank_means="yes"),
        _c("hole_diameter", "Rivet hole diameter", Kind.NUMBER, DIM, ge=0, le=2,
           warn_above=1.25, blank_means="no holes deducted"),
        _c("holes", "Holes in net section", Kind.INTEGER, ge=0, le=40, blank_means="0"),
        _c("U", "Shear lag factor U", Kind.NUMBER, gt=0, le=1, blank_means="1.0"),
        _dims_from(),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"section": "TC-1", "connectors": "lacing", "spacing": 16.0, "hole_diameter": 0.875,
      "holes": 4, "U": 0.85},),
    data_rows=100,
    context="section {section}",
)

_XY = (
    _c("x", "x", Kind.NUMBER, DIM, required=True, ge=-100, le=100),
    _c("y", "y", Kind.NUMBER, DIM, required=True, ge=-100, le=100),
)

PLATES = TableSheet(
    "Plates", "Plates of built-up members",
    "x across the truss plane, y in the truss plane; (x, y) is the centre of the plate. Only "
    "plates that run the member's whole length: pin plates at the ends go on Packing.",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("part", "Part", Kind.LABEL, required=True, help="Unique within the section, e.g. "
           "cover, web-L. Findings name it."),
        *_XY,
        _c("width", "Width", Kind.NUMBER, DIM, required=True, gt=0, le=60),
        _c("thickness", "Thickness", Kind.NUMBER, DIM, required=True, gt=0, le=4),
        _c("along", "Width runs along", Kind.CHOICE, required=True, choices=PLATE_WIDTH_AXIS),
    ),
    ({"section": "TC-1", "part": "cover", "x": 0.0, "y": 5.25, "width": 16.0,
      "thickness": 0.3125, "along": "x"},),
    data_rows=200,
    context="part {part} of section {section}",
)

CHANNELS = TableSheet(
    "Channels", "Channels of built-up members",
    "(x, y) is the centre of the back of the web. Toes: the way the flanges point.",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("part", "Part", Kind.LABEL, required=True),
        *_XY,
        _c("depth", "Depth", Kind.NUMBER, DIM, required=True, gt=0, le=24),
        _c("flange_width", "Flange width", Kind.NUMBER, DIM, required=True, gt=0, le=8),
        _c("web_thickness", "Web thickness", Kind.NUMBER, DIM, required=True, gt=0, le=2),
        _c("flange_thickness", "Flange thickness", Kind.NUMBER, DIM, required=True, gt=0, le=2,
           help="Average thickness of the flange."),
        _c("toes", "Toes", Kind.CHOICE, required=True,
           choices=tuple(t.value for t in ChannelToes)),
    ),
    ({"section": "TC-1", "part": "C-left", "x": -5.0, "y": 0.0, "depth": 10.0,
      "flange_width": 2.6, "web_thickness": 0.38, "flange_thickness": 0.44,
      "toes": "left"},),
    data_rows=200,
    context="part {part} of section {section}",
)

ANGLES = TableSheet(
    "Angles", "Angles of built-up members",
    "(x, y) is the outer heel corner; each leg points along +x or -x, +y or -y.",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("part", "Part", Kind.LABEL, required=True),
        *_XY,
        _c("leg_x", "Leg along x", Kind.NUMBER, DIM, required=True, gt=0, le=12),
        _c("leg_y", "Leg along y", Kind.NUMBER, DIM, required=True, gt=0, le=12),
        _c("thickness", "Thickness", Kind.NUMBER, DIM, required=True, gt=0, le=2),
        _c("x_dir", "x leg points", Kind.CHOICE, required=True, choices=ANGLE_X_DIRECTIONS),
        _c("y_dir", "y leg points", Kind.CHOICE, required=True, choices=ANGLE_Y_DIRECTIONS),
    ),
    ({"section": "P-1", "part": "A-1", "x": -4.0, "y": 4.0, "leg_x": 3.0, "leg_y": 3.0,
      "thickness": 0.375, "x_dir": "+x", "y_dir": "-y"},),
    data_rows=200,
    context="part {part} of section {section}",
)

ROLLED = TableSheet(
    "Rolled", "Rolled shapes",
    "Sections given by their tabulated properties (no part geometry).",
    (
        _c("section", "Section id", Kind.LABEL, required=True),
        _c("designation", "Designation", Kind.TEXT, required=True),
        _c("area", "Gross area", Kind.NUMBER, AREA, required=True, gt=0, le=200),
        _c("r_x", "r_x", Kind.NUMBER, DIM, required=True, gt=0, le=30,
           help="Radius of gyration for buckling in the plane of the truss."),
        _c("r_y", "r_y", Kind.NUMBER, DIM, required=True, gt=0, le=30,
           help="Radius of gyration for buckling out of the plane of the truss."),
        _c("r_z", "Least r_z", Kind.NUMBER, DIM, gt=0, le=30,
           blank_means="x and y are principal axes",
           help="The least radius of gyration, about a principal axis, where x and y are not "
                "principal (an angle: r_z of the tables)."),
        _c("J", "Torsional constant J", Kind.NUMBER, ("in4", "mm4"), gt=0, le=5000,
           blank_means="torsional buckling not checked",
           help="St Venant torsional constant, for torsional and flexural-torsional "
                "buckling; give x_o and y_o with it."),
        _c("C_w", "Warping constant C_w", Kind.NUMBER, ("in6", "mm6"), ge=0, le=1e7,
           blank_means="0 where J is given",
           help="Warping constant (0 or blank for a tee or an angle)."),
        _c("x_o", "Shear centre x_o", Kind.NUMBER, DIM, ge=0, le=30,
           blank_means="symmetry not given (torsional buckling left to the engineer)",
           help="Distance from the centroid to the shear centre along the x axis (the axis "
                "of r_x); 0 where the shape is symmetric about the y axis. x_o and y_o both 0 "
                "declare it doubly symmetric; both not 0 (an angle) need r_z."),
        _c("y_o", "Shear centre y_o", Kind.NUMBER, DIM, ge=0, le=30,
           blank_means="symmetry not given (torsional buckling left to the engineer)",
           help="Distance from the centroid to the shear centre along the y axis; 0 where "
                "the shape is symmetric about the x axis."),
        _c("net_area", "Net area", Kind.NUMBER, AREA, gt=0, le=200, blank_means="gross area"),
        _c("U", "Shear lag factor U", Kind.NUMBER, gt=0, le=1, blank_means="1.0"),
        _dims_from(),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"section": "S-1", "designation": "I 10 x 25 lb", "area": 7.37, "r_x": 4.07,
      "r_y": 0.97, "x_o": 0.0, "y_o": 0.0},),
    data_rows=60,
    context="section {section}",
)

MATERIALS = TableSheet(
    "Materials", "Materials",
    "Strengths from coupon tests or mill records. Leave Fy and Fu blank to use the default "
    "for the kind and year built (listed as an assumption).",
    (
        _c("material", "Material id", Kind.LABEL, required=True),
        _c("kind", "Kind", Kind.CHOICE, required=True,
           choices=tuple(k.value for k in MaterialKind)),
        _c("F_y", "Yield strength Fy", Kind.NUMBER, STRESS, gt=0, le=150, warn_below=18,
           warn_above=70),
        _c("F_u", "Tensile strength Fu", Kind.NUMBER, STRESS, gt=0, le=200, warn_below=35,
           warn_above=100),
        _c("E", "Modulus E", Kind.NUMBER, STRESS, ge=10000, le=35000,
           blank_means="29000 ksi steel, 27000 ksi wrought iron"),
        _c("unit_weight", "Unit weight", Kind.NUMBER, PCF, ge=300, le=600,
           blank_means="490 pcf steel, 480 pcf wrought iron"),
        _c("basis", "Basis", Kind.TEXT, max_length=200, width=30,
           help="e.g. coupon tests 2019, report no."),
    ),
    ({"material": "WI-1", "kind": "wrought iron", "F_y": 28.0, "F_u": 48.0,
      "basis": "coupon tests"},),
    data_rows=60,
    context="material {material}",
)

FINDINGS = TableSheet(
    "Findings", "Inspection findings",
    "One row per finding. Component: bar 1, bar 2 (eyebars), rod 1 (rods), a part name "
    "(built-up), lacing or battens (a built-up member's: a bar state of loose, missing, broken "
    "or bent rates the member without them) or all. Give the remaining thickness or the "
    "percent loss (both only if they agree).",
    (
        _c("member", "Member", Kind.LABEL, required=True, list_source=MEMBER_LIST, width=10),
        _c("component", "Component", Kind.LABEL, blank_means="all"),
        _c("region", "Location", Kind.CHOICE, choices=tuple(r.value for r in FindingRegion),
           blank_means="body",
           help="body: the shank, up to where an eyebar widens into its head; head: the forged "
                "head around the pin hole (loss there is checked through and beyond the hole; "
                "record the plate's remaining thickness on Packing too); thread: a rod's "
                "thread, upset or loop; connection: a built-up member's pin plate or riveted "
                "end."),
        _c("station", "Distance from start joint", Kind.NUMBER, LENGTH, ge=0, le=500,
           help="Along the member from its start joint: the Members sheet's Start joint, or "
                "for a generated member the first joint in its label (L5U4: from L5)."),
        _c("remaining", "Remaining thickness", Kind.NUMBER, DIM, ge=0, le=6,
           help="Of the plate or bar; for a rod, the remaining diameter."),
        _pct("loss", "Loss", ge=0, le=100, warn_above=60,
             help="Of thickness; for a rod, of diameter (30 % of the diameter takes 51 % of "
                  "the area). The number of percent: 20 for 20 %."),
        _c("how_found", "Loss found by", Kind.CHOICE, choices=HOW_FOUND,
           blank_means="measured",
           help="measured: with a gauge or caliper; estimated: judged by eye. Where an "
                "estimated loss governs a posting, the report asks for it to be measured."),
        _c("bar_state", "Bar state", Kind.CHOICE, choices=tuple(b.value for b in BarState),
           blank_means="sound"),
        _c("pack_rust", "Pack rust", Kind.YESNO, choices=YES_NO, blank_means="no"),
        _c("condition", "Condition rating", Kind.INTEGER, unit="0-9", ge=0, le=9),
        _c("photo", "Photo", Kind.TEXT, max_length=200),
        _c("note", "Note", Kind.TEXT, max_length=1000, width=40),
    ),
    ({"member": "L1L2", "component": "bar 2", "region": "body", "station": 6.5,
      "remaining": 0.81, "how_found": "measured", "bar_state": "sound", "pack_rust": "no",
      "condition": 5,
      "photo": "IMG_0142", "note": "pitting at top edge"},),
    data_rows=500,
    context="the finding on member {member}",
)

PINS = TableSheet(
    "Pins", "Pins",
    "One row per pin. The bars on it go on Packing, in order from one end of the pin.",
    (
        _c("joint", "Joint", Kind.LABEL, required=True, width=10),
        _c("diameter", "Pin diameter", Kind.NUMBER, DIM, required=True, gt=0, le=14,
           warn_below=2, warn_above=8),
        _c("material", "Material id", Kind.LABEL, list_source=MATERIAL_LIST,
           blank_means="default steel for the year built"),
        _c("spliced", "Chord spliced through", Kind.YESNO, blank_means="no",
           help="Yes where the chord runs through the joint spliced (its ends milled to bear "
                "or plated across): its two members' plates then bring only the resultant of "
                "their forces into the pin."),
        _dims_from(),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"joint": "L2", "diameter": 3.5},),
    data_rows=100,
    context="the pin at {joint}",
)

PACKING = TableSheet(
    "Packing", "Packing of bars on the pins",
    "One row per plate on the pin, in order from one end (position 1). Member: the member "
    "whose bar this is, 'floorbeam' for a floorbeam hanger, blank for a filler or spacer ring. "
    "Each plate brings its member's force into the pin; where the chord is spliced through "
    "the joint (Pins sheet), its two members' plates bring only the resultant of their "
    "forces.",
    (
        _c("joint", "Joint", Kind.LABEL, required=True, width=10),
        _c("position", "Position", Kind.INTEGER, required=True, ge=1, le=60),
        _c("member", "Member", Kind.LABEL, list_source=MEMBER_LIST, width=10,
           blank_means="filler or spacer", help="Or 'floorbeam' for a floorbeam hanger."),
        _c("thickness", "Plate thickness", Kind.NUMBER, DIM, required=True, gt=0, le=6,
           warn_below=0.1),
        _c("gap", "Gap before", Kind.NUMBER, DIM, ge=0, le=12, blank_means="0"),
        _dims_from(),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"joint": "L2", "position": 1, "member": "L1L2", "thickness": 1.0},
     {"joint": "L2", "position": 2, "member": "L2U2", "thickness": 0.75, "gap": 0.125}),
    data_rows=600,
    context="position {position} on the pin at {joint}",
)

DEADLOADS = TableSheet(
    "DeadLoads", "Dead loads other than the trusses' own weight",
    "One row per item, with its intensity in exactly one of the four load columns. Offset: "
    "distance right of the bridge centre line (lever rule between the trusses).",
    (
        _c("description", "Description", Kind.TEXT, required=True, width=28),
        _c("component", "Component", Kind.CHOICE, required=True,
           choices=tuple(k.value for k in DeadLoadKind), help="DC structure and attachments, "
           "DW wearing surface and utilities."),
        _c("psf_deck", "Load on deck area", Kind.NUMBER, PSF, gt=0, le=500),
        _c("plf_bridge", "Line load on whole bridge", Kind.NUMBER, PLF, gt=0, le=10000),
        _c("plf_truss", "Line load on each truss", Kind.NUMBER, PLF, gt=0, le=5000),
        _c("kip_floorbeam", "Load at each floorbeam", Kind.NUMBER, FORCE, gt=0, le=200,
           help="For the whole floorbeam (not per truss): it is shared between the trusses "
                "like the deck load."),
        _c("offset", "Offset from centre line", Kind.NUMBER, LENGTH, ge=-60, le=60,
           blank_means="0"),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"description": "timber deck, 4 in", "component": "DC", "psf_deck": 15.0},
     {"description": "steel stringers", "component": "DC", "plf_bridge": 180.0}),
    data_rows=60,
    context="dead load '{description}'",
)

VEHICLES = TableSheet(
    "Vehicles", "The owner's vehicles",
    "Vehicles of the owner: local legal or service trucks, rated and posted as legal loads, "
    "and permit loads, rated for the permit's issue with their own load factors and never "
    "posted. Their axles go on Axles.",
    (
        _c("vehicle", "Vehicle id", Kind.LABEL, required=True),
        _c("name", "Name", Kind.TEXT, required=True, width=28),
        _c("category", "Category", Kind.CHOICE, choices=OWNER_CATEGORIES, blank_means="owner",
           help="Decides the live-load factor: legal and specialized hauling use the legal-load "
           "factors, emergency its own; a permit (routine, single-trip escorted or mixed with "
           "traffic, multiple-trip) the permit factors, and a special (single- or "
           "multiple-trip) permit one lane loaded."),
        _c("gross", "Gross weight", Kind.NUMBER, TON, gt=0, le=200,
           blank_means="sum of the axle loads"),
        _c("lane_load", "Lane load", Kind.NUMBER, KLF, ge=0, le=5, blank_means="0"),
        _c("gamma_ll", "Live-load factor", Kind.NUMBER, ge=0.5, le=3, warn_below=1.0,
           warn_above=2.0, blank_means="by category and ADTT",
           help="The owner's live-load factor for this vehicle, in place of the one its "
                "category gives."),
        _c("wheel_gauge", "Wheel gauge", Kind.NUMBER, LENGTH, ge=3, le=14, warn_above=10,
           blank_means="6 ft, as the design vehicles",
           help="Centre to centre of the wheel lines (a wide crane's), for the lever rule "
                "across the floorbeam."),
        _pct("im", "Dynamic load allowance", ge=0, le=100, warn_above=50,
             blank_means="as for the legal loads",
             help="For this vehicle alone, e.g. 0 for an escorted permit held to a crawl "
                  "(MBE 6A.4.5.5)."),
        _c("note", "Note", Kind.TEXT, max_length=500, width=30),
    ),
    ({"vehicle": "OWN-1", "name": "county tandem dump truck", "category": "owner",
      "gross": 27.0},),
    data_rows=40,
    context="vehicle {vehicle}",
)

AXLES = TableSheet(
    "Axles", "Axles of the owner's vehicles",
    "One row per axle, front to rear. Spacing is from the axle ahead (blank for axle 1); give "
    "a maximum spacing too for a variable spacing.",
    (
        _c("vehicle", "Vehicle id", Kind.LABEL, required=True, list_source=VEHICLE_LIST),
        _c("axle", "Axle", Kind.INTEGER, required=True, ge=1, le=20),
        _c("load", "Axle load", Kind.NUMBER, FORCE, required=True, gt=0, le=100,
           warn_above=40),
        _c("spacing", "Spacing from the axle ahead", Kind.NUMBER, LENGTH, gt=0, le=100),
        _c("max_spacing", "Maximum spacing", Kind.NUMBER, LENGTH, gt=0, le=100,
           blank_means="fixed spacing"),
    ),
    ({"vehicle": "OWN-1", "axle": 1, "load": 14.0},
     {"vehicle": "OWN-1", "axle": 2, "load": 20.0, "spacing": 14.0}),
    data_rows=200,
    context="axle {axle} of vehicle {vehicle}",
)

FORMS: tuple[FormSheet, ...] = (BRIDGE, SETTINGS)
TABLES: tuple[TableSheet, ...] = (
    HEIGHTS, JOINTS, MEMBERS, EYEBARS, RODS, BUILTUP, PLATES, CHANNELS, ANGLES, ROLLED,
    MATERIALS, FINDINGS, PINS, PACKING, DEADLOADS, VEHICLES, AXLES,
)
SECTION_TABLES = (EYEBARS, RODS, BUILTUP, ROLLED)
PART_TABLES = (PLATES, CHANNELS, ANGLES)
INSTRUCTIONS_SHEET = "Instructions"
SHEET_ORDER: tuple[str, ...] = (
    INSTRUCTIONS_SHEET, BRIDGE.name, HEIGHTS.name, JOINTS.name, MEMBERS.name, EYEBARS.name,
    RODS.name, BUILTUP.name, PLATES.name, CHANNELS.name, ANGLES.name, ROLLED.name,
    MATERIALS.name, FINDINGS.name, PINS.name, PACKING.name, DEADLOADS.name, VEHICLES.name,
    AXLES.name, SETTINGS.name,
)

# Defaults the reader assumes (each listed as an assumption when used).
WEARING_SURFACE_UNIT_WEIGHT_PCF = 140.0  # AASHTO LRFD Table 3.5.1-1, bituminous [M]
WEARING_SURFACE_SOURCE = ("AASHTO LRFD Table 3.5.1-1, bituminous wearing surface 0.140 kcf "
                          "(value from memory)")
