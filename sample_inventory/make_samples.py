"""Write the demo inspection workbooks of the invented Tamarack County inventory.

Run from the repository root:  python sample_inventory/make_samples.py
Every bridge, person, place and measurement here is invented (see README.md). The workbooks
are written through the same template writer as ``pintruss template``, then filled.

The loss pattern of the Parker truss is meant to force a posting; the values that set it are
the PARKER_* constants below, so the rating can be tuned without touching anything else.
"""

from __future__ import annotations

import datetime as dt
import math
import sys
from collections.abc import Callable
from pathlib import Path

from rating.inventory.template import WorkbookContent, write_workbook
from rating.model import DeckPosition, TrussGeometry
from rating.model.builders import build_truss

HERE = Path(__file__).resolve().parent

# --- tuning knobs for the Parker truss (bridge b) ----------------------------------------
PARKER_HANGER_LOSS_PERCENT = (45.0, 40.0)  # rod 1, rod 2 of hanger L1U1, at the lower loop
PARKER_CHORD_BAR_LOSS_PERCENT = 42.0  # bar 3 of bottom chord L2L3, pitting at the pack
PARKER_DIAGONAL_LOSS_PERCENT = 30.0  # bar 1 of main diagonal U2L3, at the lower head
PARKER_COUNTER_PANELS = (4, 5, 6, 7)  # live load reverses the mains in these panels
PARKER_PIN_IN = 5.0  # one pin size throughout; smaller pins make the end pins govern
PARKER_BROKEN_COUNTER = False  # True: counter U5L6 broken (a broken counter rates as closed)

Row = dict[str, object]


def _round_up(x: float, step: float) -> float:
    return math.ceil(x / step - 1e-9) * step


def _eyebars(sid: str, count: int, width: float, thick: float, hole: float,
             note: str = "") -> Row:
    """A forged eyebar set; head sized so the net section at the hole is 1.5 x the body
    (Waddell, De Pontibus, 1898, p. 176, period proportion)."""
    head = _round_up(hole + 1.5 * width, 0.25)
    return {"section": sid, "count": count, "width": width, "thickness": thick,
            "head_diameter": head, "hole_diameter": hole, "note": note}


def _laced_channels(sid: str, depth: float, bf: float, tw: float, tf: float, back_gap: float,
                    cover: tuple[float, float] | None, spacing: float, holes: int,
                    note: str = "") -> tuple[Row, list[Row], list[Row]]:
    """Two channels toes out, backs ``back_gap`` apart, optional cover plate on top, laced.
    (Pin plates at the ends are not parts of the section, which runs the member's length:
    they are on the Packing sheet only, see ``_sections_packing``.)"""
    x = back_gap / 2.0
    chans = [
        {"section": sid, "part": "channel L", "x": -x, "y": 0.0, "depth": depth,
         "flange_width": bf, "web_thickness": tw, "flange_thickness": tf, "toes": "left"},
        {"section": sid, "part": "channel R", "x": x, "y": 0.0, "depth": depth,
         "flange_width": bf, "web_thickness": tw, "flange_thickness": tf, "toes": "right"},
    ]
    plates: list[Row] = []
    if cover is not None:
        w, t = cover
        plates.append({"section": sid, "part": "cover", "x": 0.0, "y": depth / 2 + t / 2,
                       "width": w, "thickness": t, "along": "x"})
    built = {"section": sid, "connectors": "lacing", "spacing": spacing, "snug_tight": "yes",
             "hole_diameter": 0.875, "holes": holes, "U": 0.85, "note": note}
    return built, plates, chans


