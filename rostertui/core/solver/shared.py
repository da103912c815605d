"""What several rule families share, made once per model and handed to every encoder.

An encoder is `<kind>(b, eff, shared)` in solver/<family>.py (models/rules.py). The
shared parts only compute or cache: literals are made on first use, so the model
holds nothing no rule asked for.
"""

from __future__ import annotations

from dataclasses import dataclass

from rostertui.core.solver.clock import ShiftClock
from rostertui.core.solver.rest import OffRuns
from rostertui.core.solver.scaled_hours import Hours
from rostertui.core.solver.terms import ModelBuilder
from rostertui.core.solver.weekends import WeekendsWorked


@dataclass(frozen=True)
class Shared:
    clock: ShiftClock  # real instants of shifts (rest)
    runs: OffRuns  # "off on every day of [a, z]" literals (min-rest)
    hours: Hours  # scaled hour expressions per person (hours, balance)
    weekends: WeekendsWorked  # "worked weekend k" literals (weekends, balance)

    @classmethod
    def of(cls, b: ModelBuilder) -> Shared:
        hours, weekends = Hours(b.cells), WeekendsWorked(b)
        return cls(ShiftClock(b.cells.ws), OffRuns(b), hours, weekends)
