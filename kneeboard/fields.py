"""Kept for card/style.py until it moves to kneeboard.inputs: profile keys are declared in inputs/profile_keys.py."""

from kneeboard.inputs.profile_keys import MAX_BANK_DEG  # noqa: F401 - kept for card/style.py until it moves
