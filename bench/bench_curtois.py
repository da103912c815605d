"""The solver against published results: Curtois & Qu (2014) instances 1-24.

Not a test: run by hand, copy the table into BENCHMARKS.md.

    .venv/bin/python bench/bench_curtois.py --instances 1-12 --limits 60 300
    .venv/bin/python bench/bench_curtois.py --instances 1 2 3 --limits 60

Each instance is solved through the product's real path (load the converted
workspace, build the model, solve, check the roster with the independent checker)
in a process of its own, with 2 workers and seed 0 (or several seeds: the table then
shows the median roster with the range over the seeds in brackets). Best-known values and the plain
CP-SAT model's figures are read from ../shared/benchmarks/curtois-qu/BEST_KNOWN.md
and BASELINE.md. Source of the instances: T. Curtois and R. Qu, "Computational
results on new staff scheduling benchmark instances", technical report, University
of Nottingham, 2014.
"""

from __future__ import annotations

import argparse
import json
import multiprocessing as mp
import os
import platform
import re
import resource
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
BENCH = ROOT.parent / "shared" / "benchmarks" / "curtois-qu"


def best_known() -> dict[int, int]:
    """Instance -> best seen in the literature table of BEST_KNOWN.md."""
    found: dict[int, int] = {}
    for line in (BENCH / "BEST_KNOWN.md").read_text().splitlines():
        cells = [c.strip() for c in line.strip().strip("|").split("|")]
        if len(cells) > 4 and cells[0].isdigit():
            m = re.match(r"(\d+)", cells[4])
            if m:
                found[int(cells[0])] = int(m.group(1))
    return found


def baseline() -> dict[int, dict[str, str]]:
    """Instance -> the plain CP-SAT model's row of BASELINE.md."""
    rows: dict[int, dict[str, str]] = {}
    for line in (BENCH / "BASELINE.md").read_text().splitlines():
        cells = [c.strip() for c in line.strip().strip("|").split("|")]
        if len(cells) >= 8 and cells[0].isdigit():
            rows[int(cells[0])] = {"value": cells[2], "bound": cells[4], "limit": cells[5],
                                   "best_s": cells[6]}
    return rows


def run_one(instance: int, limit: float, workers: int, seed: int, out: mp.Queue) -> None:
    from rostertui.core.io.load import load_workspace
    from rostertui.core.solver import SolveOptions, solve

    ws = load_workspace(BENCH / "workspaces" / f"Instance{instance}")
    result = solve(ws, SolveOptions(time_limit=limit, workers=workers, seed=seed))
    out.put({
        "instance": instance, "limit": limit, "seed": seed, "status": result.status,
        "objective": result.objective, "bound": result.bound,
        "best_s": result.best_seconds, "build_s": result.build_seconds,
        "compliant": bool(result.check and result.check.compliant),
        "peak_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
    })


def summarise(runs: list[dict]) -> dict:
    """The median run by objective, with the range of objectives over the seeds."""
    found = sorted((r for r in runs if r["objective"] is not None),
                   key=lambda r: r["objective"])
    if not found:
        return runs[0]
    middle = dict(found[(len(found) - 1) // 2])
    middle["range"] = (found[0]["objective"], found[-1]["objective"]) if len(found) > 1 else None
    middle["compliant"] = all(r["compliant"] for r in runs)
    middle["bound"] = max(r["bound"] for r in found)
    return middle


def parse_instances(items: list[str]) -> list[int]:
    chosen: list[int] = []
    for item in items:
        if "-" in item:
            a, b = item.split("-")
            chosen += list(range(int(a), int(b) + 1))
        else:
            chosen.append(int(item))
    return chosen


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--instances", nargs="+", default=["1-12"])
    parser.add_argument("--limits", type=float, nargs="+", default=[60.0, 300.0])
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--seeds", type=int, nargs="+", default=[0],
                        help="one run per seed; the table shows the median and the range")
    args = parser.parse_args()
    if not BENCH.is_dir():
        print(f"{BENCH} not found: the benchmark data is not beside this clone", file=sys.stderr)
        return 2
    known, plain = best_known(), baseline()
    ctx = mp.get_context("spawn")
    results: dict[tuple[int, float], dict] = {}
    print(f"# {platform.machine()}, {os.cpu_count()} cores, Python "
          f"{platform.python_version()}, {args.workers} workers, seeds {args.seeds}",
          file=sys.stderr)
    for instance in parse_instances(args.instances):
        for limit in args.limits:
            runs = []
            for seed in args.seeds:
                queue: mp.Queue = ctx.Queue()
                proc = ctx.Process(target=run_one,
                                   args=(instance, limit, args.workers, seed, queue))
                proc.start()
                row = queue.get()
                proc.join()
                runs.append(row)
                print(json.dumps(row), file=sys.stderr, flush=True)
            results[instance, limit] = summarise(runs)
    heads = ["instance", "best known"]
    for limit in args.limits:
        heads += [f"ours {limit:g} s", f"bound {limit:g} s", f"gap to best known {limit:g} s",
                  f"time to best {limit:g} s"]
    heads += ["plain model (limit)", "plain bound"]
    print("| " + " | ".join(heads) + " |")
    print("|" + "---|" * len(heads))
    for instance in parse_instances(args.instances):
        best = known.get(instance)
        cells = [str(instance), str(best) if best else "-"]
        for limit in args.limits:
            r = results[instance, limit]
            value = r["objective"]
            gap = f"{(value - best) / best:.1%}" if value is not None and best else "-"
            mark = "" if r["compliant"] else " (!)"
            spread = f" ({r['range'][0]}-{r['range'][1]})" if r.get("range") else ""
            cells += [f"{value}{spread}{mark}" if value is not None else "none", str(r["bound"]),
                      gap, f"{r['best_s']:.1f}" if r["best_s"] is not None else "-"]
        p = plain.get(instance)
        cells += [f"{p['value']} ({p['limit']} s)" if p else "-", p["bound"] if p else "-"]
        print("| " + " | ".join(cells) + " |")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
