"""The fleet floor: a bare reportlab process drawing PAGES pages of the given marks into OUT.pdf.

    python -m benchmarks.floors.bare_fleet INK.json PAGES OUT.pdf

INK.json holds {"fonts": {name: file}, "pages": [...]} (see benchmarks.ink): the sheets of the fleet's first cards,
drawn in turn until PAGES pages are on paper, so the file has as many pages as the fleet's, with as much ink.
"""

import json
import sys
from pathlib import Path

from benchmarks import ink


def main(argv: list[str]) -> int:
    spec_file, pages, out = argv
    spec = json.loads(Path(spec_file).read_text())
    ink.register(spec["fonts"])
    Path(out).write_bytes(ink.pdf(spec["pages"], int(pages)))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
