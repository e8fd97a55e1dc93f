"""Opening an untrusted workbook safely, read-only, as plain grids of cached cell values.

Two readers give the same grids. The fast one (:mod:`rating.inventory.xlsx`) reads the sheet
XML straight from the package in one pass; it takes every workbook in the plain form
spreadsheet programs write and refuses anything else. The reference reader takes the rest:
openpyxl (read-only, cached values; it parses the XML through defusedxml, a dependency) gives
the values, and one defusedxml pass over each sheet's XML tells which cells are merged and
which hold a formula whose result was never saved. The file is opened for reading only and is
never written.
"""

from __future__ import annotations

import dataclasses
import io
import posixpath
import re
import zipfile
from collections.abc import Iterable, Iterator, Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import openpyxl
from defusedxml import ElementTree as SafeET

from rating.errors import InputError
from rating.inventory import xlsx

MAX_UNCOMPRESSED_BYTES = 200_000_000  # refuse zip bombs
_NS_REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships"


@dataclass(frozen=True)
class SheetGrid:
    """The cached values of one sheet, rows and columns 1-based through :meth:`value`."""

    name: str
    rows: tuple[tuple[object, ...], ...]
    uncached_formulas: dict[tuple[int, int], str]
    merges: tuple[str, ...]
    truncated: bool
    failure: str = ""  # why the sheet could not be read at all ("" when it could)
    bad_numbers: dict[tuple[int, int], str] = field(default_factory=dict)
    beyond: int | None = None  # the first row below the rows read that holds a value

    @property
    def row_count(self) -> int:
        return len(self.rows)

    def value(self, row: int, col: int) -> object:
        if 1 <= row <= len(self.rows):
            r = self.rows[row - 1]
            if 1 <= col <= len(r):
                return r[col - 1]
        return None

    def formula_at(self, row: int, col: int) -> str | None:
        return self.uncached_formulas.get((row, col))


@dataclass(frozen=True)
class Book:
    """A workbook opened read-only: its path, the names of all its sheets and the grids of
    cached values of the sheets read (keyed by the name asked for)."""

    path: Path
    sheet_names: tuple[str, ...]
    grids: dict[str, SheetGrid]
    hidden_sheets: tuple[str, ...] = ()
    hidden_rows: dict[str, tuple[int, ...]] = field(default_factory=dict)  # of sheets read

    def find(self, wanted: str) -> str | None:
        """The workbook's own name of sheet ``wanted`` (case, spaces and _ ignored)."""
        if wanted in self.grids:
            return wanted
        key = _sheet_key(wanted)
        for name in self.sheet_names:
            if _sheet_key(name) == key:
                return name
        return None


_KEY_GAPS = re.compile(r"[\s_\-]+")


def _sheet_key(name: str) -> str:
    return _KEY_GAPS.sub("", name).lower()


def _check_container(path: Path) -> None:
    _open_container(path).close()


def _open_container(path: Path) -> zipfile.ZipFile:
    """The workbook's zip container, open; :class:`InputError` when it is not one or when it
    unpacks to an implausible size (a zip bomb)."""
    if not path.exists():
        raise InputError("the workbook file does not exist", where=str(path))
    if not path.is_file():
        raise InputError("this is a folder, not a workbook file", where=str(path))
    if path.suffix.lower() == ".xls":
        if zipfile.is_zipfile(path):  # (an .xlsx workbook renamed: its content says so)
            raise InputError("this file is named .xls but holds an .xlsx workbook; rename it "
                             "to .xlsx", where=str(path))
        raise InputError("this is an old-format .xls file; open it in the spreadsheet program "
                         "and save it as an .xlsx workbook", where=str(path))
    try:
        z = zipfile.ZipFile(path)
    except (zipfile.BadZipFile, OSError) as exc:
        if not zipfile.is_zipfile(path):  # asked only now: most files are
            raise InputError("this file is not an .xlsx workbook (it is not a zip container); "
                             "save the workbook as .xlsx", where=str(path)) from None
        raise InputError(f"the workbook cannot be opened: {exc}", where=str(path)) from exc
    total = sum(i.file_size for i in z.infolist())
    if total > MAX_UNCOMPRESSED_BYTES:
        z.close()
        raise InputError("the workbook unpacks to an implausibly large size and is refused "
                         "(a damaged or hostile file)", where=str(path))
    return z


