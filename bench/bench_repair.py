"""Repair and explain on generated units of 25, 50, 100 people x 28 days.

Not a test: run by hand, copy the table into BENCHMARKS.md.

    .venv/bin/python bench/bench_repair.py                  # 25 50 100
    .venv/bin/python bench/bench_repair.py --sizes 25 --solve-limit 20

Per size: a roster is solved (--solve-limit s), then three people are each absent
for two working days in the middle of the period and the roster is repaired from
the first absent day. Measured: repair time, status, cells changed (against the
solved roster, the cleared cells included) and the peak memory. Then explain on
the same unit made infeasible (everyone holding the skill some night cover needs,
bar one, on leave that day): time to the answer and size of the conflicting set.
"""

from __future__ import annotations

import argparse
import dataclasses
import multiprocessing as mp
import platform
import resource
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from generate import write_unit  # noqa: E402

from rostertui.core.explain.run import explain  # noqa: E402
from rostertui.core.io.load import load_workspace  # noqa: E402
from rostertui.core.models.common import OFF  # noqa: E402
from rostertui.core.models.requests import Leave  # noqa: E402
from rostertui.core.repair.absence import record_absence  # noqa: E402
from rostertui.core.repair.diff import roster_diff  # noqa: E402
from rostertui.core.repair.repair import repair  # noqa: E402
from rostertui.core.solver import SolveOptions, solve  # noqa: E402


def run_one(people: int, solve_limit: float, workers: int, out: mp.Queue) -> None:
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(write_unit(Path(tmp) / "unit", people))
        solved = solve(ws, SolveOptions(time_limit=solve_limit, workers=workers))
        assert solved.roster is not None
        ws = dataclasses.replace(ws, roster=solved.roster)
        mid = ws.unit.days // 2
        absent, first = ws, None
        for pid in ws.person_ids[::max(1, people // 3)][:3]:
            row = solved.roster.rows[pid]
            d = next(d for d in range(mid, ws.unit.days - 1) if OFF not in row[d:d + 2])
            a = record_absence(absent, pid, ws.unit.dates[d], ws.unit.dates[d + 1], "sick")
            absent = dataclasses.replace(absent, requests=a.requests, roster=a.roster)
            first = min(first or ws.unit.dates[d], ws.unit.dates[d])
        assert first is not None
        t0 = time.perf_counter()
        fixed = repair(absent, first, SolveOptions(time_limit=60, workers=workers))
        repair_s = time.perf_counter() - t0
        assert fixed.outcome.roster is not None
        changed = len(roster_diff(ws, solved.roster, fixed.outcome.roster))
        infeasible = _starve_a_night(ws)
        t0 = time.perf_counter()
        why = explain(infeasible, 60, workers, price_requests=False)
        explain_s = time.perf_counter() - t0
        conflict = [r for r in why.reasons if r.message.startswith("No roster")]
        out.put({
            "people": people, "repair_s": repair_s, "status": fixed.outcome.status,
            "changed": changed, "compliant": fixed.outcome.check.compliant
            if fixed.outcome.check else None,
            "explain_s": explain_s, "feasible": why.feasible,
            "reasons": len(why.reasons),
            "conflict_people": len(conflict[0].people) if conflict else None,
            "peak_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
        })


def _starve_a_night(ws):  # noqa: ANN001, ANN202
    """Leave for all but one holder of the skill the first skilled night cover needs."""
    cover = next(c for c in ws.shifts.cover if c.skill and c.min and c.min >= 1)
    day = ws.unit.dates[ws.unit.days // 2]
    holders = [p.id for p in ws.staff.person if cover.skill in p.skills]
    leave = [Leave.model_validate({"person": pid, "from": day}) for pid in holders[1:]]
    if cover.min == 1:
        leave.append(Leave.model_validate({"person": holders[0], "from": day}))
    requests = ws.requests.model_copy(update={"leave": [*ws.requests.leave, *leave]})
    return dataclasses.replace(ws, requests=requests)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="+", default=[25, 50, 100])
    parser.add_argument("--solve-limit", type=float, default=30.0)
    parser.add_argument("--workers", type=int, default=2)
    args = parser.parse_args()
    print(f"# {platform.processor() or platform.machine()}, Python {platform.python_version()}, "
          f"{args.workers} workers, roster solved for {args.solve_limit:g} s")
    print("| people | repair s | status | cells changed (6 cleared) | compliant | "
          "explain s | feasible | reasons | people in the conflict | peak MiB |")
    print("|---|---|---|---|---|---|---|---|---|---|")
    for n in args.sizes:
        q: mp.Queue = mp.Queue()
        p = mp.Process(target=run_one, args=(n, args.solve_limit, args.workers, q))
        p.start()
        r = q.get()
        p.join()
        print(f"| {r['people']} | {r['repair_s']:.2f} | {r['status']} | {r['changed']} | "
              f"{r['compliant']} | {r['explain_s']:.2f} | {r['feasible']} | {r['reasons']} | "
              f"{r['conflict_people']} | {r['peak_mib']:.0f} |", flush=True)


if __name__ == "__main__":
    main()
