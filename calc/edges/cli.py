"""Command line: ``python -m calc evaluate JOB.json [--json]`` and friends.

Exit status: 0 on success, 2 for an invalid job or bad arguments (one line per
problem, naming the field by its path), 1 when a file cannot be read.
"""
from __future__ import annotations

import argparse
import codecs
import json
import sys

from ..model.job import describe_job
from ..model.result import describe_result
from ..system.threads import SEAT_KEYS, BadReading, identify, parse_length, parse_pitch
from .jobfile import MAX_JOB_FILE_BYTES
from .units import label

__all__ = ["main", "model_markdown", "result_markdown", "main_thread", "OUTPUT_ERRORS", "plain_output"]

#: Plain ASCII for the unit signs a terminal's encoding may lack: "°C" is written "deg C"; the quotes around the
#: user's own words (‘cold start’) become plain ones.
_ASCII = {"°": "deg ", "³": "3", "²": "2", "·": " ", "µ": "u", "–": "-", "—": "-", "…": "...", "×": "x",
          "±": "+/-", "≤": "<=", "≥": ">=", "\u2009": " ", "\u00a0": " ", "‘": "'", "’": "'"}
#: The codec error handler of the command line's output (registered below).
OUTPUT_ERRORS = "linesmith-plain"


def plain_output(error: UnicodeEncodeError):
    """Codec error handler: a unit sign the output's encoding lacks in plain ASCII, anything else
    (a name's letters, a lone surrogate) as a backslash escape, so nothing typed is lost.

    Examples
    --------
    >>> "20 °C, 1.5 cm³, 'Müller', '\\ud800'".encode("ascii", OUTPUT_ERRORS).decode("ascii")
    "20 deg C, 1.5 cm3, 'M\\\\xfcller', '\\\\ud800'"
    """
    ch = error.object[error.start]
    plain = _ASCII.get(ch)
    if plain is None:
        plain = ch.encode("ascii", "backslashreplace").decode("ascii")
    return plain, error.start + 1


codecs.register_error(OUTPUT_ERRORS, plain_output)


def _plain_streams() -> None:
    """Make stdout and stderr write what their encoding lacks with :func:`plain_output`."""
    for stream in (sys.stdout, sys.stderr):
        try:
            stream.reconfigure(errors=OUTPUT_ERRORS)
        except (AttributeError, ValueError, OSError):  # not a text file of io (a test's capture)
            pass


def _cmd_evaluate(args) -> int:
    from ..pipeline import evaluate  # the engine's libraries load only for this command
    from .jobfile import read_job_bytes
    from .report import text_report
    try:
        with open(args.job, "rb") as fh:
            data = fh.read(MAX_JOB_FILE_BYTES + 1)
    except OSError as exc:
        print(f"{args.job}: cannot read the file ({exc.strerror})", file=sys.stderr)
        return 1
    job, errors = read_job_bytes(data)
    if errors:
        for e in errors:
            print(f"{args.job}: {e['message']}", file=sys.stderr)
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
    if args.result:
        if args.markdown:
            print(result_markdown(describe_result()))
        else:
            json.dump(describe_result(), sys.stdout, indent=1)
            print()
        return 0
    if args.markdown:
        print(model_markdown(describe_job()))
    else:
        json.dump(describe_job(), sys.stdout, indent=1)
        print()
    return 0


def result_markdown(rows: list) -> str:
    """The result declaration as a Markdown reference (read from the one declaration).

    Examples
    --------
    >>> result_markdown([{"path": "ok", "kind": "flag", "unit": None, "nullable": False, "label": "Computed",
    ...                   "help": ""}]).splitlines()[-1]
    '| `ok` | Computed | flag |  |  |  |'
    """
    out = ["| path | label | kind | unit | can be null | help |", "|---|---|---|---|---|---|"]
    for r in rows:
        unit = label(r["unit"]) if r["unit"] and r["kind"] == "number" else ""
        out.append(f"| `{r['path']}` | {r['label']} | {r['kind']} | {unit} | {'yes' if r['nullable'] else ''} | "
                   f"{r['help']} |")
    return "\n".join(out)


def model_markdown(model: dict) -> str:
    """The job model as a Markdown field reference (read from the one declaration)."""
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
            for j, c in enumerate(node.get("columns", ())):  # a table's columns: one row each, as [row][column]
                rows.append(f"| `{path}[][{j}]` | {c['label']} | {label(c['unit']) if c['unit'] else ''} | | "
                            f"{limits(c)} | Column {j + 1} of each row. |")
    walk(model["job"], "")
    return "\n".join(rows)


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    _plain_streams()
    if argv and argv[0] == "thread":
        return main_thread(argv[1:])
    ap = argparse.ArgumentParser(prog="python -m calc", description="Linesmith: power-steering line calculator")
    sub = ap.add_subparsers(dest="cmd", required=True)
    ev = sub.add_parser("evaluate", help="evaluate a job file and print the report")
    ev.add_argument("job", help="job file (.json)")
    ev.add_argument("--json", action="store_true", help="print the result as JSON")
    ev.add_argument("--units", choices=("metric", "us"), default="metric", help="units of the text report")
    ev.set_defaults(func=_cmd_evaluate)
    de = sub.add_parser("describe", help="print the job model (every field with unit, default, limits), "
                                         "or with --result the result declaration")
    de.add_argument("--markdown", action="store_true", help="print a Markdown field reference")
    de.add_argument("--json", action="store_true", help="print JSON (the default)")
    de.add_argument("--result", action="store_true", help="describe the result instead of the job")
    de.set_defaults(func=_cmd_describe)
    sub.add_parser("thread", help="identify a thread: thread MAJOR PITCH [--male|--female] [--tapered] [--json]")
    try:
        args = ap.parse_args(argv)
    except SystemExit as exc:
        return int(exc.code or 0)
    return args.func(args)


