"""Does `--time-limit` hold on a huge unit? End to end, per phase, and the build rate.

Not a test: run by hand, copy the figures into BENCHMARKS.md.

    .venv/bin/python bench/bench_limit.py                        # 2014 x 28, limits 2 and 10
    .venv/bin/python bench/bench_limit.py --people 500 --limits 5 30
    .venv/bin/python bench/bench_limit.py --phases               # where the seconds go
    .venv/bin/python bench/bench_limit.py --calibrate            # the build-time estimate

The workspace is tests/tui/bigws.py's (the clinic demo's shifts, cover and rules for N
people x D days, with a random, far from compliant roster), as in the fuzzing report
of `rostertui solve WS --time-limit 2` running 49 s on 2014 people. `--feasible`
replaces that roster by one that keeps every hard rule (the first 28 people solved
as their own unit for 20 s, everyone else on earlies Monday to Friday), so that the
warm start completes and polish and the referee have a roster to work on.

The default mode runs `rostertui solve` in a fresh process per limit on a fresh copy
and prints its wall time, peak memory, the warning it gave and how it ended.
`--phases` times each phase in this process: load, estimate, build, hint, LP build,
CP-SAT (at the smallest limit), polish, referee, save.
"""

from __future__ import annotations

import argparse
import dataclasses
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "bench"))

from rostertui.core.io.load import load_workspace  # noqa: E402
from tests.tui.bigws import make_big_workspace  # noqa: E402

CLI = ROOT / ".venv" / "bin" / "rostertui"


def make(dest: Path, people: int, days: int, feasible: bool) -> Path:
    make_big_workspace(dest, people, days)
    if feasible:
        write_feasible_roster(dest, days)
    return dest


