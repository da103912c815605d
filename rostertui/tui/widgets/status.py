"""One-line summary bar (unit, totals, unsaved) and the status lines under the grid."""

from __future__ import annotations

from rich.text import Text
from textual.widgets import Static

from rostertui.core.check import Violation
from rostertui.core.edit.session import Session
from rostertui.core.edit.view import GridView, cell_text, cover_text, person_summary
from rostertui.core.words import day as day_text

HARD_MARK, SOFT_MARK = "✖", "▲"


def violation_line(v: Violation, who: str = "") -> Text:
    mark = Text(HARD_MARK if v.hard else SOFT_MARK,
                style="bold #ff5f5f" if v.hard else "bold #e0a030")
    cost = "hard" if v.hard else f"penalty {v.penalty}"
    line = Text.assemble(mark, " ", (v.rule, "bold"), f" ({cost}) ", who, v.message)
    if v.source:
        line.append(f" — {v.source}", style="italic #8d99a6")
    return line


class SummaryBar(Static):
    """Unit, period, compliance, penalty and whether there are unsaved changes."""

    DEFAULT_CSS = """
    SummaryBar {
        height: 1; background: #1f2a36; color: #d8dee4; padding: 0 1;
        text-wrap: nowrap; text-overflow: ellipsis;
    }
    """

    def show(self, session: Session, mode: str) -> None:
        """Totals first (they matter at any width), then the unit and period."""
        unit = session.ws.unit
        check = session.check
        text = Text()
        if check.hard_violations:
            text.append(f"{HARD_MARK} {check.hard_violations} hard", style="bold #ff6b6b")
        else:
            text.append("✓ no hard violation", style="bold #8fd18f")
        soft = sum(1 for v in check.violations if not v.hard)
        text.append(f" · {SOFT_MARK} {soft} soft, penalty {check.penalty}")
        if session.dirty:
            text.append(" · ● unsaved", style="bold #f4b942")
        elif not session.had_file:
            text.append(" · no roster.toml yet", style="#8d99a6")
        text.append(f" │ {mode} │ ", style="#8d99a6")
        text.append(unit.name, style="bold")
        text.append(f" {day_text(unit.start)}-{day_text(unit.end)} {unit.end.year}")
        self.update(text, layout=False)


class StatusLine(Static):
    """What is under the cursor, in words: the cell, the person, the violations there."""

    DEFAULT_CSS = """
    StatusLine { text-wrap: nowrap; text-overflow: ellipsis; }
    """

    def show(self, session: Session, view: GridView, person: str | None, cover_row: int | None,
             day: int, typed: str = "", note: str = "", extra: Text | None = None) -> None:
        """`extra`: a line under the cell's (diff mode: the cell as published)."""
        lines: list[Text] = []
        if person is not None:
            lines.append(Text(cell_text(session, view, person, day), style="bold"))
        elif cover_row is not None:
            lines.append(Text(cover_text(view, cover_row, day), style="bold"))
        if extra is not None:
            lines.append(extra)
        if typed:
            codes = " ".join(session.codes)
            lines.append(Text(f"typing {typed}…  Enter sets it, Esc drops it  (shifts: {codes}"
                              ", - off)", style="bold #f4b942"))
        elif note:
            lines.append(Text(note, style="#f4b942"))
        elif person is not None:
            name = session.ws.person_by_id[person].name
            lines.append(Text(f"{name}: {person_summary(session, person)}", style="#aab4be"))
        if person is None and cover_row is None:
            self.update(Text("Nobody in staff.toml yet: add people there, then reopen.",
                             style="#f4b942"), layout=False)
            return
        found = self._violations(view, person, cover_row, day)
        room = max(1, (self.size.height or 4) - len(lines))
        if not found:
            lines.append(Text("✓ no violation here", style="#8fd18f"))
        for i, (v, who) in enumerate(found):
            if i == room - 1 and len(found) > room:
                lines.append(Text(f"… and {len(found) - i} more here (F3 lists every violation)",
                                  style="#8d99a6"))
                break
            lines.append(violation_line(v, who))
        self.update(Text("\n").join(lines), layout=False)  # fixed height: no layout pass

    @staticmethod
    def _violations(view: GridView, person: str | None, cover_row: int | None,
                    day: int) -> list[tuple[Violation, str]]:
        if cover_row is not None:
            return [(v, "") for v in view.cover_violations.get((cover_row, day), [])]
        if person is None:
            return []
        here = [(v, "") for v in view.cell_violations.get((person, day), [])]
        here.sort(key=lambda vw: not vw[0].hard)
        whole = [(v, "period: ") for v in view.person_violations.get(person, [])]
        whole.sort(key=lambda vw: not vw[0].hard)
        return here + whole
