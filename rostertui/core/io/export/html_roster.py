"""The printable roster: one self-contained HTML page for a notice board or a folder.

A legend of shift codes with times and paid hours; the grid (people x dates) with
weekend and holiday columns shaded and ruled apart and leave days hatched; cover
rows under the grid (people on each shift per date, then each cover entry against
its min / ideal / max); hours per person; notes. Prints on one landscape sheet
width (A4 or Letter) per page, the date header repeated on every page.
"""

from __future__ import annotations

from datetime import date

from rostertui.core.check.builtin import cover_days
from rostertui.core.check.grid import Grid, paid_hours
from rostertui.core.io.export.common import hours_text, need_roster, notes, shift_times
from rostertui.core.io.export.html_page import esc, page, table
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.shifts import Cover
from rostertui.core.models.workspace import Workspace
from rostertui.core.stats import PersonStats, roster_stats
from rostertui.core.words import MONTHS, day


def day_classes(ws: Workspace, d: date) -> str:
    """ "we" for a weekend day, "hol" for a holiday (both may apply)."""
    classes = []
    if WEEKDAYS[d.weekday()] in ws.unit.weekend:
        classes.append("we")
    if d in ws.unit.holidays:
        classes.append("hol")
    return " ".join(classes)


def _td(text: str, cls: str = "") -> str:
    return f'<td class="{cls}">{text}</td>' if cls else f"<td>{text}</td>"


def legend(ws: Workspace) -> str:
    rows = [
        [f"<b>{esc(s.code)}</b>", esc(s.name), esc(shift_times(s)),
         esc(hours_text(paid_hours(s))), "night" if s.is_night else ""]
        for s in ws.shifts.shift
    ]
    rows.append([f"<b>{OFF}</b>", "off", "", "", ""])
    key = ('<p class="small">Shaded columns: weekend days; amber: holidays; hatched cells: '
           f'leave. Times are local ({esc(ws.unit.timezone)}); "+1 day" ends the next '
           "morning.</p>")
    return table(("Code", "Shift", "Times", "Paid hours", ""), rows) + key


def _head(ws: Workspace, grid: Grid) -> str:
    spans: list[tuple[int, int, int]] = []  # (year, month, days shown)
    for d in grid.dates:
        if spans and spans[-1][:2] == (d.year, d.month):
            year, month, n = spans[-1]
            spans[-1] = (year, month, n + 1)
        else:
            spans.append((d.year, d.month, 1))
    top = "".join(f'<th colspan="{n}">{MONTHS[m - 1]} {y}</th>' for y, m, n in spans)
    days = "".join(
        f'<th class="{day_classes(ws, d)}">{WEEKDAYS[d.weekday()][:2].title()}<br>{d.day}</th>'
        for d in grid.dates
    )
    return (f'<thead><tr><th class="who" rowspan="2">Person</th>{top}'
            '<th class="num" rowspan="2">Shifts</th><th class="num" rowspan="2">Hours</th></tr>'
            f"<tr>{days}</tr></thead>")


def _person_row(ws: Workspace, grid: Grid, pid: str, stats: PersonStats) -> str:
    cells = [f'<td class="who">{esc(ws.person_by_id[pid].name)}</td>']
    for i, (d, code) in enumerate(zip(grid.dates, grid.rows[pid], strict=True)):
        cls = day_classes(ws, d)
        if code == OFF:
            cls += " leave" if i in grid.leave[pid] else " off"
        cells.append(_td(esc(code), cls.strip()))
    cells.append(_td(str(stats.shifts), "num"))
    cells.append(_td(esc(hours_text(stats.hours)), "num"))
    return "<tr>" + "".join(cells) + "</tr>"


def _cover_label(c: Cover) -> str:
    parts = [f"{c.shift} {c.skill}" if c.skill else c.shift]
    if c.min is not None:
        parts.append(f"min {c.min}")
    if c.ideal is not None:
        parts.append(f"ideal {c.ideal}")
    if c.max is not None:
        parts.append(f"max {c.max}")
    return " ".join(parts)


