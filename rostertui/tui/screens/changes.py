"""Changing a published roster by hand: a swap (shown before it is made) and an absence.

`SwapDialog` shows a `SwapPlan`: the cells that would change and the violations
the swap would create and resolve; it is dismissed with True (make the swap) or
False (nothing changes). `AbsenceDialog` asks the dates, reason and credit hours,
records the absence in the session (one undoable step) and is dismissed with the
`AbsencePlan`; a refusal is shown in the dialog, which stays open.
"""

from __future__ import annotations

from datetime import date

from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import Button, Input, Label, Static

from rostertui.core.check import Violation
from rostertui.core.edit.forms import parse_day
from rostertui.core.edit.plans import AbsencePlan, SwapPlan
from rostertui.core.edit.session import Session
from rostertui.core.errors import EditError
from rostertui.core.models.common import OFF
from rostertui.core.models.workspace import Workspace
from rostertui.core.words import weekday_day
from rostertui.tui.look import BAD, GOOD, MUTED, TITLE
from rostertui.tui.messages import SessionChanged
from rostertui.tui.widgets.status import violation_line


def code_text(code: str) -> str:
    return "off" if code == OFF else code


def violations_text(ws: Workspace, found: list[Violation], none: str) -> Content:
    if not found:
        return Content.styled(f"  {none}", style=MUTED)
    lines: list[Content] = []
    for v in sorted(found, key=lambda v: not v.hard):
        who = f"{ws.person_by_id[v.person].name}: " if v.person in ws.person_by_id else ""
        lines.append(Content("  ") + violation_line(v, who))
    return Content("\n").join(lines)


def swap_text(ws: Workspace, plan: SwapPlan) -> Content:
    """The cells that change, what the swap creates and resolves, and the totals."""
    text = Content.styled("Cells that change\n", style=f"bold {TITLE}")
    for c in plan.cells:
        name = ws.person_by_id[c.person].name if c.person in ws.person_by_id else c.person
        text += Content.styled(f"  {name:<20} {weekday_day(c.date):<11} ")
        text += Content.styled(f"{code_text(c.before)} → {code_text(c.after)}\n", style="bold")
    found = plan.impact
    text += Content.styled(f"\nCreates ({len(found.created)})\n", style=f"bold {BAD}")
    text += (violations_text(ws, found.created, "no new violation"))
    text += Content.styled(f"\n\nResolves ({len(found.resolved)})\n", style=f"bold {GOOD}")
    text += (violations_text(ws, found.resolved, "nothing"))
    before, after = found.before, found.after
    change = found.penalty_change
    text += Content.styled(f"\n\nPenalty {before.penalty} → {after.penalty} ({change:+d}) · "
                           f"hard violations {before.hard_violations} → "
                           f"{after.hard_violations}", style="bold")
    return text


class SwapDialog(ModalScreen[bool]):
    CSS_PATH = ["dialogs.tcss", "changes.tcss"]

    BINDINGS = [
        Binding("y,enter", "answer(True)", "Make the swap"),
        Binding("n,escape", "answer(False)", "Cancel: nothing changes"),
    ]

    def __init__(self, session: Session, plan: SwapPlan) -> None:
        super().__init__()
        self.session, self.plan = session, plan

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog change"):
            label = self.plan.label
            yield Label(label[:1].upper() + label[1:], classes="title")
            with VerticalScroll(classes="body"):
                yield Static(swap_text(self.session.ws, self.plan), id="swap-preview")
            with Horizontal(classes="buttons"):
                yield Button("Swap (y)", id="yes", variant="primary")
                yield Button("Cancel (n)", id="no")

    def on_mount(self) -> None:
        self.query_one("#yes", Button).focus()

    @on(Button.Pressed)
    def _pressed(self, event: Button.Pressed) -> None:
        self.dismiss(event.button.id == "yes")

    def action_answer(self, yes: bool) -> None:
        self.dismiss(yes)


class AbsenceDialog(ModalScreen[AbsencePlan | None]):
    CSS_PATH = ["dialogs.tcss", "changes.tcss"]

    BINDINGS = [Binding("escape", "dismiss(None)", "Cancel")]

    def __init__(self, session: Session, person: str, day: date) -> None:
        super().__init__()
        self.session, self.person, self.day = session, person, day

    def compose(self) -> ComposeResult:
        p = self.session.ws.person_by_id[self.person]
        with Vertical(classes="dialog change"):
            yield Label(f"Absence of {p.name} ({p.id})", classes="title")
            yield Static("A sick call or other absence, kept as leave in requests.toml "
                         "(written on ctrl+s). The shifts on those days are cleared; the "
                         "cover they held shows as short, ready for a repair (F8).",
                         classes="explain")
            with Vertical(classes="form"):
                for label, field, value, hint in (
                    ("from", "first", self.day.isoformat(), ""),
                    ("to", "last", "", "empty: one day"),
                    ("reason", "reason", "sick", ""),
                    ("credit hours", "credit", "", "per day, toward the hours rules"),
                ):
                    with Horizontal(classes="row"):
                        yield Label(label)
                        yield Input(value, placeholder=hint, id=field)
            yield Static("", id="problem")
            with Horizontal(classes="buttons"):
                yield Button("Record (Enter)", id="record", variant="primary")
                yield Button("Cancel (Esc)", id="cancel")

    def on_mount(self) -> None:
        self.query_one("#last", Input).focus()

    def value(self, field: str) -> str:
        return self.query_one(f"#{field}", Input).value.strip()

    @on(Input.Submitted)
    @on(Button.Pressed, "#record")
    def record(self) -> None:
        ws = self.session.ws
        try:
            first = parse_day(ws, self.value("first"))
            last = parse_day(ws, self.value("last")) if self.value("last") else None
            credit_text = self.value("credit")
            try:
                credit = float(credit_text) if credit_text else None
            except ValueError:
                raise EditError(f"credit hours: {credit_text!r} is not a number") from None
            plan = self.session.absent(self.person, first, last, self.value("reason") or None,
                                       credit)
        except EditError as exc:
            self.query_one("#problem", Static).update(Content.styled(str(exc), style=f"bold {BAD}"))
            self.app.bell()
            return
        self.app.post_message(SessionChanged())
        self.dismiss(plan)

    @on(Button.Pressed, "#cancel")
    def _cancel(self) -> None:
        self.dismiss(None)
