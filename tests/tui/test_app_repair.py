"""Repairing a published roster in the UI: publish and versions, diff mode, swap with its
preview, absence, repair; each undone and redone exactly."""

from __future__ import annotations

import time
from datetime import date
from pathlib import Path

import pytest
from textual.widgets import DataTable, Input, Static

from rostertui.core.edit.plans import plan_absence
from rostertui.core.edit.session import Session
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import save
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.changes import AbsenceDialog, SwapDialog
from rostertui.tui.screens.repair import RepairScreen
from rostertui.tui.screens.roster import RosterScreen
from rostertui.tui.screens.solve import SolveSettings
from rostertui.tui.screens.versions import PublishDialog, VersionsScreen
from tests.tui.conftest import run
from tests.tui.pilot import cell_segment, grid_of, status_text


@pytest.fixture(scope="module")
def solved_rows(tmp_path_factory) -> dict[str, list[str]]:
    """A roster for the clinic demo with no hard violation (one short solve per module)."""
    from rostertui.core.solver.outcome import SolveOptions
    from rostertui.core.solver.run import solve
    from tests.conftest import DEMO, copy_ws

    ws = load_workspace(copy_ws(DEMO / "clinic", tmp_path_factory.mktemp("solve")))
    outcome = solve(ws, SolveOptions(time_limit=3, workers=2))
    assert outcome.roster is not None and outcome.check is not None
    assert outcome.check.hard_violations == 0
    return outcome.roster.rows


@pytest.fixture
def solved(clinic: Path, solved_rows: dict[str, list[str]]) -> Path:
    save(Roster(start=date(2027, 3, 15), days=28, rows=solved_rows), clinic)
    return clinic


def crafted(ws: Workspace) -> Roster:
    """c01 works L on day 0 and c02 E on day 1; everyone else is off."""
    rows = {pid: ["-"] * 28 for pid in ws.person_ids}
    rows["c01"][0], rows["c02"][1] = "L", "E"
    return Roster(start=date(2027, 3, 15), days=28, rows=rows)


def notes(app: RosterApp) -> str:
    return "\n".join(str(n.message) for n in app._notifications)


async def publish(pilot, app: RosterApp, note: str) -> None:
    await pilot.press("f9")
    assert isinstance(app.screen, VersionsScreen)
    await pilot.press("p")
    assert isinstance(app.screen, PublishDialog)
    app.screen.query_one("#note", Input).value = note
    await pilot.press("enter")
    await pilot.pause()
    assert isinstance(app.screen, VersionsScreen)
    await pilot.press("escape")


def test_the_swap_preview_shows_what_it_creates_and_cancel_changes_nothing(
        clinic: Path) -> None:
    save(crafted(load_workspace(clinic)), clinic)

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            session = app.session
            before = session.roster
            await pilot.press("right", "ctrl+x", "down")  # mark c01 on 16 Mar; go to c02
            assert app.screen.mark == ("c01", 1)
            mark_bg = grid_of(app).get_component_rich_style("grid--mark", partial=True).bgcolor
            assert cell_segment(grid_of(app), "c01", 1).style.bgcolor == mark_bg
            await pilot.press("ctrl+x")
            dialog = app.screen
            assert isinstance(dialog, SwapDialog)
            preview = str(dialog.query_one("#swap-preview", Static).content)
            assert "Marta Quintela" in preview and "off → E" in preview and "E → off" in preview
            created = preview.split("Creates")[1].split("Resolves")[0]
            assert "daily-rest (hard) Marta Quintela: 9 h 30 min rest between L" in created
            await pilot.press("n")
            assert isinstance(app.screen, RosterScreen)
            assert session.roster is before and not session.can_undo and not session.dirty
            assert "swap cancelled" in status_text(app)
            await pilot.press("ctrl+x", "y")  # the mark stayed: preview again, confirm
            assert session.code("c01", 1) == "E" and session.code("c02", 1) == "-"
            assert app.screen.mark is None
            assert "Tomás Arvoredo on 16 Mar: done (ctrl+z undoes)" in status_text(app)
            assert ("daily-rest", "c01") in {(v.rule, v.person) for v in session.check.violations}
            after = session.roster
            await pilot.press("ctrl+z")
            assert session.roster == before and not session.dirty
            await pilot.press("ctrl+y")
            assert session.roster == after

    run(go)


