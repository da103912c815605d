"""The export dialog: choose a format and a path, write the files in a thread worker.

Open it with the roster on screen (hand edits not yet saved included):
`app.push_screen(ExportScreen(app.session.workspace_for_solve()))`. It is dismissed
with the paths written by the last export, or None when nothing was written.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from textual import on, work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widgets import Button, Input, Label, RadioButton, RadioSet, Static
from textual.worker import Worker, WorkerState

from rostertui.core.errors import RosterError
from rostertui.core.io.export import default_path, export
from rostertui.core.models.workspace import Workspace

CHOICES: tuple[tuple[str, str], ...] = (
    ("csv", "CSV, one row per shift (check --roster reads it back)"),
    ("csv-grid", "CSV grid, one row per person, one column per date"),
    ("ics", "Calendar (.ics), everyone in one file"),
    ("ics-per-person", "Calendars (.ics), one file per person, into a folder"),
    ("html", "Printable roster (HTML, landscape)"),
    ("audit-html", "Audit report (HTML)"),
)


@dataclass(frozen=True)
class ExportOutcome:
    written: list[Path] = field(default_factory=list)
    error: str | None = None


class ExportScreen(ModalScreen[list[Path] | None]):
    CSS_PATH = "export.tcss"

    BINDINGS = [Binding("escape,f7", "close", "Close")]

    def __init__(self, ws: Workspace, fmt: str = "html") -> None:
        super().__init__()
        self.ws = ws
        self.fmt = fmt
        self.written: list[Path] = []
        self.busy = False

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog", id="export-panel"):
            yield Label(f"Export {self.ws.unit.name}", classes="title")
            with RadioSet(id="formats"):
                for fmt, label in CHOICES:
                    yield RadioButton(label, value=fmt == self.fmt, id=f"fmt-{fmt}")
            yield Label("Write to (a folder for one calendar per person)", classes="label")
            yield Input(str(default_path(self.ws, self.fmt)), id="path")
            yield Static("", id="result")
            with Horizontal(classes="buttons"):
                yield Button("Export", id="export", variant="primary")
                yield Button("Close (Esc)", id="close")

    def on_mount(self) -> None:
        self.query_one("#export", Button).focus()

    @on(RadioSet.Changed, "#formats")
    def _format_chosen(self, event: RadioSet.Changed) -> None:
        fmt = str(event.pressed.id).removeprefix("fmt-")
        path = self.query_one("#path", Input)
        if path.value.strip() in ("", str(default_path(self.ws, self.fmt))):
            path.value = str(default_path(self.ws, fmt))  # keep a path the user typed
        self.fmt = fmt

    @on(Input.Submitted, "#path")
    @on(Button.Pressed, "#export")
    def start(self) -> None:
        if self.busy:
            return
        text = self.query_one("#path", Input).value.strip()
        out = Path(text).expanduser() if text else None
        self.busy = True
        self._show("writing…", "")
        self.run_export(self.ws, self.fmt, out)

    @work(thread=True, exclusive=True, group="export", exit_on_error=False)
    def run_export(self, ws: Workspace, fmt: str, out: Path | None) -> ExportOutcome:
        try:
            return ExportOutcome(written=export(ws, fmt, out))
        except (RosterError, OSError, ValueError) as exc:
            return ExportOutcome(error=str(exc))

    def on_worker_state_changed(self, event: Worker.StateChanged) -> None:
        if event.worker.group != "export" or event.state not in (
            WorkerState.SUCCESS, WorkerState.ERROR
        ):
            return
        self.busy = False
        outcome = event.worker.result
        if event.state == WorkerState.ERROR or not isinstance(outcome, ExportOutcome):
            self._show(f"not exported: {event.worker.error}", "-error")
        elif outcome.error is not None:
            self._show(f"not exported: {outcome.error}", "-error")
        else:
            self.written = outcome.written
            shown = outcome.written[0] if len(outcome.written) == 1 else (
                f"{len(outcome.written)} files in {outcome.written[0].parent}"
                if outcome.written else "nothing (no one on the staff)"
            )
            self._show(f"wrote {shown}", "-done")

    def _show(self, text: str, state: str) -> None:
        result = self.query_one("#result", Static)
        result.update(text)
        result.set_class(state == "-error", "-error")
        result.set_class(state == "-done", "-done")

    @on(Button.Pressed, "#close")
    def action_close(self) -> None:
        self.dismiss(self.written or None)
