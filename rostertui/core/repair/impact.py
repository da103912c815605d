"""What a change did to the check: the violations it created and those it resolved."""

from __future__ import annotations

from dataclasses import dataclass

from rostertui.core.check import CheckResult, Violation

Key = tuple[object, ...]


def key(v: Violation) -> Key:
    """The same breach before and after a change (its size may differ)."""
    return (v.rule, v.kind, v.hard, v.person, v.dates, v.shift, v.skill)


@dataclass(frozen=True)
class Impact:
    before: CheckResult
    after: CheckResult
    created: list[Violation]  # new, or grown (more units than before)
    resolved: list[Violation]  # gone, or shrunk (as they were before)

    @property
    def penalty_change(self) -> int:
        return self.after.penalty - self.before.penalty


def impact(before: CheckResult, after: CheckResult) -> Impact:
    old = {key(v): v for v in before.violations}
    new = {key(v): v for v in after.violations}
    created = [v for k, v in new.items() if k not in old or v.units > old[k].units]
    resolved = [v for k, v in old.items() if k not in new or v.units > new[k].units]
    return Impact(before, after, created, resolved)
