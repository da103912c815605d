"""Plan the next period's workspace: every file it would hold, as text, and what to say.

`plan_next` reads only (the old workspace is already loaded); `cycle.write.write_plan`
writes the plan. The CLI's `next` and the UI's preview share the plan, so what the
preview shows is what is written.

What the new workspace holds:
* unit.toml: the old text with `start` = the day after the old end, `days` (the old
  length unless given) and `holidays` (only those given: the old ones are past) changed;
  comments and layout kept (`io.toml_merge`), except the comments on those three keys,
  which describe the old values.
* staff.toml, shifts.toml and preset files the unit includes from inside the workspace:
  byte for byte.
* requests.toml: entries that end before the new start dropped, leave that began before
  it starting on it; comments kept. Entries after the new period stay for the periods
  that follow (the loader notes that they lie outside this one).
* history.toml: rows and hours_before (`cycle.history`), the longest look-back of the
  effective rules (`cycle.lookback`).
* no roster.toml (so no locks) and no published versions: the new period has no roster
  yet.
"""

from __future__ import annotations

import re
import tomllib
from collections.abc import Callable
from dataclasses import dataclass, field
from datetime import date, timedelta
from pathlib import Path
from typing import Any

import tomli_w
import tomlkit
from tomlkit.items import Comment

from rostertui.core import words
from rostertui.core.check import check_roster
from rostertui.core.check.grid import Grid
from rostertui.core.cycle.history import HoursBefore, history_rows, hours_before, mixed_windows
from rostertui.core.cycle.lookback import Need, history_days, needs
from rostertui.core.errors import EditError
from rostertui.core.io.presets import resolve_include
from rostertui.core.io.save import merged_text, toml_inline, toml_key
from rostertui.core.models.requests import Leave, Request, RequestsFile
from rostertui.core.models.workspace import Workspace

_DATED = re.compile(r"^(?P<base>.+?)-\d{4}-\d{2}-\d{2}$")


@dataclass(frozen=True)
class Plan:
    """The next period's workspace, not yet written."""

    source: Path  # the old workspace folder
    roster_label: str  # "roster.toml" or "published version N"
    target: Path
    start: date
    days: int
    holidays: tuple[date, ...]
    history_days: int
    needs: tuple[Need, ...]
    rows: dict[str, list[str]]
    hours_before: dict[str, HoursBefore]
    leave_carried: tuple[Leave, ...]
    leave_clipped: int
    leave_dropped: int
    requests_carried: tuple[Request, ...]
    requests_dropped: int
    locks_dropped: int
    hard_violations: int  # of the roster the history comes from (> 0 only when forced)
    files: dict[str, bytes] = field(default_factory=dict)  # relative path -> content
    warnings: tuple[str, ...] = ()

    @property
    def end(self) -> date:
        return self.start + timedelta(days=self.days - 1)

    def to_json(self) -> dict[str, object]:
        return {
            "folder": str(self.target),
            "from": self.roster_label,
            "start": self.start.isoformat(),
            "days": self.days,
            "end": self.end.isoformat(),
            "holidays": [d.isoformat() for d in self.holidays],
            "history_days": self.history_days,
            "hours_before": {pid: {"hours": h.hours, "basis": h.basis}
                             for pid, h in self.hours_before.items()},
            "leave_carried": len(self.leave_carried),
            "requests_carried": len(self.requests_carried),
            "locks_dropped": self.locks_dropped,
            "forced_hard_violations": self.hard_violations,
            "files": sorted(self.files),
            "warnings": list(self.warnings),
        }


def default_target(source: Path, start: date) -> Path:
    """A sibling folder named after the new start: `ward-b` (or `ward-b-2027-03-15`)
    rolls into `ward-b-2027-04-12`."""
    folder = source.resolve()
    found = _DATED.match(folder.name)
    base = found.group("base") if found else folder.name
    return folder.parent / f"{base}-{start.isoformat()}"


def _carried(lv: Leave, start: date) -> tuple[Leave | None, bool]:
    """A leave entry in the new period from `start` on: (entry or None, clipped)."""
    if lv.last < start:
        return None, False
    if lv.from_ >= start:
        return lv, False
    to = lv.to if lv.to is not None and lv.to != start else None
    return lv.model_copy(update={"from_": start, "to": to}), True


