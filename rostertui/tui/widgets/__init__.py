"""Widgets of the terminal UI: the roster grid, status lines, bars."""
