"""The fast reader (rating.inventory.xlsx) against the reference reader (openpyxl).

Every workbook here is read both ways by rating.inventory.book and the grids must be equal
cell by cell, value types included (or both readers must refuse the file with the same
message). Where the fast reader leaves a workbook to the reference reader, the test says so,
so the fallback is exercised on purpose: chart sheets, damaged parts, unusual XML.
"""

from __future__ import annotations

import datetime as dt
import zipfile
from pathlib import Path
from unittest import mock
from xml.sax.saxutils import escape

import openpyxl
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from inventory_helpers import SAMPLES_DIR, fresh, write
from xlsx_parts import (
    DATE_STYLE,
    DURATION_STYLE,
    EXCEL_ROOT,
    MAIN,
    PKG_REL,
    compare,
    package,
    sheet_xml,
    strings_xml,
    styles_xml,
)

from rating.inventory import book, reader, xlsx
from rating.inventory.reader import read_workbook, rows_read, sheets_read
from rating.inventory.template import write_template

# what openpyxl (the reference reader) says about the odd workbooks written here
pytestmark = [
    pytest.mark.filterwarnings("ignore:Cell .* is marked as a date:UserWarning"),
    pytest.mark.filterwarnings("ignore:Unknown extension is not supported:UserWarning"),
    pytest.mark.filterwarnings("ignore:.* contains invalid dependency definitions:UserWarning"),
]
SAMPLES = sorted(SAMPLES_DIR.glob("*.xlsx"))
WANTED = {"Data": 6}
ROWS = 20


def _write(tmp_path: Path, data: bytes, name: str = "w.xlsx") -> Path:
    path = tmp_path / name
    path.write_bytes(data)
    return path


def _one_sheet(tmp_path: Path, rows: str, **kw) -> Path:
    strings = strings_xml(["zero", "one", "two x005F_x", "a&b <c>"])
    sheet = sheet_xml(rows, **{k: v for k, v in kw.items() if k in ("root", "head", "tail")})
    rest = {k: v for k, v in kw.items() if k not in ("root", "head", "tail")}
    rest.setdefault("strings", strings)
    return _write(tmp_path, package([("Notes", sheet_xml("")), ("Data", sheet)], **rest))


# --- the bundled samples and the template --------------------------------------------------


@pytest.mark.parametrize("path", SAMPLES, ids=[p.name for p in SAMPLES])
def test_samples_read_the_same_both_ways_by_the_fast_reader(path: Path) -> None:
    assert compare(path, sheets_read(), rows_read())


def test_template_and_filled_workbook_read_the_same_both_ways(tmp_path: Path) -> None:
    blank = tmp_path / "blank.xlsx"
    write_template(blank)
    assert compare(blank, sheets_read(), rows_read())
    assert compare(write(tmp_path / "filled.xlsx", fresh()), sheets_read(), rows_read())


# --- one cell in many forms ----------------------------------------------------------------

