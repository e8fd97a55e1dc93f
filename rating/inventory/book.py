"""Opening an untrusted workbook safely, read-only, as plain grids of cached cell values.

openpyxl parses the XML through defusedxml when it is installed (it is a dependency), and the
merged-cell ranges are read with defusedxml too. The file is opened for reading only and is
never written; two read-only passes give the cached values and tell which cells hold a formula
whose result was never saved.
"""

from __future__ import annotations

import posixpath
import re
import zipfile
from dataclasses import dataclass
from pathlib import Path

import openpyxl
from defusedxml import ElementTree as SafeET

from rating.errors import InputError

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
    path: Path
    sheet_names: tuple[str, ...]
    grids: dict[str, SheetGrid]

    def find(self, wanted: str) -> str | None:
        """The workbook's own name of sheet ``wanted`` (case, spaces and _ ignored)."""
        if wanted in self.grids:
            return wanted
        key = _sheet_key(wanted)
        for name in self.sheet_names:
            if _sheet_key(name) == key:
                return name
        return None


def _sheet_key(name: str) -> str:
    return re.sub(r"[\s_\-]+", "", name).lower()


def _check_container(path: Path) -> None:
    if not path.exists():
        raise InputError("the workbook file does not exist", where=str(path))
    if not path.is_file():
        raise InputError("this is a folder, not a workbook file", where=str(path))
    if path.suffix.lower() == ".xls":
        raise InputError("this is an old-format .xls file; open it in the spreadsheet program "
                         "and save it as an .xlsx workbook", where=str(path))
    if not zipfile.is_zipfile(path):
        raise InputError("this file is not an .xlsx workbook (it is not a zip container); "
                         "save the workbook as .xlsx", where=str(path))
    try:
        with zipfile.ZipFile(path) as z:
            infos = z.infolist()
    except (zipfile.BadZipFile, OSError) as exc:
        raise InputError(f"the workbook cannot be opened: {exc}", where=str(path)) from exc
    total = sum(i.file_size for i in infos)
    if total > MAX_UNCOMPRESSED_BYTES:
        raise InputError("the workbook unpacks to an implausibly large size and is refused "
                         "(a damaged or hostile file)", where=str(path))


def _merge_ranges(path: Path) -> dict[str, tuple[str, ...]]:
    """Merged-cell ranges by sheet name, read from the package XML with defusedxml."""
    out: dict[str, tuple[str, ...]] = {}
    with zipfile.ZipFile(path) as z:
        names = set(z.namelist())
        if "xl/workbook.xml" not in names or "xl/_rels/workbook.xml.rels" not in names:
            return out
        wb = SafeET.fromstring(z.read("xl/workbook.xml"))
        rels = SafeET.fromstring(z.read("xl/_rels/workbook.xml.rels"))
        targets = {r.get("Id"): r.get("Target", "") for r in rels if r.tag.endswith("Relationship")}
        for el in wb.iter():
            if not el.tag.endswith("}sheet"):
                continue
            target = targets.get(el.get(f"{{{_NS_REL}}}id"), "")
            part = target.lstrip("/") if target.startswith("/") else posixpath.normpath(
                posixpath.join("xl", target))
            if part not in names:
                continue
            refs: list[str] = []
            with z.open(part) as fh:
                for _event, node in SafeET.iterparse(fh, events=("end",)):
                    if node.tag.endswith("}mergeCell") and node.get("ref"):
                        refs.append(str(node.get("ref")))
                    elif node.tag.endswith("}row"):
                        node.clear()
            out[str(el.get("name"))] = tuple(refs)
    return out


def _is_formula(v: object) -> str | None:
    if isinstance(v, str) and v.startswith("=") and len(v) > 1:
        return v
    text = getattr(v, "text", None)  # ArrayFormula / DataTableFormula objects
    if type(v).__name__.endswith("Formula"):
        return str(text or "=")
    return None


def open_book(path: Path, wanted: dict[str, int], max_rows: int) -> Book:
    """Read the sheets named in ``wanted`` (name -> columns to read) from ``path``.

    Raises :class:`InputError` when the file is missing or is not a readable workbook.
    """
    path = Path(path)
    _check_container(path)
    try:
        values_wb = openpyxl.load_workbook(path, read_only=True, data_only=True)
        formulas_wb = openpyxl.load_workbook(path, read_only=True, data_only=False)
    except Exception as exc:  # noqa: BLE001 - untrusted file: any parser failure is the file's
        raise InputError(f"the workbook cannot be read ({type(exc).__name__}: {exc}); open "
                         "it in the spreadsheet program and save it again", where=str(path)
                         ) from exc
    try:
        sheet_names = tuple(values_wb.sheetnames)
        try:
            merges = _merge_ranges(path)
        except Exception:  # noqa: BLE001 - merges are advisory; unreadable means none found
            merges = {}
        book = Book(path, sheet_names, {})
        grids: dict[str, SheetGrid] = {}
        for wanted_name, ncols in wanted.items():
            name = book.find(wanted_name)
            if name is None:
                continue
            vs = values_wb[name]
            fs = formulas_wb[name]
            if not hasattr(vs, "iter_rows"):  # a chart sheet
                continue
            rows: list[tuple[object, ...]] = []
            uncached: dict[tuple[int, int], str] = {}
            truncated = False
            try:
                pairs = zip(
                    vs.iter_rows(min_row=1, max_row=max_rows + 1, max_col=ncols,
                                 values_only=True),
                    fs.iter_rows(min_row=1, max_row=max_rows + 1, max_col=ncols,
                                 values_only=True),
                    strict=False,
                )
                for r, (vrow, frow) in enumerate(pairs, start=1):
                    if r > max_rows:
                        truncated = any(v is not None for v in vrow)
                        break
                    vals = list(vrow) + [None] * (ncols - len(vrow))
                    for c, fv in enumerate(frow, start=1):
                        if c <= ncols and vals[c - 1] is None:
                            f = _is_formula(fv)
                            if f is not None:
                                uncached[(r, c)] = f
                    rows.append(tuple(vals[:ncols]))
            except Exception as exc:  # noqa: BLE001 - a damaged sheet part
                raise InputError(f"sheet {name!r} cannot be read ({type(exc).__name__}); "
                                 "save the workbook again", where=str(path)) from exc
            while rows and all(v is None for v in rows[-1]) and not any(
                    k[0] == len(rows) for k in uncached):
                rows.pop()
            grids[wanted_name] = SheetGrid(name, tuple(rows), uncached, merges.get(name, ()),
                                           truncated)
        return Book(path, sheet_names, grids)
    finally:
        values_wb.close()
        formulas_wb.close()
