"""The blank template: sheets, headers with units, dropdowns, marked examples, no overwrite."""

from __future__ import annotations

from pathlib import Path

import openpyxl
import pytest
from openpyxl.utils import get_column_letter
from openpyxl.worksheet.cell_range import MultiCellRange

from rating.cli import main
from rating.errors import InputError
from rating.inventory import read_workbook, write_template
from rating.inventory import schema as sc
from rating.inventory.schema import Kind


@pytest.fixture(scope="module")
def template(tmp_path_factory: pytest.TempPathFactory) -> Path:
    path = tmp_path_factory.mktemp("tpl") / "blank.xlsx"
    write_template(path)
    return path


@pytest.fixture(scope="module")
def book(template: Path) -> openpyxl.Workbook:
    return openpyxl.load_workbook(template)


def test_sheets_in_order(book) -> None:
    assert tuple(book.sheetnames) == sc.SHEET_ORDER
    text = " ".join(str(c.value) for row in book[sc.INSTRUCTIONS_SHEET].iter_rows()
                    for c in row if c.value)
    assert "example" in text and "SI" in text and "pintruss check" in text


@pytest.mark.parametrize("spec", sc.TABLES, ids=lambda s: s.name)
def test_table_headers_carry_units(book, spec) -> None:
    ws = book[spec.name]
    assert ws.cell(sc.HEADER_ROW, 1).value == sc.MARK_HEADER
    for i, col in enumerate(spec.columns, start=2):
        h = ws.cell(sc.HEADER_ROW, i).value
        assert h == col.header
        if col.unit:
            assert f"[{col.unit}" in h
            if col.si_unit and col.si_unit != col.unit:
                assert h.endswith(f"| {col.si_unit}]")


def _validated(ws) -> dict[str, str]:
    """Cell range text -> list formula of every list validation on the sheet."""
    out = {}
    for dv in ws.data_validations.dataValidation:
        if dv.type == "list":
            for rng in MultiCellRange(str(dv.sqref)).ranges:
                out[rng.coord] = dv.formula1
    return out


@pytest.mark.parametrize("spec", sc.TABLES, ids=lambda s: s.name)
def test_every_closed_list_has_a_dropdown_on_tables(book, spec) -> None:
    dv = _validated(book[spec.name])
    last = sc.FIRST_DATA_ROW + spec.data_rows - 1
    for i, col in enumerate(spec.columns, start=2):
        letter = get_column_letter(i)
        rng = f"{letter}{sc.FIRST_DATA_ROW}:{letter}{last}"
        if col.kind in (Kind.CHOICE, Kind.YESNO):
            options = col.choices if col.kind is Kind.CHOICE else sc.YES_NO
            assert dv.get(rng) == '"' + ",".join(options) + '"', (spec.name, col.key)


@pytest.mark.parametrize("spec", sc.FORMS, ids=lambda s: s.name)
def test_every_closed_list_has_a_dropdown_on_forms(book, spec) -> None:
    ws = book[spec.name]
    dv = _validated(ws)
    for k, col in enumerate(spec.fields):
        r = sc.FIRST_DATA_ROW + k
        assert ws.cell(r, 1).value == col.header
        if col.kind in (Kind.CHOICE, Kind.YESNO):
            assert f"B{r}" in dv, (spec.name, col.key)


@pytest.mark.parametrize("spec", [s for s in sc.TABLES if s.examples], ids=lambda s: s.name)
def test_example_rows_are_marked_and_styled(book, spec) -> None:
    ws = book[spec.name]
    for k in range(len(spec.examples)):
        a = ws.cell(sc.FIRST_DATA_ROW + k, 1)
        assert a.value == sc.EXAMPLE_MARK
        assert a.font.i  # grey italic
    assert ws.cell(sc.FIRST_DATA_ROW + len(spec.examples), 1).value is None