def _packing(g: TrussGeometry, joint: str, plates_of: Callable[[str], list[float]],
             gap: float, stirrup: float = 0.0) -> list[Row]:
    """Symmetric packing on the pin at ``joint``: built-up pin plates outside, eyebars and
    loop rods inside, each member's plates split evenly about the centre of the pin
    (heaviest bars close together keep the pin moment down; Berg, Safe Building), and at a
    deck panel point the two legs of the floorbeam stirrup in the middle."""
    members = [m.label for m in g.members_at(joint)]
    outer = [m for m in members if plates_of(m) and plates_of(m)[0] < 0]
    inner = [m for m in members if m not in outer]
    left: list[tuple[str, float]] = []
    middle: list[tuple[str, float]] = []
    for m in outer + sorted(inner, key=lambda m: -sum(plates_of(m))):
        ts = [abs(t) for t in plates_of(m)]
        half = len(ts) // 2
        left += [(m, t) for t in ts[:half]]
        if len(ts) % 2:
            middle.append((m, ts[half]))
    if stirrup and joint in g.deck_joints:
        middle = [("floorbeam", stirrup), *middle, ("floorbeam", stirrup)]
    order = left + middle + list(reversed(left))
    rows: list[Row] = []
    for k, (m, t) in enumerate(order, start=1):
        rows.append({"joint": joint, "position": k, "member": m, "thickness": t,
                     "gap": gap if k > 1 else None})
    return rows


def _sections_packing(g: TrussGeometry, assign: dict[str, str], sheets: dict[str, list[Row]],
                      pin_of: Callable[[str], float], pin_material: str | None,
                      gap: float, stirrup: float, pin_plates: dict[str, float]) -> None:
    """Pins at every joint with the packing made from the members' sections; a built-up
    section's ends carry a pin plate of thickness ``pin_plates[section]`` on each side."""
    eyebar = {r["section"]: r for r in sheets["Eyebars"]}
    rods = {r["section"]: r for r in sheets["Rods"]}
    chans = {}
    for r in sheets["Channels"]:
        chans.setdefault(r["section"], []).append(r)

    def plates_of(member: str) -> list[float]:
        sid = assign[member]
        if sid in eyebar:
            e = eyebar[sid]
            return [float(e["thickness"])] * int(e["count"])  # type: ignore[arg-type]
        if sid in rods:
            r = rods[sid]
            return [float(r["diameter"])] * int(r["count"])  # type: ignore[arg-type]
        # built-up: the channel web plus its pin plate bears on the pin, one each side;
        # negative marks "outside" for the packing order
        tw = float(chans[sid][0]["web_thickness"])  # type: ignore[arg-type]
        pp = pin_plates.get(sid, 0.0)
        return [-(tw + pp), -(tw + pp)]

    for j in g.joints:
        sheets["Pins"].append({"joint": j.label, "diameter": pin_of(j.label),
                               "material": pin_material})
        sheets["Packing"] += _packing(g, j.label, plates_of, gap, stirrup)


def _empty_sheets() -> dict[str, list[Row]]:
    names = ("Heights", "Joints", "Members", "Eyebars", "Rods", "BuiltUp", "Plates",
             "Channels", "Angles", "Rolled", "Materials", "Findings", "Pins", "Packing",
             "DeadLoads", "Vehicles", "Axles")
    return {n: [] for n in names}


def _add_builtup(sheets: dict[str, list[Row]], parts: tuple[Row, list[Row], list[Row]]) -> None:
    built, plates, chans = parts
    sheets["BuiltUp"].append(built)
    sheets["Plates"] += plates
    sheets["Channels"] += chans


def _holes_for(g: TrussGeometry, assign: dict[str, str], sid: str,
               pin_of: Callable[[str], float], clearance: float) -> float:
    """Pin-hole diameter of an eyebar set: the largest pin at the ends of its members."""
    pins = [pin_of(e) for m in g.members if assign[m.label] == sid for e in (m.start, m.end)]
    return round(max(pins) + clearance, 4)


# ------------------------------------------------------------------------------------------
# (a) Eight-panel Pratt through truss, 1898, counters in the middle panels, moderate loss
# ------------------------------------------------------------------------------------------


