"""The rules: the effective set with each rule's origin, scope and parameters; a rule
edited as TOML is saved as a local [[rule]] of unit.toml (which replaces a preset rule
of the same id, as the workspace format says). The loader checks it first.
"""

from __future__ import annotations

import tomllib
from collections.abc import Callable
from pathlib import Path
from typing import Any

import tomli_w
from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.content import Content
from textual.widgets import Button, DataTable, Static, TextArea

from rostertui.core.edit.files import apply
from rostertui.core.edit.session import Session
from rostertui.core.errors import InputError
from rostertui.core.io.save import as_toml_data
from rostertui.core.io.toml_merge import merge_text, same_data
from rostertui.core.models.rules import RULE_KINDS
from rostertui.core.models.workspace import EffectiveRule
from rostertui.tui.look import BAD, GOOD, UNSURE
from rostertui.tui.messages import WorkspaceEdited

TEMPLATE = 'id = "max-nights-in-row"\nkind = "max-consecutive-shift"\nshift = "@night"\n' \
           'count = 3\nweight = 40\nsource = "local agreement"\n'
SCOPE_KEYS = ("people", "groups", "except")


def rule_data(eff: EffectiveRule) -> dict[str, Any]:
    data = as_toml_data(eff.rule)
    return {"id": data.pop("id"), "kind": eff.rule.kind, **data}


def _value(value: Any) -> str:
    if isinstance(value, list):
        return "[" + ", ".join(_value(v) for v in value) + "]"
    return f"{value:g}" if isinstance(value, float) else str(value)


def params_text(data: dict[str, Any]) -> str:
    skip = ("id", "kind", "weight", "source", "note", *SCOPE_KEYS)
    return ", ".join(f"{k}={_value(v)}" for k, v in data.items() if k not in skip)


def unit_text(folder: Path, rule: dict[str, Any] | None, replaces: str | None) -> str:
    """unit.toml with the local rule `replaces` swapped for `rule` (or added, or removed)."""
    original = (folder / "unit.toml").read_text(encoding="utf-8")
    data = tomllib.loads(original)
    rules = [r for r in data.get("rule", []) if r.get("id") != replaces]
    if rule is not None:
        at = next((i for i, r in enumerate(data.get("rule", [])) if r.get("id") == replaces),
                  len(rules))
        rules.insert(min(at, len(rules)), rule)
    if rules:
        data["rule"] = rules
    else:
        data.pop("rule", None)
    merged = merge_text(original, data)  # keeps the file's comments and layout
    return merged if same_data(tomllib.loads(merged), data) else tomli_w.dumps(data)


