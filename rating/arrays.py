"""Small array helpers shared by the searches."""

from __future__ import annotations

import numpy as np


def distinct_sorted(values: np.ndarray) -> np.ndarray:
    """The distinct values of an integer array, in increasing order (``np.unique(values)``).

    Written out because numpy's plain ``np.unique`` asks ``np.ma.is_masked`` and so imports
    numpy.ma on its first call: about 25 ms of a one-workbook run, for nothing here."""
    flat = np.sort(np.ravel(values))
    if flat.size < 2:
        return flat
    return flat[np.concatenate(([True], flat[1:] != flat[:-1]))]
