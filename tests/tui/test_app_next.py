"""Start the next period from the command palette: the preview shows what `next` writes,
Create writes it, a refusal shows why and writes nothing. At 80 x 24."""

from __future__ import annotations

import shutil
from pathlib import Path

from textual.widgets import Button, Checkbox, Input, Static

from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.nextperiod import NextPeriodScreen
from tests.conftest import FIXTURES
from tests.tui.conftest import run


def preview(app: RosterApp) -> str:
    return str(app.screen.query_one("#preview", Static).content)


def test_palette_preview_then_create(clinic: Path) -> None:
    shutil.copyfile(FIXTURES / "clinic_solved_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(80, 24)) as pilot:
            await pilot.press("ctrl+p")
            await pilot.pause()
            await pilot.press(*"next period")
            await pilot.pause(0.5)
            await pilot.press("enter")
            await pilot.pause(0.3)
            assert isinstance(app.screen, NextPeriodScreen)
            text = preview(app)
            target = clinic.parent / "clinic-2027-04-12"
            assert f"Next period in {target}: 2027-04-12 to 2027-05-09 (28 days)" in text
            assert "history: 91 days per person" in text
            assert "c03" in text and "warning: the new period" in text
            assert app.screen.query_one("#target", Input).value == str(target)
            # holidays typed in: the preview follows
            app.screen.query_one("#holidays", Input).value = "2027-05-01"
            await pilot.click("#refresh")
            await pilot.pause()
            assert "holidays: 2027-05-01" in preview(app)
            assert not target.exists()  # a preview writes nothing
            await pilot.click("#create")
            await pilot.pause()
            assert not isinstance(app.screen, NextPeriodScreen)
            ws = load_workspace(target)
            assert ws.unit.holidays[0].isoformat() == "2027-05-01"
            assert ws.history is not None and ws.history.hours_before

    run(go)


def test_a_roster_breaking_hard_rules_is_refused_unless_forced(clinic: Path) -> None:
    shutil.copyfile(FIXTURES / "clinic_breaches_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(80, 24)) as pilot:
            app.action_next_period()
            await pilot.pause()
            screen = app.screen
            assert isinstance(screen, NextPeriodScreen)
            assert "Cannot start the next period" in preview(app)
            assert "hard rule" in preview(app)
            assert screen.query_one("#create", Button).disabled
            screen.query_one("#force", Checkbox).value = True
            await pilot.pause()
            assert "Next period in" in preview(app)
            assert not screen.query_one("#create", Button).disabled
            await pilot.press("escape")
            assert not isinstance(app.screen, NextPeriodScreen)
            assert sorted(p.name for p in clinic.parent.iterdir()) == ["clinic"]

    run(go)