def write_feasible_roster(dest: Path, days: int) -> None:
    from rostertui.core.check import check_roster
    from rostertui.core.solver import SolveOptions, solve

    with tempfile.TemporaryDirectory() as tmp:
        small = make_big_workspace(Path(tmp) / "small", 28, days)
        (small / "roster.toml").unlink()
        solved = solve(load_workspace(small), SolveOptions(time_limit=20, workers=2))
        assert solved.roster is not None, "the 28-person unit found no roster in 20 s"
        rows = dict(solved.roster.rows)
    ws = load_workspace(dest)
    for p in ws.staff.person:
        if p.id not in rows:
            part = "part-time" in p.groups  # 10 earlies, full-time 20 (hours bands)
            rows[p.id] = ["E" if d % 7 < 5 and (not part or d // 7 % 2 == 0) else "-"
                          for d in range(days)]
    lines = [f"start = {ws.unit.start}", f"days = {days}", "", "[rows]"]
    lines += [f"{pid} = [{', '.join(f'{c!r}' for c in row)}]".replace("'", '"')
              for pid, row in rows.items()]
    (dest / "roster.toml").write_text("\n".join(lines) + "\n", encoding="utf-8")
    result = check_roster(load_workspace(dest))
    assert result.compliant, f"{result.hard_violations} hard violations in the made roster"


def end_to_end(folder: Path, limits: list[float], workers: int) -> None:
    """`rostertui solve` in its own process on a fresh copy, timed by /usr/bin/time."""
    print("| --time-limit | wall (s) | peak memory (MiB) | exit | warned | result |")
    print("|---|---|---|---|---|---|")
    for limit in limits:
        with tempfile.TemporaryDirectory() as tmp:
            ws = Path(tmp) / "ws"
            shutil.copytree(folder, ws)
            timing = Path(tmp) / "time"
            proc = subprocess.run(
                ["/usr/bin/time", "-f", "%e %M", "-o", str(timing), str(CLI), "solve",
                 str(ws), "--time-limit", f"{limit:g}", "--workers", str(workers)],
                capture_output=True, text=True, check=False)
            wall, kib = timing.read_text().split()[-2:]
            warned = "yes" if "takes about" in proc.stderr else "no"
            lines = proc.stdout.strip().splitlines() or proc.stderr.strip().splitlines()
            result = next((ln.strip() for ln in lines if "status" in ln), lines[-1].strip())
            print(f"| {limit:g} | {float(wall):.1f} | {int(kib) / 1024:.0f} | "
                  f"{proc.returncode} | {warned} | {result[:80]} |", flush=True)


def phases(folder: Path, limit: float, workers: int) -> None:
    from ortools.sat.python import cp_model

    from rostertui.core.io.save import save
    from rostertui.core.solver import run
    from rostertui.core.solver.fixing import fixed_copy
    from rostertui.core.solver.lp_bound import Relaxation
    from rostertui.core.solver.model import build_model, estimate_build

    def timed(name: str, fn, *args):  # noqa: ANN001, ANN202
        t0 = time.monotonic()
        value = fn(*args)
        print(f"  {name:<34} {time.monotonic() - t0:7.2f} s", flush=True)
        return value

    ws = timed("load", load_workspace, folder)
    est = timed("estimate_build", estimate_build, ws)
    built = timed("build_model", build_model, ws)
    proto = built.model.proto
    print(f"  (estimated {est.seconds:.1f} s; {len(proto.variables)} variables, "
          f"{len(proto.constraints)} constraints, {len(built.cells.x)} cells)")
    roster = ws.roster
    assert roster is not None
    values = {(p, d, c): int(d < len(roster.rows.get(built.cells.people[p], ()))
                             and roster.rows[built.cells.people[p]][d] == c)
              for (p, d, c) in built.cells.x}
    plain = dataclasses.replace(built, model=built.model.clone())
    timed("hint (completion, 10 s cap)", run._hint, plain, 10.0)
    full = len(plain.model.proto.solution_hint.vars) == len(proto.variables)
    print(f"  (hint {'complete' if full else 'cells only: the roster breaks a hard rule'})")
    timed("fix every cell (clone + domains)", fixed_copy, built, values)
    timed("LP relaxation built", Relaxation, built.model)
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = limit
    solver.parameters.num_workers = workers
    solver.parameters.linearization_level = 2
    code = timed(f"CP-SAT, limit {limit:g} s", solver.solve, plain.model)
    print(f"  (CP-SAT {solver.status_name(code)})")
    if full:
        total, _ = timed("polish (the hinted roster)", run.polish, built, values)
        timed("referee", run.referee, ws, run.roster_from(built, values), total)
        with tempfile.TemporaryDirectory() as tmp:
            shutil.copytree(folder, Path(tmp) / "ws")
            timed("save", save, run.roster_from(built, values), Path(tmp) / "ws")


def calibrate() -> None:
    """Build time per rule kind on 400 people, then the estimate against the build."""
    from generate import write_unit

    from rostertui.core.solver.model import build_model, estimate_build

    def best_build(ws, n: int = 2) -> float:  # noqa: ANN001
        best = float("inf")
        for _ in range(n):
            t0 = time.perf_counter()
            build_model(ws)
            best = min(best, time.perf_counter() - t0)
        return best

    with tempfile.TemporaryDirectory() as tmp:
        units = {"clinic rules 400 x 28": make_big_workspace(Path(tmp) / "b", 400, 28),
                 "generated 400 x 28": write_unit(Path(tmp) / "g", 400, 28)}
        print("Each rule kind alone, less the build without rules (us per person-day):")
        for name, folder in units.items():
            ws = load_workspace(folder)
            base = best_build(dataclasses.replace(ws, rules=[]))
            print(f"  {name}: no rules {base:.3f} s")
            for eff in ws.rules:
                extra = best_build(dataclasses.replace(ws, rules=[eff])) - base
                per = extra / max(1, len(eff.people) * ws.unit.days) * 1e6
                print(f"    {eff.rule.kind:<26} {len(eff.people):>4} people {per:6.1f}")
        print("\n| unit | measured build (s) | estimated (s) | error |")
        print("|---|---|---|---|")
        sizes = [("clinic", 100, 28), ("clinic", 500, 28), ("clinic", 500, 56),
                 ("clinic", 1000, 28), ("clinic", 2014, 28), ("generated", 200, 28),
                 ("generated", 800, 28)]
        for kind, people, days in sizes:
            dest = Path(tmp) / f"{kind}{people}x{days}"
            folder = (make_big_workspace(dest, people, days) if kind == "clinic"
                      else write_unit(dest, people, days))
            _row(f"{kind} {people} x {days}", load_workspace(folder), best_build,
                 estimate_build)
        cq = ROOT.parent / "shared" / "benchmarks" / "curtois-qu" / "workspaces"
        for i in (9, 12, 15, 20):
            if (cq / f"Instance{i}").is_dir():
                _row(f"Curtois-Qu {i}", load_workspace(cq / f"Instance{i}"), best_build,
                     estimate_build)


def _row(name: str, ws, best_build, estimate_build) -> None:  # noqa: ANN001
    measured = best_build(ws, 1)
    est = estimate_build(ws).seconds
    print(f"| {name} | {measured:.2f} | {est:.2f} | {est / measured - 1:+.0%} |", flush=True)


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--people", type=int, default=2014)
    parser.add_argument("--days", type=int, default=28)
    parser.add_argument("--limits", type=float, nargs="+", default=[2.0, 10.0])
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--feasible", action="store_true",
                        help="a current roster that keeps every hard rule")
    parser.add_argument("--keep", type=Path, help="write the workspace here and keep it")
    parser.add_argument("--phases", action="store_true", help="seconds per phase")
    parser.add_argument("--calibrate", action="store_true", help="the build-time estimate")
    args = parser.parse_args()
    if args.calibrate:
        calibrate()
        return 0
    with tempfile.TemporaryDirectory() as tmp:
        folder = args.keep or Path(tmp) / "big"
        if args.keep is None or not (folder / "unit.toml").exists():
            make(folder, args.people, args.days, args.feasible)
        print(f"{args.people} people x {args.days} days, {args.workers} workers, "
              f"{'feasible' if args.feasible else 'random'} current roster")
        if args.phases:
            phases(folder, min(args.limits), args.workers)
        else:
            end_to_end(folder, args.limits, args.workers)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
