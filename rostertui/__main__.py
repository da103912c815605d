"""`python -m rostertui` runs the command line."""

from rostertui.cli.main import main

raise SystemExit(main())
