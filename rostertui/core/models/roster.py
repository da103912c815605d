"""roster.toml: one row of codes per person, locks, the record of the last solve."""

from __future__ import annotations

from datetime import date
from typing import Annotated, Literal

from pydantic import Field

from rostertui.core.models.common import Identifier, Strict

Code = Annotated[str, Field(min_length=1, max_length=32)]
SolveStatus = Literal["optimal", "feasible", "infeasible", "unknown"]


class Lock(Strict):
    person: Identifier
    dates: list[date]


class SolveRecord(Strict):
    status: SolveStatus
    objective: int | None = None
    bound: int | None = None
    seconds: float = Field(default=0.0, ge=0)
    seed: int = 0


class Roster(Strict):
    start: date
    days: int = Field(ge=1, le=366)
    rows: dict[str, list[Code]] = Field(default_factory=dict)
    lock: list[Lock] = Field(default_factory=list)
    solve: SolveRecord | None = None
