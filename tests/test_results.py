"""Helpers of the results layer that the report and the batch share."""

from __future__ import annotations

import pytest

from rating.results import bears_on_the_decision


@pytest.mark.parametrize(("warning", "bears"), [
    ("OUT OF SERVICE: member(s) L3U4 have every bar loose", True),
    ("BENT COUNTER RELIED ON: member L3U4 is recorded bent", True),
    ("member L0L1: pack rust recorded", False),
    ("Bridge!B10: assumed: Steel of unknown grade", False),
    ("NO COLON IN THIS ONE", False),
    ("L3U4: a member label is one word, not a heading", False),
    ("BENT SUB-TIE RELIED ON: member M1 is recorded bent", True),
    ("1 2 3: digits only", False),
])
def test_a_warning_that_bears_on_the_decision_is_headed_in_capitals(warning: str,
                                                                    bears: bool) -> None:
    assert bears_on_the_decision(warning) is bears
