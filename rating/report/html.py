"""The rating report as one self-contained HTML file (inline CSS and SVG, no scripts, no
network resources), rendered with jinja2 (autoescape on) from the templates shipped as
package data (``rating/templates``, the project's ``templates/`` folder)."""

from __future__ import annotations

from functools import lru_cache
from importlib import resources
from pathlib import Path

import jinja2
from markupsafe import Markup

from rating.errors import InputError, PintrussError
from rating.report.svg import RFBands
from rating.report.view import PAPERS, build_view
from rating.results import RatingResults

PAPER_CHOICES = ("letter", "a4", "auto")


def template_dir() -> Path:
    """Folder of the report templates: the package data of an installed wheel, or the
    ``templates/`` folder of a source checkout."""
    packaged = resources.files("rating").joinpath("templates")
    candidates = [Path(str(packaged)), Path(__file__).resolve().parents[2] / "templates"]
    for c in candidates:
        if (c / "report.html.j2").is_file():
            return c
    raise PintrussError(
        "the report templates are missing from this installation (looked in "
        + ", ".join(str(c) for c in candidates) + "); reinstall pintruss")


def css_string(text: str) -> Markup:
    """A CSS string literal with every character outside [A-Za-z0-9 ,.] escaped (safe inside
    a <style> element whatever the text holds)."""
    out = []
    for ch in str(text):
        if ch.isascii() and (ch.isalnum() or ch in " ,."):
            out.append(ch)
        else:
            out.append(f"\\{ord(ch):06X}")
    return Markup('"' + "".join(out) + '"')


@lru_cache(maxsize=1)
def environment() -> jinja2.Environment:
    """The jinja2 environment (autoescape on for every template, strict undefined)."""
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(str(template_dir())),
        autoescape=True,
        undefined=jinja2.StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
        keep_trailing_newline=True,
        auto_reload=False,  # the templates are package data: never changed while running
    )
    env.filters["css_string"] = css_string
    return env


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
