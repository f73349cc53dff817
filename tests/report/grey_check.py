#!/usr/bin/env python3
"""Greyscale check of the verdict badges (issue 13): in a screenshot of the report rendered with a
CSS greyscale filter, the solid EXCEEDS/FAIL badge must be dark and the outlined WITHIN/PASS badge
light, so that the two read apart without colour. Luminance by ITU-R BT.601 weights
(0.299 R + 0.587 G + 0.114 B). Usage: grey_check.py FILE.png "x,y,w,h;x,y,w,h" """
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from png_check import decode  # noqa: E402


def mean_luma(rows, bpp, x, y, w, h):
    total = n = 0
    for yy in range(y + 2, y + h - 2):
        line = rows[yy]
        for xx in range(x + 2, x + w - 2):
            r, g, b = line[xx * bpp], line[xx * bpp + 1], line[xx * bpp + 2]
            total += 0.299 * r + 0.587 * g + 0.114 * b
            n += 1
    return total / max(n, 1)


def main():
    width, height, bpp, rows = decode(sys.argv[1])
    rects = [tuple(int(v) for v in part.split(",")) for part in sys.argv[2].split(";") if part]
    if len(rects) != 2:
        raise SystemExit(f"expected a solid and an outlined badge, got {sys.argv[2]!r}")
    for (x, y, w, h) in rects:
        if x + w > width or y + h > height:
            raise SystemExit("a badge lies outside the screenshot")
    solid = mean_luma(rows, bpp, *rects[0])
    outline = mean_luma(rows, bpp, *rects[1])
    print(f"greyscale badge luminance: solid {solid:.0f}, outlined {outline:.0f}")
    if not (solid < 150 and outline > 190 and outline - solid > 60):
        raise SystemExit("EXCEEDS/FAIL and WITHIN/PASS badges do not read apart in greyscale")


if __name__ == "__main__":
    main()
