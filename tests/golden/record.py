"""Record (or check) the golden outputs of every demo job.

    python tests/golden/record.py          write the golden files
    python tests/golden/record.py --check  compare, print the first difference per file

For each demo job in calc/data/demos/ the golden files are what the command line prints
(``python -m calc evaluate DEMO --json``, the text report in metric and in US units) and the
API's answer with US units (the JSON text ``calc.api.handle`` returns). ``tests/test_golden.py``
compares the engine with them byte for byte, so a change of behaviour shows as a diff to review.
A deliberate change re-records them with this script, and the commit says why.
"""
from __future__ import annotations

import contextlib
import io
import json
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
GOLDEN = Path(__file__).resolve().parent
DEMOS = ROOT / "calc" / "data" / "demos"


def outputs(demo: Path) -> dict[str, str]:
    """The golden outputs of one demo job, by file name."""
    from calc.edges.api import handle
    from calc.edges.cli import main

    def cli(*args: str) -> str:
        buf = io.StringIO()
        with contextlib.redirect_stdout(buf):
            status = main(["evaluate", str(demo), *args])
        if status != 0:
            raise RuntimeError(f"{demo.name}: the command line exited with {status}")
        return buf.getvalue()

    job = json.loads(demo.read_text(encoding="utf-8"))
    stem = demo.stem
    return {
        f"{stem}.result.json": cli("--json"),
        f"{stem}.report.txt": cli(),
        f"{stem}.report-us.txt": cli("--units", "us"),
        f"{stem}.api-us.json": handle(json.dumps({"op": "evaluate", "job": job, "units": "us"})) + "\n",
        f"{stem}.sweep.json": handle(json.dumps({"op": "sweep", "job": job})) + "\n",
    }


#: Thread readings for the thread operation's golden answers: (major_mm, pitch_mm, male, tapered).
THREAD_READINGS = [(14.2, 25.4 / 18, True, None), (13.95, 1.5, True, None), (11.5, 1.5, True, None),
                   (16.0, 1.5, False, None), (13.2, 25.4 / 18, True, True), (19.8, 25.4 / 14, False, False)]


def other_outputs() -> dict[str, str]:
    """The job model and the thread operation, which the restructure must keep as they are."""
    from calc.edges.api import handle
    threads = [json.loads(handle(json.dumps({"op": "thread", "args": {"major_mm": d, "pitch_mm": p, "male": m,
                                                                       "tapered": t}})))
               for d, p, m, t in THREAD_READINGS]
    return {"describe.json": handle(json.dumps({"op": "describe"})) + "\n",
            "threads.json": json.dumps(threads, indent=1) + "\n"}


def all_outputs() -> dict[str, str]:
    out: dict[str, str] = {}
    for demo in sorted(DEMOS.glob("*.json")):
        out.update(outputs(demo))
    out.update(other_outputs())
    return out


def main(argv: list[str]) -> int:
    sys.path.insert(0, str(ROOT))
    got = all_outputs()
    if "--check" in argv:
        bad = 0
        for name, text in got.items():
            want = (GOLDEN / name).read_text(encoding="utf-8") if (GOLDEN / name).exists() else None
            if want != text:
                bad += 1
                a, b = (want or "").splitlines(), text.splitlines()
                first = next((i for i, (x, y) in enumerate(zip(a, b)) if x != y), min(len(a), len(b)))
                print(f"{name}: differs at line {first + 1}")
                print(f"  golden: {a[first] if first < len(a) else '(end)'}"[:300])
                print(f"  now:    {b[first] if first < len(b) else '(end)'}"[:300])
        print(f"{bad} of {len(got)} files differ")
        return 1 if bad else 0
    for name, text in got.items():
        (GOLDEN / name).write_text(text, encoding="utf-8", newline="\n")
    print(f"wrote {len(got)} golden files to {GOLDEN.relative_to(ROOT)}")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
