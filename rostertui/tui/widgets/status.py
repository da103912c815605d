"""One-line summary bar (unit, totals, unsaved) and the status lines under the grid."""

from __future__ import annotations

from textual.content import Content
from textual.widgets import Static

from rostertui.core.check import Violation
from rostertui.core.edit.session import Session
from rostertui.core.edit.view import GridView, cell_text, cover_text, person_summary
from rostertui.core.words import day as day_text
from rostertui.tui.look import BAD, GOOD, MUTED, UNSURE

HARD_MARK, SOFT_MARK = "✖", "▲"


def violation_line(v: Violation, who: str = "") -> Content:
    mark = Content.styled(HARD_MARK if v.hard else SOFT_MARK,
                          f"bold {BAD}" if v.hard else f"bold {UNSURE}")
    cost = "hard" if v.hard else f"penalty {v.penalty}"
    line = Content.assemble(mark, " ", (v.rule, "bold"), f" ({cost}) ", who, v.message)
    if v.source:
        line = line.append_text(f" — {v.source}", f"italic {MUTED}")
    return line


class SummaryBar(Static):
    """Unit, period, compliance, penalty and whether there are unsaved changes."""

    DEFAULT_CSS = """
    SummaryBar {
        height: 1; background: $panel; color: $foreground; padding: 0 1;
        text-wrap: nowrap; text-overflow: ellipsis;
    }
    """

    def show(self, session: Session, mode: str) -> None:
        """Totals first (they matter at any width), then the unit and period."""
        unit = session.ws.unit
        check = session.check
        parts: list[str | tuple[str, str]] = []
        if check.hard_violations:
            parts.append((f"{HARD_MARK} {check.hard_violations} hard", f"bold {BAD}"))
        else:
            parts.append(("✓ no hard violation", f"bold {GOOD}"))
        soft = sum(1 for v in check.violations if not v.hard)
        parts.append(f" · {SOFT_MARK} {soft} soft, penalty {check.penalty}")
        if session.dirty:
            parts.append((" · ● unsaved", f"bold {UNSURE}"))
        elif not session.had_file:
            parts.append((" · no roster.toml yet", MUTED))
        parts += [(f" │ {mode} │ ", MUTED), (unit.name, "bold"),
                  f" {day_text(unit.start)}-{day_text(unit.end)} {unit.end.year}"]
        self.update(Content.assemble(*parts), layout=False)


class StatusLine(Static):
    """What is under the cursor, in words: the cell, the person, the violations there."""

    DEFAULT_CSS = """
    StatusLine { text-wrap: nowrap; text-overflow: ellipsis; }
    """

    def show(self, session: Session, view: GridView, person: str | None, cover_row: int | None,
             day: int, typed: str = "", note: str = "", extra: Content | None = None) -> None:
        """`extra`: a line under the cell's (diff mode: the cell as published)."""
        lines: list[Content] = []
        if person is not None:
            lines.append(Content.styled(cell_text(session, view, person, day), "bold"))
        elif cover_row is not None:
            lines.append(Content.styled(cover_text(view, cover_row, day), "bold"))
        if extra is not None:
            lines.append(extra)
        if typed:
            codes = " ".join(session.codes)
            lines.append(Content.styled(f"typing {typed}…  Enter sets it, Esc drops it  (shifts: "
                                        f"{codes}, - off)", f"bold {UNSURE}"))
        elif note:
            lines.append(Content.styled(note, UNSURE))
        elif person is not None:
            name = session.ws.person_by_id[person].name
            lines.append(Content.styled(f"{name}: {person_summary(session, person)}", MUTED))
        if person is None and cover_row is None:
            self.update(Content.styled("Nobody in staff.toml yet: add people there, then "
                                       "reopen.", UNSURE), layout=False)
            return
        found = self._violations(view, person, cover_row, day)
        room = max(1, (self.size.height or 4) - len(lines))
        if not found:
            lines.append(Content.styled("✓ no violation here", GOOD))
        for i, (v, who) in enumerate(found):
            if i == room - 1 and len(found) > room:
                lines.append(Content.styled(f"… and {len(found) - i} more here (F3 lists every "
                                            "violation)", MUTED))
                break
            lines.append(violation_line(v, who))
        self.update(Content("\n").join(lines), layout=False)  # fixed height: no layout pass

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
