#!/usr/bin/env python3
"""Write a small, valid PDF 1.4 file with two pages of text in Helvetica.

glossmith's PDF reader needs a fixture whose text is known exactly. This
script writes one by hand: a catalog, a page tree, the standard Type1 font
Helvetica (no embedding, WinAnsiEncoding), and one content stream per page,
followed by a cross-reference table with exact byte offsets. Page 1's stream
is stored uncompressed, page 2's with FlateDecode, so that a reader is
tested on both. There is no timestamp anywhere: re-running the script gives
the same bytes.

Usage:
  python3 testdata/tools/mkpdf.py [OUTPUT.pdf]
Default output: testdata/formats/quick-reference.pdf
Check (needs poppler-utils): pdftotext -layout testdata/formats/quick-reference.pdf -
"""

import os
import sys
import zlib

HERE = os.path.dirname(os.path.abspath(__file__))
DEFAULT_OUT = os.path.join(HERE, "..", "formats", "quick-reference.pdf")

# Each page is a list of (font size, text line). Text is Latin-1/WinAnsi;
# "\u00b0" (degree sign) is byte 0xB0 in WinAnsiEncoding.
PAGES = [
    [
        (16, "HV-25 Solenoid Valve: Quick Reference"),
        (11, ""),
        (11, "Pellwick Glasshouse Controls, card QR-HV25-EN"),
        (11, ""),
        (11, "Before you open a solenoid valve, close the isolating valve and"),
        (11, "release the pressure with the manual bleed screw."),
        (11, "The coil needs 24 V AC; a good coil reads approx. 30 to 40 ohm."),
        (11, "Operating pressure: 0.7 to 10 bar. Water temperature: max. 50 \u00b0C."),
        (11, ""),
        (11, "1. Clean the plunger and the pilot port first."),
        (11, "2. Replace the diaphragm if the valve (still) leaks when closed."),
        (11, "3. Tighten the union nut by hand, then a further quarter turn."),
    ],
    [
        (16, "PR-150 Pressure Regulator and DP-2 Drip Emitter"),
        (11, ""),
        (11, "The pressure regulator holds the outlet pressure at 1.5 bar."),
        (11, "Each pressure-compensating drip emitter gives 2.0 L/h between"),
        (11, "0.5 and 4.0 bar. Flush the filter when the pressure drop across"),
        (11, "the disc filter exceeds 0.3 bar."),
    ],
]


def pdf_string(text):
    """Return text as a PDF literal string in WinAnsi bytes."""
    raw = text.encode("cp1252")
    out = bytearray(b"(")
    for b in raw:
        if b in b"()\\":
            out += b"\\" + bytes([b])
        elif b < 0x20 or b > 0x7E:
            out += b"\\%03o" % b
        else:
            out.append(b)
    out += b")"
    return bytes(out)


def content_stream(lines):
    ops = [b"BT", b"72 770 Td"]
    size = None
    for font_size, text in lines:
        if font_size != size:
            ops.append(b"/F1 %d Tf %d TL" % (font_size, font_size + 5))
            size = font_size
        if text:
            ops.append(pdf_string(text) + b" Tj")
        ops.append(b"T*")
    ops.append(b"ET")
    return b"\n".join(ops) + b"\n"


def build():
    objects = {}  # number -> bytes of the object body
    n_pages = len(PAGES)
    # 1 catalog, 2 pages, 3 font, then (page, content) pairs, then info.
    page_nums = [4 + 2 * i for i in range(n_pages)]
    info_num = 4 + 2 * n_pages
    objects[1] = b"<< /Type /Catalog /Pages 2 0 R >>"
    kids = b" ".join(b"%d 0 R" % n for n in page_nums)
    objects[2] = b"<< /Type /Pages /Kids [%s] /Count %d >>" % (kids, n_pages)
    objects[3] = (b"<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica "
                  b"/Encoding /WinAnsiEncoding >>")
    for i, lines in enumerate(PAGES):
        page, content = page_nums[i], page_nums[i] + 1
        objects[page] = (
            b"<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] "
            b"/Resources << /Font << /F1 3 0 R >> >> /Contents %d 0 R >>" % content)
        data = content_stream(lines)
        if i == 0:
            objects[content] = b"<< /Length %d >>\nstream\n%s\nendstream" % (len(data), data)
        else:
            packed = zlib.compress(data, 9)
            objects[content] = (b"<< /Length %d /Filter /FlateDecode >>\nstream\n%s\nendstream"
                                % (len(packed), packed))
    objects[info_num] = (b"<< /Title (HV-25 Quick Reference) "
                         b"/Producer (glossmith testdata mkpdf.py) >>")

    out = bytearray(b"%PDF-1.4\n%\xe2\xe3\xcf\xd3\n")
    offsets = {}
    for num in sorted(objects):
        offsets[num] = len(out)
        out += b"%d 0 obj\n%s\nendobj\n" % (num, objects[num])
    xref_at = len(out)
    size = max(objects) + 1
    out += b"xref\n0 %d\n" % size
    out += b"0000000000 65535 f \n"
    for num in range(1, size):
        out += b"%010d 00000 n \n" % offsets[num]
    out += b"trailer\n<< /Size %d /Root 1 0 R /Info %d 0 R >>\n" % (size, info_num)
    out += b"startxref\n%d\n%%%%EOF\n" % xref_at
    return bytes(out)


def main(argv):
    out = argv[1] if len(argv) > 1 else DEFAULT_OUT
    data = build()
    tmp = out + ".tmp"
    with open(tmp, "wb") as f:
        f.write(data)
    os.replace(tmp, out)
    print("wrote %s (%d bytes, %d pages)" % (out, len(data), len(PAGES)))


if __name__ == "__main__":
    main(sys.argv)