def test_input_cells_are_tinted(book) -> None:
    ws = book["Members"]
    assert ws.column_dimensions["B"].fill.fgColor.rgb.endswith("FFF8DC")
    assert book["Bridge"].cell(sc.FIRST_DATA_ROW, 2).fill.fgColor.rgb.endswith("FFF8DC")
    assert ws.cell(sc.HEADER_ROW, 2).comment is not None  # help on hover


def test_blank_template_reads_with_only_missing_items(template: Path) -> None:
    """Examples are ignored: the only errors of a blank template are the empty required
    items and the missing truss description, never a value from an example row."""
    r = read_workbook(template)
    assert r.bridge is None
    for p in r.errors:
        assert p.where.startswith(("Bridge!", "Members!")), p.format()
    assert any("Structure id is required" in p.message for p in r.errors)


def test_refuses_to_overwrite(tmp_path: Path) -> None:
    path = tmp_path / "t.xlsx"
    path.write_bytes(b"precious")
    with pytest.raises(InputError, match="already exists") as exc:
        write_template(path)
    assert exc.value.where == str(path)
    assert path.read_bytes() == b"precious"
    write_template(path, force=True)
    assert path.read_bytes()[:2] == b"PK"


def test_refuses_bad_names(tmp_path: Path) -> None:
    with pytest.raises(InputError, match="must end in .xlsx"):
        write_template(tmp_path / "t.csv")
    with pytest.raises(InputError, match="does not exist"):
        write_template(tmp_path / "no" / "such" / "t.xlsx")


def test_a_folder_it_may_not_write_to_is_a_message(tmp_path: Path,
                                                  monkeypatch: pytest.MonkeyPatch) -> None:
    # (the tests may run as root, which every folder lets write: the refusal is simulated)
    import tempfile

    def refused(*args: object, **kwargs: object) -> tuple[int, str]:
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr(tempfile, "mkstemp", refused)
    with pytest.raises(InputError, match="cannot be written in .*Permission denied") as exc:
        write_template(tmp_path / "t.xlsx")
    assert exc.value.where == str(tmp_path / "t.xlsx")


def test_a_full_disk_is_a_message_and_leaves_nothing(tmp_path: Path,
                                                     monkeypatch: pytest.MonkeyPatch) -> None:
    def full(self: openpyxl.Workbook, filename: str) -> None:
        Path(filename).write_bytes(b"PK half")
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(openpyxl.Workbook, "save", full)
    path = tmp_path / "t.xlsx"
    with pytest.raises(InputError, match="cannot be written: No space left on device"):
        write_template(path)
    assert list(tmp_path.iterdir()) == []  # neither the workbook nor the temporary file


def test_cli_template_and_force(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    path = tmp_path / "new.xlsx"
    assert main(["template", str(path)]) == 0
    assert path.is_file()
    before = path.read_bytes()
    assert main(["template", str(path)]) == 2  # a usage error, as in rate and batch
    err = capsys.readouterr().err
    assert "already exists" in err and "--force" in err
    assert path.read_bytes() == before
    assert main(["template", str(path), "--force"]) == 0
    assert not list(tmp_path.glob(".pintruss-*"))  # no temporary file left behind


def test_cli_check_blank_template_fails(template: Path, capsys) -> None:
    assert main(["check", str(template)]) == 1
    out = capsys.readouterr().out
    assert "Bridge!B5" in out and "error(s)" in out


def test_cli_template_into_a_folder_is_named_as_a_folder(tmp_path: Path,
                                                         capsys: pytest.CaptureFixture[str]
                                                         ) -> None:
    folder = tmp_path / "is-a-folder.xlsx"
    folder.mkdir()
    for extra in ([], ["--force"]):
        assert main(["template", str(folder), *extra]) == 2
        err = capsys.readouterr().err
        assert "this is a folder, not a workbook file" in err and "--force" not in err
    assert folder.is_dir() and not list(folder.iterdir())
