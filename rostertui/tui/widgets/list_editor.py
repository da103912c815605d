"""A list of a workspace file (people, leave, requests, shifts, cover) with a form to
add, change and remove items. Every save goes through `editing.apply`: the loader
checks the whole workspace first, so a problem is reported in its words (file, key,
line) and nothing is written. The editor posts `WorkspaceEdited` with the new session.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

from pydantic import BaseModel
from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Grid, Horizontal, Vertical
from textual.content import Content
from textual.widgets import Button, DataTable, Input, Label, Static

from rostertui.core.edit.files import apply
from rostertui.core.edit.forms import build_item, field_text, key_of
from rostertui.core.edit.session import Session
from rostertui.core.errors import InputError
from rostertui.core.models.workspace import Workspace
from rostertui.tui.look import BAD, GOOD, UNSURE
from rostertui.tui.messages import WorkspaceEdited


@dataclass(frozen=True)
class ListSpec:
    title: str
    file: str  # the Workspace attribute holding the file model: "staff", "requests", "shifts"
    items: str  # the list inside it: "person", "leave", "request", "shift", "cover"
    model: type[BaseModel]
    fields: tuple[str, ...]  # field names, in the order of the form
    key: str | None = None  # a field that cannot change once saved (other files refer to it)
    hint: str = ""

    def file_model(self, ws: Workspace) -> BaseModel:
        return getattr(ws, self.file)

    def entries(self, ws: Workspace) -> list[BaseModel]:
        return list(getattr(self.file_model(ws), self.items))

    def label(self, item: BaseModel) -> str:
        return field_text(item, self.fields[0]) + (
            f" {field_text(item, self.fields[1])}" if len(self.fields) > 1 else "")


class ListEditor(Vertical):
    BINDINGS = [
        Binding("n", "new", "New"),
        Binding("delete", "remove", "Remove"),
    ]

    def __init__(self, spec: ListSpec, session: Callable[[], Session], **kwargs) -> None:
        super().__init__(**kwargs)
        self.spec = spec
        self.get_session = session
        self.editing: int | None = None  # index of the item in the form; None = a new one
        self.then_fill: int | None = None  # the item to show once the new session arrives

    def compose(self) -> ComposeResult:
        spec = self.spec
        yield DataTable(cursor_type="row", zebra_stripes=True, classes="items")
        yield Static("", classes="form-title")
        with Grid(classes="form"):
            for name in spec.fields:
                yield Label(key_of(spec.model, name))
                yield Input(compact=True, id=f"f-{name}", placeholder=key_of(spec.model, name))
        with Horizontal(classes="form-buttons"):
            yield Button("Save (Enter)", classes="save", variant="primary", compact=True)
            yield Button("Remove (Del)", classes="remove", variant="error", compact=True)
            yield Button("New (n)", classes="new", compact=True)
            yield Static(spec.hint, classes="hint")
        yield Static("", classes="problems")

    def on_mount(self) -> None:
        table = self.query_one(DataTable)
        for name in self.spec.fields:
            table.add_column(key_of(self.spec.model, name))
        self.reload()
        self.action_new(focus=False)

    def reload(self) -> None:
        table = self.query_one(DataTable)
        row = table.cursor_row
        table.clear()
        for i, item in enumerate(self.spec.entries(self.get_session().ws)):
            table.add_row(*(field_text(item, n) for n in self.spec.fields), key=str(i))
        if table.row_count:
            table.move_cursor(row=min(max(row, 0), table.row_count - 1))
        if self.then_fill is not None:
            self.fill(self.then_fill)
            self.then_fill = None

    # -- the form ---------------------------------------------------------------------------
    def fill(self, index: int | None) -> None:
        items = self.spec.entries(self.get_session().ws)
        item = items[index] if index is not None and index < len(items) else None
        self.editing = index if item is not None else None
        for name in self.spec.fields:
            field = self.query_one(f"#f-{name}", Input)
            field.value = field_text(item, name) if item is not None else ""
            field.disabled = item is not None and name == self.spec.key
        title = f"Changing {self.spec.label(item)}" if item is not None else \
            f"New {self.spec.items}"
        self.query_one(".form-title", Static).update(Content.styled(title, style=f"bold {UNSURE}"))

    def action_new(self, focus: bool = True) -> None:
        self.fill(None)
        self.query_one(".problems", Static).update("")
        if focus:
            self.query_one(f"#f-{self.spec.fields[0]}", Input).focus()

    @on(Button.Pressed, ".new")
    def _new(self) -> None:
        self.action_new()

    @on(DataTable.RowSelected)
    def _chosen(self, event: DataTable.RowSelected) -> None:
        self.fill(int(str(event.row_key.value)))
        first = next(n for n in self.spec.fields if n != self.spec.key)
        self.query_one(f"#f-{first}", Input).focus()

    @on(Input.Submitted)
    @on(Button.Pressed, ".save")
    def save(self) -> None:
        texts = {n: self.query_one(f"#f-{n}", Input).value for n in self.spec.fields}
        item = build_item(self.spec.model, texts)
        items = self.spec.entries(self.get_session().ws)
        if self.editing is None:
            items.append(item)
            index = len(items) - 1
        else:
            items[self.editing] = item
            index = self.editing
        if self._apply(items, f"saved {self.spec.label(item)}"):
            self.then_fill = index

    # -- removing -----------------------------------------------------------------------------
    @on(Button.Pressed, ".remove")
    def action_remove(self) -> None:
        """The highlighted item when the list has focus, else the one in the form."""
        table = self.query_one(DataTable)
        index = table.cursor_row if table.has_focus or self.editing is None else self.editing
        items = self.spec.entries(self.get_session().ws)
        if not 0 <= index < len(items):
            return
        from rostertui.tui.screens.dialogs import Confirm

        label = self.spec.label(items[index])

        def confirmed(yes: bool | None) -> None:
            if yes and self._apply(items[:index] + items[index + 1:], f"removed {label}"):
                self.then_fill = len(items)  # past the end: an empty form for a new one
                table.focus()

        self.app.push_screen(Confirm(f"Remove {label} from {self._file_name()}?", "Remove"),
                             confirmed)

    def _file_name(self) -> str:
        return {"staff": "staff.toml", "requests": "requests.toml",
                "shifts": "shifts.toml"}.get(self.spec.file, self.spec.file)

    def _apply(self, items: list[BaseModel], done: str) -> bool:
        session = self.get_session()
        problems = self.query_one(".problems", Static)
        model = self.spec.file_model(session.ws).model_copy(update={self.spec.items: items})
        try:
            new = apply(session, [model])
        except InputError as exc:
            problems.update(Content.styled(
                "Not saved:\n" + "\n".join(f"  {p}" for p in exc.problems), style=BAD))
            return False
        except OSError as exc:
            problems.update(Content.styled(f"Not saved: {exc}", style=BAD))
            return False
        problems.update(Content.styled(f"{done}; {self._file_name()} written", style=GOOD))
        self.post_message(WorkspaceEdited(new, done))
        return True
