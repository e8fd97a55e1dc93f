"""The sample inventory: template -> filled -> read round trip, check passes, input untouched."""

from __future__ import annotations

import dataclasses
import hashlib
import math
from pathlib import Path

import pytest
from inventory_helpers import SAMPLES_DIR, load_make_samples

from rating import units
from rating.cli import main
from rating.inventory import read_workbook
from rating.inventory import schema as sc
from rating.inventory.cells import from_column_unit
from rating.inventory.template import WorkbookContent, write_workbook
from rating.model import BarState, Bridge, FindingRegion, MaterialKind, UnitSystem

MAKE = load_make_samples()
NAMES = sorted(MAKE.SAMPLES)


def _strip(b: Bridge) -> Bridge:
    return dataclasses.replace(b, source_file="")


@pytest.fixture(scope="module")
def committed() -> dict[str, Bridge]:
    out = {}
    for name in NAMES:
        r = read_workbook(SAMPLES_DIR / name)
        assert r.errors == (), "\n".join(p.format() for p in r.errors)
        assert r.bridge is not None
        out[name] = r.bridge
    return out


def test_at_least_three_samples_and_readme_says_invented() -> None:
    assert len(NAMES) >= 3
    for name in NAMES:
        assert (SAMPLES_DIR / name).is_file(), f"{name} missing; run make_samples.py"
    text = (SAMPLES_DIR / "README.md").read_text(encoding="utf-8")
    assert "invented" in text.lower()


@pytest.mark.parametrize("name", NAMES)
def test_round_trip_matches_committed(name: str, tmp_path: Path, committed) -> None:
    """Template filled from the Python data and read back gives the committed bridge."""
    path = tmp_path / name
    write_workbook(path, MAKE.SAMPLES[name]())
    r = read_workbook(path)
    assert r.errors == ()
    assert r.bridge is not None
    assert _strip(r.bridge) == _strip(committed[name])


@pytest.mark.parametrize("name", NAMES)
def test_check_passes(name: str, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["check", str(SAMPLES_DIR / name)]) == 0
    out = capsys.readouterr().out
    assert "no errors" in out


@pytest.mark.parametrize("name", NAMES)
def test_input_byte_identical_after_reading(name: str) -> None:
    path = SAMPLES_DIR / name
    before = hashlib.sha256(path.read_bytes()).hexdigest()
    stat = path.stat()
    read_workbook(path)
    assert hashlib.sha256(path.read_bytes()).hexdigest() == before
    assert path.stat().st_mtime_ns == stat.st_mtime_ns


def test_pratt_has_counters_in_middle_panels_and_moderate_loss(committed) -> None:
    b = committed["tc0417_pratt_1898.xlsx"]
    g = b.geometry
    assert g.form == "pratt" and len(g.deck_joints) == 9  # 8 panels
    counters = {m.label for m in g.members if m.role.value == "counter"}
    assert counters == {"L2U3", "L3U4", "U4L5", "U5L6"}  # panels 3 to 6 of 8
    losses = [f.percent_loss for f in b.findings if f.percent_loss is not None]
    assert losses and max(losses) <= 25.0
    assert b.info.year_built == 1898
    assert any(d.material.assumed for d in b.member_designs)


def test_parker_loss_pattern_heavy_on_hanger_and_chord(committed) -> None:
    b = committed["tc0622_parker_1907.xlsx"]
    assert b.geometry.form == "parker"
    heights = {b.geometry.joint(f"U{i}").y_ft for i in range(1, 10)}
    assert len(heights) > 1  # polygonal top chord
    hanger = [f for f in b.findings if f.member == "L1U1"]
    assert len(hanger) == 2 and min(f.percent_loss or 0 for f in hanger) >= 30.0
    assert any(f.bar_state is BarState.BROKEN for f in b.findings) == MAKE.PARKER_BROKEN_COUNTER
    chord = [f for f in b.findings if f.member == "L2L3"]
    assert chord and chord[0].percent_loss == MAKE.PARKER_CHORD_BAR_LOSS_PERCENT
    assert any(f.region is FindingRegion.HEAD for f in b.findings if f.member == "U2L3")
    assert b.settings.wearing_surface_measured


def test_pony_is_si_and_converted_at_the_edge(committed) -> None:
    b = committed["tc0903_pony_1903_si.xlsx"]
    assert b.settings.units is UnitSystem.SI
    assert b.geometry.deck_position.value == "pony"
    # 3.2 m panels: 3.2 / 0.3048 ft (NIST SP 811 App. B, exact by definition)
    assert b.geometry.span_ft == pytest.approx(6 * 3.2 / 0.3048, rel=1e-12)
    eb = b.design_of("L0L1")
    assert eb is not None
    assert eb.section.width_in == pytest.approx(76.0 / 25.4, rel=1e-12)  # type: ignore[union-attr]
    assert eb.material.kind is MaterialKind.WROUGHT_IRON
    # 30 kN front axle: 1 kip = 4.4482216152605 kN (NIST SP 811 App. B)
    v = b.owner_vehicles[0]
    assert v.axle_loads_kip[0] == pytest.approx(30.0 / 4.4482216152605, rel=1e-12)
    assert v.spacings[1].is_variable
    # 12.2 tonne = 12.2 / 0.90718474 short ton (NIST SP 811 App. B)
    assert v.gross_weight_tons == pytest.approx(12.2 / 0.90718474, rel=1e-12)


