"""Benchmark: CPython time of calc.evaluate for a 3-line x 12-part x 6-condition job.

Usage: python bench/engine_bench.py [--runs N] [--out bench/results/engine.json]

Writes the median, 95th percentile and minimum wall time of one evaluate call,
with the date, machine and Python version, to a JSON file. The job is invented
(benchmark data only). Not a test: figures are recorded, not asserted.
"""
from __future__ import annotations

import argparse
import json
import os
import platform
import statistics
import sys
import time
from datetime import datetime, timezone
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from calc.model.prepared import prepare  # noqa: E402
from calc.pipeline import evaluate  # noqa: E402
from calc.stages.assembly import assembly_stage  # noqa: E402
from calc.stages.circuit import circuit_stage  # noqa: E402
from calc.stages.lines import last_feed_line, lines_stage  # noqa: E402
from calc.stages.ports import ports_stage  # noqa: E402
from calc.stages.selection import selection_stage  # noqa: E402
from calc.stages.thermal import thermal_stage  # noqa: E402


def big_job() -> dict:
    """3 lines x 12 parts x 6 conditions (invented)."""
    def line(name, role, bore):
        parts = []
        for k in range(4):
            parts.append({"kind": "fitting", "bore_mm": bore * 0.65, "shape": "elbow-90" if k % 2 else "straight"})
            parts.append({"kind": "hose", "bore_mm": bore, "length_m": 0.4,
                          "bends": [{"angle_deg": 90, "radius_mm": 8 * bore}]})
            parts.append({"kind": "tube", "od_mm": bore + 1.8, "wall_mm": 0.89, "length_m": 0.3,
                          "bends": [{"angle_deg": 45, "radius_mm": 3 * bore}]})
        return {"name": name, "role": role, "parts": parts}
    return {
        "version": 1, "name": "benchmark: 3 lines x 12 parts x 6 conditions",
        "fluid": {"preset": "atf-typical"},
        "pump": {"displacement_cc_rev": 10.0, "pulley_ratio": 1.1, "volumetric_efficiency": 0.9,
                 "flow_limit_lpm": 8.0, "relief_bar": 90.0},
        "gear": {"neutral_drop_bar": 2.5, "at_flow_lpm": 8.0},
        "conditions": [
            {"name": "cold start", "engine_rpm": 900, "fluid_temp_c": -20, "duty_percent": 0},
            {"name": "cool idle", "engine_rpm": 750, "fluid_temp_c": 20, "duty_percent": 10},
            {"name": "hot idle", "engine_rpm": 750, "fluid_temp_c": 90, "duty_percent": 25},
            {"name": "town", "engine_rpm": 1800, "fluid_temp_c": 85, "duty_percent": 30},
            {"name": "highway", "engine_rpm": 2600, "fluid_temp_c": 80, "duty_percent": 30},
            {"name": "full lock", "engine_rpm": 750, "fluid_temp_c": 100, "full_lock": True, "duty_percent": 5},
        ],
        "lines": [line("pressure", "pressure", 9.5), line("return", "return", 9.5), line("feed", "feed", 12.7)],
    }


def main() -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--runs", type=int, default=300)
    ap.add_argument("--out", default=str(ROOT / "bench" / "results" / "engine.json"))
    args = ap.parse_args()
    job = big_job()
    res = evaluate(job)
    assert res["ok"], res.get("errors")
    for _ in range(20):
        evaluate(job)
    times = []
    for _ in range(args.runs):
        t0 = time.perf_counter()
        evaluate(job)
        times.append((time.perf_counter() - t0) * 1e3)
    times.sort()
    stages = {k: [] for k in ("prepare_ms", "ports_ms", "assembly_ms", "circuit_ms", "lines_ms", "selection_ms",
                              "thermal_ms")}
    for _ in range(max(args.runs // 3, 20)):
        t = [time.perf_counter()]
        prepared = prepare(job)[0]
        t.append(time.perf_counter())
        ports = ports_stage(prepared)
        t.append(time.perf_counter())
        assembly = assembly_stage(prepared, ports)
        t.append(time.perf_counter())
        circuit = circuit_stage(prepared, assembly)
        t.append(time.perf_counter())
        lines = lines_stage(prepared, ports, assembly, circuit)
        t.append(time.perf_counter())
        selection_stage(prepared, ports, circuit, last_feed_line(prepared))
        t.append(time.perf_counter())
        thermal_stage(prepared, circuit, lines.ratings)
        t.append(time.perf_counter())
        for k, a, b in zip(stages, t, t[1:]):
            stages[k].append((b - a) * 1e3)
    fig = {
        "benchmark": "calc.evaluate, 3 lines x 12 parts x 6 conditions, CPython",
        "date": datetime.now(timezone.utc).strftime("%Y-%m-%d"),
        "machine": f"{platform.machine()}, {os.cpu_count()} cores, {platform.system()}",
        "python": platform.python_version(),
        "runs": args.runs,
        "median_ms": round(statistics.median(times), 3),
        "p95_ms": round(times[int(0.95 * len(times)) - 1], 3),
        "min_ms": round(times[0], 3),
        "goal_ms": 5.0,
        "stage_median_ms": {k: round(statistics.median(v), 3) for k, v in stages.items()},
        "note": "prepare = validate and fill the part data; assembly = cut lengths and route bends; circuit = "
                "compile every line and solve every operating point; lines = ratings and every line check; "
                "selection = whole-assembly hose candidates over every tabulated class and size (each re-planned, "
                "re-solved where its hydraulics differ, and judged by the line checks); thermal = "
                "heat per point, the steady temperature iteration, full-lock warm-up and cooler sizing.",
    }
    Path(args.out).parent.mkdir(parents=True, exist_ok=True)
    Path(args.out).write_text(json.dumps(fig, indent=1) + "\n")
    print(json.dumps(fig, indent=1))
    return 0


if __name__ == "__main__":
    sys.exit(main())
