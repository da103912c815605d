"""Why (F10): the explanation panel in a thread worker, its verdict and reasons, the jump
to a reason's cell; the solve screen offering it; Export (F7) from anywhere."""

from __future__ import annotations

import shutil
import time
from pathlib import Path

from textual.widgets import Button, Input, OptionList, Static

from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.explain import ExplainScreen
from rostertui.tui.screens.export import ExportScreen
from rostertui.tui.screens.help import HelpScreen
from rostertui.tui.screens.roster import RosterScreen
from rostertui.tui.screens.solve import SolveScreen, SolveSettings
from tests.conftest import FIXTURES
from tests.core.check.helpers import write_ws
from tests.tui.conftest import run
from tests.tui.pilot import grid_of

FAST = SolveSettings(time_limit=10, workers=2)


def night_short(tmp_path: Path, leave: bool = True) -> Path:
    """Three rn; the night of Wed 3 Mar needs two; b and c are on leave that day."""
    requests = ('[[leave]]\nperson = "b"\nfrom = 2027-03-02\nto = 2027-03-04\n'
                '[[leave]]\nperson = "c"\nfrom = 2027-03-03\nreason = "course"\n')
    return write_ws(tmp_path / "ws", rows={"a": "- - - -", "b": "- - - -", "c": "- - - -"},
                    skills={"a": ["rn"], "b": ["rn"], "c": ["rn"]},
                    cover='[[cover]]\nshift = "N"\nskill = "rn"\nmin = 2\n'
                          'dates = [2027-03-03]\n',
                    requests=requests if leave else "")


def text_of(screen, selector: str) -> str:
    return str(screen.query_one(selector, Static).content)


async def until_explained(pilot, screen: ExplainScreen, limit: float = 20) -> None:
    deadline = time.monotonic() + limit
    while screen.phase == "running" and time.monotonic() < deadline:
        await pilot.pause(0.1)
    assert screen.phase == "done", f"no explanation within {limit} s"


def prompts(screen: ExplainScreen, selector: str) -> list[str]:
    options = screen.query_one(selector, OptionList)
    return [str(options.get_option_at_index(i).prompt) for i in range(options.option_count)]


def test_why_no_roster_names_the_leave_and_leads_to_the_cell(tmp_path: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(night_short(tmp_path)), FAST)
        async with app.run_test(size=(140, 44)) as pilot:
            grid = grid_of(app)
            assert (grid.person, grid.day) == ("a", 0)
            await pilot.press("f10")
            screen = app.screen
            assert isinstance(screen, ExplainScreen)
            await until_explained(pilot, screen)
            assert "No roster can keep every hard rule" in text_of(screen, "#verdict")
            reasons = prompts(screen, "#reasons")
            first = reasons[0]
            assert "Wed 3 Mar" in first and "b and c are on leave" in first
            detail = text_of(screen, "#reason-detail")
            assert "move or shorten a leave" in detail and "shows b on Wed 3 Mar" in detail
            assert not screen.query_one("#requests", OptionList).display
            await pilot.press("enter")  # the first reason: b, on leave that night
            await pilot.pause()
            assert isinstance(app.screen, RosterScreen)
            grid = grid_of(app)
            assert (grid.person, grid.day) == ("b", 2)

            await pilot.press("f10")  # the roster has not changed: shown at once
            again = app.screen
            assert isinstance(again, ExplainScreen) and again.phase == "done"
            assert text_of(again, "#explain-progress").startswith("Explained")
            assert prompts(again, "#reasons") == reasons
            await pilot.press("f10")  # F10 closes it too
            assert isinstance(app.screen, RosterScreen)

    run(go)


def test_a_roster_exists_and_closing_early_is_harmless(tmp_path: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(night_short(tmp_path, leave=False)), FAST)
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("f10", "f10")  # closed before the result comes (Esc would stop it)
            assert isinstance(app.screen, RosterScreen)
            deadline = time.monotonic() + 20
            while app.explained is None and time.monotonic() < deadline:
                await pilot.pause(0.1)
            kept = app.explained
            assert kept is not None and kept.result.feasible  # kept for the next F10
            app.session.set_cell("a", 0, "E")
            app.revised()  # the roster changed: the kept result is stale, run again
            await pilot.press("f10")
            screen = app.screen
            assert isinstance(screen, ExplainScreen)
            await until_explained(pilot, screen)
            assert screen.done is not kept and app.explained is screen.done
            assert text_of(screen, "#explain-progress").startswith("Done in")
            verdict = text_of(screen, "#verdict")
            assert verdict.startswith("✔ A roster exists that keeps every hard rule.")
            assert "breaks 1 hard rule" in verdict  # the cover of 3 Mar, in the grid
            assert "priced against a roster that keeps every hard rule" in text_of(
                screen, "#requests-title")

    run(go)


