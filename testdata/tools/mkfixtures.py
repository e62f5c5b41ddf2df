#!/usr/bin/env python3
"""Write the byte-level reader fixtures in testdata/formats/.

These files are about encodings and bytes rather than content, so they are
generated here instead of being edited by hand, where an editor might
silently "repair" them. The output is the same on every run.

  utf16le-bom.txt   UTF-16 little endian with byte order mark
  utf16be-bom.txt   UTF-16 big endian with byte order mark, one character
                    outside the Basic Multilingual Plane (a surrogate pair)
  invalid-utf8.txt  UTF-8 text with invalid bytes on line 3 (a Latin-1
                    degree sign 0xB0 and a lone 0xFF)
  empty.txt         zero bytes
  binary.dat        PNG signature and header chunk followed by fixed
                    pseudo-random bytes (with NULs), 512 bytes in all

Usage:
  python3 testdata/tools/mkfixtures.py [OUTPUT_DIR]
Default output directory: testdata/formats/
"""

import os
import struct
import sys
import zlib

HERE = os.path.dirname(os.path.abspath(__file__))
DEFAULT_DIR = os.path.join(HERE, "..", "formats")

UTF16LE_TEXT = (
    "Root-zone temperature check\r\n"
    "\r\n"
    "Place the reference thermometer next to the root-zone temperature sensor.\r\n"
    "Wait 15 minutes, then enter the reading (e.g. 19.6 \u00b0C) in the calibration menu.\r\n"
    "The drain EC should stay between 2.5 and 3.5 mS/cm (2,500\u20133,500 \u00b5S/cm).\r\n"
)

UTF16BE_TEXT = (
    "Disc filter check\n"
    "\n"
    "Read the pressure gauges before and after the disc filter.\n"
    "If \U0001d6e5p across the filter exceeds 0.3 bar, flush the filter.\n"
    "The pressure regulator then holds the outlet pressure at 1.5 bar \u2013 check it.\n"
)

INVALID_UTF8 = (
    b"Solenoid valve log, irrigation zone 4\n"
    b"06:00 main valve opened, supply pressure 3.2 bar\n"
    b"06:01 water temperature 15 \xb0C, flow rate 2.4 m\xb3/h \xff\n"
    b"06:11 solenoid valve closed, 400 L delivered\n"
)


def png_like():
    """Return 512 fixed bytes that start like a PNG image."""
    sig = b"\x89PNG\r\n\x1a\n"
    ihdr = struct.pack(">IIBBBBB", 64, 48, 8, 2, 0, 0, 0)
    chunk = struct.pack(">I", len(ihdr)) + b"IHDR" + ihdr
    chunk += struct.pack(">I", zlib.crc32(b"IHDR" + ihdr) & 0xFFFFFFFF)
    out = bytearray(sig + chunk)
    # A linear congruential generator (constants of common practice, from
    # memory: 1664525, 1013904223) gives the same "random" bytes every run.
    x = 20240417
    while len(out) < 512:
        x = (1664525 * x + 1013904223) & 0xFFFFFFFF
        b = (x >> 24) & 0xFF
        out.append(0 if b < 24 else b)  # roughly one byte in ten is NUL
    return bytes(out)


def write(path, data):
    tmp = path + ".tmp"
    with open(tmp, "wb") as f:
        f.write(data)
    os.replace(tmp, path)
    print("wrote %s (%d bytes)" % (path, len(data)))


def main(argv):
    d = argv[1] if len(argv) > 1 else DEFAULT_DIR
    write(os.path.join(d, "utf16le-bom.txt"), b"\xff\xfe" + UTF16LE_TEXT.encode("utf-16-le"))
    write(os.path.join(d, "utf16be-bom.txt"), b"\xfe\xff" + UTF16BE_TEXT.encode("utf-16-be"))
    write(os.path.join(d, "invalid-utf8.txt"), INVALID_UTF8)
    write(os.path.join(d, "empty.txt"), b"")
    write(os.path.join(d, "binary.dat"), png_like())


if __name__ == "__main__":
    main(sys.argv)
