"""requests.toml: leave (hard) and requests (soft)."""

from __future__ import annotations

from datetime import date, timedelta
from typing import Annotated

from pydantic import Field, model_validator

from rostertui.core.models.common import HourResolution, Identifier, Strict
from rostertui.core.models.rules import Weight


class Leave(Strict):
    person: Identifier
    from_: date = Field(alias="from")
    to: date | None = None
    reason: str | None = None
    credit_hours: Annotated[float, HourResolution, Field(ge=0, le=24)] | None = None

    @model_validator(mode="after")
    def _ordered(self) -> Leave:
        if self.to is not None and self.to < self.from_:
            raise ValueError(f"to = {self.to} is before from = {self.from_}")
        return self

    @property
    def last(self) -> date:
        return self.to if self.to is not None else self.from_

    def dates(self) -> list[date]:
        n = (self.last - self.from_).days + 1
        return [self.from_ + timedelta(days=i) for i in range(n)]


class Request(Strict):
    person: Identifier
    date: date
    want: str | None = None
    avoid: str | None = None
    weight: Weight = 1
    note: str | None = None

    @model_validator(mode="after")
    def _one_of(self) -> Request:
        if (self.want is None) == (self.avoid is None):
            raise ValueError("give exactly one of want (\"off\" or a shift code) and avoid")
        return self


class RequestsFile(Strict):
    leave: list[Leave] = Field(default_factory=list)
    request: list[Request] = Field(default_factory=list)
