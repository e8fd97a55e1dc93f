"""Reading the form and table sheets into typed rows, with every cell problem logged.

Checks here need only the cell itself and its column: type, range, unit of the header,
required values, formulas without a saved result, merged cells. Checks across rows and sheets
(references, duplicates, consistency) are made by :mod:`rating.inventory.reader`.
"""

from __future__ import annotations

import re
import string
from collections.abc import Iterator, Mapping, Sequence
from dataclasses import dataclass

from openpyxl.utils import get_column_letter, range_boundaries

from rating.inventory.book import Book, SheetGrid
from rating.inventory.cells import Invalid, Parsed, describe, is_blank, parse_value
from rating.inventory.problems import Problem, ProblemLog
from rating.inventory.schema import (
    EXAMPLE_MARK,
    HEADER_ROW,
    HEADER_SEARCH_ROWS,
    MARK_HEADER,
    MAX_ROWS,
    Column,
    FormSheet,
    TableSheet,
    header_words,
)

FORM_LABEL_ROWS = 200  # form items are looked for in the first rows of column A


def ref(sheet: str, row: int, col: int) -> str:
    return f"{sheet}!{get_column_letter(col)}{row}"


@dataclass(frozen=True)
class Row:
    """One data row (or a whole form sheet): parsed values by column key.

    A key is in ``values`` only when its cell held a usable value; ``bad`` holds keys whose
    value was unusable (already reported), so later checks do not repeat the complaint.
    """

    sheet: str
    number: int
    values: Mapping[str, object]
    cells: Mapping[str, str]
    bad: frozenset[str] = frozenset()

    def get(self, key: str, default: object = None) -> object:
        return self.values.get(key, default)

    def has(self, key: str) -> bool:
        return key in self.values

    def ref(self, key: str) -> str:
        """The Sheet!Cell of ``key``'s value; for an item whose row a form sheet lacks, the
        sheet's first cell, as the reader names a missing item (never row 0)."""
        return self.cells.get(key) or f"{self.sheet}!A{max(self.number, 1)}"

    @property
    def ok(self) -> bool:
        return not self.bad


class CellRefs(Mapping[str, str]):
    """The ``Sheet!Cell`` of each column of one table row (by column key), made when asked:
    most cells of a row are blank and never named in a message."""

    __slots__ = ("_places", "_row")

    def __init__(self, places: Mapping[str, str], row: str) -> None:
        self._places = places  # column key -> "Sheet!B"
        self._row = row

    def __getitem__(self, key: str) -> str:
        return self._places[key] + self._row

    def __iter__(self) -> Iterator[str]:
        return iter(self._places)

    def __len__(self) -> int:
        return len(self._places)


@dataclass(frozen=True)
class TableData:
    """One table sheet as read: its spec, the sheet's own name, whether it is in the workbook,
    its data rows and the ``Sheet!Cell`` of each column header found (by key)."""

    spec: TableSheet
    sheet: str
    present: bool
    rows: tuple[Row, ...]
    header_cells: Mapping[str, str]
    header_row: int = HEADER_ROW

    def header_ref(self, key: str) -> str:
        return self.header_cells.get(key) or f"{self.sheet}!A{self.header_row}"


def _context_names(template: str) -> list[str]:
    return [f for _, f, _, _ in string.Formatter().parse(template) if f]


def _context(template: str, values: Mapping[str, object],
             names: list[str] | None = None) -> str:
    """How a row is named in messages (``template`` filled from ``values``; "" when a value
    is missing). ``names`` are the template's fields, when already known."""
    if not template:
        return ""
    if names is None:
        names = _context_names(template)
    if any(n not in values for n in names):
        return ""
    return template.format(**{n: values[n] for n in names})


_UNITS = re.compile(r"\[([^\]]*)\]")


def _unit_tokens(text: str) -> list[str] | None:
    m = _UNITS.search(text)
    if not m:
        return None
    return [t.strip() for t in m.group(1).split("|") if t.strip()]


def _check_header_units(col: Column, text: str, where: str, si: bool, log: ProblemLog) -> None:
    tokens = _unit_tokens(text)
    if not tokens or not col.unit:
        return
    allowed = {col.unit, col.si_unit} - {""}
    active = col.unit_for(si)
    strange = [t for t in tokens if t not in allowed]
    system = "SI" if si else "US"
    if strange:
        log.error(where, f"the header of '{col.title}' gives the unit {strange[0]!r}; this "
                  f"column is read in {col.unit}" + (f" (or {col.si_unit} when the workbook is "
                  "SI)" if col.si_unit and col.si_unit != col.unit else "")
                  + "; restore the header")
    elif active not in tokens:
        log.error(where, f"the header of '{col.title}' says [{' | '.join(tokens)}] but the "
                  f"Bridge sheet declares {system} units, so the values would be read in "
                  f"{active}; correct the header or the units cell")