def test_denied_requests_priced_and_the_jump_to_one(clinic: Path) -> None:
    shutil.copyfile(FIXTURES / "clinic_solved_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = RosterApp(load_workspace(clinic), FAST)
        async with app.run_test(size=(150, 44)) as pilot:
            await pilot.press("f10")
            screen = app.screen
            assert isinstance(screen, ExplainScreen)
            await until_explained(pilot, screen)
            assert "A roster exists" in text_of(screen, "#verdict")
            asks = prompts(screen, "#requests")
            assert len(asks) == 1
            assert "Joana Ventosa (c06) asked for a day off on Sat 3 Apr" in asks[0]
            assert "+42" in asks[0] and "paid by" in asks[0]
            await pilot.press("enter")
            await pilot.pause()
            grid = grid_of(app)
            assert (grid.person, grid.day) == ("c06", 19)  # 15 Mar + 19 = 3 Apr

    run(go)


def test_an_infeasible_solve_offers_the_explanation(tmp_path: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(night_short(tmp_path)), FAST)
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("f5")
            solve = app.screen
            assert isinstance(solve, SolveScreen)
            why = solve.query_one("#why", Button)
            assert not why.display
            await pilot.press("enter")
            deadline = time.monotonic() + 20
            while solve.phase == "running" and time.monotonic() < deadline:
                await pilot.pause(0.1)
            assert solve.phase == "done" and "No roster keeps every hard rule" in solve.summary
            assert why.display and why.has_focus
            assert "F10" in text_of(solve, "#hint")
            await pilot.press("enter")  # the Why? button
            screen = app.screen
            assert isinstance(screen, ExplainScreen)
            assert not any(isinstance(s, SolveScreen) for s in app.screen_stack)
            await until_explained(pilot, screen)
            assert "No roster can keep every hard rule" in text_of(screen, "#verdict")

    run(go)


def test_f7_exports_the_roster_as_csv(clinic: Path, tmp_path: Path) -> None:
    shutil.copyfile(FIXTURES / "clinic_solved_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("f1", "f7")  # not over another dialog
            assert isinstance(app.screen, HelpScreen)
            await pilot.press("escape", "f7")
            screen = app.screen
            assert isinstance(screen, ExportScreen)
            await pilot.click("#fmt-csv")
            target = tmp_path / "out" / "roster.csv"
            screen.query_one("#path", Input).value = str(target)
            await pilot.click("#export")
            deadline = time.monotonic() + 20
            while (not target.exists() or screen.busy) and time.monotonic() < deadline:
                await pilot.pause(0.1)
            header = target.read_text(encoding="utf-8-sig").splitlines()[0]
            assert header == "person,date,shift,start,end,paid_hours"
            await pilot.press("escape")
            assert isinstance(app.screen, RosterScreen)
            assert any(f"exported {target}" in str(n.message) for n in app._notifications)

    run(go)


def test_a_gap_reason_leads_to_the_cover_row(tmp_path: Path) -> None:
    """The "stays short" reason names no person: Enter goes to the N·rn cover row."""
    async def go() -> None:
        app = RosterApp(load_workspace(night_short(tmp_path)), FAST)
        async with app.run_test(size=(140, 44)) as pilot:
            await pilot.press("f10")
            screen = app.screen
            assert isinstance(screen, ExplainScreen)
            await until_explained(pilot, screen)
            reasons = prompts(screen, "#reasons")
            gap = next(i for i, r in enumerate(reasons) if "stays 1 short" in r)
            options = screen.query_one("#reasons", OptionList)
            options.focus()
            options.highlighted = gap
            await pilot.press("enter")
            await pilot.pause()
            grid = grid_of(app)
            assert grid.person is None and grid.day == 2
            cover = grid.view.cover[grid.cover_row]
            assert (cover.shift, cover.skill) == ("N", "rn")

    run(go)


def test_esc_stops_a_long_explanation_and_shows_it_stopped(tmp_path: Path) -> None:
    """100 people x 31 days: Esc during the conflict search stops it; the panel stays,
    says so, and keeps nothing for the next F10 (a stopped run settles nothing)."""
    from tests.tui.bigws import make_big_workspace

    ws = load_workspace(make_big_workspace(tmp_path / "big"))

    async def go() -> None:
        app = RosterApp(ws, FAST)
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("f10")
            screen = app.screen
            assert isinstance(screen, ExplainScreen)
            deadline = time.monotonic() + 30
            while (not screen.step.startswith("looking for hard items")
                   and screen.phase == "running" and time.monotonic() < deadline):
                await pilot.pause(0.02)
            assert screen.phase == "running", "the search ended before Esc"
            await pilot.press("escape")
            assert app.screen is screen and screen.cancel.is_set()
            deadline = time.monotonic() + 60
            while screen.phase == "running" and time.monotonic() < deadline:
                await pilot.pause(0.1)
            assert screen.phase == "done" and screen.done is not None
            assert screen.done.result.stopped and not screen.done.result.decided
            assert text_of(screen, "#verdict").startswith("■ Stopped (Esc)")
            assert app.explained is None
            await pilot.press("escape")  # now it closes
            assert isinstance(app.screen, RosterScreen)

    run(go)
