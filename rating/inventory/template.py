"""Writing the blank inspection workbook, and the same workbook filled from Python data.

The layout comes from :mod:`rating.inventory.schema`: an Instructions sheet, the two form
sheets (Bridge, Settings) and one table sheet per kind of item. Input cells are tinted, every
closed list has a dropdown, example rows are grey with ``example`` in column A (the reader
skips them). A file is never overwritten unless ``force`` is given.
"""

from __future__ import annotations

import datetime as dt
import os
import tempfile
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from pathlib import Path

from openpyxl import Workbook
from openpyxl.comments import Comment
from openpyxl.styles import Alignment, Border, Font, PatternFill, Side
from openpyxl.utils import get_column_letter
from openpyxl.worksheet.datavalidation import DataValidation
from openpyxl.worksheet.worksheet import Worksheet

from rating.errors import InputError, UsageError
from rating.inventory import schema as sc
from rating.inventory.schema import Column, FormSheet, Kind, TableSheet

INPUT_FILL = PatternFill("solid", fgColor="FFF8DC")
HEADER_FILL = PatternFill("solid", fgColor="1F4E5A")
EXAMPLE_FILL = PatternFill("solid", fgColor="E4E4E4")
PLAIN_FILL = PatternFill("solid", fgColor="FFFFFF")
HEADER_FONT = Font(bold=True, color="FFFFFF")
TITLE_FONT = Font(bold=True, size=14)
HELP_FONT = Font(italic=True, color="444444")
EXAMPLE_FONT = Font(italic=True, color="707070")
THIN = Side(style="thin", color="B0B0B0")
BOX = Border(left=THIN, right=THIN, top=THIN, bottom=THIN)
WRAP = Alignment(wrap_text=True, vertical="top")
AUTHOR = "pintruss"


@dataclass(frozen=True)
class WorkbookContent:
    """What to write into the template: form items by key, table rows by sheet name.

    Values are in the workbook's unit system (``bridge["units"] == "SI"`` for SI) exactly as
    an engineer would type them; keys are the column keys of :mod:`rating.inventory.schema`.
    """

    bridge: Mapping[str, object]
    tables: Mapping[str, Sequence[Mapping[str, object]]] = field(default_factory=dict)
    settings: Mapping[str, object] = field(default_factory=dict)


def _choices(col: Column) -> tuple[str, ...]:
    return col.choices if col.kind is Kind.CHOICE else sc.YES_NO if col.kind is Kind.YESNO else ()


def _list_validation(col: Column, where: str) -> DataValidation | None:
    options = _choices(col)
    if options:
        dv = DataValidation(type="list", formula1='"' + ",".join(options) + '"',
                            allow_blank=True, showErrorMessage=True, errorStyle="stop",
                            errorTitle=col.title[:32],
                            error=f"Choose one of: {', '.join(options)}"[:255])
    elif col.list_source:
        dv = DataValidation(type="list", formula1=col.list_source, allow_blank=True,
                            showErrorMessage=False)
    else:
        return None
    dv.add(where)
    return dv


def _help_text(col: Column) -> str:
    bits = [col.help] if col.help else []
    if col.required:
        bits.append("Required.")
    if _choices(col):
        bits.append("One of: " + ", ".join(_choices(col)) + ".")
    if col.blank_means:
        bits.append(f"Blank: {col.blank_means}.")
    return " ".join(bits)


def _title(ws: Worksheet, title: str, purpose: str, ncols: int) -> None:
    for c in range(1, ncols + 1):
        for r in (sc.TITLE_ROW, sc.HELP_ROW):
            ws.cell(r, c).fill = PLAIN_FILL
    ws.cell(sc.TITLE_ROW, 1, title).font = TITLE_FONT
    cell = ws.cell(sc.HELP_ROW, 1, purpose)
    cell.font = HELP_FONT
    ws.row_dimensions[sc.HELP_ROW].height = 30