D, T = DATE_STYLE, DURATION_STYLE
CELLS = [
    # numbers as openpyxl reads them (int unless a point or an exponent)
    ("int", '<c r="B2"><v>12</v></c>', True),
    ("float", '<c r="B2" t="n"><v>1.5</v></c>', True),
    ("exponent", '<c r="B2"><v>1E3</v></c>', True),
    ("spaces", '<c r="B2"><v> 7 </v></c>', True),
    ("underscore", '<c r="B2"><v>1_000</v></c>', True),
    ("overflow", '<c r="B2"><v>1e400</v></c>', True),
    ("negative zero", '<c r="B2"><v>-0.0</v></c>', True),
    ("empty value", '<c r="B2"><v></v></c>', True),
    ("empty value element", '<c r="B2" s="1"><v/></c>', True),
    ("no value", '<c r="B2" s="3" t="n"/>', True),
    ("not a number", '<c r="B2"><v>inf</v></c>', False),
    ("hex", '<c r="B2"><v>0x10</v></c>', False),
    # shared strings, booleans, errors, strings, ISO dates, unknown types
    ("shared", '<c r="B2" t="s"><v>1</v></c>', True),
    ("shared x005F_", '<c r="B2" t="s"><v>2</v></c>', True),
    ("shared escaped", '<c r="B2" t="s"><v>3</v></c>', True),
    ("shared from the end", '<c r="B2" t="s"><v>-1</v></c>', True),
    ("shared missing", '<c r="B2" t="s"><v>9</v></c>', False),
    ("true", '<c r="B2" t="b"><v>1</v></c>', True),
    ("false", '<c r="B2" t="b"><v>0</v></c>', True),
    ("boolean as word", '<c r="B2" t="b"><v>true</v></c>', False),
    ("error", '<c r="B2" t="e"><v>#N/A</v></c>', True),
    ("formula string", '<c r="B2" t="str"><v>a &amp; b</v></c>', True),
    ("iso date", '<c r="B2" t="d"><v>2024-05-14</v></c>', True),
    ("iso datetime", '<c r="B2" t="d"><v>2024-05-14T10:30:00</v></c>', True),
    ("iso time", '<c r="B2" t="d"><v>10:30:00</v></c>', True),
    ("iso nonsense", '<c r="B2" t="d"><v>May 14</v></c>', False),
    ("empty type", '<c r="B2" t=""><v>12</v></c>', True),
    ("unknown type", '<c r="B2" t="x"><v>12</v></c>', True),
    # inline strings
    ("inline", '<c r="B2" t="inlineStr"><is><t>L0L1</t></is></c>', True),
    ("inline preserved", '<c r="B2" t="inlineStr"><is><t xml:space="preserve"> a </t></is></c>',
     True),
    ("inline empty", '<c r="B2" t="inlineStr"><is/></c>', True),
    ("inline empty text", '<c r="B2" t="inlineStr"><is><t/></is></c>', True),
    ("inline without is", '<c r="B2" t="inlineStr"><v>12</v></c>', True),
    ("is without inline type", '<c r="B2"><is><t>x</t></is></c>', True),
    ("inline runs", '<c r="B2" t="inlineStr"><is><r><t>a</t></r></is></c>', False),
    ("inline attribute", '<c r="B2" t="inlineStr"><is x="1"><t>a</t></is></c>', False),
    # numbers under a date, time or duration format (openpyxl's from_excel)
    ("date", f'<c r="B2" s="{D}"><v>45413</v></c>', True),
    ("datetime", '<c r="B2" s="2"><v>45413.4375</v></c>', True),
    ("custom date", '<c r="B2" s="3"><v>45413</v></c>', True),
    ("time", '<c r="B2" s="4"><v>0.4375</v></c>', True),
    ("duration", f'<c r="B2" s="{T}"><v>1.25</v></c>', True),
    ("literal in quotes", '<c r="B2" s="7"><v>1.25</v></c>', True),
    ("minutes seconds", '<c r="B2" s="8"><v>0.01</v></c>', True),
    ("built-in duration", '<c r="B2" s="9"><v>2.5</v></c>', True),
    ("text format", '<c r="B2" s="10"><v>2.5</v></c>', True),
    ("date zero", f'<c r="B2" s="{D}"><v>0</v></c>', True),
    ("date before March 1900", f'<c r="B2" s="{D}"><v>59</v></c>', True),
    ("date 29 February 1900", f'<c r="B2" s="{D}"><v>60</v></c>', True),
    ("date negative", f'<c r="B2" s="{D}"><v>-1</v></c>', True),
    ("date too large", f'<c r="B2" s="{D}"><v>3000000</v></c>', True),
    ("date on a string", f'<c r="B2" s="{D}" t="s"><v>0</v></c>', True),
    ("style empty", '<c r="B2" s=""><v>45413</v></c>', True),
    ("style beyond the list", '<c r="B2" s="99"><v>45413</v></c>', True),
    ("style not a number", '<c r="B2" s="x"><v>1</v></c>', False),
    # formulas with and without a saved result
    ("formula with result", '<c r="B2"><f>1+1</f><v>2</v></c>', True),
    ("formula without result", '<c r="B2"><f>SUM(A1:A3)</f><v></v></c>', True),
    ("formula, no value element", '<c r="B2"><f>A1&amp;"x"</f></c>', True),
    ("shared formula", '<c r="B2"><f t="shared" si="0"/></c>', True),
    ("blank formula", '<c r="B2"><f>  </f><v/></c>', True),
    ("formula beyond the columns", '<c r="H2"><f>1</f></c>', True),
    ("string formula", '<c r="B2" t="str"><f>A1</f><v>text</v></c>', True),
    # attributes, quoting, white space, references
    ("attribute order", '<c s="1" t="n" r="B2"><v>45413</v></c>', True),
    ("single quotes", "<c r='B2' t='s'><v>0</v></c>", True),
    ("spaced", '<c  r = "B2"  >\n  <v>5</v>\n</c>', True),
    ("other attribute", '<c r="B2" cm="1"><v>5</v></c>', True),
    ("prefixed attribute", '<c r="B2" x14ac:a="1"><v>5</v></c>', True),
    ("undeclared prefix", '<c r="B2" x:a="1"><v>5</v></c>', False),
    ("attribute twice", '<c r="B2" s="1" s="2"><v>5</v></c>', False),
    ("references", '<c r="B2" t="str"><v>&lt;&gt;&amp;&quot;&apos;&#65;&#x42;&#x1F309;</v></c>',
     True),
    ("line ends", '<c r="B2" t="str"><v>a\r\nb\rc&#13;&#10;d</v></c>', True),
    ("bad reference", '<c r="B2" t="str"><v>&#1;</v></c>', False),
    ("undeclared entity", '<c r="B2" t="str"><v>&nbsp;</v></c>', False),
    ("bare ampersand", '<c r="B2" t="str"><v>a & b</v></c>', False),
    ("control character", '<c r="B2" t="str"><v>a\x01b</v></c>', False),
    ("non-ascii", '<c r="B2" t="inlineStr"><is><t>橋 ∞ ü</t></is></c>', True),
    ("CDATA", '<c r="B2" t="str"><v><![CDATA[x]]></v></c>', False),
    ("comment", '<c r="B2"><!-- x --><v>1</v></c>', False),
    ("cell of another row", '<c r="B3"><v>1</v></c>', False),
    ("lower case reference", '<c r="b2"><v>1</v></c>', False),
    ("absolute reference", '<c r="$B$2"><v>1</v></c>', False),
    ("no reference", '<c><v>1</v></c>', False),
    ("value with attribute", '<c r="B2"><v a="1">1</v></c>', False),
    ("cell with extension", '<c r="B2"><v>1</v><extLst/></c>', False),
    ("unknown element", '<c r="B2"><x/><v>1</v></c>', False),
    # long runs that a pattern able to split them in many ways would take forever over
    ("white space, then something else", '<c r="B2">' + " " * 20000 + "<x/></c>", False),
    ("long unreadable number", '<c r="B2"><f>1</f><v>' + "1" * 20000 + "x</v></c>", False),
]


@pytest.mark.parametrize("cell, fast", [c[1:] for c in CELLS], ids=[c[0] for c in CELLS])
def test_one_cell_reads_the_same_both_ways(tmp_path: Path, cell: str, fast: bool) -> None:
    rows = f'<row r="1"><c r="A1" t="s"><v>0</v></c></row><row r="2">{cell}</row>'
    assert compare(_one_sheet(tmp_path, rows, root=EXCEL_ROOT), WANTED, ROWS) is fast


