"""`rostertui next`: the clinic demo rolled into its next period; refusals exit 2 with
nothing written; --force exits 1; --from-version takes a published roster."""

from __future__ import annotations

import json
import shutil
from datetime import date
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import save
from tests.conftest import DEMO, FIXTURES, copy_ws


def snapshot(folder: Path) -> dict[str, bytes]:
    return {str(p.relative_to(folder)): p.read_bytes() for p in folder.rglob("*") if p.is_file()}


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    """The clinic demo with its solved roster, in tmp_path/ward."""
    ws = copy_ws(DEMO / "clinic", tmp_path, "ward")
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", ws / "roster.toml")
    return ws


def test_clinic_rolls_into_a_sibling_named_after_the_new_start(
    clinic: Path, capsys: pytest.CaptureFixture[str],
) -> None:
    assert main(["next", str(clinic), "--holidays", "2027-05-01", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    new = clinic.parent / "ward-2027-04-12"
    assert out["folder"] == str(new)
    assert (out["start"], out["days"], out["end"]) == ("2027-04-12", 28, "2027-05-09")
    assert out["holidays"] == ["2027-05-01"]
    # eu-working-time's 17-week window: 119 - 28 = 91 days before the new start
    assert out["history_days"] == 91
    ws = load_workspace(new)
    assert ws.history is not None and ws.roster is None
    # what is known: 7 days of the demo's history + the 28 of its roster (c08 and c14
    # are new on the ward: no history)
    assert {len(r) for pid, r in ws.history.rows.items() if pid not in ("c08", "c14")} == {35}
    assert {len(r) for pid, r in ws.history.rows.items() if pid in ("c08", "c14")} == {28}
    old = load_workspace(clinic)
    assert old.roster is not None
    assert ws.history.rows["c04"][-28:] == old.roster.rows["c04"]
    assert set(ws.history.hours_before) == set(ws.person_ids)


def test_human_report_lists_the_preview(clinic: Path, capsys) -> None:
    assert main(["next", str(clinic), str(clinic.parent / "april")]) == 0
    out = capsys.readouterr().out
    assert "Next period in" in out and "2027-04-12 to 2027-05-09 (28 days)" in out
    assert "history: 91 days per person" in out
    assert "warning: the new period 2027-04-12 to 2027-05-09 has no holidays" in out


def test_refusals_exit_2_and_write_nothing(clinic: Path, capsys, tmp_path: Path) -> None:
    def entries() -> list[str]:
        return sorted(p.name for p in tmp_path.iterdir())

    (tmp_path / "taken").mkdir()
    assert main(["next", str(clinic), str(tmp_path / "taken")]) == 2
    assert "exists already" in capsys.readouterr().err
    assert entries() == ["taken", "ward"] and not any((tmp_path / "taken").iterdir())
    (tmp_path / "taken").rmdir()
    shutil.copy(FIXTURES / "clinic_breaches_roster.toml", clinic / "roster.toml")
    before = snapshot(clinic)
    assert main(["next", str(clinic)]) == 2
    err = capsys.readouterr().err
    assert "hard rule" in err and "--force" in err and "nothing written" in err
    assert entries() == ["ward"] and snapshot(clinic) == before
    (clinic / "roster.toml").unlink()
    assert main(["next", str(clinic)]) == 2
    assert "no roster yet" in capsys.readouterr().err
    (clinic / "roster.toml").write_text("start = 2027-03-15\ndays = 28\n[rows]\nc01 = 3\n")
    assert main(["next", str(clinic)]) == 2
    assert "roster.toml" in capsys.readouterr().err
    assert main(["next", str(clinic), "--days", "x"]) == 2
    assert entries() == ["ward"]


def test_force_writes_and_exits_1(clinic: Path, capsys) -> None:
    shutil.copy(FIXTURES / "clinic_breaches_roster.toml", clinic / "roster.toml")
    assert main(["next", str(clinic), "--force", "--json"]) == 1
    out = json.loads(capsys.readouterr().out)
    assert out["forced_hard_violations"] > 0
    text = (Path(out["folder"]) / "history.toml").read_text()
    assert "# Written with --force" in text


def test_from_version_takes_the_published_roster(clinic: Path, capsys) -> None:
    assert main(["publish", str(clinic)]) == 0
    roster = load_workspace(clinic).roster
    assert roster is not None
    published_last = roster.rows["c01"][-1]
    roster.rows["c01"][-1] = "-" if published_last != "-" else "E"  # changed since
    save(roster, clinic)
    capsys.readouterr()
    assert main(["next", str(clinic), str(clinic.parent / "v1"), "--from-version", "1",
                 "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["from"] == "published version 1"
    hist = load_workspace(clinic.parent / "v1").history
    assert hist is not None and hist.rows["c01"][-1] == published_last
    assert main(["next", str(clinic), str(clinic.parent / "v9"), "--from-version", "9"]) == 2
    assert "no published version 9" in capsys.readouterr().err


def test_new_period_length_and_days(clinic: Path, capsys) -> None:
    assert main(["next", str(clinic), str(clinic.parent / "x"), "--days", "35"]) == 0
    ws = load_workspace(clinic.parent / "x")
    assert (ws.unit.start, ws.unit.days) == (date(2027, 4, 12), 35)
    assert ws.history is not None
    assert {len(r) for r in ws.history.rows.values()} <= {35, 28}  # 119 - 35 = 84 > known


@pytest.mark.slow
def test_clinic_second_month_solves_compliant_after_the_first_months_nights(
    clinic: Path, capsys,
) -> None:
    """The issue's "done when": solved month, next, solve again, check compliant; the
    first days of the second month respect the last nights of the first."""
    assert main(["next", str(clinic), "--holidays", "2027-05-01"]) == 0
    new = clinic.parent / "ward-2027-04-12"
    assert main(["solve", str(new), "--time-limit", "10", "--workers", "2", "--json"]) == 0
    capsys.readouterr()
    assert main(["check", str(new), "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["compliant"] is True
    first, second = load_workspace(clinic).roster, load_workspace(new).roster
    assert first is not None and second is not None
    ended_on_nights = [pid for pid, row in first.rows.items() if row[-1] == "N"]
    assert ended_on_nights  # the test means something
    for pid in ended_on_nights:  # N 21:00-07:30: no E (07:00) or L (14:00) next day
        assert second.rows[pid][0] not in ("E", "L"), pid
