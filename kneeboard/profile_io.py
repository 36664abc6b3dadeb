"""Kept for card/style.py until it moves to kneeboard.inputs: profile files are read in kneeboard/inputs/."""

from kneeboard.inputs.toml import parse_text  # noqa: F401 - kept for card/style.py until it moves
