"""The built wheel carries the presets and the demos, and an installed rostertui finds them."""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

from tests.conftest import FIXTURES, REPO


@pytest.fixture(scope="module")
def wheel(tmp_path_factory: pytest.TempPathFactory) -> Path:
    if shutil.which("git") is None and not (REPO / "pyproject.toml").exists():
        pytest.fail("no pyproject.toml beside the tests")
    out = tmp_path_factory.mktemp("dist")
    done = subprocess.run(
        [sys.executable, "-m", "build", "--wheel", "--no-isolation", "--outdir", str(out),
         str(REPO)],
        capture_output=True, text=True, check=False,
    )
    assert done.returncode == 0, done.stderr[-2000:]
    (path,) = out.glob("rostertui-*.whl")
    return path


@pytest.mark.slow
def test_wheel_holds_presets_and_demos(wheel: Path) -> None:
    names = set(zipfile.ZipFile(wheel).namelist())
    for preset in ("eu-working-time", "uk-working-time", "care-ward"):
        assert f"rostertui/_presets/{preset}.toml" in names
    assert "rostertui/_demo/clinic/unit.toml" in names
    assert "rostertui/_demo/depot/unit.toml" in names


@pytest.mark.slow
def test_installed_wheel_finds_its_presets(wheel: Path, tmp_path: Path) -> None:
    """Install the wheel into a target folder and run it from there, away from the checkout."""
    target = tmp_path / "site"
    done = subprocess.run(
        [sys.executable, "-m", "pip", "install", "--quiet", "--no-deps", "--no-index",
         "--target", str(target), str(wheel)],
        capture_output=True, text=True, check=False,
    )
    assert done.returncode == 0, done.stderr[-2000:]
    ws = tmp_path / "ws"
    shutil.copytree(FIXTURES / "good", ws)
    (ws / "roster.toml").unlink()
    code = (
        "import rostertui, sys;"
        "from rostertui.core.io.presets import presets_dir;"
        "from rostertui.core.io.load import load_workspace;"
        "print(rostertui.__file__); print(presets_dir());"
        "ws = load_workspace(sys.argv[1]);"
        "print(sorted(r.origin for r in ws.rules))"
    )
    env = {**os.environ, "PYTHONPATH": str(target)}
    done = subprocess.run([sys.executable, "-c", code, str(ws)], capture_output=True, text=True,
                          cwd=tmp_path, env=env, check=False)
    assert done.returncode == 0, done.stderr[-2000:]
    module_file, presets, origins = done.stdout.splitlines()
    assert module_file.startswith(str(target))
    assert presets == str(target / "rostertui" / "_presets")
    assert "eu-working-time" in origins
