"""Text from the workbook (names, notes, photo references) as HTML table cells show it."""

from __future__ import annotations

import re

from markupsafe import Markup, escape

LONG_RUN = 16
"""Characters: a run without a space longer than this is given a place to break every
:data:`RUN_PIECE` characters."""
RUN_PIECE = 12

_RUNS = re.compile(r"(\s+)")


def breakable(text: object) -> Markup:
    """``text`` escaped, with a line-break opportunity (``<wbr>``) every :data:`RUN_PIECE`
    characters of each run without a space longer than :data:`LONG_RUN` characters.

    The report's tables keep words whole (a column is as wide as its longest word); a long
    unbroken entry from the workbook (a path, a link, a file name) would then push its table
    off the printed page. Markup (already HTML) is returned as it is."""
    if isinstance(text, Markup):
        return text
    s = str(text)
    if len(s) <= LONG_RUN:
        return escape(s)
    out = []
    for part in _RUNS.split(s):
        if len(part) > LONG_RUN and not part.isspace():
            out.append(Markup("<wbr>").join(escape(part[i:i + RUN_PIECE])
                                            for i in range(0, len(part), RUN_PIECE)))
        else:
            out.append(escape(part))
    return Markup("").join(out)