@dataclass(frozen=True)
class _Extras:
    """What a scan of one sheet's XML found: its merged ranges, the formula cells with no saved
    result and the cells whose number cannot be read, by (row, column)."""

    merges: tuple[str, ...]
    uncached: dict[tuple[int, int], str]
    bad_numbers: dict[tuple[int, int], str]


_REF = re.compile(r"^([A-Z]{1,3})(\d+)$")
# one way only to match a run of digits (a long unreadable number fails at once)
_NUMBER = re.compile(r"^\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*$")


_MAYBE_FORMULA_OR_MERGE = re.compile(rb"<(?:\w+:)?f[\s>/]|mergeCell")


def _sheet_parts(z: zipfile.ZipFile) -> dict[str, str]:
    """Sheet name -> its XML part in the package."""
    return _sheet_index(z)[0]


def _sheet_index(z: zipfile.ZipFile) -> tuple[dict[str, str], tuple[str, ...]]:
    """Sheet name -> its XML part in the package, and the sheets hidden in the spreadsheet
    (state "hidden" or "veryHidden"), from one reading of the workbook part."""
    names = set(z.namelist())
    if "xl/workbook.xml" not in names or "xl/_rels/workbook.xml.rels" not in names:
        return {}, ()
    wb = SafeET.fromstring(z.read("xl/workbook.xml"))
    rels = SafeET.fromstring(z.read("xl/_rels/workbook.xml.rels"))
    targets = {r.get("Id"): r.get("Target", "") for r in rels if r.tag.endswith("Relationship")}
    out: dict[str, str] = {}
    hidden: list[str] = []
    for el in wb.iter():
        if not el.tag.endswith("}sheet"):
            continue
        if el.get("state") in ("hidden", "veryHidden"):
            hidden.append(str(el.get("name")))
        target = targets.get(el.get(f"{{{_NS_REL}}}id"), "")
        part = target.lstrip("/") if target.startswith("/") else posixpath.normpath(
            posixpath.join("xl", target))
        if part in names:
            out[str(el.get("name"))] = part
    return out, tuple(hidden)


def _scan(data: bytes, max_rows: int) -> _Extras:
    """Merged ranges, formula cells without a saved result and unreadable numbers of a sheet.

    Parsed with defusedxml (entity expansion and external references are refused). A formula
    cell is one with an ``<f>`` element; it has no saved result when its ``<v>`` is missing
    or empty.
    """
    refs: list[str] = []
    uncached: dict[tuple[int, int], str] = {}
    bad_numbers: dict[tuple[int, int], str] = {}
    for _event, node in SafeET.iterparse(io.BytesIO(data), events=("end",)):
        tag = node.tag.rsplit("}", 1)[-1]
        if tag == "c":
            f = v = None
            for child in node:
                ctag = child.tag.rsplit("}", 1)[-1]
                if ctag == "f":
                    f = child
                elif ctag == "v":
                    v = child
            m = _REF.match(node.get("r", ""))
            if m and int(m.group(2)) <= max_rows:
                rc = (int(m.group(2)), xlsx.col_number(m.group(1)))
                if f is not None and (v is None or not (v.text or "")):
                    text = (f.text or "").strip()
                    uncached[rc] = "=" + text if text else "(a shared formula)"
                elif (v is not None and v.text and node.get("t", "n") == "n"
                      and not _NUMBER.match(v.text)):
                    bad_numbers[rc] = v.text[:40]
            node.clear()
        elif tag == "row":
            node.clear()
        elif tag == "mergeCell" and node.get("ref"):
            refs.append(str(node.get("ref")))
    return _Extras(tuple(refs), uncached, bad_numbers)


def _sheet_extras(path: Path, max_rows: int, wanted: set[str],
                  deep: bool = False) -> dict[str, _Extras]:
    """:func:`_scan` of every wanted sheet (keys as :func:`_sheet_key`), by sheet name.

    Unless ``deep``, a sheet with no formula and no merge in its XML is not parsed here
    (openpyxl parses it anyway, through defusedxml).
    """
    out: dict[str, _Extras] = {}
    with zipfile.ZipFile(path) as z:
        for name, part in _sheet_parts(z).items():
            if _sheet_key(name) not in wanted:
                continue
            data = z.read(part)
            if deep or _MAYBE_FORMULA_OR_MERGE.search(data):
                out[name] = _scan(data, max_rows)
    return out


