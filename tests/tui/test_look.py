"""The look comes from the theme: no colour literal in the UI's Python; with a dark and a
light theme (and the 16 ANSI colours) at 80x24 the grid's symbols still tell hard, soft,
leave, request and lock apart without colour; a theme switch repaints the grid."""

from __future__ import annotations

import re
import shutil
from pathlib import Path

import pytest

import rostertui.tui
from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.widgets.grid import RosterGrid
from tests.conftest import FIXTURES
from tests.tui.conftest import run
from tests.tui.pilot import grid_of

HEX = re.compile(r"#[0-9a-fA-F]{6}(?:[0-9a-fA-F]{2})?\b")  # #rrggbb, #rrggbbaa
RITA = "c13"  # on leave 15-18 Mar (days 0-3)


def test_no_colour_literal_in_the_tui_python() -> None:
    root = Path(rostertui.tui.__file__).parent
    found = [f"{path.relative_to(root)}:{n}: {line.strip()}"
             for path in sorted(root.rglob("*.py"))
             for n, line in enumerate(path.read_text(encoding="utf-8").splitlines(), 1)
             if HEX.search(line) and not line.lstrip().startswith("#")]
    assert found == []


def painted(grid: RosterGrid, pid: str) -> str:
    """A person's whole row as the grid paints it (on screen or not), without styles."""
    fixed, canvas = grid.painter().person(pid, None)
    return "".join(s.text for s in fixed) + "".join(s.text for s in canvas)


def cell(grid: RosterGrid, pid: str, day: int) -> list[str]:
    """The three parts of a cell: request mark, code, lock mark."""
    row = grid.painter()._cell(pid, grid.view.days[day],
                               grid.session.roster.rows[pid][day], False)
    return [s.text.strip() for s in row]


# ansi-dark: Textual's theme of the 16 ANSI colours, for a 16-colour terminal
@pytest.mark.parametrize("theme", ["textual-dark", "textual-light", "ansi-dark"])
def test_symbols_tell_the_states_apart_in_either_theme(clinic: Path, theme: str) -> None:
    shutil.copyfile(FIXTURES / "clinic_solved_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(80, 24)) as pilot:
            app.theme = theme
            await pilot.pause()
            grid = grid_of(app)
            session = app.session
            assert session.check.hard_violations == 0
            soft = {v.person for v in session.check.violations if not v.hard and v.person}
            flags = {pid: painted(grid, pid)[0] for pid in session.ws.person_ids}
            assert "▲" in {flags[p] for p in soft}  # soft: a triangle before the name
            assert set(flags.values()) <= {"▲", " "}
            assert cell(grid, RITA, 1)[1] == "~"  # leave
            session.set_cell(RITA, 0, "E")  # on leave: hard
            session.toggle_lock("c01", 5)
            app.revised()
            await pilot.pause()
            assert painted(grid, RITA)[0] == "✖"
            assert cell(grid, "c01", 5)[2] == "#"  # lock
            (pid, day), _asks = next(iter(grid.view.requests.items()))
            assert cell(grid, pid, day)[0] == "*"  # a request
            styles = grid.painter().s
            backgrounds = {styles[n].bgcolor for n in ("hard", "soft", "leave", "mark",
                                                       "changed", "weekend")}
            assert len(backgrounds) == 6  # and colour tells them apart too

    run(go)


def test_a_theme_switch_repaints_the_grid(clinic_ws) -> None:
    async def go() -> None:
        app = RosterApp(clinic_ws)
        async with app.run_test(size=(80, 24)) as pilot:
            app.theme = "textual-dark"
            await pilot.pause()
            grid = grid_of(app)
            dark = grid.painter().s["hard"].bgcolor, grid.painter().colours["E"].color
            line = list(grid.render_line(2))
            app.theme = "textual-light"
            await pilot.pause()
            light = grid.painter().s["hard"].bgcolor, grid.painter().colours["E"].color
            assert dark[0] != light[0] and dark[1] != light[1]
            assert [s.style for s in grid.render_line(2)] != [s.style for s in line]

    run(go)
