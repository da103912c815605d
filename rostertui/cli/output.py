"""Shared output helpers for verbs: exit codes, JSON on stdout, problems on stderr."""

from __future__ import annotations

import json
import sys
from typing import Any

from rostertui.core.errors import InputError, Problem

EXIT_OK = 0
EXIT_HARD = 1
EXIT_INPUT = 2


def print_json(data: dict[str, Any]) -> None:
    """Exactly one JSON object on stdout."""
    sys.stdout.write(json.dumps(data, indent=2, ensure_ascii=False) + "\n")


def fail_input(exc: InputError) -> int:
    print(f"rostertui: {exc.summary()}", file=sys.stderr)
    print("nothing was written.", file=sys.stderr)
    return EXIT_INPUT


def warn(problems: list[Problem]) -> None:
    for p in problems:
        print(f"warning: {p}", file=sys.stderr)


def fail(message: str) -> int:
    print(f"rostertui: {message}", file=sys.stderr)
    return EXIT_INPUT
