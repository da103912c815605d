"""Published versions: the list, publishing the roster as shown, choosing a version to
compare against in the grid's diff mode.

Publishing saves the roster (and requests.toml, when an absence changed it) in the
same transaction, so the version kept is exactly what the files hold; each version is
a new file in published/, never overwriting an earlier one. The screen is dismissed
with the version to compare against, or None.
"""

from __future__ import annotations

from zoneinfo import ZoneInfo

from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import Button, DataTable, Input, Label, Static

from rostertui.core.edit.session import Session
from rostertui.core.errors import InputError
from rostertui.core.io.published import Published, list_published
from rostertui.core.repair.diff import roster_diff
from rostertui.tui.host import host
from rostertui.tui.look import BAD, MUTED
from rostertui.tui.messages import SessionChanged
from rostertui.tui.screens.dialogs import ErrorDialog, notify_written


class PublishDialog(ModalScreen[str | None]):
    """Asks the note for a new version; dismissed with the note, or None (cancel)."""

    CSS_PATH = ["dialogs.tcss", "versions.tcss"]

    BINDINGS = [Binding("escape", "dismiss(None)", "Cancel")]

    def __init__(self, session: Session, number: int) -> None:
        super().__init__()
        self.session, self.number = session, number

    def compose(self) -> ComposeResult:
        files = "roster.toml and requests.toml" if self.session.requests_dirty else "roster.toml"
        unsaved = (f"It has unsaved changes: {files} will be saved first, then "
                   if self.session.dirty else "It is saved; ")
        with Vertical(classes="dialog publish"):
            yield Label(f"Publish version {self.number}", classes="title")
            yield Static(f"Publishes the roster as shown in the grid. {unsaved}a copy is kept "
                         f"as published/{self.number:03d}.toml. Earlier versions are never "
                         "changed.")
            yield Input(placeholder="note (optional), e.g. sent to the team", id="note")
            with Horizontal(classes="buttons"):
                yield Button("Save and publish (Enter)" if self.session.dirty
                             else "Publish (Enter)", id="publish", variant="primary")
                yield Button("Cancel (Esc)", id="cancel")

    def on_mount(self) -> None:
        self.query_one("#note", Input).focus()

    @on(Input.Submitted)
    @on(Button.Pressed, "#publish")
    def _publish(self) -> None:
        self.dismiss(self.query_one("#note", Input).value.strip())

    @on(Button.Pressed, "#cancel")
    def _cancel(self) -> None:
        self.dismiss(None)


class VersionsScreen(ModalScreen[int | None]):
    CSS_PATH = "versions.tcss"

    BINDINGS = [
        Binding("p", "publish", "Publish the roster as shown"),
        Binding("enter,c", "compare", "Compare the grid with this version (diff mode)"),
        Binding("escape", "dismiss(None)", "Close"),
    ]

    def __init__(self, compared: int | None = None) -> None:
        super().__init__()
        self.compared = compared  # the version diff mode compares against (None: the last)
        self.versions: list[Published] = []

    @property
    def session(self) -> Session:
        return host(self.app).session

    def compose(self) -> ComposeResult:
        with Vertical(id="versions-panel"):
            yield Label(f"Published versions · {self.session.ws.unit.name}", id="title")
            yield DataTable(id="versions", cursor_type="row", zebra_stripes=True)
            yield Static("", id="about")
            with Horizontal(id="buttons"):
                yield Button("Publish (p)", id="publish", variant="primary")
                yield Button("Compare (Enter)", id="compare")
                yield Button("Close (Esc)", id="close")

    def on_mount(self) -> None:
        self.reload()
        self.query_one(DataTable).focus()

    def reload(self) -> None:
        session = self.session
        folder = session.ws.path
        assert folder is not None, "a loaded workspace always has a path"
        try:
            self.versions = list_published(folder)
        except InputError as exc:
            self.versions = []
            self.query_one("#about", Static).update(Content.styled(str(exc), style=f"bold {BAD}"))
            return
        table = self.query_one(DataTable)
        table.clear(columns=True)
        table.add_columns("version", "published", "note", "cells changed since")
        zone = ZoneInfo(session.ws.unit.timezone)
        compared = self.compared or (self.versions[-1].version if self.versions else None)
        for p in self.versions:
            changed = len(roster_diff(session.ws, p.roster, session.roster))
            mark = " ◆" if p.version == compared else ""
            table.add_row(f"{p.version}{mark}", f"{p.meta.at.astimezone(zone):%Y-%m-%d %H:%M}",
                          p.meta.note or "", str(changed), key=str(p.version))
        if self.versions:
            table.move_cursor(row=len(self.versions) - 1)
            about = (f"◆ diff mode (ctrl+d in the grid) compares with version {compared}. "
                     f"Times in {session.ws.unit.timezone}; \"cells changed since\": "
                     "cells of the grid as shown that differ from that version.")
        else:
            about = "Nothing published yet: p publishes the roster as shown in the grid."
        self.query_one("#about", Static).update(Content.styled(about, style=MUTED))

    # -- publishing ---------------------------------------------------------------------------
    def action_publish(self) -> None:
        number = (self.versions[-1].version + 1) if self.versions else 1
        self.app.push_screen(PublishDialog(self.session, number), self._publish)

    def _publish(self, note: str | None) -> None:
        if note is None:
            return
        session = self.session
        assert session.ws.path is not None
        try:
            done = session.publish(note)  # saves too: both in one transaction
        except OSError as exc:
            self.app.push_screen(ErrorDialog("Not published", f"{type(exc).__name__}: {exc}"))
            return
        self.app.post_message(SessionChanged())
        notify_written(self, f"published version {done.version}: published/{done.path.name}",
                       session.notices)
        self.reload()

    @on(Button.Pressed, "#publish")
    def _publish_pressed(self) -> None:
        self.action_publish()

    # -- choosing ---------------------------------------------------------------------------
    def action_compare(self) -> None:
        if not self.versions:
            self.notify("nothing published yet: p publishes the roster", severity="warning")
            return
        row = self.query_one(DataTable).cursor_row
        self.dismiss(self.versions[row].version)

    @on(DataTable.RowSelected)
    @on(Button.Pressed, "#compare")
    def _compare(self) -> None:
        self.action_compare()

    @on(Button.Pressed, "#close")
    def _close(self) -> None:
        self.dismiss(None)
