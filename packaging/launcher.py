"""The standalone program's entry point: the same `kneeboard` command a pip or pipx install puts on PATH."""

from kneeboard.cli import main_exit

main_exit()
