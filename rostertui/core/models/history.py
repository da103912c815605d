"""history.toml: what each person worked just before the period."""

from __future__ import annotations

from typing import Annotated

from pydantic import Field

from rostertui.core.models.common import HourResolution, Strict

Code = Annotated[str, Field(min_length=1, max_length=32)]


class History(Strict):
    rows: dict[str, list[Code]] = Field(default_factory=dict)
    hours_before: dict[str, Annotated[float, HourResolution, Field(ge=0, le=366 * 24)]] = Field(
        default_factory=dict
    )