def test_style_zero_with_a_date_format(tmp_path: Path) -> None:
    """A cell without s has style 0 (openpyxl's default), a date here."""
    styles = styles_xml({}, (14, 0))
    rows = '<row r="2"><c r="B2"><v>45413</v></c><c r="C2" s="1"><v>45413</v></c></row>'
    assert compare(_one_sheet(tmp_path, rows, styles=styles), WANTED, ROWS)


def test_dates_of_the_1904_system(tmp_path: Path) -> None:
    rows = (f'<row r="2"><c r="B2" s="{D}"><v>40000</v></c><c r="C2" s="2"><v>0.5</v></c>'
            f'<c r="D2" s="{T}"><v>3.5</v></c></row>')
    path = _one_sheet(tmp_path, rows, date1904=True)
    assert compare(path, WANTED, ROWS)


# --- rows --------------------------------------------------------------------------------

ROW_FORMS = [
    ("gaps", '<row r="2"><c r="B2"><v>1</v></c></row><row r="9"><c r="A9"><v>2</v></c></row>',
     True),
    ("empty rows", '<row r="1"/><row r="2" spans="1:3"></row><row r="5"><c r="A5"/></row>', True),
    ("excel row attributes",
     '<row r="3" spans="1:2" x14ac:dyDescent="0.25"><c r="A3" s="1"><v>45000</v></c></row>', True),
    ("trailing blank rows", '<row r="2"><c r="A2"><v>1</v></c></row><row r="7"><c r="A7" s="1"/>'
     '<c r="B7" t="inlineStr"><is><t></t></is></c></row>', True),
    ("text beyond the columns", '<row r="2"><c r="A2"><v>1</v></c><c r="Z2" t="str">'
     "<v>x</v></c></row>", True),
    ("cell twice", '<row r="2"><c r="B2"><v>1</v></c><c r="B2"><v>2</v></c></row>', True),
    ("cells out of order", '<row r="2"><c r="C2"><v>1</v></c><c r="A2"><v>2</v></c></row>', True),
    ("last row read", f'<row r="{ROWS}"><c r="A{ROWS}"><v>1</v></c></row>', True),
    ("one row too many", f'<row r="{ROWS + 1}"><c r="A{ROWS + 1}"><v>1</v></c></row>', True),
    ("one row too many, blank", f'<row r="{ROWS + 1}"><c r="A{ROWS + 1}"/></row>', True),
    ("far beyond", f'<row r="2"><c r="A2"><v>1</v></c></row><row r="{ROWS + 9}">'
     f'<c r="A{ROWS + 9}"><v>1</v></c></row>', True),
    ("formula in the last row", f'<row r="{ROWS}"><c r="B{ROWS}"><f>1</f></c></row>', True),
    ("formula beyond the rows", f'<row r="{ROWS + 1}"><c r="B{ROWS + 1}"><f>1</f></c></row>',
     True),
    ("rows out of order", '<row r="5"/><row r="3"><c r="A3"><v>1</v></c></row>', False),
    ("row twice", '<row r="3"><c r="A3"><v>1</v></c></row><row r="3"><c r="B3"><v>2</v></c>'
     "</row>", False),
    ("row zero", '<row r="0"/><row r="2"><c r="A2"><v>1</v></c></row>', False),
    ("row as a float", '<row r="2.0"><c r="A2"><v>1</v></c></row>', False),
    ("row without r", '<row><c r="A1"><v>1</v></c></row>', False),
    ("row r twice", '<row r="2" r="3"><c r="A2"><v>1</v></c></row>', False),
    ("undeclared row prefix", '<row r="2" x:y="1"><c r="A2"><v>1</v></c></row>', False),
    ("row inside a row", '<row r="2"><row r="3"/></row>', False),
    ("text between cells", '<row r="2">x<c r="A2"><v>1</v></c></row>', False),
    ("pretty printed", '\n  <row r="2">\n    <c r="A2" t="s">\n      <v>1</v>\n    </c>\n'
     "  </row>\n", True),
]


@pytest.mark.parametrize("rows, fast", [c[1:] for c in ROW_FORMS], ids=[c[0] for c in ROW_FORMS])
def test_rows_read_the_same_both_ways(tmp_path: Path, rows: str, fast: bool) -> None:
    assert compare(_one_sheet(tmp_path, rows, root=EXCEL_ROOT), WANTED, ROWS) is fast


# --- the sheet around the rows -------------------------------------------------------------

CELL_ROW = '<row r="2"><c r="B2"><v>4</v></c></row>'
MERGES = '<mergeCells count="2"><mergeCell ref="B2:C3"/><mergeCell ref="A5:A9"/></mergeCells>'
SHEET_FORMS = [
    ("merged cells", dict(tail=MERGES), True),
    ("merged cells before the rows", dict(head=MERGES), True),
    ("bad merged range", dict(tail='<mergeCells><mergeCell ref="B2:"/></mergeCells>'), False),
    ("merged range without ref", dict(tail="<mergeCells><mergeCell/></mergeCells>"), False),
    ("dimension", dict(head='<dimension ref="A1:C9"/>'), True),
    ("bad dimension", dict(head='<dimension ref="A1:"/>'), False),
    ("excel extensions", dict(root=EXCEL_ROOT, tail=(
        '<extLst><ext uri="{x}" xmlns:x14="http://schemas.microsoft.com/office/spreadsheetml/'
        '2009/9/main"><x14:dataValidations count="0"/></ext></extLst>')), True),
    ("main namespace with a prefix", dict(root=f'xmlns:x="{MAIN}" xmlns="{MAIN}"'), True),
    ("another default namespace", dict(root='xmlns="urn:other"'), False),
    ("namespace declared inside",
     dict(head=f'<sheetPr xmlns="{MAIN}"/>'), False),
    ("comment", dict(head="<!-- a note -->"), False),
    ("unbound prefix", dict(tail="<x:y/>"), False),
    ("not well-formed", dict(tail="<pageMargins>"), False),
]


