"""Checks: the rules that judge a line as built, in words, with the edit that carries out their advice.

Functions of a ``LineCase`` (the line's prepared and built parts, its assembly, its results at every
operating point and its rating) that return checks (``calc.model.result.check``). ``line_checks``
runs them all: the ratings stage judges each line with it, and the selection stage judges every
candidate assembly with the same function, so a candidate's verdict is the verdict its line gets
once the candidate is applied. Messages name parts by their place in the user's own list, counting
from 1, and fields by their labels; user text is quoted ‘like this’ and never converted.
"""