def _table_sheet(ws: Worksheet, spec: TableSheet) -> None:
    ncols = len(spec.columns) + 1
    _title(ws, spec.title, spec.purpose, ncols)
    last = sc.FIRST_DATA_ROW + spec.data_rows - 1
    mark = ws.cell(sc.HEADER_ROW, 1, sc.MARK_HEADER)
    mark.font, mark.fill, mark.border, mark.alignment = HEADER_FONT, HEADER_FILL, BOX, WRAP
    mark.comment = Comment(f"Rows with '{sc.EXAMPLE_MARK}' here are examples and are not read. "
                           "Leave blank for your data.", AUTHOR)
    ws.column_dimensions["A"].width = 9
    for i, col in enumerate(spec.columns, start=2):
        letter = get_column_letter(i)
        h = ws.cell(sc.HEADER_ROW, i, col.header)
        h.font, h.fill, h.border, h.alignment = HEADER_FONT, HEADER_FILL, BOX, WRAP
        text = _help_text(col)
        if text:
            h.comment = Comment(text, AUTHOR, width=300, height=120)
        dim = ws.column_dimensions[letter]
        dim.width = max(col.width, min(len(col.header) * 0.9, 26))
        dim.fill = INPUT_FILL
        if col.kind is Kind.DATE:
            dim.number_format = "yyyy-mm-dd"
        dv = _list_validation(col, f"{letter}{sc.FIRST_DATA_ROW}:{letter}{last}")
        if dv is not None:
            ws.add_data_validation(dv)
    ws.row_dimensions[sc.HEADER_ROW].height = 45
    for k, example in enumerate(spec.examples):
        r = sc.FIRST_DATA_ROW + k
        m = ws.cell(r, 1, sc.EXAMPLE_MARK)
        m.font, m.fill = EXAMPLE_FONT, EXAMPLE_FILL
        for i, col in enumerate(spec.columns, start=2):
            c = ws.cell(r, i, example.get(col.key))
            c.font, c.fill = EXAMPLE_FONT, EXAMPLE_FILL
    ws.freeze_panes = f"B{sc.FIRST_DATA_ROW}"


def _form_sheet(ws: Worksheet, spec: FormSheet) -> None:
    _title(ws, spec.title, spec.purpose, 3)
    for i, text in enumerate(("Item", "Value", "Notes"), start=1):
        h = ws.cell(sc.HEADER_ROW, i, text)
        h.font, h.fill, h.border = HEADER_FONT, HEADER_FILL, BOX
    ws.column_dimensions["A"].width = 44
    ws.column_dimensions["B"].width = 30
    ws.column_dimensions["C"].width = 90
    for k, col in enumerate(spec.fields):
        r = sc.FIRST_DATA_ROW + k
        a = ws.cell(r, 1, col.header)
        a.border = BOX
        if col.required:
            a.font = Font(bold=True)
        v = ws.cell(r, 2)
        v.fill, v.border = INPUT_FILL, BOX
        if col.kind is Kind.DATE:
            v.number_format = "yyyy-mm-dd"
        note = _help_text(col)
        example = spec.examples.get(col.key)
        if example:
            note = f"{note} ({example})" if note else str(example)
        n = ws.cell(r, 3, note)
        n.font, n.alignment = HELP_FONT, Alignment(wrap_text=True, vertical="top")
        dv = _list_validation(col, f"B{r}")
        if dv is not None:
            ws.add_data_validation(dv)
    ws.freeze_panes = f"A{sc.FIRST_DATA_ROW}"


