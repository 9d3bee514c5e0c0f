"""Linesmith engine: hose, fitting and line calculations for hydraulic power-steering circuits.

``evaluate(job)`` is the entry point (JSON-shaped dict in, JSON-shaped dict out).
The modules, one per concern:

- ``calc.model`` / ``calc.schema``: the job model and its validation;
- ``calc.fluid``: viscosity (ASTM D341), density, presets;
- ``calc.pump``: delivered flow;
- ``calc.hydraulics``: velocity, Reynolds number and pressure drop of parts;
- ``calc.engine``: the circuit at every operating point and the checks;
- ``calc.report``: the readable text report;
- ``calc.api``: the JSON-string entry point the browser worker calls;
- ``calc.cli``: the command line (``python -m calc``).
"""
from .engine import evaluate

__all__ = ["evaluate"]
__version__ = "0.1.0"
