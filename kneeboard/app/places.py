"""Where the app keeps its own files: its data folder (crash recovery) and its copy of the sample fleet."""

from pathlib import Path


def data_folder() -> Path:
    """The app's own folder for its data (the sample fleet's copy, crash recovery): `kneeboard` in the system's
    place for application data (`~/.local/share/kneeboard` on Linux, or under `$XDG_DATA_HOME`). Named here once:
    Qt's per-application location adds the organization's name to the application's, `kneeboard/kneeboard`."""
    from PySide6.QtCore import QStandardPaths

    data = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.GenericDataLocation)
    return Path(data) / "kneeboard" if data else Path.home() / ".kneeboard"


def sample_fleet() -> Path:
    """A copy of the invented sample fleet in the app's data folder, to try the app on and edit freely (the
    installed samples stay as shipped); files already copied, and a person's edits to them, are kept."""
    from kneeboard.shipped import copy_samples

    return copy_samples(data_folder() / "sample fleet")
