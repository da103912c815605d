"""What the screens read from the app, typed: the session, its revision, the last
explanation, the version diff mode compares with. Screens only read these; they
change them by posting messages (messages.py) that the app handles."""

from __future__ import annotations

from typing import TYPE_CHECKING, cast

from textual.app import App

if TYPE_CHECKING:
    from rostertui.tui.app import RosterApp


def host(app: App) -> RosterApp:
    return cast("RosterApp", app)