def unreadable(grid: SheetGrid, log: ProblemLog) -> bool:
    """Log why a sheet could not be read at all; True when it could not."""
    if not grid.failure:
        return False
    for (r, c), text in sorted(grid.bad_numbers.items()):
        log.error(ref(grid.name, r, c), f"the cell is stored as a number but holds {text!r}, "
                  "which is not a number; retype the value (the whole sheet could not be read)")
    if not grid.bad_numbers:
        log.error(f"{grid.name}!A1", f"the sheet '{grid.name}' cannot be read "
                  f"({grid.failure}); open the workbook in the spreadsheet program and save it "
                  "again")
    return True


def _check_merges(grid: SheetGrid, first_row: int, log: ProblemLog) -> None:
    for rng in grid.merges:
        try:
            c1, r1, c2, r2 = range_boundaries(rng)
        except (ValueError, TypeError):
            continue
        if r2 is not None and r2 >= first_row:
            log.error(f"{grid.name}!{rng.split(':')[0]}",
                      f"cells {rng} are merged; unmerge them so that every value has its own "
                      "cell (a merged cell hides the values under it)")


def _parse_cell(grid: SheetGrid, row: int, col_idx: int, col: Column, si: bool,
                ctx: str, log: ProblemLog) -> tuple[object, bool]:
    """(value or None when blank, usable?) for one cell; problems are logged."""
    return _parse_raw(grid.value(row, col_idx), grid.formula_at(row, col_idx), col, si, ctx,
                      log, ref(grid.name, row, col_idx))


def _parse_raw(raw: object, formula: str | None, col: Column, si: bool, ctx: str,
               log: ProblemLog, where: str, row: str = "",
               memo: dict[tuple[str, type, object], Parsed | Invalid] | None = None,
               ) -> tuple[object, bool]:
    """:func:`_parse_cell` of the cell at ``where + row`` holding ``raw`` (and ``formula``,
    a formula without a saved result, or None). ``memo`` keeps what :func:`parse_value` gave
    for a value already met in the same column (values repeat down a table)."""
    if formula is not None:
        shown = formula if len(formula) <= 40 else formula[:37] + "..."
        log.error(where + row, f"{_what(col, ctx)}: the cell holds a formula ({shown}) whose "
                  "result was never saved; open the workbook in the spreadsheet program and "
                  "save it, or type the value")
        return None, False
    if raw is None or isinstance(raw, str) and not raw.strip():  # blank
        if col.required:
            log.error(where + row, f"{_what(col, ctx)} is required and is blank")
            return None, False
        return None, True
    if memo is None:
        got = parse_value(raw, col, si)
    else:
        key = (col.key, type(raw), raw)
        known = memo.get(key)
        if known is None:
            known = parse_value(raw, col, si)
            if not (type(raw) is float and raw == 0):  # -0.0 reads as "-0", 0.0 as "0"
                memo[key] = known
        got = known
    if isinstance(got, Invalid):
        log.error(where + row, f"{_what(col, ctx)} {got.message}")
        return None, False
    if got.warning:
        log.warning(where + row, f"{_what(col, ctx)}: {got.warning}")
    return got.value, True


def _what(col: Column, ctx: str) -> str:
    return f"{col.title} of {ctx}" if ctx else col.title


def _find_header_row(grid: SheetGrid, spec: TableSheet,
                     wanted: set[str]) -> tuple[int, list[str | None]] | None:
    """The header row (among the first rows) and the header words of its cells (None where
    a cell holds no text); ``wanted`` are the header words of the columns."""
    first = header_words(spec.columns[0].title)
    for r in range(1, min(HEADER_SEARCH_ROWS, grid.row_count) + 1):
        words = [header_words(v) if isinstance(v, str) else None for v in grid.rows[r - 1]]
        present = [w for w in words if w is not None]
        if first in present and len(wanted.intersection(present)) >= min(2, len(wanted)):
            return r, words
    return None


