"""The editors: people, leave, requests, shifts, cover and rules, one tab each.

Every change is checked by the loader on a scratch copy, then written at once
(atomically); hand edits to the roster not yet saved carry over.
"""

from __future__ import annotations

from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.widgets import DataTable, Footer, TabbedContent, TabPane

from rostertui.core.edit.session import Session
from rostertui.core.models.requests import Leave, Request
from rostertui.core.models.shifts import Cover, Shift
from rostertui.core.models.staff import Person
from rostertui.tui.host import host
from rostertui.tui.messages import WorkspaceEdited
from rostertui.tui.screens.panel import PanelScreen
from rostertui.tui.widgets.list_editor import ListEditor, ListSpec
from rostertui.tui.widgets.rules_editor import RulesEditor
from rostertui.tui.widgets.status import SummaryBar

SPECS = (
    ListSpec("People", "staff", "person", Person, ("id", "name", "skills", "groups"), key="id",
             hint="skills and groups: comma separated; an id never changes"),
    ListSpec("Leave", "requests", "leave", Leave,
             ("person", "from_", "to", "reason", "credit_hours"),
             hint="dates like 2027-03-20; `to` empty for one day"),
    ListSpec("Requests", "requests", "request", Request,
             ("person", "date", "want", "avoid", "weight", "note"),
             hint="want: off or a shift code; or avoid: a shift code"),
    ListSpec("Shifts", "shifts", "shift", Shift,
             ("code", "name", "start", "end", "paid_hours", "night", "requires"), key="code",
             hint="times HH:MM; night: true/false or empty"),
    ListSpec("Cover", "shifts", "cover", Cover,
             ("shift", "days", "dates", "skill", "min", "max", "ideal", "under_weight",
              "over_weight"), hint="days: mon, tue, ... or dates; ideal needs under_weight"),
)


class EditorsScreen(PanelScreen):
    CSS_PATH = "editors.tcss"

    BINDINGS = [
        Binding("left_square_bracket", "tab(-1)", "Previous tab", key_display="["),
        Binding("right_square_bracket", "tab(1)", "Next tab", key_display="]"),
    ]

    def __init__(self) -> None:
        super().__init__()

    def session(self) -> Session:
        return host(self.app).session

    def compose(self) -> ComposeResult:
        yield SummaryBar(id="summary")
        with TabbedContent(id="tabs"):
            for spec in SPECS:
                with TabPane(spec.title, id=f"tab-{spec.items}"):
                    yield ListEditor(spec, self.session, id=f"edit-{spec.items}")
            with TabPane("Rules", id="tab-rules"):
                yield RulesEditor(self.session, id="edit-rules")
        yield Footer(compact=True, show_command_palette=False)

    def on_mount(self) -> None:
        self.follow_revisions()
        self.query_one(SummaryBar).show(self.session(), "edit")
        self.call_after_refresh(self._focus_list)

    @on(TabbedContent.TabActivated)
    def _focus_list(self) -> None:
        """The list of the tab shown takes the keys (n, Del, Enter)."""
        pane = self.query_one(TabbedContent).active_pane
        if pane is not None:
            pane.query_one(DataTable).focus()

    def reload(self) -> None:
        self.query_one(SummaryBar).show(self.session(), "edit")
        for editor in self.query(ListEditor):
            editor.reload()
        self.query_one(RulesEditor).reload()

    def action_tab(self, step: int) -> None:
        tabs = self.query_one(TabbedContent)
        ids = [str(pane.id) for pane in self.query(TabPane)]  # every pane has an id
        tabs.active = ids[(ids.index(tabs.active) + step) % len(ids)]

    @on(WorkspaceEdited)
    def _edited(self, event: WorkspaceEdited) -> None:
        self.notify(event.note, timeout=3)
