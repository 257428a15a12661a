"""``python -m app`` runs the ``poise`` command."""

import sys

from app.cli import main

sys.exit(main())