def carry_requests(requests: RequestsFile, start: date) -> tuple[RequestsFile, int, int, int]:
    """Requests of the new period from `start` on: (file, leave clipped, leave dropped,
    requests dropped)."""
    found = [_carried(lv, start) for lv in requests.leave]
    leave = [lv for lv, _ in found if lv is not None]
    kept = [r for r in requests.request if r.date >= start]
    return (RequestsFile(leave=leave, request=kept), sum(c for _, c in found),
            len(requests.leave) - len(leave), len(requests.request) - len(kept))


def _carried_raw(raw: dict[str, Any], requests: RequestsFile, start: date) -> dict[str, Any]:
    """requests.toml's data in the file's own words, with the same entries carried as
    `carry_requests` carries (the loaded file is valid, so entries match one to one)."""
    out = dict(raw)
    if "leave" in raw:
        leave = []
        for item, lv in zip(raw["leave"], requests.leave, strict=True):
            kept, clipped = _carried(lv, start)
            if kept is None:
                continue
            if clipped:
                item = {**item, "from": start}
                if kept.to is None:
                    item.pop("to", None)
            leave.append(item)
        out["leave"] = leave
    if "request" in raw:
        out["request"] = [item for item, r in zip(raw["request"], requests.request, strict=True)
                          if r.date >= start]
    return out


def _drop_comments(text: str, keys: set[str]) -> str:
    """`text` without the comments that describe the old values of top-level `keys`: the
    comment on the key's line and indented comment lines right after it."""
    doc = tomlkit.parse(text)
    after = False
    for key, item in doc.body:
        if key is not None:
            after = key.key in keys
            if after:
                item.trivia.comment = item.trivia.comment_ws = ""
        elif after and isinstance(item, Comment) and item.trivia.indent:
            item.trivia.indent = item.trivia.comment = item.trivia.trail = ""
        else:
            after = False
    return doc.as_string()


def edited(
    path: Path, change: Callable[[dict[str, Any]], dict[str, Any]], stale: set[str] | None = None,
) -> tuple[str, str]:
    """The text of TOML file `path` with its data changed by `change`, comments and layout
    kept (`io.toml_merge`) but those on the `stale` keys; when they cannot be, a fresh text
    and why ("" otherwise)."""
    text = path.read_text(encoding="utf-8")
    new = change(tomllib.loads(text))
    merged, _ = merged_text(text, new)
    if merged is not None:
        return (_drop_comments(merged, stale) if stale else merged), ""
    return tomli_w.dumps(new), f"{path.name} is written fresh: its comments could not be kept"


def _day(d: date) -> str:
    return f"{words.day(d)} {d.year}"


def dumps_history(
    rows: dict[str, list[str]], before: dict[str, HoursBefore], *, source: str,
    start: date, needs_found: list[Need], forced: int,
) -> str:
    """history.toml with a head comment saying where it comes from."""
    head = [
        f"# What each person worked before {_day(start)}: written by `rostertui next`",
        f"# from {source}.",
    ]
    if forced:
        head.append(f"# Written with --force: that roster breaks {forced} hard "
                    f"rule{'s' if forced != 1 else ''}, so these rows hold breaches too.")
    if rows:
        n = max(len(r) for r in rows.values())
        longest = needs_found[0] if needs_found else None
        why = f" ({longest.rule}: {longest.why})" if longest else ""
        last = _day(start - timedelta(days=1))
        head.append(f"# Rows: up to {n} days, oldest first, the last = {last}; the longest")
        head.append(f"# look-back of the rules{why}.")
    lines = [*head, "[rows]"]
    lines += [f"{toml_key(pid)} = {toml_inline(row)}"
              for pid, row in rows.items()]
    if before:
        some = next(iter(before.values()))
        lines += [
            "",
            f"# Hours in the part of the {some.weeks}-week averaging window (ending at the "
            "period end) before the",
            "# period: paid hours of the shifts plus leave credit, as rules.md counts hours.",
            "[hours_before]",
        ]
        for pid, h in before.items():
            note = "" if h.basis == "exact" else f"  # {h.reason()}"
            lines.append(f"{toml_key(pid)} = {h.hours!r}{note}")
    return "\n".join(lines) + "\n"


def _included_files(ws: Workspace) -> dict[str, bytes]:
    """Preset files the unit includes from inside the workspace folder, byte for byte."""
    assert ws.path is not None
    root = ws.path.resolve()
    out: dict[str, bytes] = {}
    for name in ws.unit.include:
        if not name.endswith(".toml"):
            continue
        path = resolve_include(name, ws.path)
        if path.is_file() and path.is_relative_to(root):
            out[path.relative_to(root).as_posix()] = path.read_bytes()
    return out


