"""rating.arrays against numpy's own functions (numpy is the reference here)."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import numpy as np
from hypothesis import given
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from rating.arrays import blocks, distinct_sorted, first_of_distinct_rows


@given(arrays(np.int64, st.tuples(st.integers(0, 6), st.integers(1, 5)),
              elements=st.integers(-4, 40)))
def test_distinct_sorted_is_numpys_unique(values: np.ndarray) -> None:
    got = distinct_sorted(values)
    want = np.unique(values)
    assert got.dtype == want.dtype
    np.testing.assert_array_equal(got, want)


@given(arrays(np.float64, st.tuples(st.integers(0, 12), st.integers(1, 3)),
              elements=st.sampled_from([-1.5, -0.0, 0.0, 0.25, 2.0, 7.0])))
def test_first_of_distinct_rows_is_numpys_unique_over_rows(keys: np.ndarray) -> None:
    got = first_of_distinct_rows(keys)
    want = (np.sort(np.unique(keys, axis=0, return_index=True)[1]) if keys.shape[0]
            else np.zeros(0, dtype=int))
    np.testing.assert_array_equal(got, want)


def test_a_rating_does_not_import_numpy_ma() -> None:
    # np.unique and np.setdiff1d import numpy.ma on their first call (about 25 ms of a
    # one-workbook run): the rating chain avoids them. The torsion analysis of a built-up
    # compression member imports scipy, and numpy.ma with it (rating.capacity.torsion), so
    # the pony sample is rated here with rolled shapes in place of its built-up members.
    code = ("import sys\n"
            "from dataclasses import replace\n"
            "from pathlib import Path\n"
            "from rating.inventory.reader import read_workbook\n"
            "from rating.lrfr.engine import rate_bridge\n"
            "from rating.model import BuiltUpSection, RolledShape\n"
            "book = sorted(Path('sample_inventory').glob('*pony*.xlsx'))[0]\n"
            "b = read_workbook(book).bridge\n"
            "w = RolledShape('W8x31', 9.13, 3.47, 2.02)\n"
            "built = {d.member for d in b.member_designs\n"
            "         if isinstance(d.section, BuiltUpSection)}\n"
            "b = replace(b, member_designs=tuple(replace(d, section=w) if d.member in built\n"
            "                                    else d for d in b.member_designs),\n"
            "            findings=tuple(f for f in b.findings if f.member not in built))\n"
            "rate_bridge(b)\n"
            "print('numpy.ma' in sys.modules, 'scipy' in sys.modules)\n")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True, cwd=Path(__file__).resolve().parents[1])
    assert out.stdout.strip() == "False False"


@given(st.lists(st.integers(0, 5), max_size=60).map(sorted),
       st.integers(1, 50), st.integers(1, 200))
def test_blocks_cover_every_item_once_and_keep_runs_whole(keys, per_item, budget) -> None:
    keys = np.array(keys, dtype=int)
    got = blocks(keys, per_item, budget)
    size = max(budget // per_item, 1)
    # consecutive, covering 0..n, none empty
    assert [b.start for b in got] == ([0] + [b.stop for b in got[:-1]] if got else [])
    assert (got[-1].stop if got else 0) == keys.size
    assert all(b.stop > b.start for b in got)
    for b in got:
        # a run of equal keys is never split; a block is over its size only by one run
        if b.start:
            assert keys[b.start] != keys[b.start - 1]
        if b.stop - b.start > size:
            assert keys[b.start + size - 1] == keys[b.stop - 1]
    if keys.size <= size:
        assert len(got) == (1 if keys.size else 0)
