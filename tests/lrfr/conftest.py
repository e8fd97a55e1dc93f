"""Fixtures of the rating-engine tests."""

from __future__ import annotations

import pytest
from demo_bridge import make_pratt_bridge

from rating.model import Bridge


@pytest.fixture(scope="session")
def pratt_bridge() -> Bridge:
    return make_pratt_bridge()
