#!/usr/bin/env python3
"""Checks a screenshot of the rendered report: the PNG decodes (our own decoder on the standard
library's zlib, PNG spec W3C 2003 / ISO 15948: IHDR, IDAT, filters 0-4), is not blank (enough
non-white pixels and colours), and shows the site map (pixels of the map's antenna colour, Okabe-Ito
reddish purple #CC79A7, and of the zone fills). Usage: png_check.py FILE.png"""
import struct
import sys
import zlib


def decode(path):
    data = open(path, "rb").read()
    if data[:8] != b"\x89PNG\r\n\x1a\n":
        raise SystemExit("not a PNG file")
    pos, idat, ihdr = 8, b"", None
    while pos < len(data):
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            ihdr = struct.unpack(">IIBBBBB", body)
        elif kind == b"IDAT":
            idat += body
        elif kind == b"IEND":
            break
        pos += 12 + length
    width, height, depth, colour, _, _, interlace = ihdr
    if depth != 8 or colour not in (2, 6) or interlace != 0:
        raise SystemExit(f"unsupported PNG layout depth={depth} colour={colour} interlace={interlace}")
    bpp = 3 if colour == 2 else 4
    raw = zlib.decompress(idat)
    stride = width * bpp
    rows, prev, i = [], bytearray(stride), 0
    for _ in range(height):
        f = raw[i]
        line = bytearray(raw[i + 1:i + 1 + stride])
        i += 1 + stride
        for x in range(stride):
            a = line[x - bpp] if x >= bpp else 0
            b = prev[x]
            c = prev[x - bpp] if x >= bpp else 0
            if f == 1:
                line[x] = (line[x] + a) & 255
            elif f == 2:
                line[x] = (line[x] + b) & 255
            elif f == 3:
                line[x] = (line[x] + (a + b) // 2) & 255
            elif f == 4:
                p = a + b - c
                pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                pred = a if pa <= pb and pa <= pc else (b if pb <= pc else c)
                line[x] = (line[x] + pred) & 255
        rows.append(line)
        prev = line
    return width, height, bpp, rows


def main():
    width, height, bpp, rows = decode(sys.argv[1])
    total = nonwhite = antenna = 0
    colours = set()
    for line in rows[::2]:
        for x in range(0, width * bpp, bpp * 2):
            r, g, b = line[x], line[x + 1], line[x + 2]
            total += 1
            if r < 245 or g < 245 or b < 245:
                nonwhite += 1
            colours.add((r >> 3, g >> 3, b >> 3))
            if abs(r - 0xCC) < 12 and abs(g - 0x79) < 12 and abs(b - 0xA7) < 12:
                antenna += 1
    share = nonwhite / total
    print(f"{width}x{height}: {share:.1%} non-white, {len(colours)} colours, {antenna} antenna-colour samples")
    if share < 0.02 or len(colours) < 16:
        raise SystemExit("the page looks blank")
    if antenna < 5:
        raise SystemExit("the site map's antennas are not visible")


if __name__ == "__main__":
    main()