def plan_next(
    ws: Workspace, target: Path | None = None, *, days: int | None = None,
    holidays: list[date] | None = None, force: bool = False,
    roster_label: str = "roster.toml",
) -> Plan:
    """Everything the next period's workspace would hold; EditError when it must not be
    made (no roster, a hard breach without `force`, a target that exists, bad dates)."""
    if ws.path is None:
        raise EditError("the workspace has no folder")
    roster = ws.roster
    if roster is None:
        raise EditError(f"{ws.path} has no roster yet: solve (or write roster.toml) first, "
                        "since the next period's history comes from it")
    hard = [v for v in check_roster(ws, roster).violations if v.hard]
    if hard and not force:
        first = hard[0]
        raise EditError(
            f"the roster ({roster_label}) breaks {len(hard)} hard rule"
            f"{'s' if len(hard) != 1 else ''} (first: {first.rule}: {first.message}); "
            "mend it (rostertui check shows them all), or give --force to start the next "
            "period from it all the same")
    start = ws.unit.end + timedelta(days=1)
    n = ws.unit.days if days is None else days
    if not 1 <= n <= 366:
        raise EditError(f"days = {n}: a period is 1 to 366 days long")
    end = start + timedelta(days=n - 1)
    wanted = sorted(set(holidays or []))
    outside = [d for d in wanted if not start <= d <= end]
    if outside:
        raise EditError(f"holiday {outside[0]} is outside the new period {start} to {end}")
    folder = target if target is not None else default_target(ws.path, start)
    if folder.exists() or folder.is_symlink():
        raise EditError(f"{folder} exists already; the next period goes to a new folder")

    warnings: list[str] = []
    if not wanted:
        warnings.append(f"the new period {start} to {end} has no holidays; give them with "
                        "--holidays (the old period's are past)")
    files: dict[str, bytes] = {}
    text, why = edited(ws.path / "unit.toml",
                       lambda raw: {**raw, "start": start, "days": n, "holidays": wanted},
                       stale={"start", "days", "holidays"})
    files["unit.toml"] = text.encode("utf-8")
    warnings += [why] if why else []
    for name in ("staff.toml", "shifts.toml"):
        files[name] = (ws.path / name).read_bytes()
    files.update(_included_files(ws))

    carried, clipped, leave_dropped, req_dropped = carry_requests(ws.requests, start)
    if (ws.path / "requests.toml").is_file():
        text, why = edited(ws.path / "requests.toml",
                           lambda raw: _carried_raw(raw, ws.requests, start))
        files["requests.toml"] = text.encode("utf-8")
        warnings += [why] if why else []

    found = needs(ws.rules, start, n, ws.unit.weekend, list(ws.unit.holidays))
    keep = history_days(found)
    grid = Grid(ws, roster)
    rows = history_rows(ws, roster, keep, grid)
    before = hours_before(ws, roster, n, grid)
    for pid in mixed_windows(ws):
        warnings.append(f"{pid} is under averaging rules with different weeks; hours_before "
                        "serves the longest window")
    guessed = [h for h in before.values() if h.basis != "exact"]
    if guessed:
        weeks = guessed[0].weeks
        warnings.append(
            f"hours_before of {len(guessed)} of {len(before)} people is an estimate: the "
            f"{weeks}-week window reaches back before what is known "
            f"({', '.join(h.person for h in guessed)}; history.toml says how each was "
            "found); replace them with payroll figures if you have them")
    source = f"{ws.path.resolve().name}/{roster_label}" if roster_label == "roster.toml" \
        else f"{ws.path.resolve().name}, {roster_label}"
    source += f" ({ws.unit.start} to {ws.unit.end})"
    files["history.toml"] = dumps_history(
        rows, before, source=source, start=start, needs_found=found, forced=len(hard),
    ).encode("utf-8")
    if hard:
        warnings.append(f"started from a roster that breaks {len(hard)} hard rules (--force); "
                        "history.toml says so")
    return Plan(
        source=ws.path, roster_label=roster_label, target=folder, start=start, days=n,
        holidays=tuple(wanted), history_days=keep, needs=tuple(found), rows=rows,
        hours_before=before, leave_carried=tuple(carried.leave), leave_clipped=clipped,
        leave_dropped=leave_dropped, requests_carried=tuple(carried.request),
        requests_dropped=req_dropped, locks_dropped=sum(len(lk.dates) for lk in roster.lock),
        hard_violations=len(hard), files=files, warnings=tuple(warnings),
    )
