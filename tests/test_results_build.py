"""What rating.results_build relies on to convert each wording once: an SI bridge's
"member X: words" lines convert as their two parts (no quantity reaches across ": ")."""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st

from rating.units import si_text

# pieces that make quantities (and near misses) in the wording of warnings and assumptions
PIECES = st.sampled_from([
    "2.24803 in", "26 ksi", "-3.5 kip", "12 ft", "0.5 in2", "1/32 in", "'3 in'", "in", "ft",
    "tons", "10 tons", "kip-in", "1e-3 in", "-", ":", ": ", " ", "x", "(", ")", "2", "L2U3",
    "12in", "phi_c = 0.95", "B5", "5 ", "in:", "ft: ", "3:", "^2", "²",
])
WORDS = st.lists(PIECES, max_size=12).map("".join)


@settings(max_examples=400, deadline=None)
@given(label=WORDS, words=WORDS)
def test_member_line_converts_as_its_two_parts(label: str, words: str) -> None:
    line = f"member {label}: {words}"
    head, sep, rest = line.partition(": ")  # as build_results splits it
    assert si_text(line) == si_text(head + sep) + si_text(rest)
