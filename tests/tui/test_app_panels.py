"""The violations and fairness panels, and help, driven with the pilot."""

from __future__ import annotations

import io
from pathlib import Path

from rich.console import Console
from textual.widgets import DataTable, Select, Static

from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.fairness import FairnessScreen
from rostertui.tui.screens.help import HelpScreen
from rostertui.tui.screens.roster import RosterScreen
from rostertui.tui.screens.violations import ViolationsScreen
from tests.tui.conftest import run
from tests.tui.pilot import grid_of, table_rows


def test_the_violations_panel_lists_filters_and_leads_to_the_cell(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(140, 40)) as pilot:
            await pilot.press(*["down"] * 12, *["right"] * 2, "N")  # Rita, 17 Mar: on leave
            check = app.session.check
            await pilot.press("f3")
            screen = app.screen
            assert isinstance(screen, ViolationsScreen)
            table = screen.query_one(DataTable)
            assert table.row_count == len(check.violations)
            first = table_rows(table)[0]  # hard first, then by date: 15 Mar cover
            assert first[0] == "✖"
            leave = [r for r in table_rows(table) if r[5] == "leave"]
            assert leave == [["✖", "17 Mar", "Rita Moinhola", "N on 17 Mar, a leave day", "hard",
                              "leave", ""]]
            await pilot.press("h")
            assert table.row_count == check.hard_violations
            assert {r[0] for r in table_rows(table)} == {"✖"}
            await pilot.press("s")
            soft = len(check.violations) - check.hard_violations
            assert table.row_count == soft and {r[0] for r in table_rows(table)} == {"▲"}
            await pilot.press("a")
            screen.query_one("#person", Select).value = "c13"
            await pilot.pause()
            assert {r[2] for r in table_rows(table)} == {"Rita Moinhola"}
            screen.query_one("#rule", Select).value = "leave"
            await pilot.pause()
            assert table.row_count == 1
            assert "1 of" in str(screen.query_one("#count").content)
            table.focus()
            await pilot.press("enter")  # to the grid, on the violation's cell
            await pilot.pause()
            assert isinstance(app.screen, RosterScreen)
            grid = grid_of(app)
            assert (grid.person, grid.day) == ("c13", 2)

    run(go)


def test_the_violations_panel_follows_edits(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(140, 40)) as pilot:
            await pilot.press("f3")
            table = app.screen.query_one(DataTable)
            before = table.row_count
            await pilot.press("f2", *["down"] * 12, "E", "f3")
            assert table.row_count == len(app.session.check.violations) != before
            assert any(r[5] == "leave" for r in table_rows(table))

    run(go)


def test_the_fairness_panel_draws_bars_per_person_and_group(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(160, 40)) as pilot:
            await pilot.press("N", "right", "N", "right", "N", "f4")
            assert isinstance(app.screen, FairnessScreen)
            people = app.screen.query_one("#people", DataTable)
            rows = table_rows(people)
            assert len(rows) == 14
            marta = rows[0]
            assert marta[0] == "Marta Quintela" and marta[1] == "30" and marta[3] == "3"
            assert "█" in marta[4]  # the nights bar: she has the most
            assert rows[1][3] == "0" and "█" not in rows[1][4]
            assert "│" in marta[2] or "█" in marta[2]  # hours against the contract
            groups = table_rows(app.screen.query_one("#groups", DataTable))
            assert [g[0] for g in groups] == ["full-time", "night-team", "part-time", "everyone"]
            assert groups[-1][1] == "14" and "●" in groups[-1][3]
            assert rows[0][7] == "1/1"  # asked the day off on 20 Mar: off, so granted

    run(go)


def test_help_lists_every_binding(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(100, 30)) as pilot:
            await pilot.press("f1")
            assert isinstance(app.screen, HelpScreen)
            console = Console(width=120, record=True, file=io.StringIO())
            for static in app.screen.query(Static):
                console.print(static.content)
            text = console.export_text()
            assert "ctrl+s" in text and "Save" in text
            assert "ctrl+l" in text and "F5" in text and "This person" in text
            await pilot.press("escape")
            assert isinstance(app.screen, RosterScreen)
            await pilot.press("question_mark")
            assert isinstance(app.screen, HelpScreen)

    run(go)