def _to_si(content: WorkbookContent) -> WorkbookContent:
    """The same bridge written in SI: every unit column converted with rating.units."""
    def conv(col: sc.Column, v: object) -> object:
        if isinstance(v, int | float) and not isinstance(v, bool) and col.si_unit and (
                col.si_unit != col.unit):
            return from_column_unit(float(v), col, si=True)
        return v

    bridge = {k: conv(sc.BRIDGE.field_of(k), v) for k, v in content.bridge.items()}
    bridge["units"] = "SI"
    settings = {k: conv(sc.SETTINGS.field_of(k), v) for k, v in content.settings.items()}
    tables = {}
    for name, rows in content.tables.items():
        spec = next(t for t in sc.TABLES if t.name == name)
        tables[name] = [{k: conv(spec.column(k), v) for k, v in row.items()} for row in rows]
    return WorkbookContent(bridge, tables, settings)


def _approx_equal(a: object, b: object, path: str = "") -> None:
    if dataclasses.is_dataclass(a) and not isinstance(a, type):
        assert type(a) is type(b), path
        for f in dataclasses.fields(a):
            if f.name in ("where", "source_file", "units"):
                continue
            _approx_equal(getattr(a, f.name), getattr(b, f.name), f"{path}.{f.name}")
    elif isinstance(a, tuple | list):
        assert isinstance(b, tuple | list) and len(a) == len(b), path
        for i, (x, y) in enumerate(zip(a, b, strict=True)):
            _approx_equal(x, y, f"{path}[{i}]")
    elif isinstance(a, float) and not isinstance(a, bool):
        assert isinstance(b, float) and math.isclose(a, b, rel_tol=1e-9, abs_tol=1e-9), (
            f"{path}: {a} != {b}")
    else:
        assert a == b, f"{path}: {a!r} != {b!r}"


@pytest.mark.parametrize("name", ["tc0417_pratt_1898.xlsx", "tc0622_parker_1907.xlsx"])
def test_same_bridge_in_si_reads_the_same(name: str, tmp_path: Path, committed) -> None:
    """US workbook and its SI twin give the same core values (conversions: NIST SP 811
    Appendix B, exact by definition; the round trip through rating.units is closed-form)."""
    path = tmp_path / "si.xlsx"
    write_workbook(path, _to_si(MAKE.SAMPLES[name]()))
    r = read_workbook(path)
    assert r.errors == (), "\n".join(p.format() for p in r.errors)
    assert r.bridge is not None and r.bridge.settings.units is UnitSystem.SI
    _approx_equal(r.bridge, committed[name])


def test_units_factor_used_is_nist() -> None:
    """1 in = 25.4 mm and 1 ft = 0.3048 m exactly (NIST SP 811 Appendix B)."""
    assert units.to_core(25.4, "mm") == pytest.approx(1.0, rel=1e-15)
    assert units.to_core(0.3048, "m") == pytest.approx(1.0, rel=1e-15)


def test_si_workbook_messages_read_in_si() -> None:
    # the SI pony truss: the reader's warnings and assumptions quote MPa, not ksi
    import re

    si = [n for n in NAMES if n.endswith("_si.xlsx")]
    assert si
    r = read_workbook(SAMPLES_DIR / si[0])
    texts = [p.message for p in r.problems] + list(r.assumptions)
    assert texts
    us = re.compile(r"(?<![\w./^-])\d+(?:\.\d+)? ?(in|ft|ksi|kip|klf|pcf|psf)(?![\w-])")
    assert not [t for t in texts if us.search(t)]
    assert any("MPa" in t for t in texts)


def test_inches_typed_in_an_si_workbook_are_questioned(tmp_path: Path) -> None:
    """In the SI sample a remaining thickness typed in inches (0.61 for 15.5 mm) reads as
    0.61 mm, 96 % loss, and a packing plate typed in inches (0.52 for 13.3 mm) as a 0.52 mm
    plate: both are warnings at their cells asking to confirm the value and its unit (the
    rating would otherwise close the bridge on a slip of units)."""
    from openpyxl import load_workbook

    wb = load_workbook(SAMPLES_DIR / "tc0903_pony_1903_si.xlsx")
    assert (wb["Findings"]["B5"].value, wb["Findings"]["F5"].value) == ("L0L1", 15.5)
    assert (wb["Packing"]["B6"].value, wb["Packing"]["E6"].value) == ("L0", 13.3)
    wb["Findings"]["F5"] = 0.61
    wb["Packing"]["E6"] = 0.52
    book = tmp_path / "inches.xlsx"
    wb.save(book)
    r = read_workbook(book)
    said = {p.where: p.message for p in r.warnings}
    assert "less than a quarter" in said["Findings!F5"] and "in mm as" in said["Findings!F5"]
    assert "unusually small" in said["Packing!E6"]
    clean = read_workbook(SAMPLES_DIR / "tc0903_pony_1903_si.xlsx")
    assert not any(p.where in ("Findings!F5", "Packing!E6") for p in clean.warnings)


def test_si_values_with_the_units_left_at_us_are_explained_once_first(tmp_path: Path) -> None:
    """The SI sample with its units cell blank (read as US customary): every millimetre value
    is past its limit in inches, each with its own error; one error at the units cell, first
    in the list, says what they have in common and what to set."""
    from openpyxl import load_workbook

    wb = load_workbook(SAMPLES_DIR / "tc0903_pony_1903_si.xlsx")
    assert wb["Bridge"]["B4"].value == "SI"
    wb["Bridge"]["B4"] = None
    book = tmp_path / "units_blank.xlsx"
    wb.save(book)
    errors = read_workbook(book).errors
    assert len(errors) > 100
    first = errors[0]
    assert first.where == "Bridge!B4"
    assert "set 'Units of this workbook' to SI" in first.message
    assert sum("Units of this workbook" in p.message for p in errors) == 1
    assert not any(p.where == "Bridge!B4" for p in read_workbook(
        SAMPLES_DIR / "tc0903_pony_1903_si.xlsx").problems)
