"""solve-many's run on a local Dask cluster of 2 worker processes (tests/conftest.py):
one broken unit among good ones, a worker killed mid-task, a roster changed by hand
during the run, two runs on the same folders at once."""

from __future__ import annotations

import os
import signal
import threading
from pathlib import Path
from typing import Any

import pytest

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.many.client import ManyRun
from rostertui.core.many.cluster import DaskCluster
from rostertui.core.many.files import find_workspaces
from rostertui.core.many.task import UnitOptions
from rostertui.core.many.units import WorkerNews
from tests.conftest import FIXTURES, copy_ws, temporaries, units_folder

pytest.importorskip("distributed", reason="Dask distributed (the extra rostertui[many]) is "
                    "not installed")

QUICK = UnitOptions(time_limit=3, workers=1)


def run_on(cluster: Any, folders: list[Path], options: UnitOptions = QUICK,
           hook: Any = None) -> ManyRun:
    """A ManyRun on the test cluster; `hook(run, news)` sees every worker's news first."""
    run = ManyRun(folders, options)

    def news(n: WorkerNews) -> None:
        if hook is not None:
            hook(run, n)
        run.news(n)

    with DaskCluster(news, scheduler=cluster.scheduler_address) as dask:
        run.run(dask)
    return run


def assert_written_and_compliant(folder: Path, objective: int | None = None) -> None:
    ws = load_workspace(folder)
    assert ws.roster is not None and ws.roster.solve is not None
    result = check_roster(ws)
    assert result.compliant
    assert result.penalty == ws.roster.solve.objective
    if objective is not None:
        assert result.penalty == objective


def test_four_units_one_broken_give_three_rosters_and_one_clear_error(
        dask_cluster: Any, tmp_path: Path) -> None:
    root = units_folder(tmp_path, good=3)
    for ws in root.iterdir():
        (ws / "roster.toml").unlink()
    run = run_on(dask_cluster, find_workspaces([root]))
    by_name = {u.name: u for u in run.units}
    assert {n: u.status for n, u in by_name.items()} == {
        "broken": "failed", "unit-1": "done", "unit-2": "done", "unit-3": "done"}
    broken = by_name["broken"]
    assert broken.bad_input and broken.error is not None
    assert "unit.toml: days (line 5)" in broken.error and "-1" in broken.error
    assert not (root / "broken" / "roster.toml").exists()
    for name in ("unit-1", "unit-2", "unit-3"):
        assert_written_and_compliant(root / name, by_name[name].penalty)
        assert by_name[name].attempts == 1 and not by_name[name].retried
    assert temporaries(root) == [] and run.all_done is False and not run.nothing_read


def test_a_worker_killed_mid_task_still_yields_every_good_roster(
        dask_cluster: Any, tmp_path: Path) -> None:
    """The unit `slow` loses its worker (SIGKILL) as soon as its `started` event arrives,
    a few milliseconds into a task that loads, builds and solves for about a second:
    the scheduler starts it again on a worker, and it is reported retried."""
    root = units_folder(tmp_path, good=2, broken=False)
    copy_ws(FIXTURES / "good", root, "slow")
    killed: list[int] = []

    def kill_the_slow_units_worker(run: ManyRun, news: WorkerNews) -> None:
        if news.unit == "slow" and news.kind == "started" and not killed:
            killed.append(news.pid)
            os.kill(news.pid, signal.SIGKILL)

    run = run_on(dask_cluster, find_workspaces([root]), hook=kill_the_slow_units_worker)
    by_name = {u.name: u for u in run.units}
    assert killed, "the slow unit never started"
    assert {n: u.status for n, u in by_name.items()} == {
        "slow": "done", "unit-1": "done", "unit-2": "done"}
    assert by_name["slow"].retried and by_name["slow"].attempts == 2
    assert not by_name["unit-1"].retried or not by_name["unit-2"].retried
    for name in by_name:
        assert_written_and_compliant(root / name, by_name[name].penalty)
    assert temporaries(root) == []


def test_a_roster_changed_by_hand_during_the_run_is_refused_and_kept(
        dask_cluster: Any, tmp_path: Path) -> None:
    root = units_folder(tmp_path, good=2, broken=False)
    mine = b"# the supervisor's own roster, edited while the run went on\n" + \
        (root / "unit-1" / "roster.toml").read_bytes()

    def edit_unit_1(run: ManyRun, news: WorkerNews) -> None:
        if news.unit == "unit-1" and news.kind == "started":
            (root / "unit-1" / "roster.toml").write_bytes(mine)

    run = run_on(dask_cluster, find_workspaces([root]), hook=edit_unit_1)
    by_name = {u.name: u for u in run.units}
    assert by_name["unit-1"].status == "refused" and not by_name["unit-1"].written
    assert by_name["unit-1"].error is not None and "changed" in by_name["unit-1"].error
    assert (root / "unit-1" / "roster.toml").read_bytes() == mine
    assert by_name["unit-2"].status == "done"
    assert_written_and_compliant(root / "unit-2")


def test_two_runs_on_the_same_folders_do_not_corrupt_each_other(
        dask_cluster: Any, tmp_path: Path) -> None:
    root = units_folder(tmp_path, good=3, broken=False)
    folders = find_workspaces([root])
    runs: list[ManyRun] = []
    errors: list[BaseException] = []

    def one_run(seed: int) -> None:
        try:
            runs.append(run_on(dask_cluster, folders, UnitOptions(time_limit=3, workers=1,
                                                                  seed=seed)))
        except BaseException as exc:  # shown by the assertion below
            errors.append(exc)

    threads = [threading.Thread(target=one_run, args=(seed,)) for seed in (1, 2)]
    for t in threads:
        t.start()
    for t in threads:
        t.join(timeout=120)
    assert errors == [] and len(runs) == 2
    for i, folder in enumerate(folders):
        statuses = [r.units[i].status for r in runs]
        assert set(statuses) <= {"done", "refused"} and "done" in statuses
        assert_written_and_compliant(folder)
    assert temporaries(root) == []
