"""Data shipped with kneeboard: the default card style and the profile templates (no code)."""
