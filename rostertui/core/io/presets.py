"""Where rule presets live, from a checkout and from an installed wheel."""

from __future__ import annotations

from pathlib import Path

_PACKAGE = Path(__file__).resolve().parents[2]  # .../rostertui


def presets_dir() -> Path:
    """The folder of shipped presets.

    An installed wheel carries them as `rostertui/_presets`; a checkout (or an
    editable install) keeps them in the top-level `rules/` folder.
    """
    bundled = _PACKAGE / "_presets"
    if bundled.is_dir():
        return bundled
    return _PACKAGE.parent / "rules"


def preset_names() -> list[str]:
    return sorted(p.stem for p in presets_dir().glob("*.toml"))


def resolve_include(name: str, workspace: Path) -> Path:
    """A bare name is a shipped preset; a name ending in .toml is relative to the workspace."""
    if name.endswith(".toml"):
        return (workspace / name).resolve()
    return presets_dir() / f"{name}.toml"
