"""System: the circuit as a system of parts, built from the prepared job.

Functions and read-only objects over the prepared job, no checks and no advice (those are
the stages'): ``line`` (a line compiled to SI segments, its pressure drop at one flow),
``circuit`` (the operating point of the whole circuit), ``thermal_model`` (heat generated
and rejected at a trial temperature), ``rating`` (the rating of each part), ``threads``
(thread identification) and ``adapters`` (adapter plans between a port and a line end).
"""
