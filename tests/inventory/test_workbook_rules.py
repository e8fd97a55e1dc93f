"""Every validation rule of the workbook reader: its Sheet!Cell and its message.

Cases that cannot disturb one another share one workbook (the reader collects every problem,
so one read shows them all); each case is still its own test with its own place and words.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import pytest
from inventory_helpers import (
    cell,
    check,
    explicit,
    find,
    form_cell,
    fresh,
    header,
)
from openpyxl import Workbook

from rating.inventory import schema as sc
from rating.inventory.problems import WorkbookReading


@dataclass(frozen=True)
class Case:
    id: str
    group: str
    where: str
    needle: str
    severity: str = "error"


def add(d: dict, sheet: str, *rows: dict) -> None:
    d["tables"][sheet].extend(rows)


def n(d: dict, sheet: str) -> int:
    return len(d["tables"][sheet])


# --- the groups: each builds one workbook (content changes, then optional workbook edit) -------

Edit = Callable[[Workbook], None]
GROUPS: dict[str, Callable[[], tuple[dict, Edit | None]]] = {}


def group(name: str) -> Callable:
    def deco(fn: Callable[[], tuple[dict, Edit | None]]) -> Callable:
        GROUPS[name] = fn
        return fn
    return deco


@group("cells")
def _cells() -> tuple[dict, Edit | None]:
    d = fresh()
    t = d["tables"]
    d["bridge"]["structure_id"] = None
    d["bridge"]["inspection_date"] = "last spring"
    d["bridge"]["counter_panels"] = "four"
    t["Eyebars"][0]["width"] = "wide"
    t["Eyebars"][1]["thickness"] = 0
    t["Rods"][0]["count"] = 1.5
    t["Rolled"][0]["area"] = 1e12
    t["Channels"][0]["toes"] = "sideways"
    t["Findings"][0]["pack_rust"] = "perhaps"
    t["Findings"][2]["component"] = "rod 1, rod 2"
    t["DeadLoads"][0]["description"] = "x" * 200
    t["DeadLoads"][1]["kip_floorbeam"] = -1
    t["Axles"][1]["load"] = 45.0
    add(d, "Materials", {"material": "M-2", "kind": "steel", "F_y": 250.0, "F_u": 400.0})

    def edit(wb: Workbook) -> None:
        # a fraction typed where the number of percent belongs (0.2 for 20 %)
        s, c = cell("Findings", 1, "loss").split("!")
        wb[s][c] = 0.2
        s, c = cell("Findings", 0, "station").split("!")
        wb[s][c] = "#DIV/0!"
        s, c = cell("Rods", 0, "diameter").split("!")
        wb[s][c] = "=1+0.125"
        a = cell("Vehicles", 0, "vehicle").split("!")[1]
        b = cell("Vehicles", 0, "name").split("!")[1]
        wb["Vehicles"].merge_cells(f"{a}:{b}")
    return d, edit


CASES = [
    Case("required blank", "cells", form_cell("Bridge", "structure_id"),
         "Structure id is required and is blank"),
    Case("date", "cells", form_cell("Bridge", "inspection_date"),
         "must be a date (e.g. 2024-05-14); found the text 'last spring'"),
    Case("integer list", "cells", form_cell("Bridge", "counter_panels"),
         "must list whole numbers separated by commas"),
    Case("text in number", "cells", cell("Eyebars", 0, "width"),
         "Bar width of section BC must be a number in inches; found the text 'wide'"),
    Case("zero", "cells", cell("Eyebars", 1, "thickness"),
         "Bar thickness of section DG must be greater than 0 in; found 0 in"),
    Case("whole number", "cells", cell("Rods", 0, "count"), "must be a whole number; found 1.5"),
    Case("huge", "cells", cell("Rolled", 0, "area"), "must be at most 200 in2; found 1e+12"),
    Case("choice", "cells", cell("Channels", 0, "toes"),
         "Toes of part C-L of section EP must be one of: left, right, up, down"),
    Case("yes/no", "cells", cell("Findings", 0, "pack_rust"), "must be yes or no"),
    Case("comma in id", "cells", cell("Findings", 2, "component"),
         "must be a single id without commas"),
    Case("too long", "cells", cell("DeadLoads", 0, "description"),
         "is 200 characters long; at most 60 are read"),
    Case("negative", "cells", cell("DeadLoads", 1, "kip_floorbeam"),
         "must be greater than 0 kip; found -1 kip"),
    Case("unusually large", "cells", cell("Axles", 1, "load"),
         "45 kip is unusually large (above 40 kip); please confirm", "warning"),
    Case("MPa hint", "cells", cell("Materials", 1, "F_y"),
         "must be at most 150 ksi; found 250 ksi (is it in MPa?"),
    Case("spreadsheet error", "cells", cell("Findings", 0, "station"),
         "holds the spreadsheet error #DIV/0!"),
    Case("formula without result", "cells", cell("Rods", 0, "diameter"),
         "the cell holds a formula (=1+0.125) whose result was never saved"),
    Case("fraction for a percent", "cells", cell("Findings", 1, "loss"),
         "reads as 0.2 %, under one percent: the number of percent goes here, so for 20 % "
         "type 20; a loss under one percent is recorded as 0 or 1"),
    Case("merged cells", "cells", cell("Vehicles", 0, "vehicle"), "are merged; unmerge them"),
    Case("merged hides a value", "cells", cell("Vehicles", 0, "name"),
         "Name of vehicle OWN-1 is required and is blank"),
]


@group("headers")
def _headers() -> tuple[dict, Edit | None]:
    d = fresh()
    spec = sc.BRIDGE

    def edit(wb: Workbook) -> None:
        s, c = header("Eyebars", "width").split("!")
        wb[s][c] = "Bar width [cm]"
        s, c = header("Rods", "count").split("!")
        wb[s][c] = None
        s, c = header("Rolled", "note").split("!")
        wb[s][c] = "r_x [in | mm]"
        for col in range(1, 12):
            wb["Angles"].cell(sc.HEADER_ROW, col).value = None
        ws = wb["Bridge"]
        free = sc.FIRST_DATA_ROW + len(spec.fields) + 1
        ws.cell(free, 1, "Colour of the paint")
        ws.cell(free, 2, "green")
        ws.cell(free + 1, 1, "Owner")
        ws.cell(free + 1, 2, "someone else")
        r = sc.FIRST_DATA_ROW + [f.key for f in spec.fields].index("truss_spacing")
        ws.cell(r, 1).value = None
        ws.cell(r, 2).value = None
        m = int(cell("Findings", 0, "member").split("!")[1][1:])
        wb["Findings"].cell(m, 1, "x")
    return d, edit


_FREE = sc.FIRST_DATA_ROW + len(sc.BRIDGE.fields) + 1
CASES += [
    Case("header unit", "headers", header("Eyebars", "width"),
         "the header of 'Bar width' gives the unit 'cm'; this column is read in in (or mm"),
    Case("missing column", "headers", "Rods!A3",
         "the column 'Rods' is missing from the header row of 'Rods'"),
    Case("duplicate column", "headers", header("Rolled", "note"),
         "the column 'r_x' appears twice in the header row"),
    Case("no header row", "headers", "Angles!A3", "no header row found on sheet 'Angles'"),
    Case("unknown form item", "headers", f"Bridge!A{_FREE}",
         "'Colour of the paint' is not an item pintruss knows", "warning"),
    Case("duplicate form item", "headers", f"Bridge!A{_FREE + 1}",
         "the item 'Owner' appears twice"),
    Case("missing form item", "headers", "Bridge!A1",
         "the item 'Truss spacing [ft | m]' is missing from column A"),
    Case("odd example mark", "headers", "Findings!A" + cell("Findings", 0, "member")[10:],
         "only 'example' has a meaning there", "warning"),
]


@group("si-header")
def _si_header() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"]["units"] = "SI"

    def edit(wb: Workbook) -> None:
        s, c = header("Plates", "width").split("!")
        wb[s][c] = "Width [in]"
    return d, edit


CASES += [
    Case("header unit vs SI", "si-header", header("Plates", "width"),
         "says [in] but the Bridge sheet declares SI units, so the values would be read in mm"),
    Case("bad units cell", "form-missing", form_cell("Bridge", "units"),
         "Units of this workbook must be one of: US, SI; found the text 'metric'"),
]




@group("missing-sheets")
def _missing_sheets() -> tuple[dict, Edit | None]:
    d = fresh()

    def edit(wb: Workbook) -> None:
        del wb["Members"]
        del wb["Findings"]
        del wb["Pins"]
        del wb["DeadLoads"]
        del wb["Axles"]
    return d, edit


CASES += [
    Case("required sheet missing", "missing-sheets", "Members!A1",
         "the sheet 'Members' (members) is missing from the workbook"),
    # a missing Findings, Pins or DeadLoads sheet would leave its part out of the rating
    # without a word (a reviewer rated a sample 25 -> 31 tons that way): an error each
    Case("findings sheet missing", "missing-sheets", "Findings!A1",
         "the sheet 'Findings' (inspection findings) is missing; copy it from a blank "
         "workbook made by 'pintruss template'"),
    Case("pins sheet missing", "missing-sheets", "Pins!A1",
         "the sheet 'Pins' (pins) is missing; copy it from a blank workbook"),
    Case("dead loads sheet missing", "missing-sheets", "DeadLoads!A1",
         "the sheet 'DeadLoads' (dead loads other than the trusses' own weight) is missing"),
    Case("optional sheet missing", "missing-sheets", "Axles!A1",
         "the sheet 'Axles' (axles of the owner's vehicles) is missing; it is read as empty",
         "warning"),
]


@group("no-members")
def _no_members() -> tuple[dict, Edit | None]:
    d = fresh()
    d["tables"]["Members"] = []
    return d, None


CASES += [
    # a first-time user does not know the generated names: the message gives them
    Case("no members listed", "no-members", header("Members", "member"),
         "no members are listed; the generated pratt truss has these 13, each needing a row "
         "with its section: L0L1, L1L2"),
]


@group("wearing-surface-only")
def _wearing_surface_only() -> tuple[dict, Edit | None]:
    d = fresh()
    d["tables"]["DeadLoads"] = []
    d["bridge"].update(ws_thickness=2.0)
    return d, None


CASES += [
    # a wearing surface (DW) alone does not make a deck: still no DC beyond the trusses
    Case("wearing surface only", "wearing-surface-only", "DeadLoads!A6",
         "NO DECK DEAD LOAD: the DeadLoads sheet lists no DC", "warning"),
]


@group("empty-dead-loads-and-pins")
def _empty_dead_loads_and_pins() -> tuple[dict, Edit | None]:
    d = fresh()
    d["tables"]["DeadLoads"] = []
    d["tables"]["Pins"] = []
    d["tables"]["Packing"] = []
    d["bridge"].update(ws_thickness=None)
    return d, None


CASES += [
    # a truss always carries a deck and floor system: none listed lowers no rating factor,
    # it raises them all; said in capitals, beside the recommendation
    Case("no dead load listed", "empty-dead-loads-and-pins", "DeadLoads!A6",
         "NO DECK DEAD LOAD: the DeadLoads sheet lists no DC (deck, stringers", "warning"),
    Case("no pin listed", "empty-dead-loads-and-pins", "Pins!A5",
         "PINS NOT RATED: the Pins sheet lists no pin", "warning"),
]


@group("example-unmarked")
def _example_unmarked() -> tuple[dict, Edit | None]:
    d = fresh()

    def edit(wb: Workbook) -> None:
        wb["Members"].cell(sc.FIRST_DATA_ROW, 1).value = None  # first example row now data
    return d, edit


CASES += [
    Case("example row read once unmarked", "example-unmarked", cell("Members", 0, "member"),
         "member L0L1 is listed twice (first at Members!B4)"),
]


# --- the Bridge sheet ------------------------------------------------------------------------

@group("bridge-dates")
def _bridge_dates() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"]["year_built"] = 2099
    d["bridge"]["inspection_date"] = "1890-01-01"
    return d, None




@group("roadway")
def _roadway() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"]["roadway_width"] = 18.0
    d["bridge"].update(ws_thickness=2.0)
    return d, None


@group("curb")
def _curb() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"].update(left_curb=3.0, lane_count=2, ws_measured="yes")
    return d, None




CASES += [
    Case("year built in future", "bridge-dates", form_cell("Bridge", "year_built"),
         "Year built 2099 is in the future"),
    Case("inspected before built", "bridge-dates", form_cell("Bridge", "inspection_date"),
         "Inspection date 1890-01-01 is before the year built (2099)"),
    Case("inspection in future", "counter", form_cell("Bridge", "inspection_date"),
         "Inspection date 2999-01-01 is in the future", "warning"),
    Case("roadway wider than trusses", "roadway", form_cell("Bridge", "roadway_width"),
         "Roadway width 18 ft is wider than the truss spacing 16 ft"),
    Case("curb beyond truss", "curb", form_cell("Bridge", "left_curb"),
         "ends beyond the right truss at 16 ft"),
    Case("narrow lanes", "curb", form_cell("Bridge", "lane_count"),
         "2 lanes on a 14 ft roadway is less than 12 ft per lane", "warning"),
    Case("measured without thickness", "curb", form_cell("Bridge", "ws_measured"),
         "marked as measured but no thickness is given", "warning"),
    Case("wearing unit weight assumed", "roadway", form_cell("Bridge", "ws_unit_weight"),
         "assumed: wearing surface unit weight 140 pcf (AASHTO LRFD Table 3.5.1-1", "warning"),
]


# --- generated geometry ----------------------------------------------------------------------

@group("generated")
def _generated() -> tuple[dict, Edit | None]:
    d = fresh()
    m = d["tables"]["Members"]
    m[3]["member"] = "X9"  # L3L4 renamed: unknown, and L3L4 then has no row
    m[0].update(start="L0", end="L2")
    m[1]["role"] = "vertical"
    add(d, "Members", {"member": "L0L1", "section": "BC"}, {"member": "U2U1", "section": "TC"})
    add(d, "Joints", {"joint": "L0", "x": 0.0, "y": 0.0})
    return d, None


CASES += [
    Case("member twice", "generated", cell("Members", 13, "member"),
         "member L0L1 is listed twice (first at"),
    Case("reversed label", "generated", cell("Members", 14, "member"),
         "member U2U1 is not in the generated pratt truss; it is labelled U1U2"),
    Case("unknown member", "generated", cell("Members", 3, "member"),
         "member X9 is not in the generated pratt truss; members are named by their joints"),
    Case("ends differ", "generated", cell("Members", 0, "start"),
         "member L0L1 runs L0-L1 in the generated truss, not L0-L2"),
    Case("role differs", "generated", cell("Members", 1, "role"),
         "member L1L2 is a bottom chord in the generated truss", "warning"),
    Case("members without rows", "generated", header("Members", "member"),
         "has members with no row on Members (each needs its section): L3L4"),
    Case("joints ignored", "generated", cell("Joints", 0, "joint"),
         "the Joints sheet is not read because Geometry is 'generated'", "warning"),
]


@group("heights")
def _heights() -> tuple[dict, Edit | None]:
    d = fresh()
    add(d, "Heights", {"point": 1, "height": 18.0}, {"point": 1, "height": 19.0},
        {"point": 5, "height": 20.0})
    d["settings"]["vehicles"] = "HL-93, OWN-1, HL-93"
    return d, None


@group("no-height")
def _no_height() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"]["height"] = None
    return d, None


@group("form-missing")
def _form_missing() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"].update(truss_form=None, panel_count=None)
    d["bridge"]["units"] = "metric"
    return d, None


@group("counter")
def _counter() -> tuple[dict, Edit | None]:
    d = fresh()
    d["bridge"]["counter_panels"] = "2, 7"
    d["bridge"]["inspection_date"] = "2999-01-01"
    return d, None




CASES += [
    Case("height point twice", "heights", cell("Heights", 1, "point"),
         "panel point 1 is listed twice"),
    Case("height point beyond span", "heights", cell("Heights", 2, "point"),
         "panel point 5 does not exist: the truss has 4 panels (points 0 to 4)"),
    Case("heights missing", "heights", header("Heights", "point"),
         "heights are needed at panel points 1 to 3 (or 0 to 4); missing at 2, 3"),
    Case("single height ignored", "heights", form_cell("Bridge", "height"),
         "the heights on the Heights sheet are used; the single truss height here is not read",
         "warning"),
    Case("no height", "no-height", form_cell("Bridge", "height"),
         "Truss height is needed to generate the geometry"),
    Case("no truss form", "form-missing", form_cell("Bridge", "truss_form"),
         "Truss form is needed to generate the geometry"),
    Case("no panel count", "form-missing", form_cell("Bridge", "panel_count"),
         "Panel count is needed to generate the geometry"),
    Case("counter outside", "counter", form_cell("Bridge", "counter_panels"),
         "counter panel 7 does not exist: the truss has panels 1 to 4"),
    Case("builder refuses", "loads-vehicles", form_cell("Bridge", "truss_form"),
         "the baltimore truss cannot be generated: a Baltimore/Pennsylvania truss"),
]


# --- explicit geometry -----------------------------------------------------------------------

@group("explicit-refs")
def _explicit_refs() -> tuple[dict, Edit | None]:
    d = explicit()
    t = d["tables"]
    add(d, "Joints", {"joint": "L1", "x": 50.0, "y": 0.0})
    t["Members"][1]["end"] = "L9"
    t["Members"][2]["start"] = None
    return d, None


@group("explicit-supports")
def _explicit_supports() -> tuple[dict, Edit | None]:
    d = explicit()
    for j in d["tables"]["Joints"]:
        j["support"] = None
        j["deck"] = "no"
    d["tables"]["Joints"][0]["deck"] = "yes"
    return d, None


@group("explicit-rollers")
def _explicit_rollers() -> tuple[dict, Edit | None]:
    d = explicit()
    d["tables"]["Joints"][0]["support"] = "roller"  # both bearings rollers: it slides
    return d, None


@group("explicit-empty")
def _explicit_empty() -> tuple[dict, Edit | None]:
    d = explicit()
    d["tables"]["Joints"] = []
    return d, None


@group("explicit-geometry")
def _explicit_geometry() -> tuple[dict, Edit | None]:
    d = explicit()
    d["tables"]["Joints"][3].update(x=16.0, y=0.0)  # U1 on top of L1
    return d, None


@group("explicit-mechanism")
def _explicit_mechanism() -> tuple[dict, Edit | None]:
    d = explicit()
    d["tables"]["Members"] = [m for m in d["tables"]["Members"] if m["member"] != "U1L2"]
    d["tables"]["Joints"].append({"joint": "U2", "x": 32.0, "y": 16.0})
    d["tables"]["Members"] += [
        {"member": "U1U2", "start": "U1", "end": "U2", "role": "top chord", "section": "PV"},
        {"member": "L2U2", "start": "L2", "end": "U2", "role": "end post", "section": "PV"}]
    return d, None


CASES += [
    Case("mechanism named at its joint", "explicit-mechanism", cell("Joints", 1, "joint"),
         "the truss as listed is not stable: the truss is a mechanism: joint L1 can move"),
    Case("joint twice", "explicit-refs", cell("Joints", 4, "joint"),
         "joint L1 is listed twice (first at Joints!B"),
    Case("end not a joint", "explicit-refs", cell("Members", 1, "end"),
         "End joint of member L1L2 is joint 'L9', which is not on the Joints sheet"),
    Case("start missing", "explicit-refs", cell("Members", 2, "start"),
         "Start joint of member L0U1 is needed for explicit geometry"),
    Case("two rollers: the supports named, not a joint of the truss", "explicit-rollers",
         cell("Joints", 0, "joint"), "the supports do not hold the truss: it can slide "
         "horizontally as a whole without stretching any member; give one bearing a pin"),
    Case("no supports", "explicit-supports", header("Joints", "support"),
         "no joint is marked as a support (pin or roller)"),
    Case("one deck point", "explicit-supports", header("Joints", "deck"),
         "mark at least two joints as deck panel points"),
    Case("no joints", "explicit-empty", header("Joints", "joint"),
         "Geometry is 'explicit' but no joints are listed"),
    Case("geometry refused, located", "explicit-geometry", cell("Joints", 1, "joint"),
         "the truss as listed is not valid: joints L1 and U1 are at the same point"),
]


# --- sections --------------------------------------------------------------------------------

@group("sections")
def _sections() -> tuple[dict, Edit | None]:
    d = fresh()
    eb = dict(count=2, width=3.0, thickness=0.75, head_diameter=8.0, hole_diameter=3.5)
    add(d, "Eyebars",
        {**eb, "section": "EB-X", "head_diameter": 3.6, "hole_diameter": 3.6},
        {**eb, "section": "EB-Y", "width": 5.0, "head_diameter": 4.5},
        {**eb, "section": "EB-Z", "width": 1.0, "thickness": 1.5},
        {**eb, "section": "EB-W", "head_thickness": 0.5},
        {**eb, "section": "EB-V", "head_beyond_hole": 6.0})
    add(d, "Rods", {"section": "BC", "count": 1, "diameter": 1.0, "rod_end": "upset"},
        {"section": "R-T", "count": 1, "diameter": 1.0, "rod_end": "threaded"},
        {"section": "R-U", "count": 1, "diameter": 1.0, "rod_end": "threaded",
         "root_diameter": 1.2},
        {"section": "R-V", "count": 1, "diameter": 1.0, "rod_end": "upset",
         "root_diameter": 0.8})
    add(d, "BuiltUp", {"section": "BU-X", "connectors": "solid"},
        {"section": "BU-Y", "connectors": "lacing"},
        {"section": "BU-Z", "connectors": "solid", "spacing": 12.0},
        {"section": "BU-W", "spacing": 12.0},
        {"section": "BU-V", "connectors": "solid", "holes": 2},
        {"section": "BU-U", "connectors": "solid", "hole_diameter": 0.875},
        {"section": "BU-S", "connectors": "solid", "hole_diameter": 1.0, "holes": 10})
    plate = dict(x=0.0, y=0.0, width=8.0, thickness=0.5, along="x")
    add(d, "Plates", *({**plate, "section": s, "part": "p"} for s in
                       ("BU-Y", "BU-Z", "BU-W", "BU-V", "BU-U")),
        {**plate, "section": "BU-S", "part": "p", "width": 4.0},
        {**plate, "section": "BC", "part": "p"},
        {**plate, "section": "NOPE", "part": "q"},
        {**plate, "section": "TC", "part": "web L"},
        {**plate, "section": "TC", "part": "P9", "width": 1.0, "thickness": 2.0})
    ch = dict(section="EP", x=0.0, y=0.0, depth=10.0, flange_width=2.6, web_thickness=0.24,
              flange_thickness=0.436, toes="up")
    add(d, "Channels", {**ch, "part": "C-X", "depth": 2.0, "flange_thickness": 1.2},
        {**ch, "part": "C-Y", "flange_width": 1.0, "web_thickness": 1.5})
    add(d, "Angles", {"section": "TC", "part": "A9", "x": 0.0, "y": 0.0, "leg_x": 2.0,
                      "leg_y": 2.0, "thickness": 2.0, "x_dir": "+x", "y_dir": "+y"})
    add(d, "Rolled", {"section": "R2", "designation": "I", "area": 5.0, "r_x": 3.0,
                      "r_y": 1.0, "net_area": 6.0},
        {"section": "R3", "designation": "I", "area": 5.0, "r_x": 3.0, "r_y": 1.0})
    return d, None


_P0 = 3  # plates before the added ones in the base workbook
CASES += [
    Case("id used twice", "sections", cell("Rods", 1, "section"),
         "section id BC is already used at Eyebars!B5; section ids must be unique"),
    Case("hole not smaller than head", "sections", cell("Eyebars", 2, "hole_diameter"),
         "the pin hole of section EB-X (3.6 in) is not smaller than the head (3.6 in)"),
    Case("head narrower than bar", "sections", cell("Eyebars", 3, "head_diameter"),
         "the head of section EB-Y (4.5 in) must be wider than the bar (5 in)"),
    Case("bar thicker than wide", "sections", cell("Eyebars", 4, "thickness"),
         "are width and thickness swapped?", "warning"),
    Case("head thinner than bar", "sections", cell("Eyebars", 5, "head_thickness"),
         "the head of section EB-W is thinner than the bar", "warning"),
    Case("head beyond hole too far", "sections", cell("Eyebars", 6, "head_beyond_hole"),
         "extends 6 in beyond the hole, more than the head diameter less the hole (4.5 in)"),
    Case("threaded without root", "sections", cell("Rods", 2, "root_diameter"),
         "section R-T has threaded ends: give the thread root diameter"),
    Case("root not less than rod", "sections", cell("Rods", 3, "root_diameter"),
         "the thread root diameter of section R-U (1.2 in) must be less than the rod (1 in)"),
    Case("root on upset rod", "sections", cell("Rods", 4, "root_diameter"),
         "section R-V has upset ends; the thread root diameter is not used", "warning"),
    Case("built-up without parts", "sections", cell("BuiltUp", 2, "section"),
         "built-up section BU-X has no plates, channels or angles listed"),
    Case("lacing without spacing", "sections", cell("BuiltUp", 3, "spacing"),
         "section BU-Y is laced: give the spacing a between lacing points"),
    Case("snug-tight assumed", "sections", cell("BuiltUp", 3, "snug_tight"),
         "assumed: lacing and batten connectors of built-up members taken as snug-tight",
         "warning"),
    Case("solid with spacing", "sections", cell("BuiltUp", 4, "spacing"),
         "section BU-Z is solid; the connector spacing is not used", "warning"),
    Case("spacing without connectors", "sections", cell("BuiltUp", 5, "connectors"),
         "section BU-W gives a connector spacing but no connector type"),
    Case("holes without diameter", "sections", cell("BuiltUp", 6, "hole_diameter"),
         "section BU-V deducts 2 holes: give the rivet hole diameter"),
    Case("diameter without holes", "sections", cell("BuiltUp", 7, "holes"),
         "section BU-U gives a rivet hole diameter: give the number of holes"),
    Case("holes remove the section", "sections", cell("BuiltUp", 8, "section"),
         "built-up member BU-S cannot be used: member using section BU-S: the rivet holes"),
    Case("part on an eyebar section", "sections", cell("Plates", _P0 + 6, "section"),
         "part p: section BC is an eyebar set, not a built-up member"),
    Case("part on unknown section", "sections", cell("Plates", _P0 + 7, "section"),
         "part q: section NOPE is not on the BuiltUp sheet"),
    Case("part name twice", "sections", cell("Plates", _P0 + 8, "part"),
         "part web L of section TC is already listed at Plates!C5"),
    Case("plate thicker than wide", "sections", cell("Plates", _P0 + 9, "thickness"),
         "plate P9 of section TC is thicker than wide", "warning"),
    Case("channel flanges too thick", "sections", cell("Channels", 2, "flange_thickness"),
         "the flanges of channel C-X of section EP are thicker than half its depth (2 in)"),
    Case("channel web too thick", "sections", cell("Channels", 3, "web_thickness"),
         "the web of channel C-Y of section EP is thicker than its flange is wide (1 in)"),
    Case("angle too thick", "sections", cell("Angles", 4, "thickness"),
         "angle A9 of section TC is thicker than its shorter leg"),
    Case("net above gross", "sections", cell("Rolled", 1, "net_area"),
         "the net area of section R2 (6 in2) exceeds its gross area (5 in2)"),
    Case("section unused", "sections", cell("Rolled", 2, "section"),
         "rolled shape R3 is not used by any member", "warning"),
]


# --- materials and member references ---------------------------------------------------------

@group("materials")
def _materials() -> tuple[dict, Edit | None]:
    d = fresh()
    add(d, "Materials", {"material": "M-1", "kind": "steel", "F_y": 33.0, "F_u": 60.0},
        {"material": "M-2", "kind": "steel", "F_y": 30.0},
        {"material": "M-3", "kind": "steel", "F_y": 36.0, "F_u": 30.0},
        {"material": "M-4", "kind": "wrought iron"})
    m = d["tables"]["Members"]
    m[0]["material"] = "M-9"
    m[1]["section"] = "ZZ"
    return d, None




CASES += [
    Case("material twice", "materials", cell("Materials", 1, "material"),
         "material M-1 is listed twice"),
    Case("only Fy", "materials", cell("Materials", 2, "F_u"),
         "material M-2 gives only one of Fy and Fu; give both, or neither"),
    Case("Fu below Fy", "materials", cell("Materials", 3, "F_u"),
         "material M-3: tensile strength Fu 30 ksi is less than the yield strength Fy 36 ksi"),
    Case("default by kind", "materials", cell("Materials", 4, "F_y"),
         "assumed: Wrought iron assumed Fy = 26 ksi, Fu = 48 ksi", "warning"),
    Case("material unused", "materials", cell("Materials", 4, "material"),
         "material M-4 is not used by any member or pin", "warning"),
    Case("unknown material", "materials", cell("Members", 0, "material"),
         "material M-9 of member L0L1 is not on the Materials sheet"),
    Case("unknown section", "materials", cell("Members", 1, "section"),
         "section ZZ of member L1L2 is not on Eyebars, Rods, BuiltUp or Rolled"),
    Case("no material anywhere", "packing-partial", form_cell("Bridge", "material"),
         "no truss material is given here and members L1U1, L3U3 have no material id"),
]


# --- findings --------------------------------------------------------------------------------

@group("findings")
def _findings() -> tuple[dict, Edit | None]:
    d = fresh()
    d["tables"]["Findings"][0]["station"] = 99.0
    f = [
        {"member": "L1L0", "loss": 10.0},
        {"member": "L2L3", "component": "bar 1", "loss": 100.0},
        {"member": "L0L1", "component": "bar 1", "remaining": 0.0},
        {"member": "L3L4", "component": "bar 1", "remaining": 0.8, "loss": 50.0},
        {"member": "L0L1", "component": "bar 2", "remaining": 1.0},
        {"member": "L2L3", "component": "bar 3", "loss": 10.0},
        {"member": "L2L3", "component": "top bar", "loss": 10.0},
        {"member": "U1U2", "component": "flange", "loss": 10.0},
        {"member": "L2U2", "component": "web", "loss": 10.0},
        {"member": "L0L1", "region": "thread", "loss": 10.0},
        {"member": "U2U3", "region": "head", "loss": 10.0},
        {"member": "L2U2", "remaining": 0.2},
        {"member": "U1U2", "component": "all", "remaining": 0.3},
        {"member": "L3L4", "photo": "IMG_1"},
        {"member": "L1L2", "component": "bar 2", "region": "body", "station": 99.0,
         "loss": 10.0},
        {"member": "L3L4", "component": "bar 2", "remaining": 0.7, "loss": 20.0},
    ]
    add(d, "Findings", *f)
    return d, None


_F0 = 3
CASES += [
    Case("station beyond member", "findings", cell("Findings", 0, "station"),
         "distance 99 ft is beyond the end of member L1L2, which is 16 ft long"),
    Case("finding on unknown member", "findings", cell("Findings", _F0, "member"),
         "member L1L0 of this finding is not a member of the truss; did you mean L0L1?"),
    Case("whole loss", "findings", cell("Findings", _F0 + 1, "loss"),
         "100 % loss on member L2L3 means the bar or part is gone"),
    Case("no metal left", "findings", cell("Findings", _F0 + 2, "remaining"),
         "no metal left on member L0L1"),
    Case("remaining and loss disagree", "findings", cell("Findings", _F0 + 3, "loss"),
         "the remaining thickness 0.8 in and the loss 50 % on member L3L4 disagree"),
    Case("more than original", "findings", cell("Findings", _F0 + 4, "remaining"),
         "remaining thickness 1 in on member L0L1 is more than the original bar thickness of "
         "0.875 in"),
    Case("no such bar", "findings", cell("Findings", _F0 + 5, "component"),
         "member L2L3 has 2 bars; there is no bar 3"),
    Case("bar not understood", "findings", cell("Findings", _F0 + 6, "component"),
         "component 'top bar' of member L2L3 is not understood; name a bar as 'bar 1' to "
         "'bar 2', or 'all'"),
    Case("no such part", "findings", cell("Findings", _F0 + 7, "component"),
         "member U1U2 has no part named 'flange'; its parts are web L, web R, A1, A2, A3, A4"),
    Case("rolled shape component", "findings", cell("Findings", _F0 + 8, "component"),
         "member L2U2 is a rolled shape without parts; the component must be 'all'"),
    Case("thread on eyebar", "findings", cell("Findings", _F0 + 9, "region"),
         "member L0L1 is an eyebar set, which has no thread"),
    Case("head on riveted member", "findings", cell("Findings", _F0 + 10, "region"),
         "member U2U3 is a riveted member, which has no head"),
    Case("remaining on rolled shape", "findings", cell("Findings", _F0 + 11, "remaining"),
         "member L2U2 is a rolled shape given by its properties; give the loss as a percent"),
    Case("ambiguous all", "findings", cell("Findings", _F0 + 12, "remaining"),
         "the parts of member U1U2 differ in thickness, so a remaining thickness for 'all' is "
         "ambiguous"),
    Case("finding records nothing", "findings", cell("Findings", _F0 + 13, "member"),
         "records no loss, bar state, pack rust or condition rating", "warning"),
    Case("finding twice", "findings", cell("Findings", _F0 + 14, "member"),
         "member L1L2, bar 2, body at 99 ft is already recorded at Findings!B5", "warning"),
]


# --- pins and packing ------------------------------------------------------------------------

@group("pins")
def _pins() -> tuple[dict, Edit | None]:
    d = fresh()
    add(d, "Pins", {"joint": "L2", "diameter": 3.5}, {"joint": "Q7", "diameter": 3.5},
        {"joint": "L3", "diameter": 3.5, "material": "M-9"},
        {"joint": "U1", "diameter": 3.5, "material": "M-1"})
    add(d, "Packing", {"joint": "L1", "position": 1, "member": "L0L1", "thickness": 0.875},
        {"joint": "L2", "position": 3, "member": "U1L2", "thickness": 0.75},
        {"joint": "L2", "position": 11, "member": "ZZZ", "thickness": 0.5},
        {"joint": "L2", "position": 12, "member": "L0L1", "thickness": 0.875},
        {"joint": "U1", "position": 1, "member": "Floorbeam", "thickness": 0.875})
    return d, None


@group("pin-default")
def _pin_default() -> tuple[dict, Edit | None]:
    d = fresh()
    for m in d["tables"]["Members"]:
        m["material"] = "M-1"
    d["tables"]["Pins"][0].update(material=None, diameter=2.5)
    return d, None


@group("pin-hole")
def _pin_hole() -> tuple[dict, Edit | None]:
    d = fresh()
    d["tables"]["Pins"][0]["diameter"] = 3.75
    return d, None


@group("packing-partial")
def _packing_partial() -> tuple[dict, Edit | None]:
    d = fresh()
    d["tables"]["Packing"] = [
        {"joint": "L2", "position": 1, "member": "L1L2", "thickness": 0.875},
        {"joint": "L2", "position": 2, "member": "L2L3", "thickness": 0.875},
        {"joint": "L2", "position": 3, "member": "L1L2", "thickness": 0.875},
    ]
    d["bridge"]["material"] = None
    return d, None


CASES += [
    Case("pin twice", "pins", cell("Pins", 1, "joint"), "joint L2 already has a pin at Pins!B5"),
    Case("pin at unknown joint", "pins", cell("Pins", 2, "joint"),
         "joint Q7 of this pin is not a joint of the truss"),
    Case("pin material unknown", "pins", cell("Pins", 3, "material"),
         "material M-9 of the pin at L3 is not on the Materials sheet"),
    Case("pin without packing", "pins", cell("Pins", 3, "joint"),
         "the pin at L3 has no packing rows; list the bars on it in order"),
    Case("packing without pin", "pins", cell("Packing", 10, "joint"),
         "there is no pin at joint L1 on the Pins sheet for this packing"),
    Case("position twice", "pins", cell("Packing", 11, "position"),
         "position 3 on the pin at L2 is already taken at Packing!C"),
    Case("packing member unknown", "pins", cell("Packing", 12, "member"),
         "member ZZZ on the pin at L2 is not a member of the truss (write 'floorbeam'"),
    Case("floorbeam off the deck", "pins", cell("Packing", 14, "member"),
         "joint U1 is not a deck panel point, so no floorbeam hangs on its pin"),
    Case("member not at joint", "pins", cell("Packing", 13, "member"),
         "member L0L1 does not meet at joint L2; the members there are L1L2, L2L3, L2U2, U1L2, "
         "L2U3"),
    Case("pin steel assumed", "pin-default", cell("Pins", 0, "material"),
         "assumed: Steel of unknown grade (built 1900) assumed Fy = 26 ksi", "warning"),
    Case("hole smaller than pin", "pin-hole", cell("Packing", 1, "member"),
         "the eyebars of L1L2 have a 3.53 in pin hole, smaller than the 3.75 in pin at L2"),
    Case("members not packed", "packing-partial", cell("Pins", 0, "joint"),
         "members L2U2, U1L2, L2U3 meet at L2 but have no plate in its packing"),
    Case("hole far larger than pin", "pin-default", cell("Packing", 1, "member"),
         "the eyebars of L1L2 have a 3.53 in pin hole, 1.03 in larger than the 2.5 in pin at "
         "L2 (more than 1 in)"),
    Case("plates differ from bars", "packing-partial", cell("Pins", 0, "joint"),
         "member L2L3 has 2 eyebars but 1 plates on the pin at L2", "warning"),
]


# --- loads, vehicles, settings ---------------------------------------------------------------

@group("loads-vehicles")
def _loads_vehicles() -> tuple[dict, Edit | None]:
    d = fresh()
    add(d, "DeadLoads", {"description": "railing", "component": "DC"},
        {"description": "two", "component": "DC", "psf_deck": 10.0, "plf_bridge": 100.0})
    add(d, "Vehicles", {"vehicle": "OWN-1", "name": "again"},
        {"vehicle": "OWN-2", "name": "no axles"},
        {"vehicle": "OWN-3", "name": "gap"}, {"vehicle": "OWN-4", "name": "front spacing"},
        {"vehicle": "OWN-5", "name": "no spacing"}, {"vehicle": "OWN-6", "name": "max"},
        {"vehicle": "OWN-7", "name": "heavy", "gross": 40.0},
        {"vehicle": "SU4", "name": "our own SU4"})
    ax = [
        {"vehicle": "GHOST", "axle": 1, "load": 10.0},
        {"vehicle": "OWN-1", "axle": 2, "load": 10.0, "spacing": 4.0},
        {"vehicle": "OWN-3", "axle": 1, "load": 10.0},
        {"vehicle": "OWN-3", "axle": 3, "load": 10.0, "spacing": 4.0},
        {"vehicle": "OWN-4", "axle": 1, "load": 10.0, "spacing": 3.0},
        {"vehicle": "OWN-4", "axle": 2, "load": 10.0, "spacing": 10.0},
        {"vehicle": "OWN-5", "axle": 1, "load": 10.0},
        {"vehicle": "OWN-5", "axle": 2, "load": 10.0},
        {"vehicle": "OWN-6", "axle": 1, "load": 10.0},
        {"vehicle": "OWN-6", "axle": 2, "load": 10.0, "spacing": 14.0, "max_spacing": 10.0},
        {"vehicle": "OWN-7", "axle": 1, "load": 10.0},
        {"vehicle": "OWN-7", "axle": 2, "load": 10.0, "spacing": 14.0},
        {"vehicle": "SU4", "axle": 1, "load": 10.0},
    ]
    add(d, "Axles", *ax)
    d["settings"]["vehicles"] = "HL-93, NOPE"
    d["bridge"]["truss_form"] = "baltimore"
    return d, None




CASES += [
    Case("load without intensity", "loads-vehicles", cell("DeadLoads", 2, "description"),
         "dead load 'railing' has no intensity; fill exactly one of the four load columns"),
    Case("load in two columns", "loads-vehicles", cell("DeadLoads", 3, "plf_bridge"),
         "dead load 'two' has an intensity in more than one load column"),
    Case("vehicle twice", "loads-vehicles", cell("Vehicles", 1, "vehicle"),
         "vehicle OWN-1 is listed twice"),
    Case("axle of unknown vehicle", "loads-vehicles", cell("Axles", 2, "vehicle"),
         "vehicle GHOST of this axle is not on the Vehicles sheet"),
    Case("axle twice", "loads-vehicles", cell("Axles", 3, "axle"),
         "axle 2 of vehicle OWN-1 is listed twice"),
    Case("vehicle without axles", "loads-vehicles", cell("Vehicles", 2, "vehicle"),
         "vehicle OWN-2 has no axles on the Axles sheet"),
    Case("axle missing", "loads-vehicles", cell("Vehicles", 3, "vehicle"),
         "vehicle OWN-3 has axles up to 3 but axle 2 is missing"),
    Case("front axle spacing", "loads-vehicles", cell("Axles", 6, "spacing"),
         "axle 1 of vehicle OWN-4 is the front axle; its spacing is not read", "warning"),
    Case("spacing missing", "loads-vehicles", cell("Axles", 9, "spacing"),
         "axle 2 of vehicle OWN-5 needs its spacing from the axle ahead"),
    Case("max below spacing", "loads-vehicles", cell("Axles", 11, "max_spacing"),
         "the maximum spacing of axle 2 of vehicle OWN-6 (10 ft) is less than the spacing"),
    Case("gross differs from axles", "loads-vehicles", cell("Vehicles", 7, "gross"),
         "the gross weight of vehicle OWN-7 (40 tons) differs from the sum of its axles (10 tons):"
         " the rating comes from the axles and the posting load from the gross weight"),
    Case("library id reused", "loads-vehicles", cell("Vehicles", 8, "vehicle"),
         "vehicle SU4 has the id of a library vehicle; the one on this sheet is used",
         "warning"),
    Case("unknown vehicle to rate", "loads-vehicles", form_cell("Settings", "vehicles"),
         "vehicle NOPE is neither in the vehicle library nor on the Vehicles sheet"),
    Case("vehicle listed twice", "heights", form_cell("Settings", "vehicles"),
         "vehicle HL-93 is listed twice; it is rated once", "warning"),
]


@pytest.fixture(scope="module")
def readings(tmp_path_factory: pytest.TempPathFactory) -> dict[str, WorkbookReading]:
    cache: dict[str, WorkbookReading] = {}
    folder = tmp_path_factory.mktemp("rules")

    def get(name: str) -> WorkbookReading:
        if name not in cache:
            d, edit = GROUPS[name]()
            cache[name] = check(folder, d, edit, name=f"{name}.xlsx")
        return cache[name]
    return get  # type: ignore[return-value]


@pytest.mark.parametrize("case", CASES, ids=[c.id for c in CASES])
def test_rule(case: Case, readings) -> None:
    reading = readings(case.group)
    p = find(reading, case.where, case.needle, case.severity)
    assert p.format().startswith(f"{case.severity:<7} {case.where}: ")
    if case.severity == "error":
        assert reading.bridge is None


def test_every_group_is_used() -> None:
    assert {c.group for c in CASES} == set(GROUPS)


def test_problems_are_all_collected(readings) -> None:
    """One workbook with many faults lists them all, not just the first."""
    cells = readings("cells")
    assert len(cells.errors) >= sum(1 for c in CASES if c.group == "cells"
                                    and c.severity == "error")


def test_base_workbook_is_clean(tmp_path) -> None:
    reading = check(tmp_path, fresh())
    assert reading.errors == ()
    assert reading.bridge is not None
    # the base lists one pin (L2) of the many its eyebars hang on: said once, as it should be
    unrated = [p for p in reading.warnings if "but no pin is listed there" in p.message]
    assert len(unrated) == 1 and "joints L0, L1, L3, L4, U1, U3" in unrated[0].message
    # pins not rated bear on the decision (a posting may rest on a pin no one checked): said
    # in capitals, beside the recommendation, at the first pin's row (not the example row)
    assert unrated[0].message.startswith("PINS NOT RATED: eyebars or loop rods end at joints")
    assert unrated[0].where == "Pins!A5"
    rest = [p for p in reading.warnings if p not in unrated]
    assert all(p.message.startswith("assumed: ") for p in rest)
    assert len(reading.assumptions) == len(rest) == 1
