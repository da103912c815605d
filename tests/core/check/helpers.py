"""Tiny hand-made workspaces for the checker's tests, written as TOML files."""

from __future__ import annotations

from pathlib import Path

from rostertui.core.check import CheckResult, Violation

# Shift types used unless a test gives its own shifts.toml text.
SHIFTS = """
[[shift]]
code = "E"
name = "Early"
start = "07:00"
end = "15:00"

[[shift]]
code = "D"
name = "Day"
start = "09:00"
end = "17:00"

[[shift]]
code = "L"
name = "Late"
start = "14:00"
end = "22:00"

[[shift]]
code = "N"
name = "Night"
start = "22:00"
end = "07:00"
"""


def _codes(value: str | list[str]) -> list[str]:
    return value.split() if isinstance(value, str) else list(value)


def _row(value: str | list[str]) -> str:
    codes = _codes(value)
    return "[" + ", ".join(f'"{c}"' for c in codes) + "]"


def write_ws(
    folder: Path,
    *,
    rows: dict[str, str | list[str]],
    rules: str = "",
    start: str = "2027-03-01",
    days: int | None = None,
    timezone: str = "UTC",
    people: list[str] | None = None,
    skills: dict[str, list[str]] | None = None,
    groups: dict[str, list[str]] | None = None,
    shifts: str = SHIFTS,
    cover: str = "",
    history: dict[str, str | list[str]] | None = None,
    hours_before: dict[str, float] | None = None,
    requests: str = "",
    unit_extra: str = "",
    locks: str = "",
) -> Path:
    """Write a workspace; `rows` are whitespace-separated codes ("E E - N")."""
    folder.mkdir(parents=True, exist_ok=True)
    ids = people or list(rows)
    if days is None:
        days = max(len(_codes(r)) for r in rows.values()) if rows else 7
    (folder / "unit.toml").write_text(
        f'name = "Test ward"\ntimezone = "{timezone}"\nstart = {start}\ndays = {days}\n'
        f"{unit_extra}\n{rules}\n"
    )
    staff = []
    for pid in ids:
        sk = ", ".join(f'"{s}"' for s in (skills or {}).get(pid, []))
        gr = ", ".join(f'"{g}"' for g in (groups or {}).get(pid, []))
        staff.append(
            f'[[person]]\nid = "{pid}"\nname = "{pid}"\nskills = [{sk}]\ngroups = [{gr}]\n'
        )
    (folder / "staff.toml").write_text("\n".join(staff))
    (folder / "shifts.toml").write_text(shifts + "\n" + cover)
    roster = [f"start = {start}", f"days = {days}", "[rows]"]
    roster += [f"{pid} = {_row(r)}" for pid, r in rows.items()]
    (folder / "roster.toml").write_text("\n".join(roster) + "\n" + locks)
    if history is not None or hours_before is not None:
        text = "[rows]\n" + "".join(f"{p} = {_row(r)}\n" for p, r in (history or {}).items())
        before = (hours_before or {}).items()
        text += "[hours_before]\n" + "".join(f"{p} = {h}\n" for p, h in before)
        (folder / "history.toml").write_text(text)
    if requests:
        (folder / "requests.toml").write_text(requests)
    return folder




def of_kind(result: CheckResult, kind: str) -> list[Violation]:
    """The violations of one kind, in report order."""
    return [v for v in result.violations if v.kind == kind]
