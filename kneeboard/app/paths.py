"""Folders the app starts from: the repository's sample fleet, templates and styles."""

from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = ROOT / "sample_aircraft"
TEMPLATES = ROOT / "resources" / "templates"
