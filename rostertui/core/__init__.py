"""The pure core of rostertui: models, file I/O, checker, solver, statistics.

Nothing under this package imports the terminal UI or the command line.
"""
