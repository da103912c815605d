"""Add requests from a CSV in the UI, at 80x24: reached from the command palette, a preview
(how many, per person, every problem by line), Add as one undoable change, ctrl+s writes
requests.toml with its comments."""

from __future__ import annotations

import time
from pathlib import Path

from textual.command import CommandList, CommandPalette
from textual.widgets import Button, Input, Static

from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.intake import AddRequestsScreen
from tests.tui.conftest import run

GOOD = ("\ufeffperson;date;request;weight;note\r\n"
        "c01;16/03/2027;off;3;dentist\r\n"
        "c02;17/03/2027;avoid N;;\r\n"
        "c02;2027-03-18;E;;\r\n").encode()
BAD = b"person,date,want\nc01,2027-03-16,off\nc1,2027-03-17,off\nc02,2027-04-30,Q\n"


async def until_checked(pilot, screen: AddRequestsScreen, limit: float = 20) -> str:
    deadline = time.monotonic() + limit
    await pilot.pause(0.1)
    while screen.busy and time.monotonic() < deadline:
        await pilot.pause(0.1)
    return str(screen.query_one("#preview", Static).content)


async def first_hit(pilot, app: RosterApp, text: str, limit: float = 10) -> None:
    """Wait until the palette's search shows `text` first (it searches in the background)."""
    deadline = time.monotonic() + limit
    while time.monotonic() < deadline:
        await pilot.pause(0.1)
        hits = app.screen.query_one(CommandList)
        if hits.option_count and text in str(hits.get_option_at_index(0).prompt):
            return
    raise AssertionError(f"{text!r} is not the palette's first hit")


def test_from_the_palette_preview_add_undo_and_save(clinic: Path, tmp_path: Path) -> None:
    (tmp_path / "good.csv").write_bytes(GOOD)
    (tmp_path / "bad.csv").write_bytes(BAD)
    before = (clinic / "requests.toml").read_text(encoding="utf-8")
    n = len(load_workspace(clinic).requests.request)

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(80, 24)) as pilot:
            await pilot.press("ctrl+p")
            await pilot.pause()
            assert isinstance(app.screen, CommandPalette)
            await pilot.press(*"add requests")
            await first_hit(pilot, app, "Add requests from a CSV file")
            await pilot.press("enter")
            await pilot.pause(0.2)
            screen = app.screen
            assert isinstance(screen, AddRequestsScreen)
            add = screen.query_one("#add", Button)
            assert add.disabled

            # a file with mistakes: every one by line, and no way to add
            screen.query_one("#path", Input).value = str(tmp_path / "bad.csv")
            await pilot.press("enter")
            shown = await until_checked(pilot, screen)
            assert shown.startswith("3 problems in bad.csv; nothing can be added:")
            assert "line 3, person: unknown person 'c1' (did you mean" in shown
            assert "line 4, date: 2027-04-30 is outside the period" in shown
            assert "line 4, want: unknown shift code 'Q'" in shown
            assert add.disabled

            screen.query_one("#path", Input).value = str(tmp_path / "good.csv")
            await pilot.press("enter")
            shown = await until_checked(pilot, screen)
            assert shown.startswith("3 requests to add from good.csv:\n  c01 1, c02 2")
            assert not add.disabled
            await pilot.click("#add")
            await pilot.pause()
            assert not isinstance(app.screen, AddRequestsScreen)
            session = app.session
            assert session.requests_dirty and len(session.requests.request) == n + 3
            assert (clinic / "requests.toml").read_text(encoding="utf-8") == before

            await pilot.press("ctrl+z")
            await pilot.pause()
            assert not session.requests_dirty
            await pilot.press("ctrl+y")
            await pilot.pause()
            assert len(session.requests.request) == n + 3

            await pilot.press("ctrl+s")
            await pilot.pause()
            after = (clinic / "requests.toml").read_text(encoding="utf-8")
            assert after.startswith(before)  # the comments and entries as they were
            added = load_workspace(clinic).requests.request[n:]
            assert [(r.person, str(r.date), r.want, r.avoid, r.weight, r.note)
                    for r in added] == [("c01", "2027-03-16", "off", None, 3, "dentist"),
                                        ("c02", "2027-03-17", None, "N", 1, None),
                                        ("c02", "2027-03-18", "E", None, 1, None)]

    run(go)


def test_the_same_file_again_adds_nothing_and_esc_closes(clinic: Path, tmp_path: Path) -> None:
    (tmp_path / "good.csv").write_bytes(GOOD)

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(80, 24)) as pilot:
            app.action_add_requests()
            await pilot.pause()
            screen = app.screen
            assert isinstance(screen, AddRequestsScreen)
            screen.query_one("#path", Input).value = str(tmp_path / "missing.csv")
            await pilot.press("enter")
            assert "no such file" in await until_checked(pilot, screen)
            screen.query_one("#path", Input).value = str(tmp_path / "good.csv")
            await pilot.press("enter")
            await until_checked(pilot, screen)
            await pilot.click("#add")
            await pilot.pause()
            app.action_add_requests()
            await pilot.pause()
            screen = app.screen
            assert isinstance(screen, AddRequestsScreen)
            screen.query_one("#path", Input).value = str(tmp_path / "good.csv")
            await pilot.press("enter")
            shown = await until_checked(pilot, screen)
            assert shown == ("nothing to add from good.csv\n"
                             "3 already requested, skipped (lines 2, 3, 4)")
            assert screen.query_one("#add", Button).disabled
            await pilot.press("escape")
            await pilot.pause()
            assert not isinstance(app.screen, AddRequestsScreen)

    run(go)
