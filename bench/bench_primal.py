"""The primal heuristics against published results, beside the solve without them.

Not a test: run by hand (never beside the test suite or another benchmark), copy the
tables into BENCHMARKS.md.

    .venv/bin/python bench/bench_primal.py --instances 1-15 clinic depot --limit 60
    .venv/bin/python bench/bench_primal.py --instances 5 7 8 --limit 60 --seeds 0 1 2
    .venv/bin/python bench/bench_primal.py --instances 5 --set pool_share=1.0 --only new
    .venv/bin/python bench/bench_primal.py --instances clinic --before decompose=false
    git worktree add --detach ../base HEAD~1   # the solver as it was, side by side:
    .venv/bin/python bench/bench_primal.py --instances clinic --before code=../base

`--before code=DIR` runs the baseline from the checkout in DIR (its `rostertui`
package, imported in the baseline's own process) with its default options.

Each run is a process of its own through the product's real path (load the
workspace, solve, referee), from scratch (no roster in the workspace). Every
instance is solved twice at the same limit, seed and workers: with the primal
heuristics (new, the default) and with `primal=False` (before: the solver of the
decomposition-bound issue). `--set KEY=VALUE` changes a SolveOptions field of the
new run (to compare variants). Instances are Curtois & Qu (2014, "Computational
results on new staff scheduling benchmark instances", technical report, University
of Nottingham) from ../shared/benchmarks/curtois-qu, or the bundled demos by name.
"""

from __future__ import annotations

import argparse
import dataclasses
import multiprocessing as mp
import os
import platform
import resource
import statistics
import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_bound import folder_of, gap, in_process, names  # noqa: E402
from bench_curtois import BENCH, best_known  # noqa: E402


def run_solve(name: str, limit: float, workers: int, seed: int, changes: dict,
              out: mp.Queue) -> None:
    changes = dict(changes)
    code = changes.pop("code", None)
    if code:  # another checkout's package (the solver as it was), in this fresh process
        sys.path.insert(0, str(code))
    from rostertui.core.io.load import load_workspace
    from rostertui.core.solver import SolveOptions, solve
    from rostertui.core.solver.summary import improvement_story

    ws = load_workspace(folder_of(name))
    ws.roster = None
    options = dataclasses.replace(SolveOptions(time_limit=limit, workers=workers, seed=seed),
                                  **changes)
    result = solve(ws, options)
    import rostertui

    out.put({
        "instance": name, "seed": seed, "changes": changes,
        "code": str(Path(rostertui.__file__).parent.parent), "status": result.status,
        "objective": result.objective, "bound": result.bound,
        "best_seconds": round(result.best_seconds, 1) if result.best_seconds else None,
        "seconds": round(result.wall_seconds, 1), "found_by": result.found_by,
        "story": improvement_story(result),
        "peak_mib": round(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024),
    })


def value(text: str) -> object:
    for kind in (int, float):
        try:
            return kind(text)
        except ValueError:
            pass
    return {"true": True, "false": False}.get(text.lower(), text)


def above(value: int | None, best: int | None) -> str:
    if value is None or not best:
        return "-"
    return f"{(value - best) / best:+.1%}"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--instances", nargs="+", default=["1-15", "clinic", "depot"])
    parser.add_argument("--limit", type=float, default=60.0)
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--seeds", type=int, nargs="+", default=[0])
    parser.add_argument("--set", nargs="*", default=[], metavar="KEY=VALUE",
                        help="SolveOptions fields for the new run")
    parser.add_argument("--before", nargs="*", default=["primal=false"], metavar="KEY=VALUE",
                        help="SolveOptions fields of the run compared against "
                             "(default: primal=false)")
    parser.add_argument("--only", choices=["new", "before"], help="one of the two runs")
    args = parser.parse_args()
    changes = {k: value(v) for k, v in (item.split("=", 1) for item in args.set)}
    baseline = {k: value(v) for k, v in (item.split("=", 1) for item in args.before)}
    chosen = names(args.instances)
    if any(n.isdigit() for n in chosen) and not BENCH.is_dir():
        print(f"{BENCH} not found: the benchmark data is not beside this clone", file=sys.stderr)
        return 2
    known = best_known() if BENCH.is_dir() else {}
    print(f"# {platform.machine()}, {os.cpu_count()} cores, Python "
          f"{platform.python_version()}, {args.workers} workers, seeds {args.seeds}, "
          f"limit {args.limit:g} s, new: {changes or 'defaults'}, before: {baseline}",
          file=sys.stderr)
    print("| instance | best known | new (seeds) | median new | before (seeds) | median before "
          "| new above best known | bound | found by (new, first seed) | peak MiB new |")
    print("|---|---|---|---|---|---|---|---|---|---|")
    for name in chosen:
        new: list[dict] = []
        old: list[dict] = []
        for seed in args.seeds:
            if args.only != "before":
                new.append(in_process(run_solve, name, args.limit, args.workers, seed, changes))
            if args.only != "new":
                old.append(in_process(run_solve, name, args.limit, args.workers, seed,
                                      baseline))
        best = known.get(int(name)) if name.isdigit() else None

        def cell(rows: list[dict]) -> tuple[str, str, int | None]:
            values = [r["objective"] for r in rows]
            if not values or None in values:
                return ", ".join(map(str, values)) or "-", "-", None
            mid = statistics.median(values)
            return ", ".join(map(str, values)), f"{mid:g}", mid

        new_all, new_mid, mid = cell(new)
        old_all, old_mid, _ = cell(old)
        bound = max((r["bound"] or 0) for r in new + old) if new + old else None
        first = new[0] if new else {}
        story = first.get("story", "-")
        if first.get("status") == "optimal":
            story = f"optimal; {story}"
        print(f"| {name} | {best or '-'} | {new_all} | {new_mid} | {old_all} | {old_mid} | "
              f"{above(mid, best)} | {bound} ({gap(mid, bound)}) | {story} | "
              f"{first.get('peak_mib', '-')} |", flush=True)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
