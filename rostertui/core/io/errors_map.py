"""Turn pydantic validation errors into plain-sentence Problems with key paths and lines."""

from __future__ import annotations

import difflib
from collections.abc import Iterable, Sequence
from typing import Any

from pydantic import ValidationError

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


def _sentence(err: dict[str, Any], known_keys: Iterable[str]) -> str:
    kind = err["type"]
    loc = err["loc"]
    last = loc[-1] if loc else ""
    value = err.get("input")
    if kind == "extra_forbidden":
        hint = difflib.get_close_matches(str(last), list(known_keys), n=1, cutoff=0.7)
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
