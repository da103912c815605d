"""The column-generation bound against published results, beside the solve without it.

Not a test: run by hand (never beside the test suite or another benchmark), copy the
tables into BENCHMARKS.md.

    .venv/bin/python bench/bench_bound.py --instances 1-15 clinic depot --limit 60
    .venv/bin/python bench/bench_bound.py --instances 1-19 --limit 300 --alone

Each run is a process of its own through the product's real path (load the
workspace, solve, referee). Without --alone every instance is solved twice at the
same limit, seed and workers: with the decomposition (the default) and with
`decompose=False` (the solver as it was), so the roster and bound columns compare
like with like. With --alone only the decomposition runs, up to the limit, and the
table gives its bound and the time it took to converge. Instances are Curtois & Qu
(2014, "Computational results on new staff scheduling benchmark instances",
technical report, University of Nottingham) from ../shared/benchmarks/curtois-qu,
or the bundled demos by name.
"""

from __future__ import annotations

import argparse
import json
import multiprocessing as mp
import os
import platform
import resource
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_curtois import BENCH, best_known, parse_instances  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]


def folder_of(name: str) -> Path:
    return ROOT / "demo" / name if not name.isdigit() else \
        BENCH / "workspaces" / f"Instance{name}"


def run_solve(name: str, limit: float, workers: int, seed: int, decompose: bool,
              out: mp.Queue) -> None:
    from rostertui.core.io.load import load_workspace
    from rostertui.core.solver import SolveOptions, solve

    ws = load_workspace(folder_of(name))
    ws.roster = None  # from scratch: no warm start from a roster left by an earlier run
    result = solve(ws, SolveOptions(time_limit=limit, workers=workers, seed=seed,
                                    decompose=decompose))
    dw = result.decomposition
    out.put({
        "instance": name, "decompose": decompose, "status": result.status,
        "objective": result.objective, "bound": result.bound, "bounds": result.bounds,
        "dw_converged": dw.converged if dw else None,
        "dw_seconds": round(dw.seconds, 1) if dw else None,
        "seconds": round(result.wall_seconds, 1),
        "peak_mib": round(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024),
    })


def run_alone(name: str, limit: float, workers: int, seed: int, out: mp.Queue) -> None:
    from rostertui.core.io.load import load_workspace
    from rostertui.core.solver.decompose import decompose

    ws = load_workspace(folder_of(name))
    started = time.monotonic()
    result = decompose(ws, deadline=started + limit, workers=workers, seed=seed)
    seconds = time.monotonic() - started
    # Today's bound without the decomposition, for comparison: the compact model's LP
    # relaxation (GLOP), given what `solve` gives it (lp_share of the limit) afterwards.
    from rostertui.core.solver import SolveOptions
    from rostertui.core.solver.lp_bound import Relaxation
    from rostertui.core.solver.model import build_model

    lp = Relaxation(build_model(ws).model).solve(SolveOptions().lp_share * limit)
    out.put({
        "instance": name, "bound": result.bound, "converged": result.converged,
        "lp": lp, "wall": round(seconds, 1),
        "seconds": round(result.seconds, 1), "iterations": result.iterations,
        "columns": len(result.columns),
        "master": round(result.master_value, 2) if result.master_value is not None else None,
        "peak_mib": round(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024),
    })


def in_process(target, *args) -> dict:  # noqa: ANN001
    ctx = mp.get_context("spawn")
    queue: mp.Queue = ctx.Queue()
    proc = ctx.Process(target=target, args=(*args, queue))
    proc.start()
    row = queue.get()
    proc.join()
    print(json.dumps(row), file=sys.stderr, flush=True)
    return row


def names(items: list[str]) -> list[str]:
    found: list[str] = []
    for item in items:
        found += [item] if item.isalpha() else [str(i) for i in parse_instances([item])]
    return found


def gap(value: int | None, bound: int | None) -> str:
    if value is None or bound is None:
        return "-"
    return f"{(value - bound) / value:.1%}" if value else "0.0%"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--instances", nargs="+", default=["1-15", "clinic", "depot"])
    parser.add_argument("--limit", type=float, default=60.0)
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--seed", type=int, default=0)
    parser.add_argument("--alone", action="store_true",
                        help="the decomposition only, up to the limit")
    args = parser.parse_args()
    chosen = names(args.instances)
    if any(n.isdigit() for n in chosen) and not BENCH.is_dir():
        print(f"{BENCH} not found: the benchmark data is not beside this clone", file=sys.stderr)
        return 2
    known = best_known() if BENCH.is_dir() else {}
    print(f"# {platform.machine()}, {os.cpu_count()} cores, Python "
          f"{platform.python_version()}, {args.workers} workers, seed {args.seed}, "
          f"limit {args.limit:g} s", file=sys.stderr)
    if args.alone:
        print("| instance | best known | bound | LP relaxation (before) | converged | seconds "
              "| iterations | columns | peak MiB |")
        print("|---|---|---|---|---|---|---|---|---|")
        for name in chosen:
            r = in_process(run_alone, name, args.limit, args.workers, args.seed)
            best = known.get(int(name)) if name.isdigit() else None
            lp = "-" if r["lp"] is None else r["lp"]
            print(f"| {name} | {best or '-'} | {r['bound']} | {lp} | "
                  f"{'yes' if r['converged'] else 'no'} | {r['seconds']} | {r['iterations']} "
                  f"| {r['columns']} | {r['peak_mib']} |", flush=True)
        return 0
    print(f"| instance | best known | bound {args.limit:g} s (new) | bound before | penalty "
          "(new) | penalty before | gap (new) | gap before | column generation (s) "
          "| peak MiB (new / before) |")
    print("|---|---|---|---|---|---|---|---|---|---|")
    for name in chosen:
        new = in_process(run_solve, name, args.limit, args.workers, args.seed, True)
        old = in_process(run_solve, name, args.limit, args.workers, args.seed, False)
        best = known.get(int(name)) if name.isdigit() else None
        dw = "-" if new["dw_seconds"] is None else (
            f"{new['dw_seconds']}" + ("" if new["dw_converged"] else " (not converged)"))
        print(f"| {name} | {best or '-'} | {new['bound']} | {old['bound']} | {new['objective']} "
              f"| {old['objective']} | {gap(new['objective'], new['bound'])} | "
              f"{gap(old['objective'], old['bound'])} | {dw} | "
              f"{new['peak_mib']} / {old['peak_mib']} |", flush=True)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
