"""``python -m similitude`` runs the command line."""

from similitude.cli import main

raise SystemExit(main())
