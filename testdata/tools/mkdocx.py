#!/usr/bin/env python3
"""Build a small, valid WordprocessingML (.docx) file from a marked-up text.

glossmith's demo corpus needs one .docx document. Rather than commit an
opaque binary made by a word processor, this script writes it from a plain
source text, so that the content can be reviewed and the file rebuilt
byte for byte (fixed zip timestamps, fixed member order, fixed attributes).

Source markup, one paragraph per line:
  "# text"    paragraph in style Heading1
  "## text"   paragraph in style Heading2
  "**text**"  bold run inside a paragraph
  "^"         ends the current run and starts a new one with the same
              formatting (the reader must join the runs again; Word splits
              runs like this after edits or spell checks)
  TAB         <w:tab/> element
  "<br>"      <w:br/> element (line break inside a paragraph)
Empty lines are skipped.

Usage:
  python3 testdata/tools/mkdocx.py [SOURCE.txt [OUTPUT.docx]]
Defaults: testdata/tools/hv-valve-service-manual.txt ->
          testdata/demo/hv-valve-service-manual.docx
"""

import os
import re
import sys
import zipfile
from xml.sax.saxutils import escape

HERE = os.path.dirname(os.path.abspath(__file__))
DEFAULT_SRC = os.path.join(HERE, "hv-valve-service-manual.txt")
DEFAULT_OUT = os.path.join(HERE, "..", "demo", "hv-valve-service-manual.docx")

W_NS = "http://schemas.openxmlformats.org/wordprocessingml/2006/main"
R_NS = "http://schemas.openxmlformats.org/officeDocument/2006/relationships"

CONTENT_TYPES = """<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">
<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>
<Default Extension="xml" ContentType="application/xml"/>
<Override PartName="/word/document.xml" ContentType="application/vnd.openxmlformats-officedocument.wordprocessingml.document.main+xml"/>
<Override PartName="/word/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.wordprocessingml.styles+xml"/>
</Types>
"""

PACKAGE_RELS = """<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">
<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="word/document.xml"/>
</Relationships>
"""

DOCUMENT_RELS = """<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">
<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/styles" Target="styles.xml"/>
</Relationships>
"""

STYLES = """<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<w:styles xmlns:w="%s">
<w:style w:type="paragraph" w:default="1" w:styleId="Normal"><w:name w:val="Normal"/></w:style>
<w:style w:type="paragraph" w:styleId="Heading1"><w:name w:val="heading 1"/><w:basedOn w:val="Normal"/><w:next w:val="Normal"/><w:pPr><w:outlineLvl w:val="0"/></w:pPr><w:rPr><w:b/><w:sz w:val="32"/></w:rPr></w:style>
<w:style w:type="paragraph" w:styleId="Heading2"><w:name w:val="heading 2"/><w:basedOn w:val="Normal"/><w:next w:val="Normal"/><w:pPr><w:outlineLvl w:val="1"/></w:pPr><w:rPr><w:b/><w:sz w:val="26"/></w:rPr></w:style>
</w:styles>
""" % W_NS


def run_xml(text, bold):
    """Return one <w:r> for text, turning TABs and <br> into elements."""
    parts = []
    for i, piece in enumerate(re.split(r"(\t|<br>)", text)):
        if piece == "\t":
            parts.append("<w:tab/>")
        elif piece == "<br>":
            parts.append("<w:br/>")
        elif piece:
            parts.append('<w:t xml:space="preserve">%s</w:t>' % escape(piece))
    if not parts:
        return ""
    rpr = "<w:rPr><w:b/></w:rPr>" if bold else ""
    return "<w:r>%s%s</w:r>" % (rpr, "".join(parts))


def paragraph_xml(line):
    style = None
    if line.startswith("## "):
        style, line = "Heading2", line[3:]
    elif line.startswith("# "):
        style, line = "Heading1", line[2:]
    ppr = '<w:pPr><w:pStyle w:val="%s"/></w:pPr>' % style if style else ""
    runs = []
    # Odd-numbered pieces between "**" markers are bold.
    for i, span in enumerate(line.split("**")):
        for piece in span.split("^"):
            runs.append(run_xml(piece, bold=(i % 2 == 1)))
    return "<w:p>%s%s</w:p>" % (ppr, "".join(runs))


def document_xml(lines):
    body = "\n".join(paragraph_xml(l) for l in lines)
    return (
        '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n'
        '<w:document xmlns:w="%s" xmlns:r="%s">\n<w:body>\n%s\n'
        '<w:sectPr><w:pgSz w:w="11906" w:h="16838"/></w:sectPr>\n'
        "</w:body>\n</w:document>\n" % (W_NS, R_NS, body)
    )


def write_member(zf, name, data):
    # A fixed timestamp and fixed attributes make the archive reproducible.
    info = zipfile.ZipInfo(name, date_time=(1980, 1, 1, 0, 0, 0))
    info.compress_type = zipfile.ZIP_DEFLATED
    info.external_attr = 0o644 << 16
    info.create_system = 3
    zf.writestr(info, data.encode("utf-8"))


def main(argv):
    src = argv[1] if len(argv) > 1 else DEFAULT_SRC
    out = argv[2] if len(argv) > 2 else DEFAULT_OUT
    with open(src, encoding="utf-8") as f:
        lines = [l.rstrip("\n") for l in f if l.strip()]
    tmp = out + ".tmp"
    with zipfile.ZipFile(tmp, "w") as zf:
        write_member(zf, "[Content_Types].xml", CONTENT_TYPES)
        write_member(zf, "_rels/.rels", PACKAGE_RELS)
        write_member(zf, "word/_rels/document.xml.rels", DOCUMENT_RELS)
        write_member(zf, "word/styles.xml", STYLES)
        write_member(zf, "word/document.xml", document_xml(lines))
    os.replace(tmp, out)
    print("wrote %s (%d paragraphs)" % (out, len(lines)))


if __name__ == "__main__":
    main(sys.argv)
