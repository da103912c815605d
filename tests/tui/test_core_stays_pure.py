"""The core never imports the UI: every rostertui.core module, loaded alone, leaves
textual out of sys.modules."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]


def core_modules() -> list[str]:
    root = REPO / "rostertui" / "core"
    names = []
    for path in sorted(root.rglob("*.py")):
        parts = path.relative_to(REPO).with_suffix("").parts
        names.append(".".join(parts[:-1] if parts[-1] == "__init__" else parts))
    return names


def test_no_core_module_imports_textual() -> None:
    modules = core_modules()
    assert "rostertui.core.check" in modules and "rostertui.core.solver.run" in modules
    code = (
        "import importlib, sys\n"
        f"for name in {modules!r}:\n"
        "    importlib.import_module(name)\n"
        "print(sorted(m for m in sys.modules if m.split('.')[0] == 'textual'"
        " or m.startswith('rostertui.tui')))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True, cwd=REPO)
    assert done.stdout.strip() == "[]"


def test_the_session_and_view_are_free_of_textual() -> None:
    """session.py and view.py (core/edit) hold the editing rules: testable without a terminal."""
    code = ("import sys, rostertui.core.edit.session, rostertui.core.edit.view;"
            "print([m for m in sys.modules if m.split('.')[0] == 'textual'])")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True, cwd=REPO)
    assert done.stdout.strip() == "[]"