def pratt_1898(n: int = 8, counters: tuple[int, ...] = (3, 4, 5, 6)) -> WorkbookContent:
    """The Pratt sample; ``n`` panels and counters in the panels ``counters`` for a larger
    truss of the same members (bench/report_bench.py, ``--only large``: invented)."""
    p, h = 18.0, 22.0
    g = build_truss("pratt", n, p, h, DeckPosition.THROUGH, counter_panels=counters)
    assign: dict[str, str] = {}
    for m in g.members:
        a, b = m.start, m.end
        i = sorted(int(s[1:]) for s in (a, b))
        if m.role.value == "bottom chord":
            k = min(i[0], n - 1 - i[0])  # panel from the nearer end, 0-based
            assign[m.label] = ("BC-1", "BC-1", "BC-2", "BC-3")[min(k, 3)]
        elif m.role.value == "top chord":
            assign[m.label] = "TC-1"
        elif m.role.value == "end post":
            assign[m.label] = "EP-1"
        elif m.role.value == "hanger":
            assign[m.label] = "HG-1"
        elif m.role.value == "vertical":
            assign[m.label] = "VP-1"
        elif m.role.value == "counter":
            assign[m.label] = "CT-1"
        else:  # main diagonals by panel from the nearer end
            panel = max(i)
            k = min(panel, n + 1 - panel)
            assign[m.label] = {2: "DG-1", 3: "DG-2"}.get(k, "DG-3")

    def pin_of(joint: str) -> float:
        return 4.5  # one pin size throughout, as on many county trusses of the period

    sheets = _empty_sheets()
    for sid, count, w, t in (("BC-1", 2, 4.0, 0.875), ("BC-2", 2, 5.0, 1.0),
                             ("BC-3", 4, 4.0, 1.0), ("DG-1", 2, 4.0, 1.0),
                             ("DG-2", 2, 3.5, 0.875)):
        sheets["Eyebars"].append(
            _eyebars(sid, count, w, t, _holes_for(g, assign, sid, pin_of, 1 / 32)))
    sheets["Rods"] += [
        {"section": "HG-1", "count": 2, "shape": "round", "diameter": 1.25, "rod_end": "loop",
         "note": "loop rods, hanger"},
        {"section": "DG-3", "count": 2, "shape": "round", "diameter": 1.375, "rod_end": "loop"},
        {"section": "CT-1", "count": 1, "shape": "round", "diameter": 1.375, "rod_end": "loop",
         "note": "adjustable counter, turnbuckle at mid-length"},
    ]
    _add_builtup(sheets, _laced_channels("TC-1", 10.0, 2.6, 0.24, 0.436, 10.25, (14.0, 0.3125),
                                         15.0, 4,
                                         note="2 channels 10 in, cover plate, laced below"))
    _add_builtup(sheets, _laced_channels("EP-1", 12.0, 2.94, 0.28, 0.501, 10.25,
                                         (16.0, 0.375), 16.0, 4,
                                         note="end post, 2 channels 12 in, cover plate"))
    _add_builtup(sheets, _laced_channels("VP-1", 7.0, 2.09, 0.21, 0.366, 8.0, None, 12.0, 2,
                                         note="post, 2 channels 7 in laced both faces"))
    pin_plates = {"TC-1": 0.375, "EP-1": 0.5, "VP-1": 0.3125}
    for m in g.members:
        sheets["Members"].append({"member": m.label, "start": m.start, "end": m.end,
                                  "role": m.role.value, "section": assign[m.label]})
    _sections_packing(g, assign, sheets, pin_of, None, 0.0625, stirrup=0.875,
                      pin_plates=pin_plates)
    L = g.member_length_ft
    sheets["Findings"] += [
        {"member": "L1L2", "component": "bar 2", "region": "body", "station": 9.0,
         "loss": 18.0, "condition": 5, "photo": "IMG_2031",
         "note": "pitting along the lower edge under the deck drain"},
        {"member": "L0L1", "component": "bar 1", "region": "head", "station": 0.4,
         "remaining": 0.72, "pack_rust": "yes", "condition": 5, "photo": "IMG_2027",
         "note": "pack rust between the heads at L0"},
        {"member": "L6L7", "component": "bar 1", "region": "body", "station": 3.0,
         "loss": 12.0, "condition": 6, "photo": "IMG_2058"},
        {"member": "U1L2", "component": "bar 2", "region": "head",
         "station": round(L("U1L2") - 0.5, 2), "remaining": 0.84, "condition": 5,
         "photo": "IMG_2034"},
        {"member": "L1U1", "component": "rod 1", "region": "thread", "station": 0.6,
         "loss": 15.0, "condition": 5, "photo": "IMG_2029",
         "note": "corrosion at the lower loop forge weld; no crack found with dye penetrant"},
        {"member": "L3U4", "component": "rod 1", "region": "body", "bar_state": "bent",
         "condition": 5, "photo": "IMG_2041",
         "note": "counter bowed about 1 in at mid-length; turnbuckle seized"},
        {"member": "U2U3", "component": "cover", "region": "body", "station": 9.0,
         "loss": 15.0, "condition": 6, "photo": "IMG_2045"},
        {"member": "L2U2", "component": "channel L", "region": "connection", "station": 0.8,
         "remaining": 0.17, "condition": 5, "photo": "IMG_2037",
         "note": "web loss above the bottom chord pin, debris pocket"},
        {"member": "U4L5", "component": "all", "region": "body", "condition": 6,
         "note": "counter tight, light surface rust"},
    ]
    sheets["DeadLoads"] += [
        {"description": "timber plank deck, 3 in + 2 in running planks", "component": "DC",
         "psf_deck": 16.0},
        {"description": "steel stringers, 7 lines", "component": "DC", "plf_bridge": 140.0},
        {"description": "floorbeam, rolled I 15 in", "component": "DC", "kip_floorbeam": 0.9},
        {"description": "lattice railing", "component": "DC", "plf_truss": 22.0},
    ]
    sheets["Vehicles"].append({"vehicle": "TAM-PLOW", "name": "county snowplow, tandem",
                               "category": "owner", "gross": 27.0,
                               "note": "invented county fleet truck"})
    sheets["Vehicles"].append({"vehicle": "TAM-CRANE", "name": "mobile crane to Hollis Mill",
                               "category": "single-trip permit",
                               "note": "invented permit request: one crossing, mixed with "
                                       "traffic"})
    sheets["Axles"] += [
        {"vehicle": "TAM-PLOW", "axle": 1, "load": 14.0},
        {"vehicle": "TAM-PLOW", "axle": 2, "load": 20.0, "spacing": 13.5},
        {"vehicle": "TAM-PLOW", "axle": 3, "load": 20.0, "spacing": 4.5},
        {"vehicle": "TAM-CRANE", "axle": 1, "load": 12.0},
        {"vehicle": "TAM-CRANE", "axle": 2, "load": 20.0, "spacing": 12.0},
        {"vehicle": "TAM-CRANE", "axle": 3, "load": 20.0, "spacing": 4.5},
        {"vehicle": "TAM-CRANE", "axle": 4, "load": 20.0, "spacing": 4.5},
        {"vehicle": "TAM-CRANE", "axle": 5, "load": 20.0, "spacing": 4.5},
    ]
    bridge = {
        "units": "US", "structure_id": "TC-0417", "name": "Hollis Mill Road over Tamarack Creek",
        "location": "Hollis Mill Road, 0.4 mi east of Route 9, Tamarack County",
        "owner": "Tamarack County Highway Department", "year_built": 1898,
        "material": "steel", "geometry": "generated", "truss_form": "pratt",
        "deck_position": "through", "panel_count": n, "panel_length": p, "height": h,
        "counter_panels": ", ".join(map(str, counters)), "truss_spacing": 17.0,
        "roadway_width": 15.0,
        "adtt": 40, "riding_surface": "minor deviations",
        "inspection_date": dt.date(2024, 5, 14), "inspector": "R. Okafor, PE (invented)",
    }
    return WorkbookContent(bridge, sheets, {"provision_set": "MBE 2018"})


