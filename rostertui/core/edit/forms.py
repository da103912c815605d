"""Text in a form <-> the fields of a file model's list item (a person, a leave, a shift...),
and a date typed in a form.

Pure: no textual. The text is turned into plain values by each field's type (dates,
numbers, lists split on commas) and the item is built *without* validation: the loader
judges the result, so a mistake is reported exactly as it would be in the file.
A text that does not parse is passed on as it is, for the loader to name.
"""

from __future__ import annotations

import re
import types
from datetime import date
from typing import Annotated, Any, Literal, Union, get_args, get_origin

from pydantic import BaseModel

from rostertui.core.errors import EditError
from rostertui.core.models.workspace import Workspace
from rostertui.core.words import month_number


def _base(annotation: Any) -> tuple[type | None, bool]:
    """(the scalar type, is it a list) of a field's annotation."""
    origin = get_origin(annotation)
    if origin is Annotated:
        return _base(get_args(annotation)[0])
    if origin in (Union, types.UnionType):
        inner = [a for a in get_args(annotation) if a is not type(None)]
        return _base(inner[0]) if len(inner) == 1 else (str, False)
    if origin is list:
        scalar, _ = _base(get_args(annotation)[0])
        return scalar, True
    if origin is Literal:
        return str, False
    return (annotation if isinstance(annotation, type) else str), False


def key_of(model: type[BaseModel], name: str) -> str:
    """The TOML key of a field (its alias, e.g. "from" for `from_`)."""
    return model.model_fields[name].alias or name


def field_text(item: BaseModel, name: str) -> str:
    value = getattr(item, name)
    if value is None:
        return ""
    if isinstance(value, list):
        return ", ".join(_scalar_text(v) for v in value)
    return _scalar_text(value)


def _scalar_text(value: Any) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return f"{value:g}"
    if isinstance(value, date):
        return value.isoformat()
    return str(value)


def _parse_scalar(kind: type | None, text: str) -> Any:
    try:
        if kind is date:
            return date.fromisoformat(text)
        if kind is bool:
            return {"true": True, "false": False, "yes": True, "no": False}[text.lower()]
        if kind is int:
            return int(text)
        if kind is float:
            return float(text)
    except (ValueError, KeyError):
        return text  # the loader names what is wrong with it
    return text


def parse_field(model: type[BaseModel], name: str, text: str) -> Any:
    """A form's text as the field's value; "" is "not given" (None)."""
    text = text.strip()
    kind, is_list = _base(model.model_fields[name].annotation)
    if not text:
        return [] if is_list and model.model_fields[name].default is not None else None
    if is_list:
        return [_parse_scalar(kind, part) for part in re.split(r"\s*,\s*|\s+", text) if part]
    return _parse_scalar(kind, text)


def build_item(model: type[BaseModel], texts: dict[str, str]) -> BaseModel:
    """An item from its form texts (by field name), unvalidated; unset fields default."""
    values = {name: parse_field(model, name, text) for name, text in texts.items()}
    given = {k: v for k, v in values.items() if v is not None}
    return model.model_construct(**given)


def parse_day(ws: Workspace, text: str) -> date:
    """A date typed in a form: 2027-03-20, "20 Mar" (as the grid shows dates) or "20"
    (that day of the month, in the period). Raises EditError."""
    text = text.strip()
    try:
        return date.fromisoformat(text)
    except ValueError:
        pass
    parts = text.replace("/", " ").split()
    found: list[date] = []
    if parts and parts[0].isdigit() and len(parts) <= 2:
        month = month_number(parts[1]) if len(parts) == 2 else None
        if len(parts) == 1 or month is not None:
            found = [d for d in ws.unit.dates
                     if d.day == int(parts[0]) and month in (None, d.month)]
    if not found:
        raise EditError(f"{text!r} is not a date in the period: type 2027-03-20, 20 Mar or 20")
    return found[0]