@pytest.mark.parametrize("form, fast", [c[1:] for c in SHEET_FORMS],
                         ids=[c[0] for c in SHEET_FORMS])
def test_sheets_read_the_same_both_ways(tmp_path: Path, form: dict, fast: bool) -> None:
    assert compare(_one_sheet(tmp_path, CELL_ROW, **form), WANTED, ROWS) is fast


def test_prefixed_main_namespace_is_left_to_the_reference(tmp_path: Path) -> None:
    xml = (f'<?xml version="1.0"?><x:worksheet xmlns:x="{MAIN}"><x:sheetData><x:row r="2">'
           '<x:c r="B2"><x:v>4</x:v></x:c></x:row></x:sheetData></x:worksheet>')
    path = _write(tmp_path, package([("Data", xml)]))
    assert compare(path, WANTED, ROWS) is False


def test_other_encodings_and_byte_order_mark(tmp_path: Path) -> None:
    latin = sheet_xml('<row r="2"><c r="B2" t="str"><v>\u00e9</v></c></row>').replace(
        "UTF-8", "ISO-8859-1").encode("latin-1")
    assert compare(_write(tmp_path, package([("Data", latin)])), WANTED, ROWS) is False
    bom = b"\xef\xbb\xbf" + sheet_xml(CELL_ROW).encode()
    assert compare(_write(tmp_path, package([("Data", bom)]), "b.xlsx"), WANTED, ROWS)


def test_entities_are_refused_before_any_expansion(tmp_path: Path) -> None:
    """A 'billion laughs' sheet: the fast reader refuses any DTD; defusedxml (reference)
    refuses the entities, so the workbook cannot be read, as before."""
    bomb = ('<?xml version="1.0"?><!DOCTYPE w [<!ENTITY a "aaaaaaaaaa">'
            '<!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;">]>')
    xml = bomb + sheet_xml('<row r="2"><c r="B2" t="str"><v>&b;</v></c></row>').split("?>", 1)[1]
    assert compare(_write(tmp_path, package([("Data", xml)])), WANTED, ROWS) is False
    with pytest.raises(xlsx.Unsupported, match="document type"):
        xlsx._parser().Parse(xml.encode(), True)
    external = '<?xml version="1.0"?><!DOCTYPE w SYSTEM "http://example.invalid/x.dtd"><w/>'
    with pytest.raises(xlsx.Unsupported, match="document type"):
        xlsx._parser().Parse(external.encode(), True)


# --- the package ---------------------------------------------------------------------------


def test_shared_strings_in_every_form(tmp_path: Path) -> None:
    rich = (f'<sst xmlns="{MAIN}"><si><t>plain</t></si><si><r><t>run </t></r><r><t xml:space='
            '"preserve">two</t></r></si><si/><si><t/></si><si><r><t/></r></si></sst>')
    rows = "".join(f'<row r="{k}"><c r="B{k}" t="s"><v>{k - 1}</v></c></row>' for k in range(1, 6))
    assert compare(_one_sheet(tmp_path, rows, strings=rich), WANTED, ROWS)
    formatted = rich.replace("<r><t>run", '<r><rPr><b/><sz val="11"/></rPr><t>run')
    assert compare(_one_sheet(tmp_path, rows, strings=formatted), WANTED, ROWS)
    phonetic = rich.replace("<t>plain</t>", "<t>plain</t><rPh sb=\"0\" eb=\"1\"><t>p</t></rPh>")
    assert compare(_one_sheet(tmp_path, rows, strings=phonetic), WANTED, ROWS)
    bad = rich.replace("<si/>", "<si>")
    assert compare(_one_sheet(tmp_path, rows, strings=bad), WANTED, ROWS) is False
    other = rich.replace("</sst>", " " * 20000 + "<extLst/></sst>")  # read by openpyxl's reader
    assert compare(_one_sheet(tmp_path, rows, strings=other), WANTED, ROWS)


def test_number_formats_of_every_kind(tmp_path: Path) -> None:
    formats = {164: "d/m/yyyy", 165: "[$-409]h:mm AM/PM", 166: "[mm]:ss", 167: '"d"0',
               168: "yyyy-mm-dd;@", 169: "0.00_);[Red](0.00)", 170: "[Red][h]:mm"}
    styles = styles_xml(formats, (0, *formats))
    rows = "".join(f'<row r="{k}"><c r="B{k}" s="{k - 1}"><v>45413.25</v></c></row>'
                   for k in range(1, len(formats) + 2))
    assert compare(_one_sheet(tmp_path, rows, styles=styles), WANTED, ROWS)


STYLESHEETS = {
    "formats of every kind": styles_xml(
        {164: "d/m/yyyy", 165: "[$-409]h:mm AM/PM", 166: "[mm]:ss", 167: '"d"0', 168: "@"},
        (0, 14, 164, 165, 166, 167, 168, 22, 45, 46, 47, 999)),
    "a format given twice": styles_xml({164: "0.00", 165: "yyyy"}).replace(
        'numFmtId="165"', 'numFmtId="164"'),
    "a format without code": styles_xml({164: "yyyy"}, (0, 164)).replace(
        ' formatCode="yyyy"', ""),
    "a style without format": styles_xml().replace('<xf numFmtId="14" ', "<xf "),
    "no cell styles": styles_xml().replace("<cellXfs", "<cellXfsX").replace(
        "</cellXfs>", "</cellXfsX>"),
    "empty cell styles": styles_xml({}, ()),
}


