"""Text from the workbook (names, notes, photo references) as HTML table cells show it."""

from __future__ import annotations

import re

from markupsafe import Markup, escape

LONG_RUN = 16
"""Characters: a run without a space longer than this is given a place to break every
:data:`RUN_PIECE` characters."""
RUN_PIECE = 12

_RUNS = re.compile(r"(\s+)")
_AFTER_HYPHEN = re.compile(r"(?<=-)(?=.)")


def breakable(text: object) -> Markup:
    """``text`` escaped, with line-break opportunities (``<wbr>``) in each run without a
    space longer than :data:`LONG_RUN` characters: after each hyphen of the run (so a long
    hyphenated word breaks where a reader expects, "emergency-/vehicle"), and every
    :data:`RUN_PIECE` characters of a piece between hyphens still longer than the limit.

    The report's tables keep words whole (a column is as wide as its longest word); a long
    unbroken entry from the workbook (a path, a link, a file name) would then push its table
    off the printed page. Markup (already HTML) is returned as it is."""
    if isinstance(text, Markup):
        return text
    s = str(text)
    if len(s) <= LONG_RUN:
        return escape(s)
    out = []
    wbr = Markup("<wbr>")
    for part in _RUNS.split(s):
        if len(part) > LONG_RUN and not part.isspace():
            out.append(wbr.join(
                escape(piece) if len(piece) <= LONG_RUN
                else wbr.join(escape(piece[i:i + RUN_PIECE])
                              for i in range(0, len(piece), RUN_PIECE))
                for piece in _AFTER_HYPHEN.split(part)))
        else:
            out.append(escape(part))
    return Markup("").join(out)