# ------------------------------------------------------------------------------------------
# (b) Ten-panel Parker through truss, 1907, heavy loss that forces a posting
# ------------------------------------------------------------------------------------------


def parker_1907() -> WorkbookContent:
    n, p = 10, 19.0
    heights = [21.0, 24.5, 27.0, 28.5, 29.0, 28.5, 27.0, 24.5, 21.0]  # U1..U9
    g = build_truss("parker", n, p, heights, DeckPosition.THROUGH,
                    counter_panels=PARKER_COUNTER_PANELS)
    assign: dict[str, str] = {}
    for m in g.members:
        i = sorted(int(s[1:]) for s in (m.start, m.end))
        role = m.role.value
        if role == "bottom chord":
            k = min(i[0], n - 1 - i[0])
            assign[m.label] = ("BC-1", "BC-1", "BC-2", "BC-3", "BC-3")[k]
        elif role == "top chord":
            k = min(i[0], n - 1 - i[0])
            assign[m.label] = "TC-1" if k <= 1 else "TC-2"
        elif role == "end post":
            assign[m.label] = "EP-1"
        elif role == "hanger":
            assign[m.label] = "HG-1"
        elif role == "vertical":
            assign[m.label] = "VP-1"
        elif role == "counter":
            assign[m.label] = "CT-1"
        else:
            panel = max(i)
            k = min(panel, n + 1 - panel)
            assign[m.label] = {2: "DG-1", 3: "DG-2", 4: "DG-3", 5: "DG-4"}[k]

    def pin_of(joint: str) -> float:
        return PARKER_PIN_IN

    sheets = _empty_sheets()
    for sid, count, w, t in (("BC-1", 2, 5.0, 1.0), ("BC-2", 4, 5.0, 1.0),
                             ("BC-3", 4, 6.0, 1.125), ("DG-1", 2, 5.0, 1.125),
                             ("DG-2", 2, 4.0, 1.0), ("DG-3", 2, 5.0, 1.0)):
        sheets["Eyebars"].append(
            _eyebars(sid, count, w, t, _holes_for(g, assign, sid, pin_of, 1 / 32)))
    sheets["Rods"] += [
        {"section": "HG-1", "count": 2, "shape": "round", "diameter": 1.5, "rod_end": "loop",
         "note": "loop rods carrying the first floorbeam"},
        {"section": "DG-4", "count": 2, "shape": "round", "diameter": 1.25, "rod_end": "loop"},
        {"section": "CT-1", "count": 1, "shape": "round", "diameter": 1.125, "rod_end": "loop",
         "note": "adjustable counter"},
    ]
    _add_builtup(sheets, _laced_channels("TC-1", 12.0, 2.94, 0.28, 0.501, 12.0, (18.0, 0.375),
                                         16.0, 4))
    _add_builtup(sheets, _laced_channels("TC-2", 12.0, 3.05, 0.39, 0.501, 12.0,
                                         (18.0, 0.4375), 16.0, 4))
    _add_builtup(sheets, _laced_channels("EP-1", 15.0, 3.4, 0.4, 0.65, 12.0, (18.0, 0.4375),
                                         18.0, 4))
    _add_builtup(sheets, _laced_channels("VP-1", 8.0, 2.26, 0.22, 0.39, 9.0, None, 13.0, 2))
    pin_plates = {"TC-1": 0.5, "TC-2": 0.5, "EP-1": 0.5, "VP-1": 0.375}
    sheets["Materials"] += [
        {"material": "CT-2019", "kind": "steel", "F_y": 31.5, "F_u": 57.0,
         "basis": "coupon tests from two bottom-chord bars, 2019 (invented report TC-19-07)"},
        {"material": "PIN", "kind": "steel", "F_y": 33.0, "F_u": 62.0,
         "basis": "pin steel assumed from the 1907 specification on the plans"},
    ]
    for m in g.members:
        sheets["Members"].append({"member": m.label, "section": assign[m.label],
                                  "material": "CT-2019"})
    sheets["Heights"] += [{"point": k, "height": v} for k, v in enumerate(heights, start=1)]
    _sections_packing(g, assign, sheets, pin_of, "PIN", 0.0625, stirrup=1.0,
                      pin_plates=pin_plates)
    r1, r2 = PARKER_HANGER_LOSS_PERCENT
    findings: list[Row] = [
        {"member": "L1U1", "component": "rod 1", "region": "thread", "station": 0.5,
         "loss": r1, "condition": 3, "photo": "P-114",
         "note": "heavy section loss at the lower loop, deck drainage onto the hanger"},
        {"member": "L1U1", "component": "rod 2", "region": "thread", "station": 0.5,
         "loss": r2, "condition": 3, "photo": "P-115"},
        {"member": "L9U9", "component": "rod 1", "region": "body", "station": 2.0,
         "loss": 10.0, "condition": 5, "photo": "P-171"},
        {"member": "L2L3", "component": "bar 3", "region": "body", "station": 1.5,
         "loss": PARKER_CHORD_BAR_LOSS_PERCENT, "pack_rust": "yes", "condition": 4,
         "photo": "P-121", "note": "pitting where the bars are packed against the post"},
        {"member": "U2L3", "component": "bar 1", "region": "head",
         "station": round(g.member_length_ft("U2L3") - 0.6, 2),
         "loss": PARKER_DIAGONAL_LOSS_PERCENT, "condition": 4, "photo": "P-126"},
        {"member": "U3U4", "component": "cover", "region": "body", "station": 10.0,
         "loss": 20.0, "condition": 5, "photo": "P-133"},
        {"member": "L0U1", "component": "channel R", "region": "connection", "station": 0.7,
         "remaining": 0.30, "condition": 4, "photo": "P-102",
         "note": "web loss at the bearing end"},
    ]
    if PARKER_BROKEN_COUNTER:
        findings.append({"member": "U5L6", "component": "rod 1", "region": "body",
                         "bar_state": "broken", "condition": 3, "photo": "P-150",
                         "note": "counter broken at the turnbuckle"})
    sheets["Findings"] += findings
    sheets["DeadLoads"] += [
        {"description": "timber plank deck on nailing strips, 4 in", "component": "DC",
         "psf_deck": 18.0},
        {"description": "steel stringers, 6 lines I 15", "component": "DC",
         "plf_bridge": 250.0},
        {"description": "floorbeam, built-up 30 in", "component": "DC", "kip_floorbeam": 2.4},
        {"description": "steel railing", "component": "DC", "plf_truss": 30.0},
        {"description": "water line, 8 in, on brackets", "component": "DW",
         "plf_bridge": 45.0, "offset": 9.5},
    ]
    sheets["Vehicles"].append({"vehicle": "TAM-QUARRY", "name": "quarry tri-axle dump",
                               "category": "legal", "gross": 33.0})
    sheets["Axles"] += [
        {"vehicle": "TAM-QUARRY", "axle": 1, "load": 16.0},
        {"vehicle": "TAM-QUARRY", "axle": 2, "load": 17.0, "spacing": 14.0},
        {"vehicle": "TAM-QUARRY", "axle": 3, "load": 17.0, "spacing": 4.5},
        {"vehicle": "TAM-QUARRY", "axle": 4, "load": 16.0, "spacing": 4.5},
    ]
    bridge = {
        "units": "US", "structure_id": "TC-0622", "name": "Ferry Street over the Ashby River",
        "location": "Ferry Street, Ashby village, Tamarack County",
        "owner": "Tamarack County Highway Department", "year_built": 1907,
        "material": "steel", "geometry": "generated", "truss_form": "parker",
        "deck_position": "through", "panel_count": n, "panel_length": p,
        "counter_panels": ", ".join(map(str, PARKER_COUNTER_PANELS)),
        "truss_spacing": 20.0, "roadway_width": 18.0,
        "adtt": 260, "riding_surface": "smooth", "ws_thickness": 1.5,
        "ws_measured": "yes", "inspection_date": dt.date(2024, 9, 3),
        "inspector": "M. Lindqvist, PE (invented)",
    }
    return WorkbookContent(bridge, sheets, {"provision_set": "MBE 2018"})