@pytest.mark.parametrize("styles", STYLESHEETS.values(), ids=STYLESHEETS.keys())
def test_date_styles_as_openpyxl_derives_them(styles: str) -> None:
    from openpyxl.styles.stylesheet import Stylesheet
    from openpyxl.xml.functions import fromstring

    try:
        sheet = Stylesheet.from_tree(fromstring(styles.encode()))
    except TypeError:  # refused by openpyxl: refused here too (the reference decides)
        with pytest.raises(KeyError):
            xlsx._date_styles(styles.encode())
        return
    expected = ((sheet.date_formats, sheet.timedelta_formats) if sheet.cell_styles
                else (set(), set()))
    assert xlsx._date_styles(styles.encode())[:2] == expected


def test_samples_date_styles_as_openpyxl_derives_them() -> None:
    from openpyxl.styles.stylesheet import Stylesheet
    from openpyxl.xml.functions import fromstring

    for path in SAMPLES:
        with zipfile.ZipFile(path) as z:
            data = z.read("xl/styles.xml")
        sheet = Stylesheet.from_tree(fromstring(data))
        assert xlsx._date_styles(data)[:2] == (sheet.date_formats, sheet.timedelta_formats)


@pytest.mark.parametrize("code,percent", [
    ("0%", True), ("0.00%", True), ('0.0"%"', False), ("0\\%", False), ("General", False),
    ("0.00", False), ("yyyy-mm-dd", False), (None, False), ('[Red]0.0%;"-"', True)])
def test_percent_formats(code: str | None, percent: bool) -> None:
    """A number format shows a percent where a % stands outside quoted text and escapes
    (ECMA-376 Part 1, 18.8.31 numFmt, the format codes)."""
    assert xlsx.is_percent_format(code) is percent


def test_a_percent_typed_with_its_sign_reads_as_shown_both_ways(tmp_path: Path) -> None:
    """A cell typed "45%" in a spreadsheet holds 0.45 with a percent format: both readers
    mark it (xlsx.PercentNumber), and a percent column reads 45, what the cell shows (a
    reviewer saw 100% read as 1 %)."""
    import openpyxl

    from rating.inventory.book import open_book, open_book_reference
    from rating.inventory.cells import parse_number
    from rating.inventory.schema import FINDINGS

    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Data"
    ws["A1"], ws["B1"], ws["C1"] = 0.45, 1.0, 0.45
    ws["A1"].number_format = ws["B1"].number_format = "0%"
    path = tmp_path / "pct.xlsx"
    wb.save(path)
    loss = next(c for c in FINDINGS.columns if c.key == "loss")
    for opener in (open_book, open_book_reference):
        grid = opener(path, {"Data": 3}, 10).grids["Data"]
        a, b, c = grid.value(1, 1), grid.value(1, 2), grid.value(1, 3)
        assert isinstance(a, xlsx.PercentNumber) and isinstance(b, xlsx.PercentNumber)
        assert not isinstance(c, xlsx.PercentNumber)
        assert parse_number(a, loss, False).value == 45.0
        assert parse_number(b, loss, False).value == 100.0
        assert "type 45" in parse_number(c, loss, False).message


def test_stylesheet_values_never_used_no_longer_refuse_the_workbook(tmp_path: Path) -> None:
    """The one deliberate difference: openpyxl's checks of stylesheet values the reader never
    uses (here a font family above 14, which some generators write) are not repeated; the
    reference reader refused such a workbook as unreadable, the fast reader reads it."""
    from rating.errors import InputError
    from rating.inventory import book

    styles = styles_xml().replace("<sz val=\"11\"/>", "<sz val=\"11\"/><family val=\"20\"/>")
    path = _one_sheet(tmp_path, CELL_ROW, styles=styles)
    with pytest.raises(InputError, match="cannot be read"):
        book.open_book_reference(path, WANTED, ROWS)
    got = book.open_book(path, WANTED, ROWS)
    assert got.grids["Data"].value(2, 2) == 4


def test_chart_sheet_is_left_to_the_reference(tmp_path: Path) -> None:
    chart = ('<?xml version="1.0"?><chartsheet xmlns="http://schemas.openxmlformats.org/'
             'spreadsheetml/2006/main"><sheetViews><sheetView workbookViewId="0"/>'
             "</sheetViews></chartsheet>")
    rel = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/chartsheet"
    data = package([("Data", sheet_xml(CELL_ROW)), ("Chart", chart)],
                   sheet_types={"Chart": rel})
    path = _write(tmp_path, data)
    assert compare(path, {"Data": 6, "Chart": 4}, ROWS) is False


def test_sheet_names_without_case_or_spaces_and_twice(tmp_path: Path) -> None:
    data = package([("dead loads", sheet_xml(CELL_ROW)), ("DATA", sheet_xml(CELL_ROW)),
                    ("DATA", sheet_xml('<row r="3"><c r="A3"><v>9</v></c></row>'))])
    path = _write(tmp_path, data)
    assert compare(path, {"DeadLoads": 3, "Data": 3, "data": 3, "Missing": 3}, ROWS)


def _damage(data: bytes, part: str, change) -> bytes:
    import io

    out = io.BytesIO()
    with zipfile.ZipFile(io.BytesIO(data)) as zin, zipfile.ZipFile(out, "w") as zout:
        for item in zin.infolist():
            if item.filename != part:
                zout.writestr(item, zin.read(item))
            elif change is not None:
                zout.writestr(item, change(zin.read(item)))
    return out.getvalue()


