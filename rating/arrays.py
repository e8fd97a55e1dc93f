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


def first_of_distinct_rows(keys: np.ndarray) -> np.ndarray:
    """Indices of the first occurrence of each distinct row of ``keys`` (n, k), in
    increasing order (``np.sort(np.unique(keys, axis=0, return_index=True)[1])``).

    Written out because ``np.unique`` over rows views them as records and sorts those: a
    few times slower than one stable lexicographic sort of the columns."""
    n = keys.shape[0]
    if n < 2:
        return np.arange(n)
    order = np.lexsort(keys.T[::-1])  # stable: equal rows keep their order
    s = keys[order]
    new = np.concatenate(([True], (s[1:] != s[:-1]).any(axis=1)))
    return np.sort(order[new])


BLOCK_ELEMENTS = 4_000_000
"""Array elements (32 MiB of floats) a search's temporaries take at a time where it works in
blocks (:func:`blocks`): on a large truss (16 panels, counters or rods in every panel) the
searches over every position at once made temporaries of several GiB."""


def blocks(keys: np.ndarray, per_item: int, budget: int | None = None) -> list[slice]:
    """Consecutive slices of ``keys`` (n,) holding about ``budget / per_item`` items each
    (``budget``: :data:`BLOCK_ELEMENTS` unless given), never splitting a run of equal keys
    (the pieces of one position's path, say): the work of each item stays whole within one
    block. One slice for all where they fit; none for no items."""
    n = keys.size
    size = max((BLOCK_ELEMENTS if budget is None else budget) // max(per_item, 1), 1)
    if n <= size:
        return [slice(0, n)] if n else []
    starts = np.flatnonzero(np.concatenate(([True], keys[1:] != keys[:-1])))
    out, s = [], 0
    while s < n:
        i = int(np.searchsorted(starts, s + size))
        e = int(starts[i]) if i < starts.size else n
        out.append(slice(s, e))
        s = e
    return out
