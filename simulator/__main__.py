"""``python -m simulator`` is the same as the ``tubesim`` command."""
import sys

from simulator.cli import main

sys.exit(main())
