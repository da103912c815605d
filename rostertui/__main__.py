"""`python -m rostertui` runs the command line."""

from rostertui.cli.main import main

# guarded: a process started by `spawn` (the workers of `solve-many`'s local cluster)
# imports this module again under another name and must not run the command line
if __name__ == "__main__":
    raise SystemExit(main())
