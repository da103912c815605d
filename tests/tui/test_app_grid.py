"""The roster grid driven with the pilot: move, type, lock, undo, save, reopen, quit."""

from __future__ import annotations

from pathlib import Path

from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.dialogs import ConfirmQuit
from rostertui.tui.screens.roster import RosterScreen
from tests.tui.conftest import run
from tests.tui.pilot import cell_segment, grid_of, row_text, status_text

RITA = "c13"  # Rita Moinhola, 13th in staff order, on leave 15-18 Mar (days 0-3)


def test_typing_a_code_on_leave_shows_the_hard_violation(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            grid = grid_of(app)
            assert "~" in row_text(grid, RITA)  # leave is marked
            await pilot.press(*["down"] * 12)
            assert (grid.person, grid.day) == (RITA, 0)
            before = app.session.check.hard_violations
            await pilot.press("E")
            assert app.session.code(RITA, 0) == "E"
            assert app.session.check.hard_violations == before + 1
            status = status_text(app)
            assert "Mon 15 Mar · Rita Moinhola" in status and "on leave (annual leave)" in status
            assert "✖ leave (hard) E on 15 Mar, a leave day" in status
            await pilot.press("right")  # off the cell, to see its own colour
            hard_bg = grid.get_component_rich_style("grid--hard", partial=True).bgcolor
            seg = cell_segment(grid, RITA, 0)
            assert seg.text == "E" and seg.style.bgcolor == hard_bg
            assert cell_segment(grid, RITA, 1).style.bgcolor != hard_bg
            assert "unsaved" in str(app.screen.query_one("#summary").content)

    run(go)


def test_a_code_that_starts_another_waits_for_enter(clinic: Path) -> None:
    ws = load_workspace(clinic)
    ws.shifts.shift.append(ws.shifts.shift[0].model_copy(update={"code": "E2", "name": "Early 2"}))
    ws.__dict__.pop("shift_by_code", None)

    async def go() -> None:
        app = RosterApp(ws)
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("e")
            assert app.session.code("c01", 0) == "-"
            assert "typing e…" in status_text(app)
            await pilot.press("enter")
            assert app.session.code("c01", 0) == "E"
            await pilot.press("right", "E", "2")
            assert app.session.code("c01", 1) == "E2"
            await pilot.press("right", "X")
            assert app.session.code("c01", 2) == "-"
            assert "not changed: no shift 'X'" in status_text(app)

    run(go)


def test_off_lock_and_undo(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            grid = grid_of(app)
            await pilot.press("right", "right", "N", "ctrl+l")
            assert app.session.locked("c01", 2)
            assert "#" in cell_segment(grid, "c01", 2).text or "N#" in row_text(grid, "c01")
            await pilot.press("minus")
            assert app.session.code("c01", 2) == "N"  # locked: refused
            assert "locked; unlock it first" in status_text(app)
            await pilot.press("ctrl+l", "space")
            assert app.session.code("c01", 2) == "-"
            await pilot.press("ctrl+z")
            assert app.session.code("c01", 2) == "N" and not app.session.locked("c01", 2)
            await pilot.press("ctrl+z", "ctrl+z", "ctrl+z")
            assert not app.session.dirty
            await pilot.press("ctrl+y")
            assert app.session.code("c01", 2) == "N"

    run(go)


def test_save_then_reopen_finds_the_same_roster(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("E", "right", "L", "right", "N", "ctrl+l", "ctrl+s")
            assert not app.session.dirty
            rows = app.session.roster.rows
        again = RosterApp(load_workspace(clinic))
        async with again.run_test(size=(120, 40)):
            assert again.session.roster.rows == rows
            assert again.session.code("c01", 0) == "E" and again.session.locked("c01", 2)
            assert row_text(grid_of(again), "c01").split()[3:6] == ["E", "L", "N#"]

    run(go)


def test_quitting_with_unsaved_changes_asks_first(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("L", "ctrl+q")
            assert isinstance(app.screen, ConfirmQuit)
            await pilot.press("escape")  # stay
            assert isinstance(app.screen, RosterScreen) and app.is_running
            await pilot.press("ctrl+q", "d")  # quit without saving
            await pilot.pause()
            assert not app.is_running
        assert not (clinic / "roster.toml").exists()

        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("L", "ctrl+q", "s")  # save and quit
            await pilot.pause()
            assert not app.is_running
        assert load_workspace(clinic).roster.rows["c01"][0] == "L"

        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("ctrl+q")  # nothing unsaved: no question
            await pilot.pause()
            assert not app.is_running

    run(go)


def test_usable_at_80_by_24(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(80, 24)) as pilot:
            grid = grid_of(app)
            assert grid.size.height >= 16  # 14 people and the header fit
            await pilot.press("end")  # the last day scrolls into view
            assert grid.day == 27 and grid.scroll_x > 0
            assert cell_segment(grid, "c01", 27).text == "·"
            await pilot.press("ctrl+end")
            assert grid.cover_row == 6 and "cover N (rn)" in status_text(app)

    run(go)