def _bad_checksum(data: bytes, part: str) -> bytes:
    """The package with one part's stored checksum wrong (a damaged file)."""
    import io

    out = io.BytesIO()
    with zipfile.ZipFile(io.BytesIO(data)) as zin, zipfile.ZipFile(out, "w") as zout:
        for item in zin.infolist():
            zout.writestr(item, zin.read(item), compress_type=zipfile.ZIP_STORED)
    raw = bytearray(out.getvalue())
    with zipfile.ZipFile(io.BytesIO(bytes(raw))) as z:
        info = z.getinfo(part)
    start = info.header_offset + 30 + len(info.filename.encode()) + len(info.extra)
    raw[start + 5] ^= 0x01  # flip a bit of the stored data
    return bytes(raw)


BASE_PARTS = [("Notes", sheet_xml('<row r="1"><c r="A1" t="str"><v>notes</v></c></row>')),
              ("Data", sheet_xml(CELL_ROW, tail=MERGES))]
CORE = ('<cp:coreProperties xmlns:cp="http://schemas.openxmlformats.org/package/2006/metadata/'
        'core-properties" xmlns:dc="http://purl.org/dc/elements/1.1/" xmlns:dcterms="http://'
        'purl.org/dc/terms/" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">'
        '<dc:creator>inspector</dc:creator><dcterms:created xsi:type="dcterms:W3CDTF">'
        "2024-05-14T10:00:00Z</dcterms:created></cp:coreProperties>")
SHEET_RELS = ('<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/'
              'relationships"/>')
# (what, part, change or None to remove the part, read by the fast reader)
DAMAGES = [
    ("wanted sheet not well-formed", "xl/worksheets/sheet2.xml",
     lambda d: d.replace(b"</row>", b"</rowx>"), False),
    ("wanted sheet with a formula, not well-formed", "xl/worksheets/sheet2.xml",
     lambda d: d.replace(b"<v>4</v>", b"<f>1</f>").replace(b"</row>", b"</rowx>"), False),
    ("other sheet not well-formed", "xl/worksheets/sheet1.xml",
     lambda d: d.replace(b"</row>", b"</rowx>"), False),
    ("styles not well-formed", "xl/styles.xml", lambda d: d[:-10], False),
    ("styles missing", "xl/styles.xml", None, True),
    ("strings missing", "xl/sharedStrings.xml", None, False),
    ("wanted sheet missing", "xl/worksheets/sheet2.xml", None, True),  # openpyxl drops it
    ("workbook relationships missing", "xl/_rels/workbook.xml.rels", None, False),
    ("content types missing", "[Content_Types].xml", None, False),
    ("bad document properties", "docProps/core.xml",
     lambda d: d.replace(b"2024-05-14T10:00:00Z", b"yesterday"), False),
    ("document properties not well-formed", "docProps/core.xml", lambda d: d[:-5], False),
    ("theme missing", "xl/theme/theme1.xml", None, True),
    ("sheet relationships not well-formed", "xl/worksheets/_rels/sheet2.xml.rels",
     lambda d: b"<Relationships", False),
    ("sheet relationship without target", "xl/worksheets/_rels/sheet2.xml.rels",
     lambda d: d.replace(b"/>", b'><Relationship Id="r1" Type="t"/></Relationships>'), False),
]


@pytest.mark.parametrize("part, change, fast", [d[1:] for d in DAMAGES],
                         ids=[d[0] for d in DAMAGES])
def test_damaged_parts_read_as_before(tmp_path: Path, part: str, change, fast: bool) -> None:
    data = package(BASE_PARTS, strings=strings_xml(["a"]), parts={
        "docProps/core.xml": CORE, "xl/worksheets/_rels/sheet2.xml.rels": SHEET_RELS,
        "xl/theme/theme1.xml": "<theme/>"})
    path = _write(tmp_path, _damage(data, part, change))
    assert compare(path, {"Data": 4, "Notes": 2}, ROWS) is fast


@pytest.mark.parametrize("dimension", [True, False])
@pytest.mark.parametrize("damage", ["</rowx>", "</row><!DOCTYPE x>", "</row>&nbsp;",
                                    "</row><x:y/>"])
def test_sheet_not_read_is_checked_as_openpyxl_checks_it(tmp_path: Path, dimension: bool,
                                                         damage: str) -> None:
    """openpyxl parses a sheet it does not read up to the end of its dimension only: rows
    that are not well-formed after it read the same both ways, by the fast reader too."""
    head = '<dimension ref="A1:C3"/>' if dimension else ""
    notes = sheet_xml(('<row r="1"><c r="A1" t="str"><v>notes</v></c></row>' * 400).replace(
        "</row>", damage, 1), head=head)
    path = _write(tmp_path, package([("Notes", notes), BASE_PARTS[1]]))
    assert compare(path, {"Data": 4}, ROWS) is dimension


_RELS_ROOT = f'<Relationships xmlns="{PKG_REL}">'