INSTRUCTIONS = (
    "How to fill in this inspection workbook",
    "",
    "1. Bridge: the structure, its truss form, panels, heights and roadway. One value per row "
    "in column B. Leave Geometry blank (generated) to build the truss from its form; choose "
    "explicit to list joints and members yourself.",
    "2. Members: one row per member of one truss, with the id of its section (Eyebars, Rods, "
    "BuiltUp with its Plates/Channels/Angles, or Rolled) and optionally a material id.",
    "3. Findings: one row per finding from the inspection (loss, bar state, pack rust, "
    "condition rating, photo). Pins and Packing: each pin and the order of the bars on it.",
    "4. DeadLoads, Vehicles/Axles and Settings as needed. Then run: pintruss check WORKBOOK.",
    "",
    "Units: every header shows [US | SI]. The workbook is read in US customary units unless "
    "'Units of this workbook' on the Bridge sheet says SI; then the second unit applies "
    "everywhere. Do not mix. Inch dimensions may be typed as fractions, e.g. 1-1/4.",
    "Example rows: grey rows with 'example' in column A are never read (their values are in US "
    "units). Leave them or delete them; your own rows have column A blank.",
    "Tinted cells are for input; closed lists have a dropdown. Hover over a header for help.",
    "Formulas are allowed, but the workbook must have been saved by a spreadsheet program so "
    "that their results are stored; a formula without a stored result is reported.",
    "Do not merge cells in the tables. Columns may be moved but keep their header words.",
    "Sign convention: tension positive. Truss geometry: x along the span from the left "
    "bearing, y up; section parts: x across the truss plane, y in the truss plane.",
    "",
    "Defaults the program assumes (material strengths by year built, wearing-surface unit "
    "weight, detail allowance) are listed as assumptions in the check and in the report.",
    "The results are an aid to the licensed engineer in responsible charge of the rating.",
)


def _instructions(ws: Worksheet) -> None:
    ws.column_dimensions["A"].width = 24
    ws.column_dimensions["B"].width = 46
    ws.column_dimensions["C"].width = 16
    ws.column_dimensions["D"].width = 80
    r = 1
    for i, line in enumerate(INSTRUCTIONS):
        c = ws.cell(r, 1, line)
        c.font = TITLE_FONT if i == 0 else Font()
        r += 1
    r += 1
    ws.cell(r, 1, "Sheets").font = Font(bold=True, size=12)
    r += 1
    for spec in (*sc.FORMS, *sc.TABLES):
        ws.cell(r, 1, spec.name).font = Font(bold=True)
        ws.cell(r, 2, spec.title)
        ws.cell(r, 4, spec.purpose).alignment = Alignment(wrap_text=False)
        r += 1
    r += 1
    ws.cell(r, 1, "Columns and items").font = Font(bold=True, size=12)
    r += 1
    for i, text in enumerate(("Sheet", "Column or item", "Kind", "Meaning"), start=1):
        h = ws.cell(r, i, text)
        h.font, h.fill = HEADER_FONT, HEADER_FILL
    r += 1
    for spec in (*sc.FORMS, *sc.TABLES):
        cols = spec.fields if isinstance(spec, FormSheet) else spec.columns
        for col in cols:
            ws.cell(r, 1, spec.name)
            ws.cell(r, 2, col.header)
            ws.cell(r, 3, col.kind.value)
            ws.cell(r, 4, _help_text(col))
            r += 1


def build_template() -> Workbook:
    """The blank inspection workbook as an openpyxl workbook (not yet saved)."""
    wb = Workbook()
    first = wb.active
    if first is None:  # pragma: no cover - a new Workbook always has a sheet
        first = wb.create_sheet()
    first.title = sc.INSTRUCTIONS_SHEET
    _instructions(first)
    specs = {s.name: s for s in (*sc.FORMS, *sc.TABLES)}
    for name in sc.SHEET_ORDER[1:]:
        ws = wb.create_sheet(name)
        spec = specs[name]
        if isinstance(spec, FormSheet):
            _form_sheet(ws, spec)
        else:
            _table_sheet(ws, spec)
    wb.properties.creator = AUTHOR
    wb.properties.title = "pintruss inspection workbook"
    return wb


