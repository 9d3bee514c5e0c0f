"""Long fuzz run: 50,000 seeded mutations of the demo jobs through the engine's JSON API.

Usage: python bench/fuzz_long.py [--jobs N] [--seed S] [--out bench/results/fuzz.json]

The mutation fuzzer of the test suite (tests/fuzzing.py: hostile values, integers beyond float range,
nested lists of numbers, booleans and decimal commas for numbers, lone surrogates, numbers at and past
their limits, keys dropped, nulled or added), run far longer than the test's 2,000 jobs. Every job is
sent as the page sends it (evaluate, open with the file's bytes, sweep, drop_curve); a failure is any
exception, any internal-error reply, a refusal without field-named errors, a non-finite figure or a
text report that does not encode. Writes the figures (jobs tried, valid, refused, errors by kind,
failures with their jobs) to a JSON file; exits 1 if anything failed. Not a test: the suite runs the
short version.
"""
from __future__ import annotations

import argparse
import json
import os
import platform
import sys
import time
from datetime import datetime, timezone
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from tests.fuzzing import run  # noqa: E402


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--jobs", type=int, default=50_000)
    ap.add_argument("--seed", type=int, default=20261202)
    ap.add_argument("--out", type=Path, default=ROOT / "bench" / "results" / "fuzz.json")
    args = ap.parse_args(argv)
    started = time.perf_counter()
    tally = run(args.jobs, args.seed, keep_going=True)
    seconds = time.perf_counter() - started
    non_finite = sum(1 for f in tally.failures if "non-finite" in f["error"])
    record = {
        "benchmark": "mutation fuzzer over the demo jobs (tests/fuzzing.py) through calc.edges.api.handle",
        "date": datetime.now(timezone.utc).strftime("%Y-%m-%d"),
        "machine": f"{platform.machine()}, {os.cpu_count()} cores, {platform.system()}",
        "python": platform.python_version(),
        "seed": args.seed,
        "jobs_tried": tally.tried,
        "valid": tally.valid,
        "refused": tally.refused,
        "finite_results_checked": tally.finite_checked,
        "exceptions": len(tally.failures) - non_finite,
        "non_finite_results": non_finite,
        "errors_by_kind": dict(tally.error_kinds.most_common()),
        "jobs_by_operation": dict(tally.by_op.most_common()),
        "mutations_applied": dict(tally.by_mutation.most_common()),
        "seconds": round(seconds, 1),
        "failures": tally.failures[:50],
    }
    args.out.write_text(json.dumps(record, indent=1) + "\n", encoding="utf-8")
    print(f"{tally.tried} jobs in {seconds:.0f} s: {tally.valid} valid, {tally.refused} refused, "
          f"{len(tally.failures)} failures; figures in {args.out}")
    return 1 if tally.failures else 0


if __name__ == "__main__":
    sys.exit(main())
