"""Command line: ``factsheet build``, ``check``, ``serve``, ``new`` and ``init``.

Problems in the input are printed one per line as ``FILE:LINE: key: message`` and the command
exits with status 1; a traceback is shown only with ``--debug``.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from factsheet import __version__
from factsheet.errors import FactsheetError, printable
from factsheet.resources import demo_dir

DEFAULT_OUT = Path("site")


def main(argv: list[str] | None = None) -> int:
    parser = make_parser()
    args = parser.parse_args(argv)
    try:
        return args.run(args)
    except FactsheetError as exc:
        if args.debug:
            raise
        _print_problems(exc)
        return 1
    except OSError as exc:  # a file-system fault no stage turned into a clearer error
        if args.debug:
            raise
        where = f"{exc.filename}: " if exc.filename else ""
        print(f"error: {printable(where)}{exc.strerror or exc}", file=sys.stderr)
        return 1
    except KeyboardInterrupt:
        print("interrupted; the earlier site is untouched", file=sys.stderr)
        return 130


def _print_problems(exc: FactsheetError) -> None:
    lines = [str(p) for p in exc.problems] or [str(exc)]
    for line in lines:
        print(f"error: {printable(line)}", file=sys.stderr)
    if len(lines) > 1:
        print(f"{len(lines)} problems found", file=sys.stderr)


def make_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="factsheet",
        description="Fact sheets for gravitational-wave merger detections, as a static website.",
    )
    parser.add_argument("--version", action="version", version=f"factsheet {__version__}")
    parser.add_argument("--debug", action="store_true", help="show tracebacks")
    sub = parser.add_subparsers(dest="command", required=True, metavar="COMMAND")

    b = sub.add_parser(
        "build",
        help="build the site (the packaged demo when no catalogue is given)",
        description="Check, derive and render a catalogue into a static site.",
    )
    _catalogue_arg(b)
    b.add_argument(
        "-o", "--out", type=Path, default=DEFAULT_OUT, help="output folder (default: site/)"
    )
    b.add_argument(
        "--audience",
        choices=("public", "internal"),
        default="public",
        help="public leaves out internal and embargoed items (default: public)",
    )
    b.add_argument(
        "-j",
        "--jobs",
        type=_positive,
        default=None,
        help="worker processes (default: the cores this process may run on)",
    )
    b.add_argument(
        "--force",
        action="store_true",
        help="replace the output folder even if factsheet did not make it",
    )
    _strict_arg(b)
    b.set_defaults(run=run_build)

    v = sub.add_parser(
        "serve",
        help="preview the site on 127.0.0.1, rebuilding on change",
        description="Build, serve on 127.0.0.1 and rebuild when the catalogue "
        "changes; the page reloads itself after each rebuild.",
    )
    _catalogue_arg(v)
    v.add_argument("-o", "--out", type=Path, default=DEFAULT_OUT, help="output folder")
    v.add_argument("-p", "--port", type=int, default=8000, help="port (default 8000; 0: any)")
    v.add_argument(
        "--audience",
        choices=("public", "internal"),
        default="internal",
        help="audience of the preview (default: internal, which shows internal notes and "
        "embargoed events; public previews the public site)",
    )
    v.set_defaults(run=run_serve)

    c = sub.add_parser(
        "check",
        help="validate a catalogue without building",
        description="Validate every file; exit 1 and list each problem if any.",
    )
    _catalogue_arg(c)
    _strict_arg(c)
    c.set_defaults(run=run_check)

    n = sub.add_parser(
        "new",
        help="write a commented event file to fill in",
        description="Write ID.yaml, a commented event file to fill in.",
    )
    n.add_argument("id", help="designation of the new event (letters, digits, . _ -)")
    n.add_argument("-d", "--dir", type=Path, default=Path("."), help="catalogue folder")
    n.set_defaults(run=run_new)

    i = sub.add_parser(
        "init",
        help="start a catalogue of your own in a new folder",
        description="Write a new catalogue folder that checks and builds as it is: "
        "catalogue.yaml with every setting commented, an example event and a README.",
    )
    i.add_argument("folder", type=Path, help="the new catalogue folder (must not exist yet)")
    i.set_defaults(run=run_init)
    return parser


def _strict_arg(parser: argparse.ArgumentParser) -> None:
    parser.add_argument(
        "--strict",
        action="store_true",
        help="treat warnings (valid but suspicious input) as errors",
    )


def _positive(text: str) -> int:
    value = int(text)
    if value < 1:
        raise argparse.ArgumentTypeError("must be at least 1")
    return value


def _catalogue_arg(parser: argparse.ArgumentParser) -> None:
    parser.add_argument(
        "catalogue",
        nargs="?",
        type=Path,
        help="catalogue folder (default: the packaged demo catalogue)",
    )


def run_build(args: argparse.Namespace) -> int:
    from factsheet.build import build

    if args.catalogue is None:
        print(DEMO_NOTE, file=sys.stderr)
    report = build(
        args.catalogue or demo_dir(),
        args.out,
        args.audience,
        args.force,
        jobs=args.jobs,
        progress=True,  # a line rewritten in place on a terminal, a line every few s in a log
        strict=args.strict,
    )
    _print_skipped(report.skipped)
    _print_warnings(report.warnings)
    print(summary_line(report))
    return 0


def counted(number: int, noun: str) -> str:
    """``1 event``, ``2 events``: a count with its noun in the right number."""
    return f"{number} {noun}{'' if number == 1 else 's'}"


def summary_line(report) -> str:
    """One line: events built and reused, what was withheld, where and how long."""
    line = (
        f"built {counted(report.built, 'fact sheet')} ({report.built - report.reused} derived, "
        f"{report.reused} reused) into {report.out}/ in {report.seconds:.1f} s"
    )
    if report.withheld_internal or report.withheld_embargo:
        line += (
            f"; withheld {report.withheld_internal} internal and "
            f"{report.withheld_embargo} embargoed"
        )
    return line


def run_serve(args: argparse.Namespace) -> int:
    from factsheet.serve import serve

    if args.catalogue is None:
        print(DEMO_NOTE, file=sys.stderr)
    serve(args.catalogue or demo_dir(), args.out, args.port, args.audience)
    return 0


def run_check(args: argparse.Namespace) -> int:
    from factsheet.load import load_catalogue

    catalogue = load_catalogue(args.catalogue or demo_dir())
    _print_skipped(catalogue.skipped)
    _print_warnings(catalogue.warnings)
    if args.strict and catalogue.warnings:
        print(f"{len(catalogue.warnings)} warnings, fatal with --strict", file=sys.stderr)
        return 1
    warnings = len(catalogue.warnings)
    found = counted(warnings, "warning") if warnings else "no problems found"
    print(f"{catalogue.root}: {counted(len(catalogue.events), 'event')}, {found}")
    return 0


def _print_skipped(skipped) -> None:
    """The files and folders of the catalogue folder that were not read, and why."""
    for path, reason in skipped:
        print(f"skipped: {printable(str(path))}: {printable(reason)}", file=sys.stderr)


def _print_warnings(warnings) -> None:
    for problem in warnings:
        print(f"warning: {printable(str(problem))}", file=sys.stderr)


def run_init(args: argparse.Namespace) -> int:
    from factsheet.load.scaffold import init_catalogue

    for path in init_catalogue(args.folder):
        print(f"wrote {path}")
    print(
        f"next: edit {args.folder}/example-001.yaml, then `factsheet check {args.folder}` and "
        f"`factsheet build {args.folder} -o site`"
    )
    return 0


DEMO_NOTE = (
    "note: no catalogue given, so this is the packaged demo (invented events, a read-only copy "
    "inside the installed package); `factsheet init my-catalogue` starts one of your own"
)


def run_new(args: argparse.Namespace) -> int:
    from factsheet.load.scaffold import write_new_event

    path = write_new_event(args.id, args.dir)
    print(f"wrote {path}: fill in the values, then run `factsheet check {args.dir}`")
    return 0


if __name__ == "__main__":
    sys.exit(main())
