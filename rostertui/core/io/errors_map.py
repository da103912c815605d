"""Turn pydantic validation errors into plain-sentence Problems with key paths and lines."""

from __future__ import annotations

import difflib
from collections.abc import Iterable, Sequence
from datetime import date, datetime, time
from typing import Any

from pydantic import ValidationError
from pydantic_core import ErrorDetails

from rostertui.core.errors import Problem
from rostertui.core.io.toml_lines import line_of
from rostertui.core.models.rules import RULE_KINDS

KeyPath = tuple[str | int, ...]


def key_path_text(path: Sequence[str | int]) -> str:
    """('person', 3, 'skills', 1) -> 'person[3].skills[1]'."""
    out = ""
    for part in path:
        if isinstance(part, int):
            out += f"[{part}]"
        else:
            out += ("." if out else "") + part
    return out


def clean_loc(loc: Iterable[Any]) -> KeyPath:
    """Drop pydantic's internal loc parts (union tags, validator names)."""
    cleaned: list[str | int] = []
    for part in loc:
        if isinstance(part, str) and ("[" in part or part in RULE_KINDS) and cleaned:
            if isinstance(cleaned[-1], int):
                continue  # discriminator tag after a list index
            if "[" in part:
                continue
        cleaned.append(part)
    return tuple(cleaned)


_EXPECTED = {
    "date_type": "a TOML date (YYYY-MM-DD, no quotes)",
    "float_type": "a number",
    "int_type": "a whole number",
    "bool_type": "true or false",
    "string_type": "a string in quotes",
    "list_type": "a list in [ ]",
    "dict_type": "a table",
    "model_type": "a table",
    "model_attributes_type": "a table",
}


def _found(value: Any) -> str:
    """What a TOML value is, in the file's own words."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, datetime):
        return f"the date-time {value.isoformat()}"
    if isinstance(value, date):
        return f"the date {value.isoformat()}"
    if isinstance(value, time):
        return f"the time of day {value.isoformat()}"
    if isinstance(value, int | float):
        return f"the number {value!r}"
    if isinstance(value, str):
        return f"the string {_short(value)!r}"
    if isinstance(value, list):
        return "a list"
    if isinstance(value, dict):
        return "a table"
    return type(value).__name__


def _short(text: str, limit: int = 40) -> str:
    return text if len(text) <= limit else text[:limit] + "..."


def _hint(kind: str, value: Any) -> str:
    """A one-step fix where the intended value is plain to see."""
    if kind == "date_type":
        if isinstance(value, str):
            try:
                return f": write {date.fromisoformat(value.strip()).isoformat()}"
            except ValueError:
                return ""
        if isinstance(value, datetime):
            return f": write the date alone, {value.date().isoformat()}"
    if kind in ("float_type", "int_type") and isinstance(value, str):
        try:
            number = float(value.strip())
        except ValueError:
            return ""
        if kind == "float_type" or number.is_integer():
            return f": write {value.strip()} without quotes"
    if kind == "int_type" and isinstance(value, float) and value.is_integer():
        return f": write {int(value)}"
    if kind == "bool_type" and isinstance(value, str) and value.strip().lower() in (
            "true", "false"):
        return f": write {value.strip().lower()} without quotes"
    return ""


def _type_sentence(kind: str, value: Any) -> str:
    return f"expected {_EXPECTED[kind]}; found {_found(value)}{_hint(kind, value)}"


def _sentence(err: ErrorDetails, known_keys: Sequence[str]) -> str:
    kind = err["type"]
    loc = err["loc"]
    last = loc[-1] if loc else ""
    value = err.get("input")
    if kind == "extra_forbidden":
        if str(last) == "include":
            return ("key 'include' is not allowed here: only unit.toml lists presets, at its "
                    "top level, and a preset cannot include another")
        if str(last) in known_keys:
            return f"key '{last}' is not allowed here (it belongs to another table)"
        hint = difflib.get_close_matches(str(last), known_keys, n=1, cutoff=0.7)
        tip = f" (did you mean '{hint[0]}'?)" if hint else ""
        return f"unknown key '{last}'{tip}"
    if kind == "missing":
        return f"required key '{last}' is missing"
    if kind == "union_tag_invalid":
        return f"unknown rule kind {value.get('kind')!r}; expected one of: " + ", ".join(
            RULE_KINDS
        )
    if kind == "union_tag_not_found":
        return "a rule needs a kind; expected one of: " + ", ".join(RULE_KINDS)
    if kind in _EXPECTED:
        return _type_sentence(kind, value)
    msg = str(err.get("msg", "invalid value"))
    if kind == "value_error":
        return msg.removeprefix("Value error, ")
    if isinstance(value, dict | list):
        return msg
    return f"{msg} (got {value!r})"


def problems_from(
    exc: ValidationError,
    file: str,
    lines: dict[KeyPath, int],
    *,
    known_keys: Iterable[str] = (),
    prefix: KeyPath = (),
) -> list[Problem]:
    found: list[Problem] = []
    keys = list(known_keys)
    for err in exc.errors(include_url=False):
        path = prefix + clean_loc(err["loc"])
        found.append(
            Problem(
                file=file,
                key=key_path_text(path),
                message=_sentence(err, keys),
                line=line_of(lines, path),
            )
        )
    return found
