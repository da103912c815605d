"""Painting the roster grid line by line: the layout of its columns and one Strip per line.

A line is two strips: the fixed part (flag, name, skills) that never scrolls, and
the canvas (days, then the statistics) that the widget crops to its scroll offset.
Backgrounds carry state (cursor > swap mark > changed since the version compared
against, in diff mode > hard > soft > leave > holiday > weekend), the code's colour
says which shift it is (palette.py); a `*` before the code marks a request (green
granted, red not), a `#` after it a lock, `~` a day of leave.
"""

from __future__ import annotations

from dataclasses import dataclass

from rich.segment import Segment
from rich.style import Style
from textual.strip import Strip

from rostertui.core.check.builtin import honoured as granted
from rostertui.core.edit.session import Session
from rostertui.core.edit.view import DayColumn, GridView
from rostertui.core.models.common import OFF
from rostertui.core.words import month, number

HEADER = 2
STATS = (("hours", 8), ("nts", 4), ("wknd", 5), ("req", 5))
STYLE_NAMES = (
    "base", "header", "header-weekend", "header-holiday", "header-cursor", "name", "name-cursor",
    "skills", "flag-hard", "flag-soft", "off", "leave", "leave-mark", "weekend", "holiday", "hard",
    "soft", "cursor", "cursor-hard", "cursor-soft", "req-ok", "req-denied", "lock", "sep",
    "cover-label", "cover-ok", "cover-short", "cover-under", "stat-bad", "stat-warn", "stat-ok",
    "changed", "mark",
)


@dataclass(frozen=True)
class Row:
    kind: str  # "person", "sep" or "cover"
    key: str | int | None = None  # person id, or cover row index


@dataclass
class Layout:
    name_w: int
    skills_w: int
    cell_w: int
    day_x: list[int]
    stats_x: int
    canvas_w: int

    @property
    def fixed_w(self) -> int:
        return 1 + self.name_w + 1 + self.skills_w + 1

    @classmethod
    def of(cls, session: Session, view: GridView, width: int) -> Layout:
        names = max((len(p.name) for p in view.people), default=4)
        labels = max((len(c.label) + 6 for c in view.cover), default=0)
        skills = max((len(",".join(p.skills)) for p in view.people), default=0)
        code_w = min(4, max((len(c) for c in session.codes), default=1))
        wide = width >= 150
        name_w = max(8, min(max(names, labels), 24 if wide else 14))
        skills_w = min(skills, 14 if wide else 6)
        # cells grow (up to 2 more columns) when the terminal has room for every day
        fixed_w = 1 + name_w + 1 + skills_w + 1
        stats_w = 2 + sum(w + 1 for _, w in STATS)
        seps = sum(1 for d in view.days if d.week_start)
        room = (width - fixed_w - stats_w - seps - 1) // max(1, len(view.days))
        cell_w = max(code_w + 2, min(code_w + 4, room))
        x, day_x = 0, []
        for d in view.days:
            x += 1 if d.week_start else 0
            day_x.append(x)
            x += cell_w
        stats_x = x + 2
        canvas_w = stats_x + sum(w + 1 for _, w in STATS)
        return cls(name_w, skills_w, cell_w, day_x, stats_x, canvas_w)


def fit(text: str, width: int, align: str = "left") -> str:
    if len(text) > width:
        return text[: max(0, width - 1)] + "…" if width > 1 else text[:width]
    if align == "right":
        return text.rjust(width)
    if align == "center":
        return text.center(width)
    return text.ljust(width)


