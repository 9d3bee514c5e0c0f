"""Command line: ``python -m calc evaluate JOB.json [--json]`` and friends.

Exit status: 0 on success, 2 for an invalid job or bad arguments (one line per
problem, naming the field by its path), 1 when a file cannot be read.
"""
from __future__ import annotations

import argparse
import json
import sys

__all__ = ["main"]


def _cmd_evaluate(args) -> int:
    from .engine import evaluate
    from .report import text_report
    try:
        with open(args.job, encoding="utf-8") as fh:
            job = json.load(fh)
    except OSError as exc:
        print(f"{args.job}: cannot read the file ({exc.strerror})", file=sys.stderr)
        return 1
    except (ValueError, RecursionError) as exc:
        print(f"{args.job}: not a valid JSON job file ({exc})", file=sys.stderr)
        return 2
    res = evaluate(job)
    if not res["ok"]:
        for e in res["errors"]:
            print(f"{e['path'] or 'job'}: {e['message']}", file=sys.stderr)
        return 2
    if args.json:
        from .api import dumps
        sys.stdout.write(dumps(res, indent=1))
        print()
    else:
        print(text_report(res, units=args.units))
    return 0


def _cmd_describe(args) -> int:
    from .model import describe_job
    if args.markdown:
        print(model_markdown(describe_job()))
    else:
        json.dump(describe_job(), sys.stdout, indent=1)
        print()
    return 0


def model_markdown(model: dict) -> str:
    """The job model as a Markdown field reference (read from the one declaration)."""
    from .units import label
    rows = ["| path | label | unit | default | limits | help |", "|---|---|---|---|---|---|"]

    def limits(f):
        parts = [f"> {f['gt']:g}" if "gt" in f else "", f">= {f['ge']:g}" if "ge" in f else "",
                 f"< {f['lt']:g}" if "lt" in f else "", f"<= {f['le']:g}" if "le" in f else ""]
        if f.get("choices"):
            parts.append(" / ".join(f"`{c}`" for c in f["choices"]))
        return ", ".join(p for p in parts if p)

    def walk(node, path):
        kind = node["kind"]
        if kind == "record":
            for f in node["fields"]:
                walk(f, f"{path}.{f['key']}" if path else f["key"])
        elif kind == "list":
            walk(node["item"], f"{path}[]")
        elif kind == "variants":
            for tag, rec in node["variants"].items():
                rows.append(f"| {path} ({node['tag']} = `{tag}`) | {rec['label']} | | | | |")
                walk(rec, path)
        else:
            default = "required" if node["required"] else ("" if node["default"] is None else
                                                           f"`{json.dumps(node['default'])}`")
            rows.append(f"| `{path}` | {node['label']} | {label(node['unit']) if node['unit'] else ''} | "
                        f"{default} | {limits(node)} | {node['help']} |")
    walk(model["job"], "")
    return "\n".join(rows)


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    if argv and argv[0] == "thread":
        from .threads import main_thread
        return main_thread(argv[1:])
    ap = argparse.ArgumentParser(prog="python -m calc", description="Linesmith: power-steering line calculator")
    sub = ap.add_subparsers(dest="cmd", required=True)
    ev = sub.add_parser("evaluate", help="evaluate a job file and print the report")
    ev.add_argument("job", help="job file (.json)")
    ev.add_argument("--json", action="store_true", help="print the result as JSON")
    ev.add_argument("--units", choices=("metric", "us"), default="metric", help="units of the text report")
    ev.set_defaults(func=_cmd_evaluate)
    de = sub.add_parser("describe", help="print the job model (every field with unit, default, limits)")
    de.add_argument("--markdown", action="store_true", help="print a Markdown field reference")
    de.set_defaults(func=_cmd_describe)
    sub.add_parser("thread", help="identify a thread: thread MAJOR PITCH [--male|--female] [--tapered] [--json]")
    try:
        args = ap.parse_args(argv)
    except SystemExit as exc:
        return int(exc.code or 0)
    return args.func(args)
