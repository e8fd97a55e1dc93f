"""Helpers shared by the report tests (a module of its own, so that test modules never import
from a conftest: several test folders have one)."""

from __future__ import annotations

import importlib.util
from pathlib import Path
from typing import Any

REPO = Path(__file__).resolve().parents[2]
SAMPLES = REPO / "sample_inventory"


def sample_workbooks(tmp: Path) -> list[Path]:
    """The bundled sample workbooks; generated into ``tmp`` when not written yet."""
    books = sorted(p for p in SAMPLES.glob("*.xlsx") if not p.name.startswith("~$"))
    if books or not (SAMPLES / "make_samples.py").is_file():
        return books
    spec = importlib.util.spec_from_file_location("make_samples", SAMPLES / "make_samples.py")
    if spec is None or spec.loader is None:
        return []
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return sorted(mod.write_all(tmp))


def smallest_rated(outcomes: list[Any]) -> Any | None:
    """The rated sample with the fewest members (the quickest to rate again)."""
    rated = [o for o in outcomes if o.results is not None]
    return min(rated, key=lambda o: len(o.results.members), default=None)
