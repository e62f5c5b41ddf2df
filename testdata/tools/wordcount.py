#!/usr/bin/env python3
"""Count the words of each demo document, the way DEMO.md reports them.

A word is a run of non-space characters, as with `wc -w`, counted on the
text a reader sees: the file itself for .md and .txt (byte order mark
removed), the decompressed text for .gz, the visible text for .html
(<script> and <style> skipped, entities decoded) and the <w:t> runs for
.docx. Markdown markup such as "#" or "|---|" is counted as written.

Usage:
  python3 testdata/tools/wordcount.py [DIR]
Default directory: testdata/demo/
"""

import gzip
import html
import html.parser
import os
import re
import sys
import zipfile

HERE = os.path.dirname(os.path.abspath(__file__))


class _Visible(html.parser.HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.skip = 0
        self.out = []

    def handle_starttag(self, tag, attrs):
        if tag in ("script", "style"):
            self.skip += 1
        self.out.append(" ")

    def handle_endtag(self, tag):
        if tag in ("script", "style"):
            self.skip -= 1
        self.out.append(" ")

    def handle_data(self, data):
        if not self.skip:
            self.out.append(data)


def text_of(path):
    if path.endswith(".gz"):
        with gzip.open(path) as f:
            return f.read().decode("utf-8-sig")
    if path.endswith(".docx"):
        xml = zipfile.ZipFile(path).read("word/document.xml").decode("utf-8")
        xml = re.sub(r"<w:tab/>|<w:br/>|</w:p>", " ", xml)
        return html.unescape(re.sub(r"<[^>]+>", "", xml))
    with open(path, encoding="utf-8-sig") as f:
        t = f.read()
    if path.endswith(".html"):
        p = _Visible()
        p.feed(t)
        return "".join(p.out)
    return t


def main(argv):
    d = argv[1] if len(argv) > 1 else os.path.join(HERE, "..", "demo")
    total = 0
    for name in sorted(os.listdir(d)):
        n = len(text_of(os.path.join(d, name)).split())
        total += n
        print("%6d  %s" % (n, name))
    print("%6d  total" % total)


if __name__ == "__main__":
    main(sys.argv)
