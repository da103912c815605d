"""Add requests from a CSV file: a path, a preview (how many, per person, every problem by
line), then Add. The check (`plan_requests`, the loader included) runs in a thread worker.

Open it with the requests being edited: `app.push_screen(AddRequestsScreen(app.session.ws))`.
A relative path is taken from the current folder, else from the workspace folder. It is
dismissed with the plan to apply (`RequestsImport`, ok and adding something), or None.
Nothing is written here: the app takes the plan as one undoable change.
"""

from __future__ import annotations

from pathlib import Path

from textual import on, work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Button, Input, Label, Static
from textual.worker import Worker, WorkerState

from rostertui.core.errors import Problem
from rostertui.core.intake.requests_csv import RequestsImport, plan_requests
from rostertui.core.models.workspace import Workspace

HELP = ("Columns: person, date (2027-03-05, 5/3/2027 or 5.3.2027), want / avoid or one "
        "request column (off, N, avoid N), weight, note; ; or , separated.")


def problem_line(p: Problem) -> str:
    where = ", ".join(x for x in (f"line {p.line}" if p.line else "", p.key) if x)
    return f"{where}: {p.message}" if where else p.message


def preview_text(plan: RequestsImport) -> str:
    """What the import would do, in a few lines."""
    if not plan.ok:
        n = len(plan.problems)
        head = f"{n} problem{'s' if n != 1 else ''} in {plan.label}; nothing can be added:"
        return "\n".join([head, *(f"  {problem_line(p)}" for p in plan.problems)])
    lines = []
    n = len(plan.added)
    if n:
        lines.append(f"{n} request{'s' if n != 1 else ''} to add from {plan.label}:")
        lines.append("  " + ", ".join(f"{pid} {k}" for pid, k in plan.per_person().items()))
    else:
        lines.append(f"nothing to add from {plan.label}")
    if plan.skipped:
        where = ", ".join(str(line) for line, _ in plan.skipped)
        k = len(plan.skipped)
        lines.append(f"{k} already requested, skipped (line{'s' if k != 1 else ''} {where})")
    if n:
        lines.append("Add puts them in the session (ctrl+z undoes); ctrl+s writes "
                     "requests.toml.")
    return "\n".join(lines)


class AddRequestsScreen(ModalScreen[RequestsImport | None]):
    CSS_PATH = "intake.tcss"

    BINDINGS = [Binding("escape", "close", "Close")]

    def __init__(self, ws: Workspace, path: str = "") -> None:
        super().__init__()
        self.ws = ws
        self.path = path
        self.plan: RequestsImport | None = None
        self.busy = False

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog", id="intake-panel"):
            yield Label("Add requests from a CSV file", classes="title")
            yield Static(HELP, classes="label")
            yield Input(self.path, placeholder="path/to/requests.csv", id="path")
            with VerticalScroll(id="preview-box"):
                yield Static("Enter (or Preview) checks the file; nothing is added yet.",
                             id="preview")
            with Horizontal(classes="buttons"):
                yield Button("Preview", id="check")
                yield Button("Add", id="add", variant="primary", disabled=True)
                yield Button("Close (Esc)", id="close")

    def on_mount(self) -> None:
        self.query_one("#path", Input).focus()

    @on(Input.Changed, "#path")
    def _edited(self) -> None:
        self.plan = None
        self.query_one("#add", Button).disabled = True

    @on(Input.Submitted, "#path")
    @on(Button.Pressed, "#check")
    def check(self) -> None:
        if self.busy:
            return
        text = self.query_one("#path", Input).value.strip()
        if not text:
            self._show("give the path of a CSV file", "-error")
            return
        path = Path(text).expanduser()
        if not path.is_file() and not path.is_absolute() and self.ws.path is not None:
            path = self.ws.path / path  # a file beside the workspace's own
        if not path.is_file():
            self._show(f"no such file: {path}", "-error")
            return
        self.busy = True
        self._show("checking…", "")
        self.run_check(path)

    @work(thread=True, exclusive=True, group="intake", exit_on_error=False)
    def run_check(self, path: Path) -> RequestsImport:
        return plan_requests(path, self.ws)

    def on_worker_state_changed(self, event: Worker.StateChanged) -> None:
        if event.worker.group != "intake" or event.state not in (
            WorkerState.SUCCESS, WorkerState.ERROR
        ):
            return
        self.busy = False
        plan = event.worker.result
        if event.state == WorkerState.ERROR or not isinstance(plan, RequestsImport):
            self._show(f"cannot be read: {event.worker.error}", "-error")
            return
        self.plan = plan
        ready = plan.ok and bool(plan.added)
        self._show(preview_text(plan), "-done" if ready else ("" if plan.ok else "-error"))
        add = self.query_one("#add", Button)
        add.disabled = not ready
        if ready:
            add.focus()

    def _show(self, text: str, state: str) -> None:
        preview = self.query_one("#preview", Static)
        preview.update(text)
        preview.set_class(state == "-error", "-error")
        preview.set_class(state == "-done", "-done")

    @on(Button.Pressed, "#add")
    def add(self) -> None:
        if self.plan is not None and self.plan.ok and self.plan.added:
            self.dismiss(self.plan)

    @on(Button.Pressed, "#close")
    def action_close(self) -> None:
        self.dismiss(None)