def _cell_value(value: object) -> object:
    if isinstance(value, tuple | list):
        return ", ".join(str(v) for v in value)
    return value


def fill(wb: Workbook, content: WorkbookContent) -> None:
    """Write ``content`` into a workbook made by :func:`build_template`."""
    for spec, values in ((sc.BRIDGE, content.bridge), (sc.SETTINGS, content.settings)):
        unknown = set(values) - {f.key for f in spec.fields}
        if unknown:
            raise ValueError(f"unknown {spec.name} item(s): {', '.join(sorted(unknown))}")
        ws = wb[spec.name]
        for k, col in enumerate(spec.fields):
            if col.key in values and values[col.key] is not None:
                ws.cell(sc.FIRST_DATA_ROW + k, 2, _cell_value(values[col.key]))
    tables = {t.name: t for t in sc.TABLES}
    for name, rows in content.tables.items():
        if name not in tables:
            raise ValueError(f"unknown sheet {name!r}; known: {', '.join(tables)}")
        spec = tables[name]
        ws = wb[name]
        keys = spec.keys
        start = sc.FIRST_DATA_ROW + len(spec.examples)
        for k, row in enumerate(rows):
            unknown = set(row) - set(keys)
            if unknown:
                raise ValueError(f"unknown column(s) on {name}: {', '.join(sorted(unknown))}")
            for i, key in enumerate(keys, start=2):
                v = row.get(key)
                if v is None:
                    continue
                c = ws.cell(start + k, i, _cell_value(v))
                c.fill = INPUT_FILL
                if isinstance(v, dt.date):
                    c.number_format = "yyyy-mm-dd"


def _save_new(wb: Workbook, path: Path, force: bool) -> None:
    path = Path(path)
    if path.suffix.lower() not in (".xlsx", ".xlsm"):
        raise UsageError("the workbook file name must end in .xlsx", where=str(path))
    if path.is_dir():  # (before "exists": --force would not replace a folder either)
        raise UsageError("this is a folder, not a workbook file", where=str(path))
    if path.exists() and not force:
        raise UsageError("the file already exists and is not overwritten; choose another name "
                         "or use --force to replace it", where=str(path))
    folder = path.parent if str(path.parent) else Path(".")
    if not folder.is_dir():
        raise UsageError(f"the folder {folder} does not exist", where=str(path))
    try:
        fd, tmp = tempfile.mkstemp(suffix=".xlsx", prefix=".pintruss-", dir=folder)
    except OSError as exc:  # a folder we may not write to
        raise InputError(f"the workbook cannot be written in {folder}: "
                         f"{exc.strerror or exc}", where=str(path)) from exc
    os.close(fd)
    try:
        wb.save(tmp)
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(tmp, 0o666 & ~umask)  # mkstemp makes it private; a workbook is not
        if force:
            os.replace(tmp, path)
        else:
            try:
                os.link(tmp, path)  # fails if the file appeared meanwhile: never overwrite
            except FileExistsError:
                raise InputError("the file already exists and is not overwritten; use --force "
                                 "to replace it", where=str(path)) from None
            except OSError:
                if path.exists():
                    raise InputError("the file already exists and is not overwritten",
                                     where=str(path)) from None
                os.replace(tmp, path)
    except OSError as exc:  # no permission, a full disk: the temporary file is removed
        raise InputError(f"the workbook cannot be written: {exc.strerror or exc}",
                         where=str(path)) from exc
    finally:
        if os.path.exists(tmp):
            os.unlink(tmp)


def write_template(path: Path, force: bool = False) -> None:
    """Write the blank inspection workbook to ``path``; never overwrites unless ``force``."""
    _save_new(build_template(), Path(path), force)


def write_workbook(path: Path, content: WorkbookContent, force: bool = False) -> None:
    """Write the template filled with ``content`` to ``path`` (samples, tests)."""
    wb = build_template()
    fill(wb, content)
    _save_new(wb, Path(path), force)
