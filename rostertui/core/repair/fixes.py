"""Which resolved violations each changed cell answers, for the repair report.

A cover breach is answered by a change on its date to or from its shift; a
person's breach by a change of that person's within the breach's dates (or any of
their changes, for a breach over the whole period). A change that answers nothing
directly made room for another one.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from rostertui.core.check import Violation
from rostertui.core.repair.diff import CellDiff


@dataclass(frozen=True)
class ChangedCell:
    cell: CellDiff
    fixes: tuple[Violation, ...]

    def to_json(self) -> dict[str, Any]:
        return {**self.cell.to_json(), "fixes": [v.message for v in self.fixes]}


def answers(cell: CellDiff, v: Violation) -> bool:
    if v.kind == "cover":
        return cell.date in v.dates and v.shift in (cell.before, cell.after)
    if v.person != cell.person:
        return False
    return not v.dates or min(v.dates) <= cell.date <= max(v.dates)


def attribute(cells: list[CellDiff], resolved: list[Violation]) -> list[ChangedCell]:
    return [ChangedCell(c, tuple(v for v in resolved if answers(c, v))) for c in cells]
