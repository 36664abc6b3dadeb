"""What kneeboard ships inside its package: the default card style, the profile templates and the sample fleet.

They live at the top of the repository (`resources/`, `sample_aircraft/`) and travel in the wheel as the data-only
packages `kneeboard.resources` and `kneeboard.samples`; they are found through `importlib.resources`, never through
the source tree, so a clone, an editable install and an installed wheel all find the same files.

The installed package is never written to: a person who opens the samples works on a copy in a folder of their own.
"""

import os
import re
import shutil
from importlib.resources import files
from pathlib import Path

CATEGORIES_WITH_TEMPLATES = ("normal", "utility", "acrobatic", "glider")


def _path(package: str, name: str = "") -> Path:
    # Installed packages are plain folders (pip unpacks wheels), so the traversable is a real path.
    return Path(os.fspath(files(package).joinpath(name) if name else files(package)))


def default_style_path() -> Path:
    """The shipped default card style."""
    return _path("kneeboard.resources", "default.style.toml")


def template_path(category: str) -> Path:
    """The template of a new profile of `category` ("normal", "utility", "acrobatic", "glider")."""
    if category not in CATEGORIES_WITH_TEMPLATES:
        raise ValueError(f"no template for the category {category!r}")
    return _path("kneeboard.resources.templates", f"{category}.toml")


#: An optional key a template shows as a commented example: "# best_glide_speed = ..."
_EXAMPLE = re.compile(r"^# ([a-z_]+ = )", re.MULTILINE)


def template_data(category: str) -> dict | None:
    """The plain data of a category's template, its commented examples included (a value left as the example is
    a placeholder too), or None when there is no such template. Raises FileProblem when the shipped template
    cannot be read (a broken installation): a profile made from it is never read as if it had no placeholders."""
    from kneeboard.fileio import FileProblem, read_text
    from kneeboard.i18n import Msg
    from kneeboard.inputs.toml import parse_text

    if category not in CATEGORIES_WITH_TEMPLATES:
        return None
    path = template_path(category)
    data, problems = parse_text(_EXAMPLE.sub(r"\1", read_text(path)))
    if data is None:
        raise FileProblem(Msg("{file}: the shipped template {problem}; reinstall kneeboard", file=str(path),
                              problem=problems[0].message))
    return data


def samples_folder() -> Path:
    """The shipped sample fleet (read only: copy it with `copy_samples` before editing)."""
    return _path("kneeboard.samples")


def sample_files() -> list[Path]:
    return sorted(p for p in samples_folder().iterdir() if p.suffix == ".toml")


#: the style a fleet folder's cards use, defined here alone (kneeboard.inputs.styles reads it under this name)
FLEET_STYLE = "fleet.style.toml"


def sample_fleet_files() -> list[tuple[Path, str]]:
    """What a copy of the sample fleet holds, as (shipped file, name in the copy): the sample profiles, and the
    default card style as the fleet's own style, to edit. The app's first start and `kneeboard samples` copy these."""
    return [(p, p.name) for p in sample_files()] + [(default_style_path(), FLEET_STYLE)]


def copy_samples(destination: Path) -> Path:
    """Copy the sample fleet into `destination` (created), leaving files already there alone; returns it.

    A person's own edits to an earlier copy are never overwritten.
    """
    destination = Path(destination)
    destination.mkdir(parents=True, exist_ok=True)
    for source, name in sample_fleet_files():
        target = destination / name
        if not target.exists():
            shutil.copyfile(source, target)
    return destination
