"""Test configuration: headless Qt for every test, and shared fixtures."""

import os
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import pytest  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_aircraft"

MINIMAL = """\
schema = 1

[aircraft]
registration = "TEST-1"
model = "Test aircraft (invented)"
max_weight = "750 kg"

[[configuration]]
name = "Flaps up"
stall_speed = "50 kt"
"""


@pytest.fixture
def sample_paths():
    return sorted(SAMPLES.glob("*.toml"))


@pytest.fixture
def minimal_text():
    return MINIMAL
