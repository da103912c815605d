"""rostertui: build, repair and audit staff rosters from the terminal."""

__version__ = "0.1.0"
