"""`rostertui`: registers the verbs; each verb lives in its own module as do_<verb>()."""

from __future__ import annotations

import argparse
import sys
from collections.abc import Sequence
from pathlib import Path

from rostertui import __version__
from rostertui.cli import (
    absent,
    add_requests,
    check,
    demo,
    diff,
    explain,
    export,
    new,
    publish,
    repair,
    solve,
    solve_many,
    stats,
    swap,
)
from rostertui.cli import next as next_verb
from rostertui.cli import open as open_verb
from rostertui.cli.output import EXIT_INPUT, fail, fail_input
from rostertui.core.errors import EditError, InputError

DESCRIPTION = """Build, repair and audit staff rosters.

Exit status: 0 done and compliant; 1 done but the roster breaks a hard rule
(or none can keep them all); 2 the input could not be read or the command
was wrong (message on stderr, nothing written)."""


def build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="rostertui",
        description=DESCRIPTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--version", action="version", version=f"rostertui {__version__}")
    verbs = parser.add_subparsers(dest="verb", metavar="VERB")
    for module in (open_verb, check, stats, solve, solve_many, explain, repair, publish, diff,
                   swap, absent, export, new, next_verb, add_requests, demo):
        module.register(verbs)
    return parser


def _verbs(parser: argparse.ArgumentParser) -> set[str]:
    for action in parser._actions:
        if isinstance(action, argparse._SubParsersAction):
            return set(action.choices)
    return set()


def main(argv: Sequence[str] | None = None) -> int:
    parser = build_parser()
    args_list = list(sys.argv[1:] if argv is None else argv)
    if not args_list:
        if Path("unit.toml").is_file():  # `rostertui` inside a workspace opens it
            args_list = ["open", "."]
        else:
            parser.print_help()
            return 0
    elif args_list[0] not in _verbs(parser) and not args_list[0].startswith("-"):
        args_list.insert(0, "open")  # `rostertui WS` is `rostertui open WS`
    try:
        args = parser.parse_args(args_list)
    except SystemExit as exc:  # argparse exits 2 on a wrong command, 0 on --help
        return int(exc.code or 0)
    try:
        return int(args.run(args))
    except InputError as exc:
        return fail_input(exc)
    except EditError as exc:
        return fail(f"{exc}; nothing written")
    except OSError as exc:  # a folder not writable, a disk full: say which file, no trace
        where = f"{exc.filename}: " if exc.filename else ""
        return fail(f"{where}{exc.strerror or exc}; the files are as they were")
    except KeyboardInterrupt:
        print("interrupted; nothing written", file=sys.stderr)
        return EXIT_INPUT
