"""A Reason: one finding in plain words, with the rules, people and dates it names."""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date
from typing import Any


@dataclass(frozen=True)
class Reason:
    message: str
    rules: tuple[str, ...] = ()
    people: tuple[str, ...] = ()
    dates: tuple[date, ...] = ()
    cover: tuple[str, str | None] | None = None  # (shift, skill) of a cover row it is about

    def to_json(self) -> dict[str, Any]:
        """The cli.md shape: {"message", "rules", "people", "dates"} (`cover` is for the UI)."""
        return {"message": self.message, "rules": list(self.rules),
                "people": list(self.people), "dates": [d.isoformat() for d in self.dates]}


def unique(items: list[Any]) -> tuple[Any, ...]:
    return tuple(dict.fromkeys(items))
