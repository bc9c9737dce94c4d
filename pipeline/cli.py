"""The ``knotledger`` command: one subcommand per module, dispatched here.

Each subcommand module provides ``add_arguments(parser)`` and ``main(args) -> int``.
Only the module of the command being run is imported (the others bring pandas,
DuckDB or matplotlib), so ``knotledger show`` starts without them.
Exit codes (README.md, contract): 0 success, 1 checked and found false, 2 bad input
or usage.  Errors are one line on stderr, never a traceback.
"""

from __future__ import annotations

import argparse
import importlib
import sys

from .errors import KnotLedgerError

__all__ = ["main"]

#: subcommand -> (module, one-line help)
COMMANDS = {
    "show": ("pipeline.present.show", "every invariant of one diagram, with the colouring matrix"),
    "draw": ("pipeline.present.draw", "draw a diagram with arc labels and a witness colouring"),
    "run": ("pipeline.census.run", "run a census spec and write the Parquet tables"),
    "query": ("pipeline.explore.query", "read-only SQL over a census directory"),
    "check": ("pipeline.explore.claims", "test a claimed formula on every row of a census"),
    "fit": ("pipeline.explore.fit", "propose a closed formula in the family parameters"),
    "report": ("pipeline.present.report", "write report.md, report.html, explorer.html and plots for a census"),
}


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # one line, exit 2
        sys.stderr.write(f"{self.prog}: error: {message}\n")
        raise SystemExit(2)


def _command_of(argv: list[str]) -> str | None:
    """The subcommand named in ``argv``: its first word that is not an option."""
    return next((a for a in argv if not a.startswith("-")), None)


def build_parser(command: str | None = None) -> argparse.ArgumentParser:
    """The parser with every subcommand listed; only ``command``'s module is imported
    and its options registered (the one argparse will dispatch to)."""
    parser = _Parser(prog="knotledger",
                     description="Census tabulation and database builder for knots and links.")
    from . import __version__
    parser.add_argument("--version", action="version", version=f"knotledger {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    for name, (modname, help_text) in COMMANDS.items():
        p = sub.add_parser(name, help=help_text, description=help_text)
        if name == command:
            mod = importlib.import_module(modname)
            mod.add_arguments(p)
            p.set_defaults(_main=mod.main)
    return parser


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    parser = build_parser(_command_of(argv))
    args = parser.parse_args(argv)
    if not getattr(args, "command", None):
        parser.print_help(sys.stderr)
        return 2
    try:
        return int(args._main(args) or 0)
    except KnotLedgerError as err:
        sys.stderr.write(f"knotledger {args.command}: error: {err}\n")
        return 2
    except BrokenPipeError:
        return 0
    except OSError as err:  # a file system fault the command did not expect: one line
        where = f"{err.filename}: " if err.filename is not None else ""
        sys.stderr.write(f"knotledger {args.command}: error: {where}{err.strerror or err}\n")
        return 1
    except KeyboardInterrupt:
        sys.stderr.write("knotledger: interrupted\n")
        return 130


if __name__ == "__main__":  # pragma: no cover
    raise SystemExit(main())
