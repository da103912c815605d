"""The one module that talks to Dask distributed (the optional extra `rostertui[many]`).

`DaskCluster` starts a local cluster sized to the machine (one single-threaded worker
process per unit that fits: cores / search threads per unit), or connects to a running
scheduler, and adapts it to what `client.ManyRun` needs: `submit`, `completed`,
`cancel`. Dask is imported only when a cluster is opened, so the package and every
other verb work without it.

Each unit is one task, `run_unit`, which gets the workspace's files as data. It tells
the client through a Dask event topic (`Worker.log_event`, `Client.subscribe_topic`;
they travel through the scheduler, so they work on a real cluster too) when it starts
and, at most once a second, its best penalty and bound. A unit whose worker dies is
started again elsewhere by the scheduler, which the client sees as a second start;
`allowed-failures = 1` makes the scheduler give up on the second death (KilledWorker),
and `retries = 1` gives an unexpected error in the task one more try. A worker takes
one unit at a time (`worker-saturation = 1.0`): the others wait at the scheduler.
"""

from __future__ import annotations

import logging
import os
import re
import time
import uuid
from collections.abc import Callable, Iterator
from types import TracebackType
from typing import TYPE_CHECKING, Any

from rostertui.core.errors import RosterError
from rostertui.core.many.task import UnitOptions, UnitResult, solve_unit
from rostertui.core.many.units import WorkerNews
from rostertui.core.solver.outcome import SolveProgress

if TYPE_CHECKING:
    from distributed import Client, Future, LocalCluster

EXTRA = "pip install 'rostertui[many]'"
PROGRESS_EVERY = 1.0  # seconds between two progress events of one unit, at least
ALLOWED_FAILURES = 1  # a unit whose worker dies is started once more, not a third time
CONNECT_TIMEOUT = "10s"
# What solve-many wants of a scheduler (set on the local one; README: on a real one).
# Saturation 1.0: a worker holds no more units than threads, the rest wait at the
# scheduler for the first worker free (the default, 1.1, may queue two units behind
# each other on one worker while another is idle).
SCHEDULER_CONFIG = {"distributed.scheduler.allowed-failures": ALLOWED_FAILURES,
                    "distributed.scheduler.worker-saturation": 1.0}


class MissingExtra(RosterError):
    """Dask distributed is not installed."""


class ClusterUnreachable(RosterError):
    """The scheduler given with --scheduler did not answer."""


class WorkerLost(RosterError):
    """The unit's worker died on each of its attempts."""


def require_dask() -> None:
    """MissingExtra, naming the extra to install, when Dask distributed is absent."""
    try:
        import distributed  # noqa: F401
    except ImportError:
        raise MissingExtra(f"solve-many needs Dask distributed, an optional extra: {EXTRA} "
                           "(on this machine and on every worker)") from None


def units_at_once(workers_per_unit: int, cores: int | None = None) -> int:
    """How many units a local cluster solves at once: cores / search threads per unit
    (0 threads = every core, so one unit at a time), at least one."""
    cores = cores or os.cpu_count() or 1
    per = workers_per_unit if workers_per_unit > 0 else cores
    return max(1, cores // per)


def run_unit(topic: str, unit: str, files: dict[str, bytes], options: UnitOptions
             ) -> UnitResult:
    """The task a worker runs for one unit: say so, solve, send progress as it goes."""
    from distributed import get_worker

    worker = get_worker()
    worker.log_event(topic, {"unit": unit, "kind": "started", "worker": worker.address,
                             "pid": os.getpid()})
    last: dict[str, Any] = {"at": 0.0, "sent": None}

    def progress(p: SolveProgress) -> None:
        now, sent = time.monotonic(), (p.penalty, p.bound)
        if sent == last["sent"] or now - last["at"] < PROGRESS_EVERY:
            return
        last["at"], last["sent"] = now, sent
        worker.log_event(topic, {"unit": unit, "kind": "progress", "penalty": p.penalty,
                                 "bound": p.bound})

    return solve_unit(files, options, progress)


class DaskCluster:
    """A Dask client (and, without `scheduler`, its local cluster) for one run; a
    context manager that closes both."""

    def __init__(self, on_news: Callable[[WorkerNews], None], *, scheduler: str | None = None,
                 workers_per_unit: int = 1, units: int | None = None):
        self.on_news = on_news
        self.scheduler = scheduler
        self.units = units or units_at_once(workers_per_unit)
        self.topic = f"rostertui-many-{uuid.uuid4().hex}"
        self.local: LocalCluster | None = None
        self._client: Client | None = None
        self._futures: dict[Future[UnitResult], str] = {}

    @property
    def client(self) -> Client:
        assert self._client is not None, "use DaskCluster as a context manager"
        return self._client

    @property
    def address(self) -> str:
        return str(self.client.scheduler.address if self.client.scheduler else "")

    def __enter__(self) -> DaskCluster:
        require_dask()
        import dask
        from distributed import Client, LocalCluster

        # read by a scheduler when it starts: here, the local one's
        with dask.config.set(SCHEDULER_CONFIG):
            if self.scheduler is None:
                self.local = LocalCluster(n_workers=self.units, threads_per_worker=1,
                                          processes=True, dashboard_address=":0",
                                          silence_logs=logging.ERROR)
                self._client = Client(self.local, set_as_default=False)
            else:
                try:
                    self._client = Client(self.scheduler, set_as_default=False,
                                          timeout=CONNECT_TIMEOUT)
                except (OSError, TimeoutError) as exc:
                    raise ClusterUnreachable(f"--scheduler {self.scheduler}: no Dask "
                                             f"scheduler answers there ({exc})") from None
        self.client.subscribe_topic(self.topic, self._event)
        return self

    def __exit__(self, kind: type[BaseException] | None, exc: BaseException | None,
                 tb: TracebackType | None) -> None:
        client, self._client = self._client, None
        if client is not None:
            try:
                client.unsubscribe_topic(self.topic)
            finally:
                client.close()
        if self.local is not None:
            self.local.close()
            self.local = None

    def _event(self, event: tuple[float, dict[str, Any]]) -> None:
        msg = event[1]
        if msg.get("kind") == "started":
            self.on_news(WorkerNews(str(msg["unit"]), "started", worker=str(msg["worker"]),
                                    pid=int(msg["pid"])))
        elif msg.get("kind") == "progress":
            self.on_news(WorkerNews(str(msg["unit"]), "progress", penalty=msg["penalty"],
                                    bound=msg["bound"]))

    def submit(self, unit: str, files: dict[str, bytes], options: UnitOptions) -> None:
        slug = re.sub(r"[^A-Za-z0-9_.-]+", "-", unit)[-40:]
        future = self.client.submit(run_unit, self.topic, unit, files, options,
                                    key=f"rostertui-{slug}-{uuid.uuid4().hex[:12]}",
                                    retries=1, pure=False)
        self._futures[future] = unit

    def completed(self) -> Iterator[tuple[str, UnitResult | BaseException]]:
        from distributed import as_completed
        from distributed.scheduler import KilledWorker

        for future in as_completed(list(self._futures), loop=self.client.loop):
            unit = self._futures[future]
            if future.cancelled():
                continue
            outcome: UnitResult | BaseException
            try:
                outcome = future.result()
            except KilledWorker:
                outcome = WorkerLost("its worker died on each of its two attempts (killed, "
                                     "or out of memory?); nothing written")
            except Exception as exc:  # raised in the task (after its retry): reported
                outcome = exc
            yield unit, outcome

    def cancel(self) -> None:
        if self._client is not None and self._futures:
            self.client.cancel(list(self._futures), force=True)