def test_publish_twice_and_diff_mode_highlights_exactly_the_changed_cells(
        clinic: Path) -> None:
    save(crafted(load_workspace(clinic)), clinic)

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(140, 40)) as pilot:
            screen, grid = app.screen, grid_of(app)
            assert isinstance(screen, RosterScreen)
            await pilot.press("ctrl+d")  # nothing published yet
            assert not screen.diff and grid.changed is None
            assert "Nothing published yet" in notes(app)
            await pilot.press("E")  # an unsaved edit: publishing saves it first
            await publish(pilot, app, "first week")
            first = clinic / "published" / "001.toml"
            assert first.is_file() and not app.session.dirty
            assert load_workspace(clinic).roster.rows["c01"][0] == "E"
            kept = first.read_bytes()
            await pilot.press("down", "down", "N")  # c03 day 0, then a swap c01/c02 on day 1
            app.session.swap("c01", 1, "c02")
            app.revised()
            await pilot.press("ctrl+d")
            assert screen.diff
            changed = {("c03", 0): "-", ("c01", 1): "-", ("c02", 1): "E"}
            assert grid.changed == changed
            assert "changed since version 1: published off → now N" in status_text(app)
            await pilot.press("ctrl+end")  # the cursor off the people's cells
            hl = grid.get_component_rich_style("grid--changed", partial=True).bgcolor
            for pid in app.session.ws.person_ids:
                for day in range(28):
                    painted = cell_segment(grid, pid, day).style.bgcolor == hl
                    assert painted == ((pid, day) in changed), (pid, day)
            await publish(pilot, app, "after the swap")
            assert (clinic / "published" / "002.toml").is_file() and first.read_bytes() == kept
            assert grid.changed == {}  # compared with the last version: nothing changed
            await pilot.press("f9", "up", "enter")  # compare with version 1 again
            assert isinstance(app.screen, RosterScreen) and app.compare_to == 1
            assert grid.changed == changed
            await pilot.press("ctrl+d")
            assert grid.changed is None

    run(go)


def first_short(session: Session) -> tuple[str, int]:
    """A person's shift whose absence leaves hard cover short."""
    for pid in session.ws.person_ids:
        for day in range(28):
            if session.code(pid, day) != "-":
                plan = plan_absence(session.ws, session.roster, pid, session.ws.unit.dates[day],
                                    check=session.check)
                if plan.short:
                    return pid, day
    raise AssertionError("no single absence leaves the cover short")


async def until_done(pilot, screen: RepairScreen, limit: float) -> None:
    deadline = time.monotonic() + limit
    while screen.phase == "running" and time.monotonic() < deadline:
        await pilot.pause(0.2)
    assert screen.phase == "done", f"the repair did not finish in {limit} s"


def test_absence_then_repair_ends_with_no_hard_violation(solved: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(solved), SolveSettings(time_limit=3, workers=2))
        async with app.run_test(size=(140, 44)) as pilot:
            session, screen = app.session, app.screen
            assert session.check.hard_violations == 0
            pid, day = first_short(session)
            roster, requests = session.roster, session.requests
            screen.goto(pid, day)
            await pilot.press("ctrl+a")
            assert isinstance(app.screen, AbsenceDialog)
            await pilot.press("enter")  # from the cursor's day; one day; reason "sick"
            assert isinstance(app.screen, RosterScreen)
            assert session.code(pid, day) == "-" and session.requests.leave[-1].person == pid
            assert "1 shift cleared; cover now short" in notes(app)
            assert session.check.hard_violations > 0
            absent_roster, absent_requests = session.roster, session.requests
            await pilot.press("ctrl+z")
            assert session.roster == roster and session.requests == requests
            await pilot.press("ctrl+y")
            assert session.roster == absent_roster and session.requests == absent_requests

            await pilot.press("f8")
            repair = app.screen
            assert isinstance(repair, RepairScreen)
            repair.query_one("#from", Input).value = session.ws.unit.dates[day].isoformat()
            await pilot.click("#start")
            await until_done(pilot, repair, 40)
            result = repair.result
            assert result is not None and result.outcome.roster is not None
            assert result.changed and all(c.cell.date >= session.ws.unit.dates[day]
                                          for c in result.changed)
            assert repair.query_one("#changed", DataTable).row_count == len(result.changed)
            assert session.roster == absent_roster  # nothing applied before "keep"
            assert f"{len(result.changed)} cell" in repair.summary
            await pilot.press("k")
            assert isinstance(app.screen, RosterScreen)
            assert session.check.hard_violations == 0 and session.roster != absent_roster
            cell = result.changed[0].cell
            i = (cell.date - session.ws.unit.start).days
            assert session.code(cell.person, i) == cell.after
            grid = grid_of(app)
            grid.goto(cell.person, i)
            await pilot.pause()
            assert "✓ no hard violation" in str(app.screen.query_one("#summary").content)
            shown = cell_segment(grid, cell.person, i).text.strip()
            assert shown == (cell.after if cell.after != "-" else "·")  # the grid repainted
            await pilot.press("ctrl+z")
            assert session.roster == absent_roster and session.requests == absent_requests

    run(go)
