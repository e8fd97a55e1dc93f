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
from rating.report.text import breakable


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
    a <style> element whatever the text holds). Each escape is six hex digits and a space:
    CSS reads one whitespace after a hex escape as its end (CSS Syntax Module Level 3,
    "consume an escaped code point", 4.3.7: section number from memory), so a
    space of the text right after an escaped character is kept only because of it."""
    out = []
    for ch in str(text):
        if ch.isascii() and (ch.isalnum() or ch in " ,."):
            out.append(ch)
        else:
            out.append(f"\\{ord(ch):06X} ")
    return Markup('"' + "".join(out) + '"')


class TemplateCodeCache(jinja2.FileSystemBytecodeCache):
    """The compiled templates kept between runs, as Python keeps its bytecode: jinja2's own
    cache (keyed by the template's name and checked against a checksum of its source), in
    jinja2's private folder for this user under the system's temporary folder (jinja2 makes
    it readable and writable by its owner alone, and checks so before using it). Compiling
    the two templates costs about 0.1 s of a one-workbook run. A cache that cannot be read or
    written is simply not used."""

    def load_bytecode(self, bucket: jinja2.bccache.Bucket) -> None:
        try:
            super().load_bytecode(bucket)
        except Exception:  # unreadable or damaged (jinja2 unpickles its header): compile
            bucket.reset()

    def dump_bytecode(self, bucket: jinja2.bccache.Bucket) -> None:
        try:
            super().dump_bytecode(bucket)
        except OSError:
            pass


def _code_cache() -> jinja2.BytecodeCache | None:
    try:
        return TemplateCodeCache(pattern="pintruss-%s.cache")
    except (OSError, RuntimeError):  # no private temporary folder: compile each run
        return None


@lru_cache(maxsize=1)
def environment() -> jinja2.Environment:
    """The jinja2 environment (autoescape on for every template, strict undefined), with the
    compiled templates kept between runs where the system allows it."""
    return build_environment(_code_cache())


def build_environment(code_cache: jinja2.BytecodeCache | None) -> jinja2.Environment:
    """A fresh jinja2 environment of the report's templates with the given cache of
    compiled templates (None: compile each time)."""
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(str(template_dir())),
        bytecode_cache=code_cache,
        autoescape=True,
        undefined=jinja2.StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
        keep_trailing_newline=True,
        auto_reload=False,  # the templates are package data: never changed while running
    )
    env.filters["css_string"] = css_string
    env.filters["breakable"] = breakable
    return env