def read_table(book: Book, spec: TableSheet, si: bool, log: ProblemLog,
               required: bool = False) -> TableData:
    """Every data row of one table sheet (example rows and blank rows skipped)."""
    grid = book.grids.get(spec.name)
    if grid is None:
        if required:
            log.error(f"{spec.name}!A1", f"the sheet '{spec.name}' ({spec.title.lower()}) is "
                      "missing from the workbook")
        return TableData(spec, spec.name, False, (), {})
    if unreadable(grid, log):
        return TableData(spec, grid.name, True, (), {})
    by_words = {header_words(c.title): c for c in spec.columns}
    found = _find_header_row(grid, spec, set(by_words))
    if found is None:
        log.error(ref(grid.name, HEADER_ROW, 1),
                  f"no header row found on sheet '{grid.name}': expected the column headers "
                  + ", ".join(f"'{c.header}'" for c in spec.columns[:4]) + ", ... in one of "
                  f"the first {HEADER_SEARCH_ROWS} rows (as in the template)")
        return TableData(spec, grid.name, True, (), {})
    hdr, words = found
    _check_merges(grid, hdr, log)
    mark_words = header_words(MARK_HEADER)
    colpos: dict[str, int] = {}
    header_cells: dict[str, str] = {}
    mark_col: int | None = None
    for c_idx, (v, w) in enumerate(zip(grid.rows[hdr - 1], words, strict=True), start=1):
        if not isinstance(v, str) or w is None:
            continue
        if w == mark_words:
            mark_col = c_idx
            continue
        col = by_words.get(w)
        if col is None:
            continue
        where = ref(grid.name, hdr, c_idx)
        if col.key in colpos:
            log.error(where, f"the column '{col.title}' appears twice in the header row "
                      f"(also {header_cells[col.key]}); delete one")
            continue
        colpos[col.key] = c_idx
        header_cells[col.key] = where
        _check_header_units(col, v, where, si, log)
    for col in spec.columns:
        if col.key not in colpos and col.required:
            log.error(ref(grid.name, hdr, 1),
                      f"the column '{col.header}' is missing from the header row of "
                      f"'{grid.name}'; restore it as in the template")
    if grid.truncated:
        below = grid.beyond or MAX_ROWS + 1
        log.error(ref(grid.name, below, 1),
                  f"sheet '{grid.name}' has entries from row {below} down, past the "
                  f"{MAX_ROWS} data rows a sheet may hold: they are not read, so the workbook "
                  "is not rated; move the rows up (no blank rows are needed between entries) "
                  "or split the bridge's entries")
    cols = [(c, colpos[c.key]) for c in spec.columns if c.key in colpos]
    missing = frozenset(c.key for c in spec.columns if c.key not in colpos and c.required)
    rows = _read_rows(grid, spec, hdr, cols, mark_col, missing, si, log)
    return TableData(spec, grid.name, True, rows, header_cells, hdr)


def _read_rows(grid: SheetGrid, spec: TableSheet, hdr: int, cols: list[tuple[Column, int]],
               mark_col: int | None, missing: frozenset[str], si: bool,
               log: ProblemLog) -> tuple[Row, ...]:
    """The data rows below the header row ``hdr``: ``cols`` are the columns found (with their
    column numbers), ``missing`` the required ones not found."""
    key_cols = [(c, i) for c, i in cols if c.required][:2]
    keys = {c.key for c, _ in key_cols}
    places = {c.key: f"{grid.name}!{get_column_letter(i)}" for c, i in cols}
    columns = [(c, c.key, i - 1, places[c.key], c.required, c.key in keys) for c, i in cols]
    places_read = [i - 1 for _, i in cols]
    template = spec.context
    names = frozenset(_context_names(template))
    uncached = grid.uncached_formulas
    memo: dict[tuple[str, type, object], Parsed | Invalid] = {}
    quiet = ProblemLog()  # the messages of a row's key cells, kept for later
    problems = log.problems
    rows: list[Row] = []
    for r in range(hdr + 1, grid.row_count + 1):
        line = grid.rows[r - 1]  # every row of a grid is as wide as the columns read
        mark = line[mark_col - 1] if mark_col is not None else None
        if isinstance(mark, str) and mark.strip().lower() == EXAMPLE_MARK:
            continue
        for k in places_read:  # a row with nothing in the columns read is passed over
            v = line[k]
            if v is not None and not (isinstance(v, str) and not v.strip()):
                break
        else:
            if not uncached or all((r, k + 1) not in uncached for k in places_read):
                continue
        if mark_col is not None and not is_blank(mark):
            log.warning(ref(grid.name, r, mark_col),
                        f"column '{MARK_HEADER}' holds {describe(mark)}; "
                        f"only '{EXAMPLE_MARK}' has a meaning there (the row is read as data)")
        number = str(r)
        # the row's name first, so every message can say which item it is about; a key cell
        # whose messages need no name is not parsed twice (its messages are kept for later)
        pre: dict[str, object] = {}
        first: dict[str, tuple[object, bool, Sequence[Problem]]] = {}
        for c, i in key_cols:
            raw = line[i - 1]
            got = memo.get((c.key, type(raw), raw)) if raw is not None else None
            logged: Sequence[Problem] = ()
            if (got is not None and got.__class__ is Parsed and not got.warning  # type: ignore[union-attr]
                    and (not uncached or (r, i) not in uncached)):
                v, ok = got.value, True  # type: ignore[union-attr]
            else:
                v, ok = _parse_raw(raw, uncached.get((r, i)) if uncached else None, c, si, "",
                                   quiet, places[c.key], number, memo)
                if quiet.problems:
                    logged, quiet.problems = quiet.problems, []
            first[c.key] = (v, ok, logged)
            if ok and v is not None:
                pre[c.key] = v
        # how the row is named in messages ("" when a value of the name is missing)
        ctx = template.format_map(pre) if template and pre.keys() >= names else ""
        values: dict[str, object] = {}
        bad: set[str] = set(missing)
        for c, key, k, place, required, is_key in columns:
            raw = line[k]
            if is_key and (key in pre or not ctx):
                v, ok, logged = first[key]
                problems.extend(logged)
            elif raw is None:
                if not required and (not uncached or (r, k + 1) not in uncached):
                    continue  # blank and optional: nothing to say, nothing to keep
                v, ok = _parse_raw(raw, uncached.get((r, k + 1)) if uncached else None, c, si,
                                   "" if key in pre else ctx, log, place, number, memo)
            else:
                got = memo.get((key, type(raw), raw))  # a value met before, read quietly
                if (got is not None and got.__class__ is Parsed and not got.warning  # type: ignore[union-attr]
                        and (not uncached or (r, k + 1) not in uncached)):
                    v, ok = got.value, True  # type: ignore[union-attr]
                else:
                    v, ok = _parse_raw(raw, uncached.get((r, k + 1)) if uncached else None, c,
                                       si, "" if key in pre else ctx, log, place, number, memo)
            if not ok:
                bad.add(key)
            elif v is not None:
                values[key] = v
        rows.append(Row(grid.name, r, values, CellRefs(places, number), frozenset(bad)))
    return tuple(rows)


