"""The rating report: one self-contained HTML file with SVG drawings, for print."""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

if TYPE_CHECKING:
    from rating.report.html import render_report

__all__ = ["render_report"]


def __getattr__(name: str) -> Any:
    # loaded on first use: the batch's index needs the templates and bands, not the drawings
    # (numpy) or the view
    if name == "render_report":
        from rating.report.html import render_report

        return render_report
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