# ------------------------------------------------------------------------------------------
# (c) Six-panel Pratt pony truss, 1903, wrought iron, recorded in SI units
# ------------------------------------------------------------------------------------------


def pony_1903_si() -> WorkbookContent:
    n, p_m, h_m = 6, 3.2, 2.1
    ft = 1 / 0.3048
    g = build_truss("pratt", n, p_m * ft, h_m * ft, DeckPosition.PONY, counter_panels=(3, 4))
    assign: dict[str, str] = {}
    for m in g.members:
        role = m.role.value
        i = sorted(int(s[1:]) for s in (m.start, m.end))
        if role == "bottom chord":
            k = min(i[0], n - 1 - i[0])
            assign[m.label] = ("BC-1", "BC-1", "BC-2")[k]
        elif role in ("top chord", "end post"):
            assign[m.label] = "TC-1"
        elif role in ("hanger", "vertical"):
            assign[m.label] = "VP-1" if role == "vertical" else "HG-1"
        elif role == "counter":
            assign[m.label] = "CT-1"
        else:
            panel = max(i)
            k = min(panel, n + 1 - panel)
            assign[m.label] = {2: "DG-1", 3: "DG-2"}[k]

    def pin_of(joint: str) -> float:  # mm
        return 76.0

    sheets = _empty_sheets()
    for sid, count, w, t in (("BC-1", 2, 76.0, 19.0), ("BC-2", 2, 89.0, 22.0),
                             ("DG-1", 2, 64.0, 19.0)):
        sheets["Eyebars"].append(
            _eyebars(sid, count, w, t, _holes_for(g, assign, sid, pin_of, 0.8)))
    sheets["Rods"] += [
        {"section": "HG-1", "count": 2, "shape": "round", "diameter": 25.0, "rod_end": "loop"},
        {"section": "DG-2", "count": 2, "shape": "round", "diameter": 25.0, "rod_end": "loop"},
        {"section": "CT-1", "count": 1, "shape": "square", "diameter": 22.0, "rod_end": "loop",
         "note": "square counter rod"},
    ]
    built, plates, chans = _laced_channels("TC-1", 178.0, 53.0, 5.3, 9.3, 190.0, (300.0, 8.0),
                                           300.0, 4, note="top chord and end posts")
    built["hole_diameter"] = 20.6
    _add_builtup(sheets, (built, plates, chans))
    sheets["BuiltUp"].append({"section": "VP-1", "connectors": "lacing", "spacing": 280.0,
                              "snug_tight": "yes",
                              "hole_diameter": 20.6, "holes": 2, "U": 0.8,
                              "note": "four angles laced"})
    a = 64.0
    # heels 140 mm apart: the 64 mm legs stop 12 mm short of each other
    for part, x, y, xd, yd in (("A-1", -80.0, 70.0, "+x", "-y"), ("A-2", 80.0, 70.0, "-x", "-y"),
                               ("A-3", -80.0, -70.0, "+x", "+y"),
                               ("A-4", 80.0, -70.0, "-x", "+y")):
        sheets["Angles"].append({"section": "VP-1", "part": part, "x": x, "y": y, "leg_x": a,
                                 "leg_y": a, "thickness": 8.0, "x_dir": xd, "y_dir": yd})
    for m in g.members:
        sheets["Members"].append({"member": m.label, "section": assign[m.label],
                                  "K": 0.875 if assign[m.label] == "TC-1" else None})
    eyebar = {r["section"]: r for r in sheets["Eyebars"]}
    rods = {r["section"]: r for r in sheets["Rods"]}

    def plates_of(member: str) -> list[float]:
        sid = assign[member]
        if sid in eyebar:
            return [float(eyebar[sid]["thickness"])] * int(eyebar[sid]["count"])  # type: ignore[arg-type]
        if sid in rods:
            return [float(rods[sid]["diameter"])] * int(rods[sid]["count"])  # type: ignore[arg-type]
        # built-up: at the ends the web with its pin plate bears on the pin each side (on
        # Packing only: the pin plates are not parts of the section, see _laced_channels)
        return [-16.0, -16.0] if sid == "VP-1" else [-(5.3 + 8.0), -(5.3 + 8.0)]

    for j in g.joints:
        sheets["Pins"].append({"joint": j.label, "diameter": pin_of(j.label)})
        sheets["Packing"] += _packing(g, j.label, plates_of, 1.5, stirrup=19.0)
    sheets["Findings"] += [
        {"member": "L0L1", "component": "bar 2", "region": "body", "station": 1.2,
         "remaining": 15.5, "condition": 5, "photo": "DSC_0412",
         "note": "laminar corrosion, typical of wrought iron"},
        {"member": "L2L3", "component": "bar 1", "region": "body", "station": 1.6,
         "loss": 12.0, "condition": 6, "photo": "DSC_0419"},
        {"member": "L1U1", "component": "rod 2", "region": "thread", "station": 0.2,
         "loss": 20.0, "condition": 5, "photo": "DSC_0415",
         "note": "forge line of the lower loop opened slightly"},
        {"member": "U1U2", "component": "cover", "region": "body", "station": 1.6,
         "remaining": 6.5, "condition": 6, "photo": "DSC_0421"},
        {"member": "L2U3", "component": "rod 1", "region": "body", "bar_state": "bent",
         "condition": 5, "photo": "DSC_0430", "note": "counter bent by a farm implement"},
    ]
    sheets["DeadLoads"] += [
        {"description": "timber deck on timber stringers", "component": "DC",
         "psf_deck": 0.85},
        {"description": "floorbeam, rolled I 300 mm", "component": "DC",
         "kip_floorbeam": 3.1},
        {"description": "pipe railing", "component": "DC", "plf_truss": 0.25},
    ]
    sheets["Vehicles"].append({"vehicle": "TWP-HAY", "name": "farm tractor with hay wagon",
                               "category": "owner", "gross": 12.2})
    sheets["Axles"] += [
        {"vehicle": "TWP-HAY", "axle": 1, "load": 30.0},
        {"vehicle": "TWP-HAY", "axle": 2, "load": 45.0, "spacing": 3.0},
        {"vehicle": "TWP-HAY", "axle": 3, "load": 45.0, "spacing": 4.2, "max_spacing": 5.0},
    ]
    bridge = {
        "units": "SI", "structure_id": "TC-0903", "name": "Quarry Lane pony truss over Birch Run",
        "location": "Quarry Lane, Weller Township, Tamarack County",
        "owner": "Tamarack County Highway Department", "year_built": 1903,
        "material": "wrought iron", "truss_form": "pratt", "deck_position": "pony",
        "panel_count": n, "panel_length": p_m, "height": h_m, "counter_panels": "3, 4",
        "truss_spacing": 5.2, "roadway_width": 4.6, "lane_count": 1, "adtt": 5,
        # the floorbeams, rolled I of 380 mm (about 440 in4): the U-frames hold the top chord
        "floorbeam_I": 183_000_000.0,
        "chord_at_hips": "continuous",  # spliced: the cover plate runs over the hip pin
        "riding_surface": "major deviations", "inspection_date": dt.date(2023, 10, 26),
        "inspector": "J. Mbeki (invented)",
    }
    return WorkbookContent(bridge, sheets, {"detail_allowance": 20.0})


SAMPLES: dict[str, Callable[[], WorkbookContent]] = {
    "tc0417_pratt_1898.xlsx": pratt_1898,
    "tc0622_parker_1907.xlsx": parker_1907,
    "tc0903_pony_1903_si.xlsx": pony_1903_si,
}


def write_all(folder: Path = HERE) -> list[Path]:
    out = []
    for name, make in SAMPLES.items():
        path = folder / name
        write_workbook(path, make(), force=True)
        out.append(path)
    return out


if __name__ == "__main__":
    for path in write_all(Path(sys.argv[1]) if len(sys.argv) > 1 else HERE):
        print(f"wrote {path}")
