"""Edges: where the engine meets the world. Nothing here knows physics.

``api`` (the JSON-string entry point the browser worker calls), ``jobfile`` (the one reader of job
files: command line, API and page), ``cli`` (``python -m calc``),
``report`` (the readable text report and the cautions) and ``units`` (display units, the only
place that converts).
"""
