"""Helpers for the pilot tests: read what the grid paints, the status lines, a table."""

from __future__ import annotations

from rich.segment import Segment
from textual.app import App
from textual.widgets import DataTable, Static

from rostertui.tui.widgets.grid import RosterGrid
from rostertui.tui.widgets.grid_paint import HEADER


def grid_of(app: App) -> RosterGrid:
    return app.screen.query_one(RosterGrid)


def row_segments(grid: RosterGrid, person: str) -> list[Segment]:
    """The segments the grid paints for a person's row (the row must be on screen)."""
    index = next(i for i, r in enumerate(grid.rows) if r.key == person and r.kind == "person")
    y = HEADER + index - int(grid.scroll_y)
    assert 0 <= y < grid.size.height, f"{person} is not on screen"
    return list(grid.render_line(y))


def row_text(grid: RosterGrid, person: str) -> str:
    return "".join(s.text for s in row_segments(grid, person))


def cell_segment(grid: RosterGrid, person: str, day: int) -> Segment:
    """The middle segment (the code) of a person's cell on a day."""
    x = grid.grid_layout.fixed_w + grid.grid_layout.day_x[day] - int(grid.scroll_x) + 1
    at = 0
    for seg in row_segments(grid, person):
        if at <= x < at + seg.cell_length:
            return seg
        at += seg.cell_length
    raise AssertionError(f"no segment at x={x}")


def status_text(app: App) -> str:
    return str(app.screen.query_one("#status", Static).content)


def table_rows(table: DataTable) -> list[list[str]]:
    return [[str(c) for c in table.get_row_at(i)] for i in range(table.row_count)]
