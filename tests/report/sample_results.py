"""A realistic rating results object built by hand, for developing and testing the report.

Invented scenario (our own): "Mill Creek Bridge", an 1898 eight-panel Pratt through truss,
160 ft span, 20 ft panels, 24 ft deep, eyebar bottom chord and diagonals, rod hangers, laced
posts, counters in the two middle panels. The forces are computed here from the real
influence lines of the geometry (``rating.analysis``) with a brute-force moving-load scan on a
0.25 ft grid and the LRFR rating equation written out inline, so the numbers hang together;
the fixture does not replace the rating engine and is not checked against a source.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from rating.analysis.truss import influence_lines
from rating.model.builders import build_truss
from rating.results import (
    SCHEMA_VERSION,
    BridgeSummary,
    CheckSummary,
    Factors,
    FindingEcho,
    InfluenceLineData,
    JointResult,
    LiveLoadEffect,
    MemberResult,
    PackingRow,
    PinResult,
    Position,
    PostingResultEntry,
    Rating,
    RatingResults,
    Resistance,
    SectionSummary,
    VehicleResult,
    units_block,
)

F_Y, F_U, E = 26.0, 52.0, 29000.0  # steel before 1905, MBE Table 6A.6.2.1-1 [value from memory]
DF = 0.80  # lever rule, one lane, multiple presence 1.20 (see distribution below)
IM = 0.33
P_DC, P_DW = 22.0, 3.0  # kip per interior deck panel point, one truss


@dataclass(frozen=True)
class _Veh:
    id: str
    name: str
    category: str
    level: str
    axles: tuple[float, ...]
    spacings: tuple[float, ...]
    W: float
    lane: float
    gamma_ll: float
    source: str
    tag: str


VEHICLES = (
    _Veh("HL93-INV", "HL-93 design load, inventory", "design", "inventory", (8, 32, 32),
         (14, 14), 36.0, 0.64, 1.75, "AASHTO LRFD 3.6.1.2", "V"),
    _Veh("HL93-OPR", "HL-93 design load, operating", "design", "operating", (8, 32, 32),
         (14, 14), 36.0, 0.64, 1.35, "AASHTO LRFD 3.6.1.2", "V"),
    _Veh("TYPE3", "AASHTO Type 3", "legal", "legal", (16, 17, 17), (15, 4), 25.0, 0.0,
         1.45, "MBE 6A.4.4.2.1", "M"),
    _Veh("TYPE3S2", "AASHTO Type 3S2", "legal", "legal", (10, 15.5, 15.5, 15.5, 15.5),
         (11, 4, 22, 4), 36.0, 0.0, 1.45, "MBE 6A.4.4.2.1", "M"),
    _Veh("TYPE3-3", "AASHTO Type 3-3", "legal", "legal", (12, 12, 12, 16, 14, 14),
         (15, 4, 15, 16, 4), 40.0, 0.0, 1.45, "MBE 6A.4.4.2.1", "M"),
    _Veh("SU4", "Single-unit SHV SU4", "specialized hauling", "legal", (12, 8, 17, 17),
         (10, 4, 4), 27.0, 0.0, 1.45, "MBE 6A.4.4.2.1", "M"),
    _Veh("EV3", "Emergency vehicle EV3", "emergency", "legal", (24, 31, 31), (15, 4), 43.0,
         0.0, 1.30, "FAST Act emergency vehicles", "M"),
)


@dataclass(frozen=True)
class _Sec:
    A_g: float
    A_n: float
    compression: bool
    KL_r: float | None = None
    finding: str = ""
    phi_c: float = 1.0
    phi_s: float = 0.90


def _sections(labels: tuple[str, ...], roles: dict[str, str]) -> dict[str, _Sec]:
    out: dict[str, _Sec] = {}
    for lab in labels:
        role = roles[lab]
        if role == "bottom chord":
            a = {"L0L1": 10.0, "L7L8": 10.0, "L1L2": 10.0, "L6L7": 10.0, "L2L3": 15.0,
                 "L5L6": 15.0}.get(lab, 18.0)
            out[lab] = _Sec(a, a * 1.5, False)
        elif role == "top chord":
            out[lab] = _Sec(30.0, 27.0, True, 38.0)
        elif role == "end post":
            out[lab] = _Sec(26.0, 23.0, True, 52.0)
        elif role == "hanger":
            out[lab] = _Sec(4.0, 3.1, False, phi_s=1.0)
        elif role == "vertical":
            out[lab] = _Sec(12.0, 10.5, True, 74.0)
        elif role == "counter":
            out[lab] = _Sec(2.4, 1.9, False, phi_s=1.0)
        else:  # main diagonals
            a = {"U1L2": 12.0, "L6U7": 12.0, "U2L3": 9.0, "L5U6": 9.0}.get(lab, 6.0)
            out[lab] = _Sec(a, a * 1.5, False)
    # the inspection findings
    out["L1U1"] = replace(out["L1U1"], A_n=2.45, finding="L1U1 thread: 18% loss, Findings!A4",
                          phi_c=0.95)
    out["U1L2"] = replace(out["U1L2"], A_g=11.1, finding="U1L2 bar 2 body: 0.56 in remaining, "
                          "Findings!A5", phi_c=0.95)
    out["U2U3"] = replace(out["U2U3"], A_g=26.4, finding="U2U3 cover plate: 12% loss, "
                          "Findings!A6", phi_c=0.85)
    return out


def _il(stations: np.ndarray, y: np.ndarray, x: np.ndarray) -> np.ndarray:
    return np.interp(x, stations, y, left=0.0, right=0.0)


def _scan(stations: np.ndarray, y: np.ndarray, v: _Veh) -> dict[str, tuple[float, Position]]:
    """Brute-force extremes of one line under one vehicle (fixture only: 0.25 ft grid)."""
    offsets = np.concatenate([[0.0], np.cumsum(v.spacings)])
    P = np.array(v.axles, dtype=float)
    fronts = np.arange(stations[0] - 1.0, stations[-1] + offsets[-1] + 1.0, 0.25)
    best: dict[str, tuple[float, Position]] = {}
    for direction, sign in (("forward", -1.0), ("reverse", 1.0)):
        starts = fronts if sign < 0 else fronts - offsets[-1]
        xs = starts[:, None] + sign * offsets[None, :]
        eff = (_il(stations, y, xs) * P).sum(axis=1)
        for key, idx in (("max", int(np.argmax(eff))), ("min", int(np.argmin(eff)))):
            value = float(eff[idx])
            lane_segs: tuple[tuple[float, float], ...] = ()
            if v.lane:
                pos = y > 1e-9 if key == "max" else y < -1e-9
                segs = []
                for k in range(len(stations) - 1):
                    if pos[k] or pos[k + 1]:
                        segs.append((float(stations[k]), float(stations[k + 1])))
                lane_segs = tuple(segs)
                part = np.where(pos, y, 0.0)
                value += v.lane * float(np.trapezoid(part, stations))
            p = Position(front_axle_station=float(starts[idx]), direction=direction,
                         spacings=tuple(float(s) for s in v.spacings),
                         axle_stations=tuple(float(s) for s in xs[idx]),
                         axle_loads=tuple(float(a) for a in v.axles),
                         load_model="truck + lane" if v.lane else "axles",
                         lane_segments=lane_segs)
            if key not in best or (value > best[key][0] if key == "max"
                                   else value < best[key][0]):
                best[key] = (value, p)
    return best


def _compression_resistance(A_g: float, KL_r: float) -> float:
    """Fixture only: AASHTO LRFD 6.9.4.1.1 curve. [value from memory]"""
    P_o = F_Y * A_g
    P_e = math.pi**2 * E * A_g / KL_r**2
    return 0.95 * (0.658 ** (P_o / P_e) * P_o if P_e / P_o >= 0.44 else 0.877 * P_e)


def sample_results(system: str = "US", hostile: bool = False) -> RatingResults:
    """The Mill Creek sample; ``system`` "SI" asks for an SI report; ``hostile`` puts HTML and
    script into every text a workbook could carry, to test that the report keeps it inert."""
    g = build_truss("pratt", 8, 20.0, 24.0, counter_panels=(4, 5))
    counters = tuple(m.label for m in g.members if m.role.value == "counter")
    lines = influence_lines(g, inactive=counters)
    stations = np.asarray(lines.stations_ft, dtype=float)
    roles = {m.label: m.role.value for m in g.members}
    secs = _sections(tuple(m.label for m in g.members), roles)
    P_dc = np.full(stations.size, P_DC)
    P_dw = np.full(stations.size, P_DW)
    P_dc[[0, -1]] = P_DC / 2
    P_dw[[0, -1]] = P_DW / 2

    members: list[MemberResult] = []
    il_data: list[InfluenceLineData] = []
    for m in g.members:
        if m.label in counters:  # engages when its panel's main would go into compression
            nums = {m.start[1:], m.end[1:]}
            main = next(o.label for o in g.members if o.role.value == "diagonal"
                        and {o.start[1:], o.end[1:]} == nums)
            y = -lines.row(main)
        else:
            y = lines.row(m.label)
        dc = float(y @ P_dc) if m.label not in counters else 0.0
        dw = float(y @ P_dw) if m.label not in counters else 0.0
        il_data.append(InfluenceLineData(m.label, tuple(float(s) for s in stations),
                                         tuple(round(float(v), 6) + 0.0 for v in y)))
        s = secs[m.label]
        floor = max(s.phi_c * s.phi_s, 0.85)
        t_res = floor * min(0.95 * F_Y * s.A_g, 0.80 * F_U * s.A_n)
        c_res = floor * _compression_resistance(s.A_g, s.KL_r) if s.compression else None
        checks = [CheckSummary("yielding of the gross section", "tension", 0.95,
                               F_Y * s.A_g, floor * 0.95 * F_Y * s.A_g, "AASHTO LRFD 6.8.2.1",
                               "body", s.finding if "body" in s.finding else ""),
                  CheckSummary("fracture of the net section", "tension", 0.80,
                               F_U * s.A_n, floor * 0.80 * F_U * s.A_n, "AASHTO LRFD 6.8.2.1",
                               "end", s.finding if "thread" in s.finding else "")]
        if c_res is not None:
            checks.append(CheckSummary("flexural buckling", "compression", 0.95,
                                       c_res / (0.95 * floor), c_res, "AASHTO LRFD 6.9.4.1.1",
                                       "member", s.finding if "plate" in s.finding else ""))
        live: dict[str, LiveLoadEffect] = {}
        ratings: dict[str, Rating] = {}
        for v in VEHICLES:
            ext = _scan(stations, y, v)
            mx, mxp = ext["max"]
            mn, mnp = ext["min"]
            lane_share = 0.0
            if v.lane:
                lane_share = v.lane * float(np.trapezoid(np.where(y > 1e-9, y, 0.0), stations))
            mx_im = DF * ((mx - lane_share) * (1 + IM) + lane_share)
            lane_neg = v.lane * float(np.trapezoid(np.where(y < -1e-9, y, 0.0), stations))
            mn_im = DF * ((mn - lane_neg) * (1 + IM) + lane_neg)
            live[v.id] = LiveLoadEffect(DF * mx, DF * mn, mx_im, mn_im, DF, IM, mxp, mnp)
            cands: list[Rating] = []
            fac = Factors(1.25, 1.50, v.gamma_ll, IM, 0.95, s.phi_c, s.phi_s)
            if mx_im > 1e-9:
                rf = (t_res - 1.25 * dc - 1.50 * dw) / (v.gamma_ll * mx_im)
                gov = min(checks[:2], key=lambda c: c.factored)
                cands.append(Rating(rf, "tension", gov.name, fac,
                                    "load multiplier" if m.tension_only else "linear", mxp,
                                    gov.finding or s.finding))
            if c_res is not None and mn_im < -1e-9:
                rf = (c_res + 1.25 * dc + 1.50 * dw) / (v.gamma_ll * -mn_im)
                cands.append(Rating(rf, "compression", "flexural buckling", fac, "linear", mnp,
                                    s.finding))
            if cands:
                ratings[v.id] = min(cands, key=lambda r: r.rf)
        warnings: tuple[str, ...] = ()
        if m.label == "L1U1":
            warnings = ("L1U1: forge-welded loop rod ends; cracking at the forge line is a "
                        "frequent flaw (VTRC 11-R13): inspect closely.",)
        if m.role.value == "counter" and m.label.endswith("4"):
            ratings = {}  # the far counter is listed as not rated (no live load reaches it)
            live = {}
            warnings = (f"{m.label}: counter not rated: no vehicle position engages it.",)
        section = SectionSummary(s.A_g, s.A_n, F_Y, F_U, g.member_length_ft(m.label),
                                 0.875 if s.compression else None, s.KL_r, E)
        members.append(MemberResult(
            m.label, m.role.value, (m.start, m.end), m.tension_only, {"DC": dc, "DW": dw},
            live, section, Resistance(t_res, c_res, tuple(checks)), ratings, warnings))

    # a pin that governs on paper (its section moments combine bars at one vehicle position)
    pin_fac = Factors(1.25, 1.50, 1.30, IM, 1.0, 0.95, 1.0)
    pin_ratings = {v.id: Rating(0.88 if v.id == "EV3" else 1.04 + 0.01 * i, "pin",
                                "combined flexure and shear at section 3", pin_fac,
                                "load multiplier", None, "")
                   for i, v in enumerate(VEHICLES)}
    pin_ratings["HL93-INV"] = Rating(0.71, "pin", "combined flexure and shear at section 3",
                                     replace(pin_fac, gamma_ll=1.75), "load multiplier")
    pins = (
        PinResult("L2", 4.0, (PackingRow("L2L3", 1.0, 0.0), PackingRow("U1L2", 1.125, 0.0625),
                              PackingRow("L1L2", 1.0, 0.0625), PackingRow("L2U2", 0.5, 0.125),
                              PackingRow(None, 0.25, 0.0), PackingRow("L2U2", 0.5, 0.0),
                              PackingRow("L1L2", 1.0, 0.125), PackingRow("U1L2", 1.125, 0.0625),
                              PackingRow("L2L3", 1.0, 0.0625)),
                  "section 3, between U1L2 and L1L2", pin_ratings,
                  ("pin L2: packing measured in 2024, bars not symmetric about the centre",)),
        PinResult("U1", 4.5, (PackingRow("L0U1", 0.75, 0.0), PackingRow("U1U2", 0.75, 0.0),
                              PackingRow("U1L2", 1.125, 0.125), PackingRow("L1U1", 1.25, 0.25),
                              PackingRow("L1U1", 1.25, 0.25), PackingRow("U1L2", 1.125, 0.25),
                              PackingRow("U1U2", 0.75, 0.125), PackingRow("L0U1", 0.75, 0.0)),
                  "section 2, between U1L2 and L1U1",
                  {v.id: Rating(1.9 + 0.02 * i, "pin", "bearing on L0U1 plate", pin_fac,
                                "load multiplier") for i, v in enumerate(VEHICLES)}),
    )

    # controlling member (or pin) and posting per vehicle
    posting: dict[str, PostingResultEntry] = {}
    for v in VEHICLES:
        cand = [(mr.ratings[v.id].rf, mr.id) for mr in members if v.id in mr.ratings]
        cand += [(p.ratings[v.id].rf, f"pin {p.joint}") for p in pins if v.id in p.ratings]
        rf, who = min(cand)
        if v.level != "legal":
            posting[v.id] = PostingResultEntry(rf, rf * v.W, None, who, "none",
                                               "design-load rating: not used for posting")
        elif rf >= 1.0:
            posting[v.id] = PostingResultEntry(rf, rf * v.W, None, who, "none")
        elif rf >= 0.3:
            posting[v.id] = PostingResultEntry(rf, rf * v.W,
                                               float(math.floor(v.W / 0.7 * (rf - 0.3))), who,
                                               "post")
        else:
            posting[v.id] = PostingResultEntry(rf, rf * v.W, None, who, "close",
                                               "consider closing; the owner's policy governs")
    posts = {k: p for k, p in posting.items() if p.action == "post"}
    if any(p.action == "close" for p in posting.values()):
        recommendation = "Consider closing the bridge (a legal load rates below 0.3)."
    elif posts:
        low = min(posts.items(), key=lambda kv: kv[1].posting_tons or 0.0)
        recommendation = (f"Post the bridge: {low[0]} safe load {low[1].posting_tons:g} tons "
                          f"({low[1].member} controls).")
    else:
        recommendation = "No load restriction is needed for the legal loads rated."

    joints = tuple(
        JointResult(j.label, j.x_ft, j.y_ft, j.label in g.deck_joints,
                    {"L0": "pin", "L8": "roller"}.get(j.label))
        for j in g.joints)
    vehicles = tuple(
        VehicleResult(v.id, v.name, v.category, v.W, tuple(float(a) for a in v.axles),
                      tuple((float(s), 30.0 if (v.lane and k == 1) else float(s))
                            for k, s in enumerate(v.spacings)),
                      v.lane, v.source, v.tag, v.level, v.gamma_ll, IM)
        for v in VEHICLES)
    findings = (
        FindingEcho("L1U1", "all", "thread", 0.5, None, 18.0, "sound", 5,
                    "IMG_0412.jpg", "rust at lower nut, threads pitted", "Findings!A4"),
        FindingEcho("U1L2", "bar 2", "body", 6.0, 0.56, None, "sound", 5, "",
                    "pitting 2 ft below U1", "Findings!A5"),
        FindingEcho("U2U3", "cover plate", "body", None, None, 12.0, "sound", 4, "",
                    "pack rust between cover plate and channel flanges", "Findings!A6"),
        FindingEcho("L3L4", "bar 3", "body", None, None, None, "loose", 6, "",
                    "bar 3 rattles under traffic; taken as carrying no load", "Findings!A7"),
    )
    bridge = BridgeSummary(
        "CR-114-0032", "Mill Creek Bridge", g.span_ft, "County Road 114 over Mill Creek",
        "Harlan County Highway Department", 1898, "2024-05-14", "J. Ortega, P.E.", "pratt",
        "through", 8, 18.0, 16.0, "mill_creek.xlsx")
    assumptions = (
        "Steel of unknown grade built 1898: F_y = 26 ksi, F_u = 52 ksi (MBE Table 6A.6.2.1-1, "
        "value from memory).",
        "Live load factor for legal loads, ADTT unknown: 1.45 (MBE 2018 Table 6A.4.4.2.3a-1, "
        "value from memory).",
        "Dynamic load allowance 33% on axles, none on the lane load (AASHTO LRFD 3.6.2.1).",
        "Condition factor from the member condition rating (MBE 6A.4.2.3, value from memory).",
        "Counters carry no initial tension (common practice).",
    )
    warnings = (
        "Wrought iron or steel not confirmed by coupon tests; coupon tests are advised.",
        "L3L4 bar 3 is loose and taken as carrying no load (Findings!A7).",
    )
    distribution = {"method": "lever rule", "lanes": 1, "multiple presence factor": 1.2,
                    "distribution factor": DF, "governing case": "one lane, wheel 2 ft from "
                    "the curb"}
    results = RatingResults(
        schema_version=SCHEMA_VERSION, bridge=bridge, units=units_block(system),
        method="LRFR", provision_set="MBE 2018", joints=joints, vehicles=vehicles,
        members=tuple(members), pins=pins, posting=posting, recommendation=recommendation,
        warnings=warnings, assumptions=assumptions, findings=findings,
        influence_lines=tuple(il_data), distribution=distribution,
        generator="pintruss test fixture")
    return _make_hostile(results) if hostile else results


SCRIPT = "<script>alert('x')</script>"
IMG = '<img src="http://example.invalid/x.png" onerror="alert(1)">'
# a long entry without a space, as a photo path pasted into the workbook can be
LONG_PATH = "\\\\county-files\\bridges\\CR-114\\2024-09-03\\IMG_2027_lower_eye_of_L1U1_pitting.jpg"


def _make_hostile(r: RatingResults) -> RatingResults:
    """Every workbook text carries markup; a member id too."""
    bad = "L0L1<i>"
    r = replace(
        r,
        members=tuple(replace(m, id=bad) if m.id == "L0L1" else m for m in r.members),
        influence_lines=tuple(replace(il, member=bad) if il.member == "L0L1" else il
                              for il in r.influence_lines),
        posting={k: replace(p, member=bad) if p.member == "L0L1" else p
                 for k, p in r.posting.items()})
    bridge = replace(r.bridge, name="Mill Creek " + SCRIPT, location="Road " + IMG,
                     owner='Owner "&" <b>bold</b>', inspector="</td></tr></table>" + SCRIPT,
                     id="CR<114>", source_file="x" + SCRIPT + ".xlsx")
    findings = tuple(replace(f, note=f.note + " " + SCRIPT + " see " + LONG_PATH, photo=IMG,
                             component="bar <2>") for f in r.findings)
    members = tuple(replace(m, warnings=(*m.warnings, "note " + SCRIPT)) for m in r.members)
    warnings = (*r.warnings, "workbook note: " + IMG)
    assumptions = (*r.assumptions, "owner note: </style>" + SCRIPT)
    return replace(r, bridge=bridge, findings=findings, members=members, warnings=warnings,
                   assumptions=assumptions,
                   recommendation=r.recommendation + " " + SCRIPT)
