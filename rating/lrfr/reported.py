"""The rating factor as reported: the rounding every printed RF, RT and posting load share.

Kept free of numpy so that the batch's parent process, which only writes the summary, can
use it without loading the engine's libraries.
"""

from __future__ import annotations

import math

RF_DECIMALS = 2
"""Rating factors are reported to two decimals, rounded down (common practice)."""


def reported_rf(rf: float) -> float:
    """The rating factor as the report prints it, and as RT and the posting load are worked
    from: two decimals, rounded down, never up (0.996 is 0.99: rounding up could hide a
    posting), so that a reviewer recomputes the printed RT and posting load from the printed
    RF and W (common practice). Infinite and NaN values are returned unchanged."""
    if not math.isfinite(rf):
        return rf
    scale = 10.0 ** RF_DECIMALS
    return math.floor(rf * scale + 1e-7) / scale