@pytest.mark.parametrize("rels", [
    SHEET_RELS,
    f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n{_RELS_ROOT}'
    '<Relationship Id="a" Target="t" TargetMode="External"/>\n'
    '<Relationship Target="u" Id="b" /></Relationships>',
    f'{_RELS_ROOT}</Relationships>',
    f'{_RELS_ROOT}<Relationship Id="a" Type="t"/></Relationships>',  # no target
    f'{_RELS_ROOT}<Relationship Id="a" Id="b" Target="t"/></Relationships>',  # not XML
    f'{_RELS_ROOT}<Relationship Id="a" Target="t" Other="x"/></Relationships>',
    f'{_RELS_ROOT}<Relationship Id="a" Target="t"/><Other/></Relationships>',
    f'{_RELS_ROOT}<Relationship Id="a&amp;" Target="t"/></Relationships>',
    f'{_RELS_ROOT}<Relationship Id="a" Target="t"/><!-- x --></Relationships>',
    f'{_RELS_ROOT}<Relationship Id="a" Target="t\x01"/></Relationships>',
    f'{_RELS_ROOT}<Relationship Id="a" Target="t"></Relationships>',
])
def test_sheet_relationships_checked_as_when_parsed(rels: str) -> None:
    """The plain form of a sheet's relationships is checked by its form, with the outcome
    of parsing them (accepted, or refused)."""
    def outcome(check) -> str:
        try:
            check()
        except Exception as exc:  # noqa: BLE001 - the refusal is the outcome compared
            return type(exc).__name__
        return "accepted"

    def parsed() -> None:
        _root, children = xlsx._children(rels.encode())
        for tag, attrs in children:
            if tag == "Relationship" and (
                    not set(attrs) <= {"Id", "Type", "Target", "TargetMode"}
                    or "Target" not in attrs):
                raise xlsx.Unsupported("an unusual relationship")

    assert outcome(lambda: xlsx._check_relationships(rels.encode())) == outcome(parsed)


@pytest.mark.parametrize("part", ["xl/worksheets/sheet1.xml", "xl/worksheets/sheet2.xml",
                                  "xl/styles.xml"])
def test_bad_zip_checksum_is_left_to_the_reference(tmp_path: Path, part: str) -> None:
    path = _write(tmp_path, _bad_checksum(package(BASE_PARTS), part))
    assert compare(path, {"Data": 4}, ROWS) is False


def _read_both_ways(path: Path) -> list[tuple[str, object, object]]:
    """Every member of ``path`` read by the fast reader and by ``ZipFile.read`` (the bytes,
    or the type of the error), and whether the fast reader took it from the file itself."""
    def outcome(read, name: str) -> object:
        try:
            return read(name)
        except Exception as exc:  # noqa: BLE001 - the error is the outcome compared
            return type(exc).__name__
    out = []
    with zipfile.ZipFile(path) as z:
        members = xlsx._Members(z)
        for info in z.infolist():
            direct = members.direct(info) is not None
            out.append((info.filename, (outcome(members.read, info.filename), direct),
                        outcome(z.read, info.filename)))
    return out


@pytest.mark.parametrize("path", SAMPLES, ids=[p.name for p in SAMPLES])
def test_members_read_as_zipfile_reads_them(path: Path) -> None:
    for name, (got, direct), expected in _read_both_ways(path):
        assert got == expected, name
        assert direct, name  # taken from the file's bytes, not left to zipfile


@pytest.mark.parametrize("stored", [False, True])
def test_damaged_member_is_read_by_zipfile_itself(tmp_path: Path, stored: bool) -> None:
    data = package(BASE_PARTS)
    if stored:
        data = _bad_checksum(data, "xl/worksheets/sheet2.xml")
    else:  # a deflated member cut short, and one whose stored name differs
        raw = bytearray(data)
        with zipfile.ZipFile(_write(tmp_path, data, "ok.xlsx")) as z:
            sheet, styles = z.getinfo("xl/worksheets/sheet2.xml"), z.getinfo("xl/styles.xml")
        raw[sheet.header_offset + 30 + len(sheet.filename) + 2] ^= 0xFF
        raw[styles.header_offset + 30] ^= 0x01
        data = bytes(raw)
    outcomes = {name: (got, direct, expected)
                for name, (got, direct), expected in _read_both_ways(_write(tmp_path, data))}
    for got, _direct, expected in outcomes.values():
        assert got == expected
    got, direct, _ = outcomes["xl/worksheets/sheet2.xml"]
    assert not direct and isinstance(got, str)  # zipfile's own error
    assert outcomes["[Content_Types].xml"][1]
    if not stored:
        assert not outcomes["xl/styles.xml"][1]


def test_file_names_openpyxl_does_not_open(tmp_path: Path) -> None:
    path = _write(tmp_path, package(BASE_PARTS), "w.zip")
    assert compare(path, {"Data": 4}, ROWS) is False


def _with_names(names: str) -> bytes:
    return _damage(package(BASE_PARTS), "xl/workbook.xml", lambda d: d.replace(
        b"</sheets>", b"</sheets><definedNames>" + names.encode() + b"</definedNames>"))


@pytest.mark.parametrize(("names", "fast"), [
    ('<definedName name="_xlnm.Print_Titles" localSheetId="1">Data!$1:$3</definedName>', True),
    ('<definedName name="_xlnm.Print_Titles" localSheetId="0">Notes!$A:$B,Notes!$1:$2'
     "</definedName>", True),
    ('<definedName name="_xlnm.Print_Area" localSheetId="1">Data!$A$1:$D$9</definedName>', True),
    ('<definedName name="_xlnm._FilterDatabase" localSheetId="1" hidden="1">Data!$A$1:$D$9'
     "</definedName>", True),
    ('<definedName name="span" localSheetId="1">Data!$B$2</definedName>'
     '<definedName name="span">Notes!$A$1</definedName>', True),
    ('<definedName name="_xlnm.Print_Titles" localSheetId="7">Data!$1:$3</definedName>', True),
    ('<definedName name="_xlnm.Print_Titles" localSheetId="-1">Data!$1:$3</definedName>', True),
    ('<definedName name="_xlnm.Print_Area" localSheetId="1"/>', True),  # openpyxl warns
    ('<definedName name="_xlnm.Print_Titles" localSheetId="1">nothing</definedName>',
     False),  # openpyxl refuses the workbook
    ('<definedName name="_xlnm.Print_Titles" localSheetId="1"/>', False),
    ('<definedName name="_xlnm.Print_Titles" localSheetId="one">Data!$1:$3</definedName>',
     False),
])
@pytest.mark.filterwarnings("ignore:Defined names for sheet index:UserWarning")
@pytest.mark.filterwarnings("ignore:Print area cannot be set:UserWarning")
def test_names_defined_for_one_sheet_as_openpyxl_binds_them(tmp_path: Path, names: str,
                                                             fast: bool) -> None:
    path = _write(tmp_path, _with_names(names))
    assert compare(path, {"Data": 4}, ROWS) is fast