def read_form(book: Book, spec: FormSheet, si: bool | None, log: ProblemLog,
              units_key: str = "") -> tuple[Row, bool]:
    """The items of a form sheet as one :class:`Row`, and whether the workbook is in SI.

    ``units_key`` names the item declaring the unit system; it is read first and decides
    how every other item is read (``si`` given by the caller otherwise).
    """
    grid = book.grids.get(spec.name)
    if grid is None:
        log.error(f"{spec.name}!A1", f"the sheet '{spec.name}' ({spec.title.lower()}) is "
                  "missing from the workbook")
        return Row(spec.name, 1, {}, {}, frozenset(c.key for c in spec.fields)), bool(si)
    if unreadable(grid, log):
        return Row(grid.name, 1, {}, {}, frozenset(c.key for c in spec.fields)), bool(si)
    for rng in grid.merges:
        try:
            c1, r1, c2, r2 = range_boundaries(rng)
        except (ValueError, TypeError):
            continue
        if c1 is not None and c1 <= 2 and r2 is not None and r2 > HEADER_ROW:
            log.error(f"{grid.name}!{rng.split(':')[0]}",
                      f"cells {rng} are merged; unmerge them so that every item has its own "
                      "label and value cell")
    by_words = {header_words(c.title): c for c in spec.fields}
    rowpos: dict[str, int] = {}
    for r in range(1, min(FORM_LABEL_ROWS, grid.row_count) + 1):
        label = grid.value(r, 1)
        if not isinstance(label, str):
            continue
        col = by_words.get(header_words(label))
        if col is None:
            if r > HEADER_ROW and not is_blank(grid.value(r, 2)) and header_words(label):
                log.warning(ref(grid.name, r, 1),
                            f"'{label.strip()[:40]}' is not an item pintruss knows; its value "
                            f"in {ref(grid.name, r, 2)} is not read")
            continue
        if col.key in rowpos:
            log.error(ref(grid.name, r, 1), f"the item '{col.title}' appears twice (also row "
                      f"{rowpos[col.key]}); delete one")
            continue
        rowpos[col.key] = r
    values: dict[str, object] = {}
    cells: dict[str, str] = {}
    bad: set[str] = set()
    if units_key and units_key in rowpos:
        ucol = spec.field_of(units_key)
        v, ok = _parse_cell(grid, rowpos[units_key], 2, ucol, False, "", log)
        si = ok and v == "SI"
    si = bool(si)
    for col in spec.fields:
        if col.key not in rowpos:
            if col.required:
                log.error(f"{grid.name}!A1", f"the item '{col.header}' is missing from column "
                          f"A of '{grid.name}'; restore its row as in the template")
                bad.add(col.key)
            continue
        r = rowpos[col.key]
        _check_header_units(col, str(grid.value(r, 1)), ref(grid.name, r, 1), si, log)
        cells[col.key] = ref(grid.name, r, 2)
        quiet = col.key == units_key
        v, ok = _parse_cell(grid, r, 2, col, si, "", ProblemLog() if quiet else log)
        if not ok:
            bad.add(col.key)
        elif v is not None:
            values[col.key] = v
    return Row(grid.name, 0, values, cells, frozenset(bad)), si
