"""Live solve in a thread worker: progress, the summary, save and reopen, stop early."""

from __future__ import annotations

import asyncio
import time
from pathlib import Path

from textual.widgets import Static

from rostertui.core.edit.session import changed_cells
from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.help import HelpScreen
from rostertui.tui.screens.roster import RosterScreen
from rostertui.tui.screens.solve import SolveScreen, SolveSettings
from tests.tui.conftest import run
from tests.tui.pilot import grid_of, row_text


async def until_finished(pilot, screen: SolveScreen, limit: float) -> None:
    deadline = time.monotonic() + limit
    while screen.phase == "running" and time.monotonic() < deadline:
        await pilot.pause(0.2)
    assert screen.phase == "done", f"the solve did not finish in {limit} s"


def test_solve_shows_progress_replaces_the_grid_and_saves(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic), SolveSettings(time_limit=5, workers=2))
        async with app.run_test(size=(120, 40)) as pilot:
            before = app.session.roster
            await pilot.press("f5")
            screen = app.screen
            assert isinstance(screen, SolveScreen)
            await pilot.press("enter")
            assert screen.phase == "running"
            await pilot.pause(1.5)
            assert "elapsed" in str(screen.query_one("#progress", Static).content)
            await until_finished(pilot, screen, 40)
            relay = screen.relay
            assert relay.received > 0 and 0 < relay.posted <= relay.received
            assert screen.penalties and screen.penalties[-1] >= screen.last_penalty
            session = app.session
            changed = len(changed_cells(before, session.roster))
            assert changed > 100 and session.dirty and session.check.compliant
            assert f"{changed} cells changed" in screen.summary
            assert f"-> {session.check.penalty};" in screen.summary
            assert "Bounds: " in screen.summary and "column generation" in screen.summary
            assert "Found by: " in screen.summary
            await pilot.press("escape")
            assert isinstance(app.screen, RosterScreen)
            assert set(row_text(grid_of(app), "c01").split()) & {"E", "L", "N"}
            await pilot.press("ctrl+s")
            rows = session.roster.rows
            penalty = session.check.penalty
        again = load_workspace(clinic)
        assert again.roster is not None and again.roster.rows == rows
        assert again.roster.solve is not None and again.roster.solve.objective == penalty

    run(go)


def test_escape_stops_the_search_and_keeps_the_best_roster(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic), SolveSettings(time_limit=120, workers=2))
        async with app.run_test(size=(100, 30)) as pilot:
            await pilot.press("f5", "enter")
            screen = app.screen
            assert isinstance(screen, SolveScreen)
            started = time.monotonic()
            while screen.last_stage != "bound" and time.monotonic() - started < 30:
                await pilot.pause(0.05)
            # still proving the bound, and CP-SAT's first roster already shows
            assert screen.last_stage == "bound" and screen.last_penalty is not None
            await pilot.press("escape")
            await until_finished(pilot, screen, 30)  # far before the 120 s limit
            assert "(stopped early)" in screen.summary
            assert app.session.check.compliant and app.session.dirty
            await pilot.press("escape", "ctrl+z")  # close; the old roster comes back
            assert not app.session.dirty

    run(go)


def test_the_ui_answers_keys_while_the_solver_runs(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic), SolveSettings(time_limit=4, workers=2))
        async with app.run_test(size=(100, 30)) as pilot:
            await pilot.press("f5", "enter")
            screen = app.screen
            await pilot.pause(0.5)
            ticks = str(screen.query_one("#progress", Static).content)
            t = time.monotonic()
            app.simulate_key("f1")  # help opens over the solve while it runs
            while not isinstance(app.screen, HelpScreen) and time.monotonic() - t < 5:
                await asyncio.sleep(0.01)
            # how fast: bench/bench_cancel.py measures it; here, that it answers at all
            assert isinstance(app.screen, HelpScreen) and screen.phase == "running"
            await pilot.pause(0.6)
            assert str(screen.query_one("#progress", Static).content) != ticks  # still ticking
            await pilot.press("escape")
            assert app.screen is screen
            await until_finished(pilot, screen, 30)

    run(go)


def test_the_progress_text_says_when_the_bound_is_being_proved() -> None:
    from rostertui.tui.screens.solve import progress_text

    assert "proving a bound" in str(progress_text(1.0, None, 412, stage="bound"))
    assert "searching for a first roster" in str(progress_text(1.0, None, 412))
    assert "penalty 500" in str(progress_text(2.0, 500, 412, stage="bound"))
    assert "by integer master" in str(progress_text(2.0, 500, 412, found_by="integer master"))
    assert " by " not in str(progress_text(2.0, None, 412, found_by="RINS"))
