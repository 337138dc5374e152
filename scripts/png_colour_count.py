"""Counts the distinct colours of a PNG (8-bit RGB or RGBA, non-interlaced,
as headless Chromium writes them) with the standard library only, and exits
with status 1 when there are fewer than the given minimum.

usage: python3 png_colour_count.py IMAGE.png MINIMUM
"""
import struct
import sys
import zlib


def rows(path):
    with open(path, "rb") as f:
        data = f.read()
    if data[:8] != b"\x89PNG\r\n\x1a\n":
        raise SystemExit(f"{path}: not a PNG file")
    pos, idat, header = 8, b"", None
    while pos < len(data):
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            header = struct.unpack(">IIBBBBB", body)
        elif kind == b"IDAT":
            idat += body
        pos += 12 + length
    width, height, depth, colour, _, _, interlace = header
    if depth != 8 or colour not in (2, 6) or interlace:
        raise SystemExit(f"{path}: only 8-bit RGB/RGBA non-interlaced PNGs are handled")
    channels = 3 if colour == 2 else 4
    raw = zlib.decompress(idat)
    stride = width * channels
    previous = bytearray(stride)
    for y in range(height):
        start = y * (stride + 1)
        kind, line = raw[start], bytearray(raw[start + 1:start + 1 + stride])
        for i in range(stride):  # the five PNG filters (PNG spec, section 9)
            a = line[i - channels] if i >= channels else 0
            b = previous[i]
            c = previous[i - channels] if i >= channels else 0
            if kind == 1:
                line[i] = (line[i] + a) & 0xFF
            elif kind == 2:
                line[i] = (line[i] + b) & 0xFF
            elif kind == 3:
                line[i] = (line[i] + (a + b) // 2) & 0xFF
            elif kind == 4:
                p = a + b - c
                pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                line[i] = (line[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 0xFF
        previous = line
        yield width, channels, line


def main():
    path, minimum = sys.argv[1], int(sys.argv[2])
    colours = set()
    size = None
    for count, (width, channels, line) in enumerate(rows(path)):
        size = (width, count + 1)
        for x in range(0, width * channels, channels * 4):  # every 4th pixel is plenty
            colours.add(bytes(line[x:x + 3]))
    print(f"{path}: {size[0]}x{size[1]} px, {len(colours)} distinct colours (minimum {minimum})")
    if len(colours) < minimum:
        sys.exit(1)


if __name__ == "__main__":
    main()
