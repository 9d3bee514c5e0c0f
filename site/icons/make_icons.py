"""Draw Linesmith's app icons (our own design: a bent line between two end fittings).

    python site/icons/make_icons.py

Writes icon.svg, icon-192.png and icon-512.png beside this script with the standard
library only (a small scanline rasteriser and zlib). The outputs are committed; build.py
copies them into dist/icons/. Run again only when the design changes.
"""
from __future__ import annotations

import struct
import zlib
from pathlib import Path

HERE = Path(__file__).resolve().parent
BACKGROUND = (0x00, 0x3F, 0x8A)   # the page's accent blue
INK = (0xFF, 0xFF, 0xFF)
# Design in a 0..100 box; the drawing stays inside the central 70 % (safe zone of a maskable icon).
CURVE = ((20, 66), (40, 66), (40, 34), (50, 34), (60, 34), (60, 66), (80, 66))
STROKE = 9.0
FITTINGS = ((20, 66), (80, 66))
FITTING_R = 8.0


def _bezier_points(steps: int = 600):
    """Points along the two cubic segments of CURVE (a smooth S between the fittings)."""
    pts = []
    for seg in (CURVE[0:4], CURVE[3:7]):
        (x0, y0), (x1, y1), (x2, y2), (x3, y3) = seg
        for i in range(steps + 1):
            t = i / steps
            a, b, c, d = (1 - t) ** 3, 3 * t * (1 - t) ** 2, 3 * t * t * (1 - t), t ** 3
            pts.append((a * x0 + b * x1 + c * x2 + d * x3, a * y0 + b * y1 + c * y2 + d * y3))
    return pts


def _raster(size: int, oversample: int = 4) -> bytes:
    n = size * oversample
    scale = n / 100.0
    mask = bytearray(n * n)

    def disc(cx, cy, r):
        cx, cy, r = cx * scale, cy * scale, r * scale
        for row in range(max(0, int(cy - r)), min(n, int(cy + r) + 2)):
            dy = row + 0.5 - cy
            if dy * dy > r * r:
                continue
            half = (r * r - dy * dy) ** 0.5
            x0, x1 = max(0, int(cx - half + 0.5)), min(n, int(cx + half + 0.5))
            if x1 > x0:
                mask[row * n + x0: row * n + x1] = b"\x01" * (x1 - x0)

    for x, y in _bezier_points():
        disc(x, y, STROKE / 2)
    for x, y in FITTINGS:
        disc(x, y, FITTING_R)

    rows = []
    k = oversample * oversample
    for y in range(size):
        line = bytearray([0])  # PNG filter type 0
        for x in range(size):
            cover = 0
            for sy in range(oversample):
                base = (y * oversample + sy) * n + x * oversample
                cover += sum(mask[base: base + oversample])
            a = cover / k
            line += bytes(round(BACKGROUND[i] * (1 - a) + INK[i] * a) for i in range(3))
        rows.append(bytes(line))
    return b"".join(rows)


def png(size: int) -> bytes:
    def chunk(tag: bytes, data: bytes) -> bytes:
        return struct.pack(">I", len(data)) + tag + data + struct.pack(">I", zlib.crc32(tag + data) & 0xFFFFFFFF)
    header = struct.pack(">IIBBBBB", size, size, 8, 2, 0, 0, 0)
    return (b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", header)
            + chunk(b"IDAT", zlib.compress(_raster(size), 9)) + chunk(b"IEND", b""))


def svg() -> str:
    (x0, y0), *rest = CURVE
    path = f"M{x0} {y0} C" + " ".join(f"{x} {y}" for x, y in rest[:3]) + " S" + " ".join(
        f"{x} {y}" for x, y in rest[4:])
    bg = "#%02x%02x%02x" % BACKGROUND
    ink = "#%02x%02x%02x" % INK
    circles = "".join(f'<circle cx="{x}" cy="{y}" r="{FITTING_R:g}" fill="{ink}"/>' for x, y in FITTINGS)
    return (f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100">'
            f'<rect width="100" height="100" fill="{bg}"/>'
            f'<path d="{path}" fill="none" stroke="{ink}" stroke-width="{STROKE:g}" stroke-linecap="round"/>'
            f"{circles}</svg>\n")


if __name__ == "__main__":
    (HERE / "icon.svg").write_text(svg(), encoding="utf-8")
    for size in (192, 512):
        (HERE / f"icon-{size}.png").write_bytes(png(size))
    print("wrote", ", ".join(p.name for p in sorted(HERE.glob("icon*"))))
