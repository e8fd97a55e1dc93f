"""The workbook as a file: refused files, untrusted XML, read-only, sheet names, row limit."""

from __future__ import annotations

import io
import zipfile
from pathlib import Path
from typing import Any

import openpyxl.xml
import pytest
from inventory_helpers import cell, check, content_of, fresh, write

from rating.errors import InputError
from rating.inventory import book, read_workbook, tables
from rating.inventory import schema as sc
from rating.inventory.problems import Problem, WorkbookReading


def test_openpyxl_parses_with_defusedxml() -> None:
    assert openpyxl.xml.DEFUSEDXML is True


@pytest.mark.parametrize("name, data, needle", [
    ("old.xls", b"\xd0\xcf\x11\xe0", "old-format .xls"),
    ("text.xlsx", b"structure,name\n", "not an .xlsx workbook"),
    # an .xlsx renamed .xls: a zip container (an empty one here), named for what it is
    ("renamed.xls", b"PK\x05\x06" + bytes(18), "named .xls but holds an .xlsx workbook"),
])
def test_refused_files(tmp_path: Path, name: str, data: bytes, needle: str) -> None:
    path = tmp_path / name
    path.write_bytes(data)
    with pytest.raises(InputError, match=needle) as exc:
        read_workbook(path)
    assert exc.value.where == str(path)


def test_missing_file_and_folder(tmp_path: Path) -> None:
    with pytest.raises(InputError, match="does not exist"):
        read_workbook(tmp_path / "nothing.xlsx")
    with pytest.raises(InputError, match="folder"):
        read_workbook(tmp_path)


def test_zip_that_is_not_a_workbook(tmp_path: Path) -> None:
    path = tmp_path / "z.xlsx"
    with zipfile.ZipFile(path, "w") as z:
        z.writestr("hello.txt", "not a workbook")
    with pytest.raises(InputError, match="cannot be read"):
        read_workbook(path)


def _rewrite(src: Path, dst: Path, part: str, transform) -> None:
    with zipfile.ZipFile(src) as zin, zipfile.ZipFile(dst, "w") as zout:
        for item in zin.infolist():
            data = zin.read(item)
            zout.writestr(item, transform(data) if item.filename == part else data)


def test_entity_expansion_is_refused(tmp_path: Path) -> None:
    """A 'billion laughs' sheet is refused by defusedxml, not expanded."""
    src = write(tmp_path / "ok.xlsx", fresh())
    bomb = (b'<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol">'
            b'<!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;">]>')
    part = f"xl/worksheets/sheet{sc.SHEET_ORDER.index('Bridge') + 1}.xml"
    dst = tmp_path / "bomb.xlsx"
    _rewrite(src, dst, part, lambda data: bomb + data.split(b"?>", 1)[-1]
             if data.startswith(b"<?xml") else bomb + data)
    with pytest.raises(InputError, match="cannot be read"):
        read_workbook(dst)


