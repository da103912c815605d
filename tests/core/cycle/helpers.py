"""Rolling hand-made workspaces: plan and write the next period, then give it a roster."""

from __future__ import annotations

import json
from pathlib import Path

from rostertui.core.cycle import Plan, plan_next, write_plan
from rostertui.core.io.load import load_workspace


def roll(folder: Path, target: Path, **options: object) -> Plan:
    """Write the period after `folder`'s into `target`; the plan written."""
    plan = plan_next(load_workspace(folder), target, **options)  # type: ignore[arg-type]
    write_plan(plan)
    return plan


def give_roster(folder: Path, rows: dict[str, str | list[str]]) -> None:
    """Write roster.toml for the workspace's whole period; a row may be "E - N"."""
    unit = load_workspace(folder).unit
    lines = [f"start = {unit.start}", f"days = {unit.days}", "[rows]"]
    for pid, row in rows.items():
        codes = row.split() if isinstance(row, str) else row
        lines.append(f"{pid} = [{', '.join(json.dumps(c) for c in codes)}]")
    (folder / "roster.toml").write_text("\n".join(lines) + "\n")