def open_book(path: Path, wanted: dict[str, int], max_rows: int) -> Book:
    """Read the sheets named in ``wanted`` (name -> columns to read) from ``path``, with the
    sheets and rows hidden in the spreadsheet (:func:`_with_hidden`).

    Raises :class:`InputError` when the file is missing or is not a readable workbook.
    """
    path = Path(path)
    book: Book | None = None
    with _open_container(path) as z:
        try:
            book = open_book_fast(z, path, wanted, max_rows)
        except Exception:  # noqa: BLE001 - not the plain form, or damaged: the reference decides
            pass
        if book is not None:
            return _with_hidden(book, z)
    book = open_book_reference(path, wanted, max_rows)
    with zipfile.ZipFile(path) as z:
        return _with_hidden(book, z)


_ROW_TAG = re.compile(rb"<(?:\w+:)?row\b([^>]*)>")
_ROW_NUMBER = re.compile(rb"""\br\s*=\s*["'](\d+)["']""")
_HIDDEN_ATTR = re.compile(rb"""\bhidden\s*=\s*["'](?:1|true)["']""")


def _with_hidden(book: Book, z: zipfile.ZipFile) -> Book:
    """The book with the sheets hidden in the spreadsheet and the hidden rows of each sheet
    read: they are read like any other, but the user does not see them (a hidden finding once
    controlled a rating unseen). A part that cannot be scanned hides nothing here (its
    reading says what is wrong with it)."""
    try:
        parts, hidden_sheets = _sheet_index(z)
        rows: dict[str, tuple[int, ...]] = {}
        for g in book.grids.values():
            part = parts.get(g.name)
            if part is None:
                continue
            found = tuple(int(n.group(1)) for m in _ROW_TAG.finditer(z.read(part))
                          if _HIDDEN_ATTR.search(m.group(1))
                          and (n := _ROW_NUMBER.search(m.group(1))) is not None)
            if found:
                rows[g.name] = found
    except Exception:  # noqa: BLE001 - untrusted file: the sheets' reading says what is wrong
        return book
    return dataclasses.replace(book, hidden_sheets=hidden_sheets, hidden_rows=rows)


def open_book_fast(z: zipfile.ZipFile, path: Path, wanted: dict[str, int],
                   max_rows: int) -> Book:
    """:func:`open_book` through :mod:`rating.inventory.xlsx` from the open package ``z``;
    raises (:class:`rating.inventory.xlsx.Unsupported` or the error of a damaged part) when
    the reference reader must decide."""
    package = xlsx.read_package(z, path)
    by_key: dict[str, str] = {}  # as Book.find finds a sheet (the first of a key)
    for sheet in package.sheet_names:
        by_key.setdefault(_sheet_key(sheet), sheet)
    grids: dict[str, SheetGrid] = {}
    for wanted_name, ncols in wanted.items():
        name = by_key.get(_sheet_key(wanted_name))
        if name is not None:
            cells = package.cells(name, ncols, max_rows)
            grids[wanted_name] = _grid(name, ncols, max_rows, cells.rows, cells.uncached,
                                       cells.merges, cells.beyond)
    package.check_unread({g.name for g in grids.values()})
    return Book(path, package.sheet_names, grids)


def _grid(name: str, ncols: int, max_rows: int, rows_read: Iterable[Sequence[object]],
          uncached: dict[tuple[int, int], str], merges: tuple[str, ...],
          beyond: int | None = None) -> SheetGrid:
    """The grid of one sheet from its rows as openpyxl's ``iter_rows`` yields them (from 1 to
    ``max_rows + 1`` at most, each ``ncols`` wide; blank rows at the end may be left out):
    blank rows at the end dropped except above a formula without a saved result;
    ``truncated`` when row ``max_rows + 1`` holds a value, or a row below it (``beyond``, the
    first such row)."""
    uncached = {k: v for k, v in uncached.items() if k[1] <= ncols}
    rows: list[tuple[object, ...]] = []
    truncated = False
    for r, vrow in enumerate(rows_read, start=1):
        if r > max_rows:
            truncated = any(_holds(v) for v in vrow)
            beyond = r if truncated else beyond
            break
        if type(vrow) is tuple and len(vrow) == ncols:
            rows.append(vrow)  # as wide as the grid already
        else:
            vals = tuple(vrow) + (None,) * (ncols - len(vrow))
            rows.append(vals[:ncols])
    last_formula_row = max((k[0] for k in uncached), default=0)
    while len(rows) > last_formula_row and rows and all(v is None for v in rows[-1]):
        rows.pop()
    while len(rows) < last_formula_row:
        rows.append((None,) * ncols)
    return SheetGrid(name, tuple(rows), uncached, merges, truncated or beyond is not None,
                     beyond=beyond)


