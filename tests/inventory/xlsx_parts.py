"""Small .xlsx packages written part by part, and the fast reader compared with the reference.

The parts are written the way spreadsheet programs other than openpyxl write them (shared
strings, number formats, row attributes in other namespaces...) or damaged on purpose, so the
two readers of :mod:`rating.inventory.book` can be compared on them.
"""

from __future__ import annotations

import io
import zipfile
from pathlib import Path
from xml.sax.saxutils import escape, quoteattr

from rating.errors import InputError
from rating.inventory import book
from rating.inventory.book import Book

MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main"
REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships"
PKG_REL = "http://schemas.openxmlformats.org/package/2006/relationships"
CT = "http://schemas.openxmlformats.org/package/2006/content-types"
SHEET_TYPE = "application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"
WORKSHEET_REL = f"{REL}/worksheet"
EXCEL_ROOT = (f'xmlns="{MAIN}" xmlns:r="{REL}" '
              'xmlns:mc="http://schemas.openxmlformats.org/markup-compatibility/2006" '
              'mc:Ignorable="x14ac" '
              'xmlns:x14ac="http://schemas.microsoft.com/office/spreadsheetml/2009/9/ac"')

# cell styles by index: 0 General, 1 m/d/yy (14), 2 m/d/yy h:mm (22), 3 yyyy-mm-dd, 4 h:mm,
# 5 [h]:mm:ss (a duration), 6 0.00%, 7 a literal with date letters in quotes, 8 mm:ss (45),
# 9 [h]:mm:ss built in (46), 10 text (49)
NUMBER_FORMATS = {164: "yyyy-mm-dd", 165: "h:mm", 166: "[h]:mm:ss", 167: '0.0" days"'}
XF_FORMATS = (0, 14, 22, 164, 165, 166, 10, 167, 45, 46, 49)
DATE_STYLE, DATETIME_STYLE, ISO_STYLE, TIME_STYLE, DURATION_STYLE = 1, 2, 3, 4, 5


def styles_xml(formats: dict[int, str] = NUMBER_FORMATS,
               xf_formats: tuple[int, ...] = XF_FORMATS) -> str:
    apply = ' applyNumberFormat="1"'
    fmts = "".join(f'<numFmt numFmtId="{k}" formatCode={quoteattr(v)}/>'
                   for k, v in formats.items())
    xfs = "".join(f'<xf numFmtId="{k}" fontId="0" fillId="0" borderId="0" xfId="0"'
                  f'{apply if k else ""}/>' for k in xf_formats)
    return (f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>'
            f'<styleSheet xmlns="{MAIN}"><numFmts count="{len(formats)}">{fmts}</numFmts>'
            '<fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts>'
            '<fills count="1"><fill><patternFill patternType="none"/></fill></fills>'
            '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border>'
            '</borders><cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" '
            f'borderId="0"/></cellStyleXfs><cellXfs count="{len(xf_formats)}">{xfs}</cellXfs>'
            '<cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/>'
            '</cellStyles></styleSheet>')


def strings_xml(strings: list[str]) -> str:
    items = "".join(f"<si><t xml:space=\"preserve\">{escape(s)}</t></si>" for s in strings)
    return (f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>'
            f'<sst xmlns="{MAIN}" count="{len(strings)}" uniqueCount="{len(strings)}">'
            f"{items}</sst>")


def sheet_xml(rows: str, *, root: str = f'xmlns="{MAIN}"', head: str = "",
              tail: str = "") -> str:
    return (f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?><worksheet {root}>'
            f'{head}<sheetData>{rows}</sheetData>{tail}</worksheet>')


