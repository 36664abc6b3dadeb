"""Older profile formats brought up to the current one, and where the original of a migrated file is kept."""

from pathlib import Path

from kneeboard.inputs.toml import parse_text

FORMAT_0 = 0  #: files written before profiles carried a format number (no `schema` key)


def file_format(text: str) -> int | None:
    """The format number a profile text declares: 0 when it has none, None when it cannot be read."""
    data, _ = parse_text(text)
    if data is None:
        return None
    version = data.get("schema", FORMAT_0)
    return version if isinstance(version, int) and not isinstance(version, bool) else None


def migrate_text(text: str) -> tuple[str, int | None]:
    """Bring an older profile text up to the current format; returns (text, the old format or None).

    Format 0 is format 1 without its number: migrating adds `schema = 1` after the leading comments.
    """
    if file_format(text) != FORMAT_0:
        return text, None
    lines = text.splitlines(keepends=True)
    at = 0
    while at < len(lines) and lines[at].lstrip().startswith("#"):
        at += 1
    gap = [] if at < len(lines) and not lines[at].strip() else ["\n"]
    from kneeboard.inputs.schema import SCHEMA_VERSION

    return "".join(lines[:at] + [f"schema = {SCHEMA_VERSION}\n"] + gap + lines[at:]), FORMAT_0


def backup_path(path: Path, old_format: int) -> Path:
    """Where the original of a migrated file is kept when it is first saved over."""
    return path.with_name(f"{path.name}.format{old_format}.bak")
