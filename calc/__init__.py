"""Linesmith engine: hose, fitting and line calculations for hydraulic power-steering circuits.

``evaluate(job)`` is the entry point (JSON-shaped dict in, JSON-shaped dict out).
The modules, one per concern:

- ``calc.schema`` / ``calc.model``: the job model, declared once, and its validation;
- ``calc.fluid``: viscosity (ASTM D341), density, presets;
- ``calc.pump``: delivered flow with the flow-control cap;
- ``calc.hydraulics``: velocity, Reynolds number and pressure drop of parts (fluids);
- ``calc.engine``: the circuit at every operating point, the stages and the checks;
- ``calc.ratings`` / ``calc.routing``: part ratings, weakest part, hose selection, route geometry;
- ``calc.thermal``: heat load and rejection (ht), steady temperature, full-lock warm-up, cooler sizing;
- ``calc.threads``: thread tables, identification and adapter plans;
- ``calc.units``: display units, used only at the edges;
- ``calc.report``: the readable text report and the cautions;
- ``calc.api``: the JSON-string entry point the browser worker calls;
- ``calc.cli``: the command line (``python -m calc``).
"""
from .engine import evaluate

__all__ = ["evaluate"]
__version__ = "0.1.0"
