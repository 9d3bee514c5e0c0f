"""Linesmith engine: hose, fitting and line calculations for hydraulic power-steering circuits.

``calc.evaluate(job)`` is the entry point (JSON-shaped dict in, JSON-shaped dict out, no I/O).
The layers, each importing only the ones above it in this list:

- ``calc.physics``: pure functions on numbers (fluid properties, pump delivery, friction, minor
  losses, convection and heat, lumped balances, wall strength, route geometry, thread form);
- ``calc.data``: the part tables with their provenance, and the practice constants;
- ``calc.model``: the job declaration, the result declaration and the prepared (read-only) job;
- ``calc.system``: the circuit as a system of parts: compiled lines, operating points, the
  thermal model, part ratings, thread identification, adapter plans, the assembly's cut length
  and bends, and a hose re-sized with its ends;
- ``calc.checks``: the rules that judge a line as built, in words, with the edit that carries out
  their advice; the same for a line and for a candidate assembly;
- ``calc.stages``: ports, assembly, circuit, lines, selection and thermal; each returns its own
  section of the result;
- ``calc.pipeline``: ``evaluate`` and ``sweep``, which run the stages in order;
- ``calc.edges``: the API the browser worker calls, the one reader of job files, the command line,
  the text report, units.
"""
__all__ = ["evaluate"]
__version__ = "0.1.0"


def __getattr__(name):
    # evaluate is imported on first use: `python -m calc describe` and the thread command do
    # not need the engine's physics libraries.
    if name == "evaluate":
        from .pipeline import evaluate
        return evaluate
    raise AttributeError(f"module 'calc' has no attribute {name!r}")