class RulesEditor(Vertical):
    BINDINGS = [
        Binding("n", "new", "New local rule"),
        Binding("delete", "remove", "Remove local rule"),
        Binding("ctrl+r", "save", "Save rule"),
    ]

    def __init__(self, session: Callable[[], Session], **kwargs) -> None:
        super().__init__(**kwargs)
        self.get_session = session
        self.replaces: str | None = None  # id of the local rule in the text, if any

    def compose(self) -> ComposeResult:
        yield DataTable(cursor_type="row", zebra_stripes=True, classes="items")
        yield Static("", classes="form-title")
        yield TextArea(TEMPLATE, classes="rule-text")
        with Horizontal(classes="form-buttons"):
            yield Button("Save rule (ctrl+r)", classes="save", variant="primary", compact=True)
            yield Button("Remove local rule (Del)", classes="remove", variant="error",
                         compact=True)
            yield Button("New (n)", classes="new", compact=True)
            yield Static(f"kinds: {', '.join(RULE_KINDS)}", classes="hint")
        yield Static("", classes="problems")

    def on_mount(self) -> None:
        table = self.query_one(DataTable)
        for label in ("id", "kind", "hard/weight", "origin", "scope", "parameters", "source"):
            table.add_column(label)
        self.reload()
        self.action_new(focus=False)

    def effective(self) -> list[EffectiveRule]:
        return list(self.get_session().ws.rules)

    def reload(self) -> None:
        session = self.get_session()
        table = self.query_one(DataTable)
        row = table.cursor_row
        table.clear()
        everyone = len(session.ws.person_ids)
        for eff in self.effective():
            data = rule_data(eff)
            scope = "everyone" if len(eff.people) == everyone else f"{len(eff.people)} people"
            weight = "hard" if eff.hard else f"soft {eff.rule.weight}"
            table.add_row(eff.id, eff.rule.kind, weight, eff.origin, scope, params_text(data),
                          eff.rule.source or "", key=eff.id)
        if table.row_count:
            table.move_cursor(row=min(max(row, 0), table.row_count - 1))

    def _show(self, text: str, title: str, replaces: str | None) -> None:
        self.replaces = replaces
        self.query_one(TextArea).load_text(text)
        self.query_one(".form-title", Static).update(Content.styled(title, style=f"bold {UNSURE}"))

    def action_new(self, focus: bool = True) -> None:
        self._show(TEMPLATE, "New local rule (unit.toml): edit the TOML, then ctrl+r", None)
        self.query_one(".problems", Static).update("")
        if focus:
            self.query_one(TextArea).focus()

    @on(Button.Pressed, ".new")
    def _new(self) -> None:
        self.action_new()

    @on(DataTable.RowSelected)
    def _chosen(self, event: DataTable.RowSelected) -> None:
        eff = next(e for e in self.effective() if e.id == str(event.row_key.value))
        local = eff.origin == "unit.toml"
        title = (f"Local rule {eff.id} (unit.toml)" if local else
                 f"{eff.id} from {eff.origin}: saving makes a local rule that replaces it")
        self._show(tomli_w.dumps(rule_data(eff)), title, eff.id if local else None)
        self.query_one(TextArea).focus()

    @on(Button.Pressed, ".save")
    def action_save(self) -> None:
        problems = self.query_one(".problems", Static)
        try:
            rule = tomllib.loads(self.query_one(TextArea).text)
        except tomllib.TOMLDecodeError as exc:
            problems.update(Content.styled(f"Not saved: not valid TOML: {exc}", style=BAD))
            return
        replaces = self.replaces if self.replaces is not None else rule.get("id")
        if self._apply(rule, replaces, f"saved rule {rule.get('id')}"):
            self.replaces = rule.get("id")

    @on(Button.Pressed, ".remove")
    def action_remove(self) -> None:
        table = self.query_one(DataTable)
        rules = self.effective()
        rid = rules[table.cursor_row].id if table.has_focus and rules else self.replaces
        eff = next((e for e in rules if e.id == rid), None)
        problems = self.query_one(".problems", Static)
        if eff is None or eff.origin != "unit.toml":
            problems.update(Content.styled(
                "Only local rules (origin unit.toml) can be removed here; a preset rule goes "
                "with its include in unit.toml.", style=UNSURE))
            return
        if self._apply(None, rid, f"removed rule {rid}"):
            self.action_new(focus=False)

    def _apply(self, rule: dict[str, Any] | None, replaces: str | None, done: str) -> bool:
        session = self.get_session()
        problems = self.query_one(".problems", Static)
        assert session.ws.path is not None
        try:
            new = apply(session, [], {"unit.toml": unit_text(session.ws.path, rule, replaces)})
        except InputError as exc:
            problems.update(Content.styled(
                "Not saved:\n" + "\n".join(f"  {p}" for p in exc.problems), style=BAD))
            return False
        except (OSError, tomllib.TOMLDecodeError) as exc:
            problems.update(Content.styled(f"Not saved: {exc}", style=BAD))
            return False
        problems.update(Content.styled(f"{done}; unit.toml written", style=GOOD))
        self.post_message(WorkspaceEdited(new, done))
        return True
