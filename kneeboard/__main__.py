import sys

from kneeboard.cli import main

sys.exit(main())