def _first_beyond(ws: Any, last: int, ncols: int) -> int | None:
    """The first row below ``last`` holding a value in the first ``ncols`` columns of an
    openpyxl read-only worksheet (None where there is none)."""
    known = getattr(ws, "max_row", None)  # (from the sheet's dimension, where it has one)
    if isinstance(known, int) and known <= last:
        return None
    for r, vrow in enumerate(ws.iter_rows(min_row=last + 1, max_col=ncols, values_only=True),
                             start=last + 1):
        if any(_holds(v) for v in vrow):
            return r
    return None


def _holds(value: object) -> bool:
    """A cell holds an entry: a value other than nothing or blank text (a lone space far down
    a sheet is no entry)."""
    return value is not None and not (isinstance(value, str) and not value.strip())


def _shown_values(rows: Iterable[Sequence[Any]]) -> Iterator[tuple[object, ...]]:
    """The cells' values, row by row, with a number formatted as a percent marked as such
    (rating.inventory.xlsx.PercentNumber), as the direct reader marks it."""
    for row in rows:
        yield tuple(_shown(c) for c in row)


def _shown(cell: Any) -> object:
    v = cell.value
    if type(v) not in (int, float):
        return v
    try:
        code = getattr(cell, "number_format", None)
    except (TypeError, IndexError, KeyError):  # a style openpyxl cannot look up (an empty
        return v  # or damaged s attribute): its value as stored, as the direct reader has it
    return xlsx.PercentNumber(v) if xlsx.is_percent_format(code) else v


def open_book_reference(path: Path, wanted: dict[str, int], max_rows: int) -> Book:
    """:func:`open_book` through openpyxl: the reader of every workbook the fast one refuses,
    and the reference the tests compare it with."""
    path = Path(path)
    _check_container(path)
    try:
        keys = {_sheet_key(n) for n in wanted}
        extras = _sheet_extras(path, max_rows, keys)
    except Exception as exc:  # noqa: BLE001 - untrusted file: any parser failure is the file's
        raise InputError(f"the workbook cannot be read ({type(exc).__name__}: {exc}); open "
                         "it in the spreadsheet program and save it again", where=str(path)
                         ) from exc
    try:
        values_wb = openpyxl.load_workbook(path, read_only=True, data_only=True)
    except Exception as exc:  # noqa: BLE001 - untrusted file: any parser failure is the file's
        raise InputError(f"the workbook cannot be read ({type(exc).__name__}: {exc}); open "
                         "it in the spreadsheet program and save it again", where=str(path)
                         ) from exc
    try:
        sheet_names = tuple(values_wb.sheetnames)
        book = Book(path, sheet_names, {})
        grids: dict[str, SheetGrid] = {}
        for wanted_name, ncols in wanted.items():
            name = book.find(wanted_name)
            if name is None:
                continue
            ws = values_wb[name]
            if not hasattr(ws, "iter_rows"):  # a chart sheet
                continue
            ex = extras.get(name, _Extras((), {}, {}))
            try:
                grids[wanted_name] = _grid(name, ncols, max_rows, _shown_values(ws.iter_rows(
                    min_row=1, max_row=max_rows + 1, max_col=ncols)), ex.uncached, ex.merges,
                    _first_beyond(ws, max_rows + 1, ncols))
            except Exception as exc:  # noqa: BLE001 - a damaged sheet part: say so, go on
                try:
                    ex = _sheet_extras(path, max_rows, {_sheet_key(name)}, deep=True).get(
                        name, ex)
                except Exception:  # noqa: BLE001 - the failure is reported below anyway
                    pass
                grids[wanted_name] = SheetGrid(
                    name, (), {}, ex.merges, False,
                    failure=f"{type(exc).__name__}: {str(exc)[:80]}",
                    bad_numbers={k: v for k, v in ex.bad_numbers.items() if k[1] <= ncols})
        return Book(path, sheet_names, grids)
    finally:
        values_wb.close()