class Painter:
    """Paints the lines of one view of the session with the widget's styles."""

    def __init__(self, session: Session, view: GridView, layout: Layout,
                 styles: dict[str, Style], colours: dict[str, Style],
                 changed: dict[tuple[str, int], str] | None = None,
                 mark: tuple[str, int] | None = None):
        """`styles`: the widget's component styles by name (STYLE_NAMES); `colours`: each
        shift code's style; `changed`: in diff mode, the cells that differ from the
        version compared against (with its code); `mark`: the cell marked for a swap."""
        self.session, self.view, self.layout = session, view, layout
        self.s = styles
        self.colours = colours
        self.changed = changed or {}
        self.mark = mark

    def _column_bg(self, d: DayColumn) -> Style:
        if d.holiday:
            return self.s["holiday"]
        return self.s["weekend"] if d.weekend else self.s["base"]

    def _canvas(self, cells: list[list[Segment]], after: list[Segment]) -> Strip:
        """Day cells (with week separators), then the statistics segments."""
        s = self.s
        out: list[Segment] = []
        for d, cell in zip(self.view.days, cells, strict=True):
            if d.week_start:
                out.append(Segment("│", s["sep"]))
            out += cell
        out.append(Segment("  ", s["base"]))
        out += after
        return Strip(out).adjust_cell_length(self.layout.canvas_w, s["base"])

    # -- header -------------------------------------------------------------------------------
    def header(self, line: int, cursor_day: int | None) -> tuple[Strip, Strip]:
        s, lay, view = self.s, self.layout, self.view
        if line == 0:
            first, last = view.days[0].date, view.days[-1].date
            one = (first.year, first.month) == (last.year, last.month)
            label = f"{month(first)}" + ("" if one else f"-{month(last)}") + f" {last.year}"
            fixed = Segment(fit(" " + label, lay.fixed_w), s["header"])
            stats = [Segment(fit(name, w, "right") + " ", s["header"]) for name, w in STATS]
        else:
            text = " " + fit("person", lay.name_w) + " " + fit("skills", lay.skills_w) + " "
            fixed = Segment(text, s["header"])
            stats = [Segment(" " * (w + 1), s["header"]) for _, w in STATS]
        cells = []
        for d in view.days:
            text = d.weekday if line == 0 else str(d.date.day)
            style = s["header-holiday"] if d.holiday else (
                s["header-weekend"] if d.weekend else s["header"])
            if d.index == cursor_day:
                style = s["header-cursor"]
            cells.append([Segment(fit(text, lay.cell_w, "center"), style)])
        return Strip([fixed]), self._canvas(cells, stats)

    # -- body -----------------------------------------------------------------------------------
    def row(self, row: Row, cursor_day: int | None) -> tuple[Strip, Strip]:
        if row.kind == "person":
            assert isinstance(row.key, str)
            return self.person(row.key, cursor_day)
        if row.kind == "cover":
            assert isinstance(row.key, int)
            return self.cover(row.key, cursor_day)
        return self.separator()

    def _fixed(self, flag: Segment, name: str, skills: str, on_cursor: bool,
               name_style: Style | None = None) -> Strip:
        s, lay = self.s, self.layout
        style = s["name-cursor"] if on_cursor else (name_style or s["name"])
        return Strip([
            flag,
            Segment(fit(name, lay.name_w), style),
            Segment(" ", s["base"]),
            Segment(fit(skills, lay.skills_w), s["skills"]),
            Segment(" ", s["base"]),
        ])

    def person(self, pid: str, cursor_day: int | None) -> tuple[Strip, Strip]:
        s, view, session = self.s, self.view, self.session
        person = session.ws.person_by_id[pid]
        sev = view.person_severity(pid)
        flag = Segment("✖" if sev == "hard" else "▲" if sev == "soft" else " ",
                       s[f"flag-{sev}"] if sev else s["base"])
        fixed = self._fixed(flag, person.name, ",".join(person.skills), cursor_day is not None)
        row = session.roster.rows[pid]
        cells = [self._cell(pid, d, row[d.index], d.index == cursor_day) for d in view.days]
        return fixed, self._canvas(cells, self._stats(pid))

    def _cell(self, pid: str, d: DayColumn, code: str, on_cursor: bool) -> list[Segment]:
        """Three parts: request mark, the code (or · off, ~ leave), lock mark."""
        s, view = self.s, self.view
        key = (pid, d.index)
        leave = key in view.leave
        sev = view.severity(pid, d.index)
        bg = s["cursor"] if on_cursor else s["mark"] if key == self.mark else (
            s["changed"] if key in self.changed else s[sev] if sev else (
                s["leave"] if leave else self._column_bg(d)))
        if code == OFF:
            text, fg = ("~", s["leave-mark"]) if leave else ("·", s["off"])
        else:
            text, fg = code, self.colours.get(code, Style(bold=True))
        if on_cursor:
            fg = s["cursor-hard"] if sev == "hard" else s["cursor-soft"] if sev else s["cursor"]
        reqs = view.requests.get(key)
        left = Segment(" ", bg)
        if reqs:
            ok = all(granted(r, code) for r in reqs)
            left = Segment("*", bg + s["req-ok" if ok else "req-denied"])
        locked = self.session.locked(pid, d.index)
        right = Segment("#" if locked else " ", bg + s["lock"])
        middle = Segment(fit(text, self.layout.cell_w - 2, "center"), bg + fg)
        return [left, middle, right]

    def _stats(self, pid: str) -> list[Segment]:
        s = self.s
        p = self.session.stats.person(pid)
        hours_style = s["stat-ok"]
        if (p.hours_min is not None and p.hours < p.hours_min) or (
                p.hours_max is not None and p.hours > p.hours_max):
            hours_style = s["stat-bad"]
        req = f"{p.requests_granted}/{p.requests_asked}" if p.requests_asked else ""
        values = [
            (number(p.hours), hours_style),
            (str(p.nights), s["base"]),
            (str(p.weekends), s["base"]),
            (req, s["stat-warn"] if p.requests_denied else s["base"]),
        ]
        return [Segment(fit(text, w, "right") + " ", style)
                for (text, style), (_, w) in zip(values, STATS, strict=True)]

    def cover(self, index: int, cursor_day: int | None) -> tuple[Strip, Strip]:
        s, view = self.s, self.view
        c = view.cover[index]
        fixed = self._fixed(Segment(" ", s["base"]), f"cover {c.label}", "",
                            cursor_day is not None, s["cover-label"])
        cells = []
        for d in view.days:
            need = c.needs[d.index]
            n = c.assigned[d.index]
            if need is None:
                text, style = ("" if n == 0 else str(n)), self._column_bg(d) + s["off"]
            else:
                state = need.state(n)
                style = (s["cover-short"] if state in ("short", "over") else
                         s["cover-under"] if state in ("under", "above") else
                         self._column_bg(d) + s["cover-ok"])
                text = str(n)
            if d.index == cursor_day:
                style = s["cursor"]
            cells.append([Segment(fit(text, self.layout.cell_w, "center"), style)])
        return fixed, self._canvas(cells, [])

    def separator(self) -> tuple[Strip, Strip]:
        s, lay = self.s, self.layout
        label = fit("─ cover: on shift ", lay.fixed_w)
        label = label.rstrip() + "─" * (lay.fixed_w - len(label.rstrip()))
        return Strip([Segment(label, s["sep"])]), Strip([Segment("─" * lay.canvas_w, s["sep"])])