def _cover_rows(ws: Workspace, grid: Grid) -> list[str]:
    out: list[str] = []
    classes = [day_classes(ws, d) for d in grid.dates]
    for s in ws.shifts.shift:
        counts = [sum(1 for pid in ws.person_ids if grid.rows[pid][i] == s.code)
                  for i in range(grid.n)]
        tds = "".join(_td(str(n), cls) for n, cls in zip(counts, classes, strict=True))
        out.append(f'<tr class="cover"><td class="who">on {esc(s.code)}</td>{tds}'
                   "<td></td><td></td></tr>")
    for c in ws.shifts.cover:
        holders = [p.id for p in ws.staff.person if c.skill is None or c.skill in p.skills]
        applies = set(cover_days(c, grid))
        cells = []
        for i in range(grid.n):
            if i not in applies:
                cells.append(_td("", classes[i]))
                continue
            n = sum(1 for pid in holders if grid.rows[pid][i] == c.shift)
            state = ("short" if c.min is not None and n < c.min
                     else "over" if c.max is not None and n > c.max
                     else "under" if c.ideal is not None and n < c.ideal else "")
            cells.append(_td(str(n), f"{classes[i]} {state}".strip()))
        out.append(f'<tr class="cover"><td class="who">{esc(_cover_label(c))}</td>'
                   f'{"".join(cells)}<td></td><td></td></tr>')
    if out:
        out[0] = out[0].replace('<tr class="cover">', '<tr class="cover first-cover">', 1)
    return out


def _bounds(p: PersonStats) -> str:
    """The person's hours rule: "target 150", "120-165", "min 60", "max 48" or ""."""
    if p.hours_target is not None:
        return f"target {hours_text(p.hours_target)}"
    if p.hours_min is not None and p.hours_max is not None:
        return f"{hours_text(p.hours_min)}-{hours_text(p.hours_max)}"
    if p.hours_min is not None:
        return f"min {hours_text(p.hours_min)}"
    if p.hours_max is not None:
        return f"max {hours_text(p.hours_max)}"
    return ""


def roster_html(ws: Workspace) -> str:
    """The printable roster page."""
    grid = need_roster(ws)
    stats = {p.person: p for p in roster_stats(ws).people}
    unit = ws.unit
    period = f"{day(unit.start)} {unit.start.year} to {day(unit.end)} {unit.end.year}"
    cols = "<col>" * grid.n
    grid_table = (
        f'<table class="grid"><colgroup><col class="who">{cols}'
        '<col class="tot"><col class="tot"></colgroup>'
        f"{_head(ws, grid)}<tbody>\n"
        + "\n".join(_person_row(ws, grid, pid, stats[pid]) for pid in ws.person_ids)
        + "\n" + "\n".join(_cover_rows(ws, grid)) + "\n</tbody></table>"
    )
    hours_rows = [
        [esc(f"{p.name} ({p.person})"), str(p.shifts), str(p.nights), str(p.weekends),
         esc(hours_text(p.paid_hours)), esc(hours_text(p.leave_hours)),
         f"<b>{esc(hours_text(p.hours))}</b>", esc(_bounds(p))]
        for p in stats.values()
    ]
    body = [
        f"<h1>{esc(unit.name)}</h1>",
        f'<p class="meta">Roster {esc(period)} ({unit.days} days) &middot; '
        f"{len(ws.staff.person)} people &middot; times in {esc(unit.timezone)}</p>",
        legend(ws),
        grid_table,
        '<p class="small">Cover rows: people on each shift, then each cover entry of '
        "shifts.toml; red: below min, blue: above max, amber: below ideal.</p>",
        "<h2>Hours per person</h2>",
        table(("Person", "Shifts", "Nights", "Weekends", "Paid hours", "Leave credit",
               "Hours", "Contract"), hours_rows),
    ]
    noted = notes(ws)
    if noted:
        rows = [[esc(f"{ws.person_by_id[pid].name} ({pid})") if pid in ws.person_by_id
                 else esc(pid), esc(day(d)), esc(text)]
                for (pid, d), texts in sorted(noted.items(), key=lambda kv: (kv[0][1], kv[0][0]))
                for text in texts]
        body += ["<h2>Notes</h2>", table(("Person", "Date", "Note"), rows)]
    return page(f"{unit.name} - roster {period}", body)