# -- command line -------------------------------------------------------------
class _Parser(argparse.ArgumentParser):
    def error(self, message):  # one line, no usage dump
        raise BadReading(message)


def main_thread(argv: list[str]) -> int:
    """``python -m calc thread MAJOR PITCH [--male|--female] [--tapered|--straight] [--seat SEAT] [--json]``.

    MAJOR is a caliper reading with its unit (``15.9mm``, ``0.625in``,
    ``5/8in``); for a female thread it is the minor diameter across the crests.
    PITCH is ``18tpi`` or ``1.5mm``. ``--json`` prints the candidate list, best
    first. Returns the exit status: 0 when something fits, 1 when nothing fits,
    2 for bad input (one line on stderr naming the argument).

    Examples
    --------
    >>> main_thread(["15.8mm", "18tpi", "--json"]) == 0   # doctest: +ELLIPSIS
    [...
    True
    """
    p = _Parser(prog="python -m calc thread", description="Identify a thread from a caliper and a pitch gauge.")
    p.add_argument("major", metavar="MAJOR", help="caliper reading, e.g. 15.9mm or 0.625in")
    p.add_argument("pitch", metavar="PITCH", help="pitch, e.g. 18tpi or 1.5mm")
    g = p.add_mutually_exclusive_group()
    g.add_argument("--male", dest="male", action="store_true", default=True)
    g.add_argument("--female", dest="male", action="store_false")
    t = p.add_mutually_exclusive_group()
    t.add_argument("--tapered", dest="tapered", action="store_const", const=True, default=None)
    t.add_argument("--straight", dest="tapered", action="store_const", const=False)
    p.add_argument("--seat", choices=SEAT_KEYS, default=None,
                   help="the seat or sealing face seen at the port; threads with no end of that seat do not match")
    p.add_argument("--json", action="store_true")
    try:
        args = p.parse_args(argv)
    except BadReading as exc:
        print(f"thread: {exc}", file=sys.stderr)
        return 2
    except SystemExit as exc:  # --help
        return int(exc.code or 0)
    try:
        major = parse_length(args.major)
    except BadReading as exc:
        print(f"thread: MAJOR: {exc}", file=sys.stderr)
        return 2
    try:
        pitch = parse_pitch(args.pitch)
    except BadReading as exc:
        print(f"thread: PITCH: {exc}", file=sys.stderr)
        return 2
    try:
        r = identify(major, pitch, male=args.male, tapered=args.tapered, seat=args.seat)
    except BadReading as exc:
        name = "MAJOR" if str(exc).startswith("major") else "PITCH"
        print(f"thread: {name}: {exc}", file=sys.stderr)
        return 2
    if args.json:
        print(json.dumps(r["candidates"], indent=1))
        return 0 if r["match"] == "good" else 1
    tol = r["tolerance"]
    side = "male" if args.male else "female"
    print(f"Reading: {major:.3f} mm ({major / 25.4:.4f} in), pitch {pitch:.4f} mm ({25.4 / pitch:.2f} tpi), {side}"
          + ("" if args.tapered is None else (", tapered" if args.tapered else ", straight")))
    print(f"Measured as: {tol['measured']}")
    u, o = (("male_under_mm", "male_over_mm") if args.male else ("female_under_mm", "female_over_mm"))
    print(f"Tolerance: diameter -{tol[u]:.2f}/+{tol[o]:.2f} mm (tapered: widened by gauge length/16), "
          f"pitch +/-{tol['pitch_percent']:g} % ({tol['source']})")
    print()
    print(f"{'thread':<14} {'fits':<5} {'diam mm':>8} {'pitch %':>8}  seals / used by")
    for c in r["candidates"]:
        print(f"{c['thread']:<14} {'yes' if c['within'] else 'no':<5} {c['fit_error_mm']:>+8.2f} "
              f"{c['pitch_error_percent']:>+8.1f}  {', '.join(c['seals']) or '-'}")
        if c["ends"]:
            print(f"{'':<38}{'; '.join(c['ends'])}")
    print()
    print(r["message"])
    print("Dimensions are recalled from the named standards: confirm against the standard or the maker's data.")
    return 0 if r["match"] == "good" else 1