def test_oversized_package_refused(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    path = write(tmp_path / "w.xlsx", fresh())
    monkeypatch.setattr(book, "MAX_UNCOMPRESSED_BYTES", 10_000)
    with pytest.raises(InputError, match="implausibly large"):
        read_workbook(path)


def test_formula_with_saved_result_is_used(tmp_path: Path) -> None:
    """A formula whose result the spreadsheet program saved is read as that result."""
    src = write(tmp_path / "w.xlsx", fresh())
    ref = cell("Eyebars", 0, "width").split("!")[1]
    part = f"xl/worksheets/sheet{sc.SHEET_ORDER.index('Eyebars') + 1}.xml"

    def add_formula(data: bytes) -> bytes:
        text = data.decode()
        old = f'<c r="{ref}" s="'
        i = text.index(old)
        j = text.index("<v>", i)
        return (text[:j] + "<f>7/2</f>" + text[j:]).encode()
    dst = tmp_path / "f.xlsx"
    _rewrite(src, dst, part, add_formula)
    r = read_workbook(dst)
    assert r.errors == ()
    assert r.bridge is not None
    assert r.bridge.design_of("L0L1").section.width_in == 3.5  # type: ignore[union-attr]


def test_sheet_names_found_without_case_or_spaces(tmp_path: Path) -> None:
    def edit(wb) -> None:
        wb["DeadLoads"].title = "dead loads"
        wb["Findings"].title = "tmp"  # openpyxl refuses a case-only rename in one step
        wb["tmp"].title = "FINDINGS"
        wb.create_sheet("My notes")["A1"] = "anything"
    d = fresh()
    d["tables"]["Findings"][0]["station"] = 99.0
    r = check(tmp_path, d, edit)
    assert any(p.where.startswith("FINDINGS!E") and "beyond the end" in p.message
               for p in r.errors)
    assert not any("missing" in p.message for p in r.problems)
    assert r.bridge is None and len(r.errors) == 1


def test_too_many_rows(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr(sc, "MAX_ROWS", 20)
    monkeypatch.setattr(tables, "MAX_ROWS", 20)
    d = fresh()
    d["tables"]["Findings"] = [{"member": "L1L2", "loss": float(k % 20)} for k in range(30)]
    r = check(tmp_path, d)
    # (the rows read: MAX_ROWS data rows and the header's search rows)
    last = sc.MAX_ROWS + sc.HEADER_SEARCH_ROWS
    assert any(p.where == f"Findings!A{last + 1}" and "past the 20 data rows a sheet may hold"
               in p.message for p in r.errors)


def test_an_entry_far_below_the_rows_read_is_refused_not_dropped(tmp_path: Path) -> None:
    """A finding typed far down the sheet, below the rows read, with blank rows between: the
    workbook is refused at its cell (it was dropped without a word, and the bridge rated
    without that loss: a prober's finding)."""
    def edit(wb: Any) -> None:
        ws = wb["Findings"]
        ws["B6000"], ws["C6000"], ws["G6000"] = "L1L2", "bar 1", 60
    r = check(tmp_path, fresh(), edit)
    assert r.bridge is None
    assert any(p.where == "Findings!A6000" and "from row 6000 down" in p.message
               for p in r.errors)


def test_never_modified(tmp_path: Path) -> None:
    path = write(tmp_path / "w.xlsx", content_of(fresh()))
    path.chmod(0o444)  # read-only on disk: reading must still work
    before = path.read_bytes()
    r = read_workbook(path)
    assert r.bridge is not None
    assert path.read_bytes() == before


def test_problem_format_is_one_line() -> None:
    text = "Bar thickness of section EB-3 must be greater than 0 in"
    p = Problem("error", "Eyebars!D7", text)
    assert p.format() == f"error   Eyebars!D7: {text}"
    r = WorkbookReading(None, (p, Problem("warning", "Bridge!B9", "x")))
    assert r.errors == (p,) and len(r.warnings) == 1


def test_in_memory_bytes_not_accepted_as_path() -> None:
    with pytest.raises((InputError, TypeError)):
        read_workbook(io.BytesIO(b""))  # type: ignore[arg-type]


def test_unreadable_number_is_listed_at_its_cell(tmp_path: Path) -> None:
    """A number cell holding non-numeric text (only a foreign or damaged writer does that)
    makes the sheet unreadable; the reader says which cell, and carries on elsewhere."""
    src = write(tmp_path / "w.xlsx", fresh())
    where = cell("Eyebars", 0, "width")
    ref = where.split("!")[1]
    part = f"xl/worksheets/sheet{sc.SHEET_ORDER.index('Eyebars') + 1}.xml"

    def spoil(data: bytes) -> bytes:
        text = data.decode()
        i = text.index(f'<c r="{ref}" s="')
        j = text.index("<v>", i)
        k = text.index("</v>", j)
        return (text[:j] + "<v>inf" + text[k:]).encode()
    dst = tmp_path / "bad.xlsx"
    _rewrite(src, dst, part, spoil)
    r = read_workbook(dst)
    assert any(p.where == where and "holds 'inf', which is not a number" in p.message
               for p in r.errors)
    assert r.bridge is None


@pytest.mark.parametrize("lock", ["~$w.xlsx", ".~lock.w.xlsx#"])
def test_a_workbook_open_in_a_spreadsheet_program_is_noticed(tmp_path, lock: str) -> None:
    """A lock file beside the workbook means it is open elsewhere: the rating reads the file
    as last saved, and a warning says so (unsaved edits are not in it)."""
    from inventory_helpers import fresh, write

    from rating.inventory import read_workbook

    book = write(tmp_path / "w.xlsx", fresh())
    assert not any("lock file" in p.message for p in read_workbook(book).problems)
    (tmp_path / lock).write_bytes(b"owner")
    said = [p for p in read_workbook(book).warnings if "lock file" in p.message]
    assert len(said) == 1 and said[0].where == "w.xlsx" and lock in said[0].message


def test_an_optional_item_whose_row_is_gone_is_named_at_the_sheets_first_cell(
        tmp_path: Path) -> None:
    """The ADTT row deleted from the Bridge sheet: its warning is placed at Bridge!A1, as a
    missing required item is, never at a row 0 that no sheet has (a prober's finding)."""
    def edit(wb: Any) -> None:
        ws = wb["Bridge"]
        row = next(c.row for c in ws["A"] if isinstance(c.value, str)
                   and c.value.startswith("ADTT"))
        ws.delete_rows(row)
    r = check(tmp_path, fresh(), edit)
    said = [p for p in r.warnings if "ADTT is not given" in p.message]
    assert [p.where for p in said] == ["Bridge!A1"]
    assert not any(p.where.endswith("!A0") for p in r.problems)


def test_a_lone_space_far_below_the_rows_read_is_no_entry(tmp_path: Path) -> None:
    def edit(wb: Any) -> None:
        wb["Findings"]["A6000"] = " "
    r = check(tmp_path, fresh(), edit)
    assert r.bridge is not None and not r.errors
