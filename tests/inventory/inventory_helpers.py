"""Shared helpers for the workbook tests: a small valid bridge, cell addresses, write + read."""

from __future__ import annotations

import copy
import importlib.util
from collections.abc import Callable
from pathlib import Path
from types import ModuleType

from openpyxl import Workbook
from openpyxl.utils import get_column_letter

from rating.inventory import read_workbook
from rating.inventory import schema as sc
from rating.inventory.problems import Problem, WorkbookReading
from rating.inventory.template import WorkbookContent, build_template, fill

REPO = Path(__file__).resolve().parents[2]
SAMPLES_DIR = REPO / "sample_inventory"

_TABLES = {t.name: t for t in sc.TABLES}
_FORMS = {f.name: f for f in sc.FORMS}


def load_make_samples() -> ModuleType:
    spec = importlib.util.spec_from_file_location("make_samples_for_tests",
                                                  SAMPLES_DIR / "make_samples.py")
    assert spec is not None and spec.loader is not None
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return mod


def cell(sheet: str, index: int, key: str) -> str:
    """Sheet!Cell of column ``key`` in the ``index``-th (0-based) data row written by fill()."""
    spec = _TABLES[sheet]
    row = sc.FIRST_DATA_ROW + len(spec.examples) + index
    return f"{sheet}!{get_column_letter(spec.keys.index(key) + 2)}{row}"


def header(sheet: str, key: str) -> str:
    spec = _TABLES[sheet]
    return f"{sheet}!{get_column_letter(spec.keys.index(key) + 2)}{sc.HEADER_ROW}"


def form_cell(sheet: str, key: str, column: str = "B") -> str:
    spec = _FORMS[sheet]
    keys = [f.key for f in spec.fields]
    return f"{sheet}!{column}{sc.FIRST_DATA_ROW + keys.index(key)}"


def coords(ref: str) -> tuple[str, str]:
    sheet, c = ref.split("!")
    return sheet, c


def base_content() -> dict:
    """A small valid bridge: 4-panel Pratt through truss, every sheet used once or more.

    Returned as plain dicts (bridge, tables, settings) so tests can change any value.
    """
    tables: dict[str, list[dict]] = {t.name: [] for t in sc.TABLES}
    assign = {"L0L1": "BC", "L1L2": "BC", "L2L3": "BC", "L3L4": "BC", "U1U2": "TC",
              "U2U3": "TC", "L0U1": "EP", "L4U3": "EP", "L1U1": "HG", "L3U3": "HG",
              "L2U2": "PV", "U1L2": "DG", "L2U3": "DG"}
    tables["Members"] = [{"member": m, "section": s, "material": "M-1" if s != "HG" else None}
                         for m, s in assign.items()]
    tables["Eyebars"] = [
        {"section": "BC", "count": 2, "width": 3.5, "thickness": 0.875, "head_diameter": 9.0,
         "hole_diameter": 3.53},
        {"section": "DG", "count": 2, "width": 3.0, "thickness": 0.75, "head_diameter": 8.25,
         "hole_diameter": 3.53},
    ]
    tables["Rods"] = [{"section": "HG", "count": 2, "diameter": 1.125, "rod_end": "loop"}]
    tables["BuiltUp"] = [
        {"section": "TC", "connectors": "lacing", "spacing": 14.0, "hole_diameter": 0.875,
         "holes": 4, "U": 0.85, "snug_tight": "yes"},
        {"section": "EP", "connectors": "batten", "spacing": 30.0, "snug_tight": "no"},
    ]
    tables["Plates"] = [
        {"section": "TC", "part": "web L", "x": -5.0, "y": 0.0, "width": 10.0,
         "thickness": 0.375, "along": "y"},
        {"section": "TC", "part": "web R", "x": 5.0, "y": 0.0, "width": 10.0,
         "thickness": 0.375, "along": "y"},
        {"section": "EP", "part": "cover", "x": 0.0, "y": 5.19, "width": 14.0,
         "thickness": 0.375, "along": "x"},
    ]
    tables["Angles"] = [
        {"section": "TC", "part": f"A{k}", "x": x, "y": y, "leg_x": 2.5, "leg_y": 2.5,
         "thickness": 0.3125, "x_dir": xd, "y_dir": yd}
        for k, (x, y, xd, yd) in enumerate(((-4.8125, 5.0, "+x", "-y"),
                                            (4.8125, 5.0, "-x", "-y"),
                                            (-4.8125, -5.0, "+x", "+y"),
                                            (4.8125, -5.0, "-x", "+y")), start=1)
    ]
    tables["Channels"] = [
        {"section": "EP", "part": "C-L", "x": -5.0, "y": 0.0, "depth": 10.0,
         "flange_width": 2.6, "web_thickness": 0.24, "flange_thickness": 0.436, "toes": "left"},
        {"section": "EP", "part": "C-R", "x": 5.0, "y": 0.0, "depth": 10.0,
         "flange_width": 2.6, "web_thickness": 0.24, "flange_thickness": 0.436,
         "toes": "right"},
    ]
    tables["Rolled"] = [{"section": "PV", "designation": "I 8 x 18.4 lb", "area": 5.34,
                         "r_x": 3.26, "r_y": 0.84}]
    tables["Materials"] = [{"material": "M-1", "kind": "steel", "F_y": 30.0, "F_u": 58.0,
                            "basis": "coupon tests (test data)"}]
    tables["Findings"] = [
        {"member": "L1L2", "component": "bar 2", "region": "body", "station": 8.0,
         "loss": 15.0, "condition": 5},
        {"member": "U1U2", "component": "web L", "region": "body", "station": 4.0,
         "remaining": 0.30, "condition": 6},
        {"member": "L1U1", "component": "rod 1", "region": "thread", "station": 0.3,
         "remaining": 1.0},
    ]
    tables["Pins"] = [{"joint": "L2", "diameter": 3.5, "material": "M-1"}]
    order = ["L2U2", "L1L2", "U1L2", "L2L3", "L2U3", "L2U3", "L2L3", "U1L2", "L1L2", "L2U2"]
    thick = {"L2U2": 0.5, "L1L2": 0.875, "L2L3": 0.875, "U1L2": 0.75, "L2U3": 0.75}
    tables["Packing"] = [{"joint": "L2", "position": k, "member": m, "thickness": thick[m],
                          "gap": 0.0625 if k > 1 else None}
                         for k, m in enumerate(order, start=1)]
    tables["DeadLoads"] = [
        {"description": "timber deck", "component": "DC", "psf_deck": 15.0},
        {"description": "floorbeam", "component": "DC", "kip_floorbeam": 0.8},
    ]
    tables["Vehicles"] = [{"vehicle": "OWN-1", "name": "county truck", "category": "owner",
                           "gross": 17.0}]
    tables["Axles"] = [{"vehicle": "OWN-1", "axle": 1, "load": 12.0},
                       {"vehicle": "OWN-1", "axle": 2, "load": 22.0, "spacing": 14.0}]
    bridge = {"units": "US", "structure_id": "TEST-1", "name": "test bridge",
              "year_built": 1900, "material": "steel", "geometry": "generated",
              "truss_form": "pratt", "deck_position": "through", "panel_count": 4,
              "panel_length": 16.0, "height": 18.0, "truss_spacing": 16.0,
              "roadway_width": 14.0, "inspection_date": "2024-06-01", "adtt": 40}
    return {"bridge": bridge, "tables": tables,
            "settings": {"vehicles": "HL-93, OWN-1", "provision_set": "MBE 2018"}}


