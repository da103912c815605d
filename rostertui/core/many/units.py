"""Each unit of a many-unit run as the client sees it, and the news workers send.

A unit is `queued`, then `solving` (once a worker says it started), then one of
`done` (its roster written), `failed` (bad input, no roster, a roster the checker
refuses, a worker lost twice), `refused` (roster.toml changed meanwhile: not written)
or `cancelled` (Ctrl-C before it finished).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Literal

UnitStatus = Literal["queued", "solving", "done", "failed", "refused", "cancelled"]
FINAL: tuple[UnitStatus, ...] = ("done", "failed", "refused", "cancelled")


@dataclass(frozen=True)
class WorkerNews:
    """A worker's word about a unit: its attempt started, or its best roster and bound."""

    unit: str
    kind: Literal["started", "progress"]
    worker: str = ""  # the worker's address
    pid: int = 0  # the worker's process
    penalty: int | None = None
    bound: int | None = None


@dataclass
class UnitState:
    name: str  # shown: the folder's name (its path when two folders share a name)
    folder: Path
    status: UnitStatus = "queued"
    solve_status: str | None = None  # optimal / feasible / infeasible / unknown
    penalty: int | None = None
    bound: int | None = None
    seconds: float | None = None  # on the worker (the last attempt), once finished
    error: str | None = None
    attempts: int = 0  # attempts started (a worker that died: its unit starts again)
    worker: str | None = None
    started_at: float | None = None  # time.monotonic() on the client at the last start
    written: bool = False
    bad_input: bool = False  # its files could not be read (the loader's problems in error)
    warnings: list[str] = field(default_factory=list)

    @property
    def retried(self) -> bool:
        return self.attempts > 1

    @property
    def gap(self) -> float | None:
        if self.penalty is None or self.bound is None:
            return None
        if self.penalty == 0:
            return 0.0
        return max(0.0, (self.penalty - self.bound) / abs(self.penalty))

    @property
    def finished(self) -> bool:
        return self.status in FINAL

    def as_json(self) -> dict[str, Any]:
        return {
            "workspace": str(self.folder), "name": self.name, "status": self.status,
            "solve_status": self.solve_status, "penalty": self.penalty, "bound": self.bound,
            "gap": None if self.gap is None else round(self.gap, 6),
            "seconds": None if self.seconds is None else round(self.seconds, 3),
            "error": self.error, "attempts": self.attempts, "retried": self.retried,
            "written": self.written, "warnings": self.warnings,
        }


def unit_names(folders: list[Path]) -> list[str]:
    """Each folder's name, or its path where two folders share a name."""
    names = [f.name or str(f) for f in folders]
    return [str(f) if names.count(n) > 1 else n for f, n in zip(folders, names, strict=True)]
