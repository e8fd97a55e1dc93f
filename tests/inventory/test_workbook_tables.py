"""Table rows read from a grid: each message names its row, however often a value repeats.

The reader parses a value met again in the same column only once; these tests make sure the
messages still name each row's own item and cell, in the order of the cells.
"""

from __future__ import annotations

from pathlib import Path

from rating.inventory import schema as sc
from rating.inventory.book import Book, SheetGrid
from rating.inventory.problems import ProblemLog
from rating.inventory.tables import read_table

SPEC = sc.EYEBARS
NCOLS = len(SPEC.columns) + 1


def _book(data_rows: list[dict[str, object]]) -> Book:
    header = (sc.MARK_HEADER, *(c.header for c in SPEC.columns))
    rows = [(SPEC.title,) + (None,) * (NCOLS - 1), (None,) * NCOLS, header]
    for values in data_rows:
        rows.append((None, *(values.get(c.key) for c in SPEC.columns)))
    grid = SheetGrid(SPEC.name, tuple(tuple(r) for r in rows), {}, (), False)
    return Book(Path("w.xlsx"), (SPEC.name,), {SPEC.name: grid})


def _row(section: str, thickness: object) -> dict[str, object]:
    return {"section": section, "count": 2, "width": 3.0, "thickness": thickness,
            "head_diameter": 8.0, "hole_diameter": 3.5}


def test_repeated_bad_value_is_reported_at_each_row_with_its_item() -> None:
    log = ProblemLog()
    table = read_table(_book([_row("BC", 0.0), _row("DG", 0.0), _row("HG", 0.875)]), SPEC,
                       False, log)
    errors = [(p.where, p.message) for p in log.problems if p.severity == "error"]
    assert errors == [
        ("Eyebars!E4", "Bar thickness of section BC must be greater than 0 in; found 0 in"),
        ("Eyebars!E5", "Bar thickness of section DG must be greater than 0 in; found 0 in"),
    ]
    assert [r.ok for r in table.rows] == [False, False, True]
    assert table.rows[2].get("thickness") == 0.875


def test_negative_zero_is_quoted_as_entered() -> None:
    log = ProblemLog()
    read_table(_book([_row("BC", 0.0), _row("DG", -0.0), _row("EP", 0.0)]), SPEC, False, log)
    found = [p.message.rsplit("found ", 1)[1] for p in log.problems]
    assert found == ["0 in", "-0 in", "0 in"]


def test_repeated_warning_and_key_value_messages_in_cell_order() -> None:
    log = ProblemLog()
    rows = [_row("BC", 4.0), _row("BC", 4.0), {**_row("", 4.0), "count": 2.5}]
    read_table(_book(rows), SPEC, False, log)
    got = [(p.severity, p.where, p.message.split(";")[0]) for p in log.problems]
    assert got == [
        ("warning", "Eyebars!E4", "Bar thickness of section BC: 4 in is unusually large "
         "(above 2.5 in)"),
        ("warning", "Eyebars!E5", "Bar thickness of section BC: 4 in is unusually large "
         "(above 2.5 in)"),
        ("error", "Eyebars!B6", "Section id is required and is blank"),
        ("error", "Eyebars!C6", "Bars must be a whole number"),
        ("warning", "Eyebars!E6", "Bar thickness: 4 in is unusually large (above 2.5 in)"),
    ]
