"""The rating report as one self-contained HTML file (inline CSS and SVG, no scripts, no
network resources), rendered with jinja2 (autoescape on) from the templates shipped as
package data (``rating/templates``, the project's ``templates/`` folder)."""

from __future__ import annotations

from rating.errors import InputError
from rating.report.bands import RFBands
from rating.report.jinja import css_string, environment, template_dir
from rating.report.view import PAPERS, build_view
from rating.results import RatingResults

__all__ = ["PAPER_CHOICES", "css_string", "environment", "render_report", "template_dir"]

PAPER_CHOICES = ("letter", "a4", "auto")


def render_report(results: RatingResults, *, paper: str | None = None,
                  bands: RFBands | None = None) -> str:
    """The rating report of one bridge as a self-contained HTML document.

    ``paper``: "letter", "a4" or "auto" (left to the print dialog); by default Letter for
    US customary units and A4 for SI. ``bands``: the RF limits used to shade the drawing
    (default 0.3, 1.0, 1.2).
    """
    if paper is not None and paper.strip().lower() not in PAPER_CHOICES:
        raise InputError(f"paper size {paper!r} is not known; choose one of "
                         + ", ".join(PAPER_CHOICES), where="paper")
    view = build_view(results, paper=paper, bands=bands)
    page_size = PAPERS[view.paper][0] if view.paper in PAPERS else "auto"
    return environment().get_template("report.html.j2").render(v=view, page_size=page_size)
