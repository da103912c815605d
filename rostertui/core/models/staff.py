"""staff.toml: the people of a unit, their skills and groups."""

from __future__ import annotations

from pydantic import Field

from rostertui.core.models.common import DisplayName, Identifier, Strict


class Person(Strict):
    id: Identifier
    name: DisplayName
    skills: list[Identifier] = Field(default_factory=list)
    groups: list[Identifier] = Field(default_factory=list)


class Staff(Strict):
    person: list[Person] = Field(default_factory=list)