def test_sample_saved_with_print_titles_reads_on_the_fast_path(tmp_path: Path) -> None:
    """A sample saved again with print titles on a sheet (as a spreadsheet program saves a
    sheet set up for printing) reads by the fast reader, and reads as through openpyxl."""
    wb = openpyxl.load_workbook(SAMPLES[0])
    wb["Members"].print_title_rows = "1:2"
    path = tmp_path / "titles.xlsx"
    wb.save(path)
    with zipfile.ZipFile(path) as z:
        assert b'localSheetId="' in z.read("xl/workbook.xml")
    assert compare(path, sheets_read(), rows_read()) is True
    with mock.patch.object(book, "open_book_reference", side_effect=AssertionError):
        fast = read_workbook(path)  # the reference reader is never asked
    with mock.patch.object(reader, "open_book", book.open_book_reference):
        reference = read_workbook(path)
    assert fast == reference
    assert fast.bridge is not None


# --- random cells ----------------------------------------------------------------------------

_values = st.one_of(
    st.integers(-10**6, 10**6).map(str), st.floats(allow_nan=True).map(repr),
    st.sampled_from(["", " ", "1e5", "-0", "1_0", "nan", "inf", "0x1", "1.", ".5", "1e", "#N/A",
                     "true", "2024-05-14", "12:30:00", "7/8", "&amp;", "&#9;x", "a\r\nb"]),
    st.text(alphabet=st.characters(blacklist_categories=("Cs", "Cc")), max_size=12).map(escape),
)
_cell = st.builds(
    lambda col, s, t, f, v, inline, spaces: (
        f'<c r="{col}2"{s}{t}>' + ("\n " if spaces else "") + f + v + inline + "</c>"),
    st.sampled_from("ABCDEFGH"),
    st.sampled_from(["", ' s="0"', ' s="1"', ' s="2"', ' s="4"', ' s="5"', ' s="8"', ' s=""',
                     ' s="40"']),
    st.sampled_from(["", ' t="n"', ' t="s"', ' t="b"', ' t="e"', ' t="str"', ' t="d"',
                     ' t="inlineStr"', ' t=""']),
    st.sampled_from(["", "<f>A1+1</f>", '<f t="shared" si="0"/>', "<f>&quot;x&quot;</f>"]),
    st.one_of(st.just(""), st.just("<v/>"), _values.map(lambda v: f"<v>{v}</v>")),
    st.sampled_from(["", "<is><t>in</t></is>", "<is/>"]),
    st.booleans(),
)


@settings(max_examples=60, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(cells=st.lists(_cell, min_size=1, max_size=4), date1904=st.booleans(),
       date_first=st.booleans())
def test_random_cells_read_the_same_both_ways(tmp_path: Path, cells: list[str],
                                              date1904: bool, date_first: bool) -> None:
    rows = f'<row r="2">{"".join(cells)}</row>'
    styles = styles_xml() if not date_first else styles_xml(xf_formats=(14, 0, 22, 45, 46))
    compare(_one_sheet(tmp_path, rows, date1904=date1904, styles=styles), WANTED, ROWS)


_row_cells = st.lists(st.tuples(st.sampled_from("ABCDEFGH"), st.sampled_from([
    "/>", "><v>1</v></c>", ' t="s"><v>0</v></c>', ' t="inlineStr"><is><t>x</t></is></c>',
    "><f>A1</f></c>", "></c>", ' s="1"><v>45000.5</v></c>'])), max_size=4)
_row = st.tuples(st.integers(1, ROWS + 3), _row_cells,
                 st.sampled_from(["", ' spans="1:3"', ' x14ac:dyDescent="0.25"', ' ht="20"']),
                 st.sampled_from(["", "\n  "]))


def _rows_xml(rows: list[tuple[int, list[tuple[str, str]], str, str]]) -> str:
    out = []
    for r, cells, attrs, space in rows:
        body = "".join(f'{space}<c r="{col}{r}"{rest}' for col, rest in cells)
        out.append(f'{space}<row r="{r}"{attrs}>{body}</row>' if cells else
                   f'{space}<row r="{r}"{attrs}/>')
    return "".join(out)


@settings(max_examples=40, deadline=None,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(rows=st.lists(_row, max_size=6), merged=st.booleans())
def test_random_rows_read_the_same_both_ways(tmp_path: Path, rows, merged: bool) -> None:
    tail = MERGES if merged else ""
    compare(_one_sheet(tmp_path, _rows_xml(rows), root=EXCEL_ROOT, tail=tail), WANTED, ROWS)


def test_datetime_values_are_typed_as_openpyxl_types_them(tmp_path: Path) -> None:
    rows = (f'<row r="2"><c r="B2" s="{D}"><v>45413</v></c><c r="C2" s="4"><v>0.5</v></c>'
            f'<c r="D2" s="{T}"><v>1.5</v></c></row>')
    path = _one_sheet(tmp_path, rows)
    assert compare(path, WANTED, ROWS)
    with zipfile.ZipFile(path) as z:
        cells = xlsx.read_package(z, path).cells("Data", 6, ROWS)
    assert cells.rows[1][1:4] == (dt.datetime(2024, 5, 1), dt.time(12, 0),
                                  dt.timedelta(days=1, hours=12))
