"""The README's table of shop precision states the table the build sheet reads (site/static/js/precision.js).

Source: the project's rule that the sheet reads one declared table, stated in the README (issue 14).
"""
import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
UNIT = {"length_mm": ("mm", "in"), "length_m": ("m", "ft"), "pressure_bar": ("bar", "psi"), "angle_deg": ("°", "°"),
        "flow_lpm": ("L/min", "gpm"), "speed_rpm": ("rpm", "rpm")}
MODE = {"up": "up", "nearest": "nearest", "down": "down"}


def _declared():
    text = (ROOT / "site/static/js/precision.js").read_text(encoding="utf-8")
    rows = re.findall(r'label: "([^"]+)", kind: "(\w+)", metric: \{ (\w+): ([\d.]+) \}, us: \{ (\w+): ([\d.]+) \}, '
                      r'mode: "(\w+)"', text)
    out = {}
    for label, kind, mk, mv, uk, uv, mode in rows:
        m_unit, u_unit = UNIT[kind]
        metric = f"{mv} {m_unit}".replace(" °", "°")
        us = f"1/{uv} in" if uk == "fraction" else f"{uv} {u_unit}".replace(" °", "°")
        out[label] = (metric, us, mode)
    return out


def _readme():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    block = text.split("| Quantity | Metric | US | Rounding |", 1)[1].split("\n\n", 1)[0]
    out = {}
    for line in block.strip().splitlines()[1:]:
        q, metric, us, rounding = [c.strip() for c in line.strip("|").split("|")]
        out[q] = (metric, us, rounding.split()[0])
    return out


def test_readme_table_is_the_declared_table():
    declared = _declared()
    assert len(declared) == 11
    assert _readme() == declared
