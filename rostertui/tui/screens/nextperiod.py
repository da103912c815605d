"""Start the next period: a preview of the new workspace, then create it.

The preview is `core.cycle.plan_next` on the workspace as saved (unsaved grid edits are
not in it: the dialog says so), in words by `core.cycle.preview_lines`: what the CLI's
`rostertui next` prints and writes. Dismissed with the new folder, or None.
"""

from __future__ import annotations

from datetime import date
from pathlib import Path

from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Button, Checkbox, Input, Label, Static

from rostertui.core.cycle import Plan, plan_next, preview_lines, write_plan
from rostertui.core.errors import InputError, RosterError
from rostertui.core.io.load import load_workspace


def parse_dates(text: str) -> list[date]:
    """Dates as YYYY-MM-DD separated by commas or spaces; ValueError names a bad one."""
    out = []
    for part in text.replace(",", " ").split():
        try:
            out.append(date.fromisoformat(part))
        except ValueError:
            raise ValueError(f"{part!r} is not a date; write YYYY-MM-DD") from None
    return out


class NextPeriodScreen(ModalScreen[Path | None]):
    CSS_PATH = "nextperiod.tcss"

    BINDINGS = [Binding("escape", "dismiss(None)", "Close")]

    def __init__(self, folder: Path, unsaved: bool = False) -> None:
        super().__init__()
        self.folder = folder
        self.unsaved = unsaved
        self.plan: Plan | None = None

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Label("Start the next period", classes="title")
            with Horizontal(classes="fields"):
                yield Input(placeholder="days (same as now)", id="days", type="integer")
                yield Input(placeholder="holidays: 2027-05-01, ...", id="holidays")
            yield Input(placeholder="folder (default: beside this one)", id="target")
            yield Checkbox("start from a roster that breaks hard rules", id="force")
            with VerticalScroll(id="preview-box"):
                yield Static("", id="preview")
            with Horizontal(classes="buttons"):
                yield Button("Create", id="create", variant="primary", disabled=True)
                yield Button("Preview", id="refresh")
                yield Button("Cancel (Esc)", id="cancel")

    def on_mount(self) -> None:
        self.refresh_plan()
        if self.plan is not None:
            self.query_one("#target", Input).value = str(self.plan.target)
        self.query_one("#create", Button).focus()

    @on(Input.Submitted)
    @on(Button.Pressed, "#refresh")
    @on(Checkbox.Changed)
    def refresh_plan(self) -> None:
        """Plan again with the fields as they are; show the plan or why there is none."""
        self.plan = None
        lines: list[str] = []
        if self.unsaved:
            lines.append("Unsaved changes in the grid are not included: save first (ctrl+s).")
        try:
            self.plan = self._plan()
        except (RosterError, ValueError) as exc:
            text = exc.summary() if isinstance(exc, InputError) else str(exc)
            lines.insert(0, f"Cannot start the next period: {text}")
        else:
            lines = preview_lines(self.plan) + [f"warning: {w}" for w in self.plan.warnings] \
                + lines
        self.query_one("#preview", Static).update("\n".join(lines))
        self.query_one("#create", Button).disabled = self.plan is None

    def _plan(self) -> Plan:
        days_text = self.query_one("#days", Input).value.strip()
        target_text = self.query_one("#target", Input).value.strip()
        ws = load_workspace(self.folder)
        return plan_next(
            ws, Path(target_text) if target_text else None,
            days=int(days_text) if days_text else None,
            holidays=parse_dates(self.query_one("#holidays", Input).value),
            force=self.query_one("#force", Checkbox).value,
        )

    @on(Button.Pressed, "#create")
    def create(self) -> None:
        self.refresh_plan()  # the files may have changed since the preview
        if self.plan is None:
            return
        try:
            write_plan(self.plan)
        except (RosterError, OSError) as exc:
            self.query_one("#preview", Static).update(f"Not written: {exc}")
            self.query_one("#create", Button).disabled = True
            return
        self.dismiss(self.plan.target)

    @on(Button.Pressed, "#cancel")
    def cancel(self) -> None:
        self.dismiss(None)
