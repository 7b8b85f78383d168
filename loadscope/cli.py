"""``loadscope`` on the command line.

    loadscope solve FILE [--format json|csv|table|html] [--units si|us] [--out PATH]
        (the loads of the drive, then the margins of every rated component
        per load case and over the duty cycle)
    loadscope demo [--write FILE]
    loadscope schema
    loadscope serve [--port N] [--snapshot FILE] [--no-browser] [--pool N] [--base-url /]

Bad input prints one clear message naming the field and exits with status 2;
it never prints a traceback.
"""

from __future__ import annotations

import argparse
import json
import sys
import warnings
from pathlib import Path

from . import CAUTION
from .errors import InputError

EXIT_INPUT = 2


def _parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(prog="loadscope", description="Every load in a gear drive. " + CAUTION)
    sub = p.add_subparsers(dest="command", required=True)
    s = sub.add_parser("solve", help="solve a drive snapshot and print its loads")
    s.add_argument("file", help="drive snapshot (JSON); '-' reads standard input")
    s.add_argument("--format", choices=("json", "csv", "table", "html"), default="table",
                   help="html: one self-contained design-load report (needs plotly)")
    s.add_argument("--units", choices=("si", "us"), default="si")
    s.add_argument("--out", help="write to this file instead of standard output")
    d = sub.add_parser("demo", help="solve the built-in demo drive, or write its snapshot")
    d.add_argument("--write", metavar="FILE", help="write the demo snapshot to FILE and stop")
    d.add_argument("--units", choices=("si", "us"), default="si")
    sub.add_parser("schema", help="print the JSON Schema of the drive snapshot")
    v = sub.add_parser("serve", help="serve the dashboards as web pages on 127.0.0.1 (Voila)")
    v.add_argument("--port", type=int, default=8866)
    v.add_argument("--snapshot", metavar="FILE", help="open the dashboards on this drive snapshot")
    v.add_argument("--no-browser", action="store_true", help="do not open a browser")
    v.add_argument("--pool", type=int, default=1, help="warm kernels kept ready per dashboard (0: none)")
    v.add_argument("--base-url", default="/", help="URL prefix, e.g. /loadscope/ behind a reverse proxy")
    return p


def _emit(text: str, out: str | None) -> None:
    if out:
        Path(out).write_text(text, encoding="utf-8")
        print(f"wrote {out}", file=sys.stderr)
    else:
        sys.stdout.write(text)


def _solve_and_format(drive, fmt: str, units: str) -> str:
    from . import report
    from .kernel.ratings import rate
    from .kernel.solve import solve

    result = solve(drive)
    ratings = rate(drive)
    if fmt == "html":
        from .report.html import to_html

        return to_html(result, units, ratings)
    if fmt == "json":
        doc = report.result_to_dict(result, units)
        doc["ratings"] = report.ratings_to_dict(ratings, units, loads=True)
        return json.dumps(doc, indent=2) + "\n"
    if fmt == "csv":
        return report.loads_and_margins_csv(result, ratings, units)
    return report.to_text(result, units) + "\n" + report.margins_text(ratings, units)


def main(argv: list[str] | None = None) -> int:
    """Run the command line; returns the exit status."""
    args = _parser().parse_args(argv)
    from . import spec

    try:
        if args.command == "schema":
            sys.stdout.write(json.dumps(spec.snapshot_schema(), indent=2) + "\n")
        elif args.command == "demo":
            if args.write:
                Path(args.write).write_text(spec.dump_snapshot(spec.demo_snapshot()) + "\n", encoding="utf-8")
                print(f"wrote {args.write}", file=sys.stderr)
            else:
                drive = spec.drive_from_snapshot(spec.demo_snapshot())
                sys.stdout.write(_solve_and_format(drive, "table", args.units))
        elif args.command == "serve":
            from .serving import serve

            serve(args.port, args.snapshot, not args.no_browser, args.pool, args.base_url)
        elif args.command == "solve":
            if args.file == "-":
                source: object = sys.stdin.read()
            else:
                path = Path(args.file)
                if not path.is_file():
                    raise InputError("FILE", f"no such file: {args.file}", "a readable snapshot file")
                source = path
            drive = spec.load_snapshot(source)  # type: ignore[arg-type]
            with warnings.catch_warnings():
                # a value that overflows or loses meaning in the solve stops it here, never a NaN in the output
                warnings.simplefilter("error", RuntimeWarning)
                text = _solve_and_format(drive, args.format, args.units)
            _emit(text, args.out)
    except InputError as exc:
        print(f"loadscope: input error: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except (ArithmeticError, RuntimeWarning, RecursionError) as exc:
        print(f"loadscope: input error: the solve ran out of the range of numbers ({exc}): some value of the "
              "drive is far from any real drive's scale (accepted: sizes, loads, speeds and moduli of a real "
              "drive)", file=sys.stderr)
        return EXIT_INPUT
    except ImportError as exc:  # an optional package a format needs (html: plotly)
        print(f"loadscope: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except OSError as exc:
        print(f"loadscope: {exc.strerror or exc}: {exc.filename or ''}".rstrip(": "), file=sys.stderr)
        return 1
    return 0


def entry() -> None:
    """Console-script entry point."""
    sys.exit(main())


if __name__ == "__main__":
    entry()
