"""Stages: each reads the prepared job (and the sections of the stages before it) and returns its
own section of the result, with its checks in words. No stage edits what it was given, and no
stage imports another stage.

Order (``calc.pipeline.run``): ``ports`` (adapter plans; the adapters become parts of the
lines), ``circuit`` (every operating point; hydraulic checks), ``ratings`` (part and assembly
ratings; rating checks), ``selection`` (hose candidates) and ``thermal`` (heat, steady
temperature, full-lock hold, cooler advice).
"""
