"""Shared output helpers for verbs: exit codes, JSON on stdout, problems on stderr."""

from __future__ import annotations

import json
import sys
from pathlib import Path
from typing import Any

from pydantic import BaseModel

from rostertui.core.errors import InputError, Problem
from rostertui.core.io.save import save

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


def save_and_warn(model: BaseModel, folder: Path) -> Path:
    """`save`, printing its notices (a file written fresh: where its old text is kept)."""
    notices: list[Problem] = []
    path = save(model, folder, notices)
    warn(notices)
    return path


def fail(message: str) -> int:
    print(f"rostertui: {message}", file=sys.stderr)
    return EXIT_INPUT