def explicit() -> dict:
    """Two-panel king-post style truss listed explicitly, eyebar/rolled sections only."""
    d = fresh()
    d["bridge"].update(geometry="explicit", truss_form=None, panel_count=None,
                       panel_length=None, height=None)
    t = d["tables"]
    t["Joints"] = [
        {"joint": "L0", "x": 0.0, "y": 0.0, "support": "pin", "deck": "yes"},
        {"joint": "L1", "x": 16.0, "y": 0.0, "deck": "yes"},
        {"joint": "L2", "x": 32.0, "y": 0.0, "support": "roller", "deck": "yes"},
        {"joint": "U1", "x": 16.0, "y": 16.0},
    ]
    t["Members"] = [
        {"member": "L0L1", "start": "L0", "end": "L1", "role": "bottom chord", "section": "BC"},
        {"member": "L1L2", "start": "L1", "end": "L2", "role": "bottom chord", "section": "BC"},
        {"member": "L0U1", "start": "L0", "end": "U1", "role": "end post", "section": "PV"},
        {"member": "U1L2", "start": "U1", "end": "L2", "role": "end post", "section": "PV"},
        {"member": "L1U1", "start": "L1", "end": "U1", "role": "hanger", "section": "DG",
         "tension_only": "yes"},
    ]
    for s in ("BuiltUp", "Plates", "Channels", "Angles", "Findings", "Pins", "Packing",
              "Rods"):
        t[s] = []
    return d


def content_of(d: dict) -> WorkbookContent:
    return WorkbookContent(d["bridge"], d["tables"], d.get("settings", {}))


def fresh() -> dict:
    return copy.deepcopy(_BASE)


_BASE = base_content()


def write(path: Path, d: dict | WorkbookContent,
          edit: Callable[[Workbook], None] | None = None) -> Path:
    wb = build_template()
    fill(wb, d if isinstance(d, WorkbookContent) else content_of(d))
    if edit is not None:
        edit(wb)
    wb.save(path)
    return path


def check(tmp_path: Path, d: dict, edit: Callable[[Workbook], None] | None = None,
          name: str = "w.xlsx") -> WorkbookReading:
    return read_workbook(write(tmp_path / name, d, edit))


def find(reading: WorkbookReading, where: str, needle: str,
         severity: str | None = "error") -> Problem:
    """The problem at ``where`` whose message contains ``needle`` (case-insensitive)."""
    for p in reading.problems:
        if p.where == where and needle.lower() in p.message.lower() and (
                severity is None or p.severity == severity):
            return p
    listing = "\n".join(p.format() for p in reading.problems)
    raise AssertionError(f"no {severity or 'problem'} at {where} containing {needle!r}; "
                         f"found:\n{listing}")


def set_cell(ref: str, value: object) -> Callable[[Workbook], None]:
    def edit(wb: Workbook) -> None:
        sheet, c = coords(ref)
        wb[sheet][c] = value
    return edit
