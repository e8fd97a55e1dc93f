"""The jinja2 environment of the report and of the batch index: templates shipped as package
data (``rating/templates``, the project's ``templates/`` folder), autoescape on.

Apart from :mod:`rating.report.html` (and the drawings it needs) so that the batch's index is
rendered without loading them.
"""

from __future__ import annotations

from functools import lru_cache
from importlib import resources
from pathlib import Path

import jinja2
from markupsafe import Markup

from rating.errors import PintrussError


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