def package(sheets: list[tuple[str, str]], *, strings: str | None = None,
            styles: str | None = None, date1904: bool = False,
            parts: dict[str, bytes | str] | None = None,
            sheet_types: dict[str, str] | None = None) -> bytes:
    """A workbook of ``sheets`` (name, worksheet XML), in the order given.

    ``parts`` adds or replaces parts by name (bytes as they are); ``sheet_types`` gives a
    sheet another relationship type (e.g. a chart sheet).
    """
    styles = styles_xml() if styles is None else styles
    rels = [f'<Relationship Id="rId{k}" Type="{(sheet_types or {}).get(name, WORKSHEET_REL)}"'
            f' Target="worksheets/sheet{k}.xml"/>' for k, (name, _) in enumerate(sheets, 1)]
    overrides = [f'<Override PartName="/xl/worksheets/sheet{k}.xml" ContentType="{SHEET_TYPE}"/>'
                 for k in range(1, len(sheets) + 1)]
    n = len(sheets)
    rels.append(f'<Relationship Id="rId{n + 1}" Type="{REL}/styles" Target="styles.xml"/>')
    overrides.append('<Override PartName="/xl/styles.xml" ContentType="application/'
                     'vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>')
    if strings is not None:
        rels.append(f'<Relationship Id="rId{n + 2}" Type="{REL}/sharedStrings" '
                    'Target="sharedStrings.xml"/>')
        overrides.append('<Override PartName="/xl/sharedStrings.xml" ContentType="application/'
                         'vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/>')
    epoch = ' date1904="1"' if date1904 else ""
    sheet_list = "".join(f'<sheet name={quoteattr(name)} sheetId="{k}" r:id="rId{k}"/>'
                         for k, (name, _) in enumerate(sheets, 1))
    out: dict[str, bytes | str] = {
        "[Content_Types].xml": (
            f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?><Types xmlns="{CT}">'
            '<Default Extension="rels" ContentType="application/'
            'vnd.openxmlformats-package.relationships+xml"/>'
            '<Default Extension="xml" ContentType="application/xml"/>'
            '<Override PartName="/xl/workbook.xml" ContentType="application/'
            'vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>'
            + "".join(overrides) + "</Types>"),
        "_rels/.rels": (f'<?xml version="1.0" encoding="UTF-8"?><Relationships '
                        f'xmlns="{PKG_REL}"><Relationship Id="rId1" Type="{REL}/'
                        'officeDocument" Target="xl/workbook.xml"/></Relationships>'),
        "xl/workbook.xml": (f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>'
                            f'<workbook xmlns="{MAIN}" xmlns:r="{REL}">'
                            f"<workbookPr{epoch}/><sheets>{sheet_list}</sheets></workbook>"),
        "xl/_rels/workbook.xml.rels": (f'<?xml version="1.0" encoding="UTF-8"?><Relationships '
                                       f'xmlns="{PKG_REL}">{"".join(rels)}</Relationships>'),
        "xl/styles.xml": styles,
    }
    if strings is not None:
        out["xl/sharedStrings.xml"] = strings
    for k, (_, xml) in enumerate(sheets, 1):
        out[f"xl/worksheets/sheet{k}.xml"] = xml
    out.update(parts or {})
    buf = io.BytesIO()
    with zipfile.ZipFile(buf, "w", zipfile.ZIP_DEFLATED) as z:
        for name, data in out.items():
            z.writestr(name, data)
    return buf.getvalue()


def snapshot(b: Book) -> object:
    """Everything in a book, each value with its type (``==`` would take 1, 1.0 and True for
    one another), formulas and unreadable numbers in a fixed order."""
    def typed(v: object) -> tuple[str, str]:
        return type(v).__name__, repr(v)
    return (str(b.path), b.sheet_names, {
        k: (g.name, tuple(tuple(typed(v) for v in row) for row in g.rows),
            sorted(g.uncached_formulas.items()), g.merges, g.truncated, g.failure,
            sorted(g.bad_numbers.items()))
        for k, g in b.grids.items()})


def _outcome(read) -> object:
    try:
        return snapshot(read())
    except InputError as exc:
        return ("InputError", str(exc))


def compare(path: Path, wanted: dict[str, int], max_rows: int) -> bool:
    """Assert that :func:`book.open_book` gives exactly what the reference reader gives (the
    same grids, or the same refusal); True when the fast reader read it itself."""
    expected = _outcome(lambda: book.open_book_reference(path, wanted, max_rows))
    got = _outcome(lambda: book.open_book(path, wanted, max_rows))
    assert got == expected, _difference(got, expected)
    try:
        with zipfile.ZipFile(path) as z:
            book.open_book_fast(z, path, wanted, max_rows)
    except Exception:  # noqa: BLE001 - any refusal sends the workbook to the reference
        return False
    return True


def _difference(got: object, expected: object) -> str:
    if not (isinstance(got, tuple) and isinstance(expected, tuple) and len(got) == 3
            and len(expected) == 3):
        return f"fast: {got!r}\nreference: {expected!r}"
    lines = []
    if got[1] != expected[1]:
        lines.append(f"sheet names {got[1]} != {expected[1]}")
    for key in sorted(set(got[2]) | set(expected[2])):
        a, b = got[2].get(key), expected[2].get(key)
        if a != b:
            lines.append(f"{key}: fast {a!r}\n{key}: reference {b!r}")
    return "\n".join(lines)
