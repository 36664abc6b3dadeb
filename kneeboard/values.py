"""Kept for card/style.py until it moves to kneeboard.inputs: the text rules are in inputs/values.py."""

from kneeboard.inputs.values import first_non_text, key_text  # noqa: F401 - kept for card/style.py until it moves
