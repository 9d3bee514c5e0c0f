"""Words for people: no sentence of any result shows a field key or a path, and parts count from 1.

Source: the project's message rules (DEVELOPERS.md): messages name parts by their place in the user's own
list counting from 1, fields by their labels, and quote the user's own text.
"""
import copy
import json
import re

import pytest

from calc import evaluate
from calc.model.result import field_at

from ..jobs import demo_paths
from ..model.test_result import _variants
from .test_fixes import _many_fixes_job

KEY = re.compile(r"\b[a-z0-9]+_[a-z0-9_]+\b")   # a snake_case field key
PATH = re.compile(r"\w+\[\d+\]")                 # a field path


def _sentences(obj, path="", out=None):
    out = [] if out is None else out
    decl = field_at(path) if path else None
    if decl is not None and decl.kind == "sentence" and isinstance(obj, str):
        out.append((path, obj))
    elif decl is not None and decl.kind == "value":
        pass
    elif isinstance(obj, dict):
        for k, v in obj.items():
            _sentences(v, f"{path}.{k}" if path else k, out)
    elif isinstance(obj, list):
        for v in obj:
            if isinstance(v, dict):
                for k, x in v.items():
                    _sentences(x, f"{path}[].{k}", out)
            else:
                _sentences(v, f"{path}[]", out)
    return out


JOBS = [json.loads(p.read_text(encoding="utf-8")) for p in demo_paths()] + _variants()[3:] + [_many_fixes_job()]
SENTENCES = [s for job in JOBS for s in _sentences(evaluate(copy.deepcopy(job)))]


def test_there_are_sentences_to_read():
    assert len(SENTENCES) > 300


@pytest.mark.parametrize("pattern", [KEY, PATH], ids=["snake_case key", "field path"])
def test_no_sentence_shows_a_key_or_a_path(pattern):
    bad = sorted({(p, m.group(0)) for p, s in SENTENCES for m in pattern.finditer(s)})
    assert bad == []


def test_parts_count_from_1_and_adapters_are_never_numbered():
    for _, s in SENTENCES:
        assert not re.search(r"\bpart 0\b|\bbend 0\b|\bpoint 0\b|\bline 0\b", s), s
        assert not re.search(r"adapter \d", s), s
