"""The page: index.html rendered with jinja2 from site/templates/ and the engine's job model.

``engine_page_model`` is the one place the build reads the engine; everything the
page needs from calc (the job model, the result declaration, the unit table, the cautions)
comes through it.
"""

from __future__ import annotations

import json
from pathlib import Path

from .common import CONTENT_SECURITY_POLICY, DEMO_DIR, SITE_DIR
from .fetch import PYODIDE_VERSION


def engine_page_model() -> dict:
    """The engine's job model, result declaration, unit table, cautions, job-file size limit and the thread
    operation's arguments (labels and seat answers), for the form and the page's script."""
    from calc.edges.jobfile import MAX_JOB_FILE_BYTES
    from calc.edges.report import CAUTIONS
    from calc.edges.units import UNITS
    from calc.model.job import describe_job
    from calc.model.result import describe_result
    from calc.data.tables import starting_job
    from calc.edges.api import SEAT_LABELS, THREAD_ARGS

    return {"model": describe_job(), "result_model": describe_result(),
            "units": {k: list(v) for k, v in UNITS.items()}, "cautions": list(CAUTIONS),
            "limits": {"job_file_max_bytes": MAX_JOB_FILE_BYTES}, "new_job": starting_job(),
            "thread_args": {**THREAD_ARGS.describe(), "seat_labels": SEAT_LABELS}}


def load_demos() -> list[dict]:
    """Return the demo jobs in calc/data/demos/, sorted by file name."""
    demos = []
    for path in sorted(DEMO_DIR.glob("*.json")):
        with open(path, encoding="utf-8") as f:
            job = json.load(f)
        demos.append({"file": path.name, "job": job})
    return demos


def render_page(out_dir: Path, demos: list[dict], wheels: list[str], bytecode: str | None = None,
                snapshot: dict | None = None) -> None:
    """Write out_dir/index.html; wheels are file names in wheels/ (ours first), bytecode the zip's.

    snapshot: the engine snapshot's config from sitebuild.snapshot.add_snapshot, or None.
    """
    import jinja2  # build-time only

    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(SITE_DIR / "templates"),
        autoescape=True,
        undefined=jinja2.StrictUndefined,
        keep_trailing_newline=True,
    )
    config = {"pyodide": "./pyodide/", "wheels": [f"./wheels/{w}" for w in wheels]}
    if bytecode:
        config["bytecode"] = f"./wheels/{bytecode}"  # passed on to worker.js by the page's init message
    if snapshot:
        config["snapshot"] = snapshot  # worker.js restores it; start.js limits how long that may take
    html = env.get_template("index.html.j2").render(
        csp=CONTENT_SECURITY_POLICY,
        config=config,
        demos=demos,
        first_demo=demos[0]["job"] if demos else None,
        pyodide_version=PYODIDE_VERSION,
        **engine_page_model(),
    )
    (out_dir / "index.html").write_text(html, encoding="utf-8")
