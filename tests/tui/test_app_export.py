"""The export dialog: choose a format, write to a path in a thread worker, show the
path or the error. Pushed on the real RosterApp the way a key binding would."""

from __future__ import annotations

import shutil
import time
from pathlib import Path

from textual.app import App
from textual.widgets import Input, RadioButton, Static

from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.export import ExportScreen
from tests.conftest import FIXTURES
from tests.tui.conftest import run


async def until_done(pilot, screen: ExportScreen, limit: float = 20) -> str:
    deadline = time.monotonic() + limit
    while time.monotonic() < deadline:
        await pilot.pause(0.1)
        if not screen.busy:
            break
    return str(screen.query_one("#result", Static).content)


def test_export_the_grid_on_screen_as_html_then_csv(clinic: Path, tmp_path: Path) -> None:
    shutil.copyfile(FIXTURES / "clinic_breaches_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            app.session.set_cell("c01", 2, "N")  # an unsaved hand edit: 17 Mar off -> N
            screen = ExportScreen(app.session.workspace_for_solve())
            await app.push_screen(screen)
            path = screen.query_one("#path", Input)
            assert path.value == str(clinic / "export" / "roster.html")  # the default
            await pilot.click("#export")
            shown = await until_done(pilot, screen)
            page = clinic / "export" / "roster.html"
            assert shown == f"wrote {page}"
            assert "Alcaravão Community Clinic" in page.read_text(encoding="utf-8")

            await pilot.click("#fmt-csv")
            await pilot.pause()
            assert path.value == str(clinic / "export" / "roster.csv")  # followed the format
            target = tmp_path / "mine" / "long.csv"
            path.value = str(target)
            await pilot.click("#export")
            assert await until_done(pilot, screen) == f"wrote {target}"
            text = target.read_text(encoding="utf-8-sig")
            assert "c01,2027-03-17,N," in text  # the unsaved edit is what was exported
            await pilot.press("escape")
            assert not isinstance(app.screen, ExportScreen)

    run(go)


class Host(App[None]):
    def __init__(self, ws: Workspace) -> None:
        super().__init__()
        self.ws = ws
        self.dismissed: list[object] = []

    def on_mount(self) -> None:
        self.push_screen(ExportScreen(self.ws, fmt="ics-per-person"), self.dismissed.append)


def test_per_person_calendars_into_a_folder_and_the_result(clinic: Path) -> None:
    shutil.copyfile(FIXTURES / "clinic_breaches_roster.toml", clinic / "roster.toml")

    async def go() -> None:
        app = Host(load_workspace(clinic))
        async with app.run_test(size=(100, 36)) as pilot:
            screen = app.screen
            assert isinstance(screen, ExportScreen)
            assert screen.query_one("#fmt-ics-per-person", RadioButton).value
            await pilot.press("enter")  # the Export button has the focus
            shown = await until_done(pilot, screen)
            folder = clinic / "export" / "calendars"
            assert shown == f"wrote 14 files in {folder}"
            assert "BEGIN:VEVENT" in (folder / "c01.ics").read_text(encoding="utf-8")
            await pilot.click("#close")
            await pilot.pause()
        assert len(app.dismissed) == 1 and len(app.dismissed[0]) == 14  # type: ignore[arg-type]

    run(go)


def test_no_roster_shows_the_error_and_writes_nothing(clinic: Path) -> None:
    async def go() -> None:
        app = Host(load_workspace(clinic))
        async with app.run_test(size=(100, 36)) as pilot:
            screen = app.screen
            assert isinstance(screen, ExportScreen)
            await pilot.click("#export")
            shown = await until_done(pilot, screen)
            assert shown.startswith("not exported: no roster yet")
            assert screen.query_one("#result", Static).has_class("-error")
            await pilot.press("escape")
            await pilot.pause()
        assert app.dismissed == [None]
        assert not (clinic / "export").exists()

    run(go)
