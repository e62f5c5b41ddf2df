// Package read turns the files a user names into glossmith documents:
// plain text ready for the tokenizer, or sentences already tokenized
// (CoNLL-U).
//
// # Inputs
//
// Expand takes command-line arguments: "-" is standard input; a file is
// read whatever its name; a directory is walked recursively in lexical
// order, reading the files whose extension names a format below and
// skipping, with a note, hidden entries (names starting with "."), links
// to directories, and files of other types (one note per directory
// counting them by extension). With Options.Format set, every file in a
// directory is read as that format. An argument naming no file but holding
// * ? or [ is expanded as a pattern (filepath.Match syntax; "*" does not
// match a leading dot), for shells that leave patterns alone. A directory
// with no file to read, a pattern matching nothing and a missing or
// unreadable file are Errors naming the argument.
//
// # Formats
//
// The format comes from Options.Format (the CLI's --from), else from the
// extension — .txt .text → txt; .md .markdown → md; .html .htm .xhtml →
// html; .docx; .pdf; .conllu — else from the content: "%PDF-" → pdf; a zip
// → docx; HTML by the WHATWG MIME sniffing patterns (a leading <!DOCTYPE
// html>, <html>, <head>, <body>, <p>, <div>, ... tag); CoNLL-U by 10-column
// tab-separated rows with numeric IDs or a "# sent_id"/"# newdoc" comment;
// Markdown by an ATX heading, a code fence, an inline link, a table
// delimiter row, front matter, a setext heading or **strong** text; plain
// text otherwise.
//
// Any of them may be gzip-compressed: a ".gz" name ("manual.md.gz" is
// Markdown) or the gzip magic number. The decompressed size is capped at
// Options.MaxBytes (DefaultMaxBytes, 128 MiB), counting the bytes actually
// inflated, so a gzip bomb costs at most that much memory.
//
// Paragraph breaks reach the tokenizer as a blank line, or — in Markdown,
// where adding lines would break line numbers — as U+2029 PARAGRAPH
// SEPARATOR at the start of the block's text. The tokenizer must end a
// sentence at either.
//
// txt: the text as it is. CRLF and lone CR become LF (so in md too, and
// in html <pre>), so Token.Line is the line an editor shows.
//
// md: parsed by goldmark (CommonMark 0.31.2 with the GitHub extensions —
// tables, task lists, strikethrough, autolinked URLs — and footnotes);
// what a renderer shows as text is kept, each run on the line of the
// source where it stands (goldmark gives byte offsets into the source),
// so the text has exactly the source's lines and Token.Line is the source
// line. Dropped: YAML (---) or TOML (+++) front matter at the top; fenced
// and indented code blocks, since code is not prose and its identifiers
// would crowd the term lists; raw HTML tags (the text between them is
// kept), HTML comments, and the content of script, style, textarea and
// pre; thematic breaks and setext underlines; link reference definitions
// (also over several lines); link destinations and titles; footnote
// references "[^1]"; task boxes. Kept: heading text, list items without
// bullets or numbers, block quotes without ">", emphasis, strikethrough
// and link text (also wrapped over lines), inline code without backticks,
// image alt text, autolinks as the URL, backslash escapes and entities
// decoded, footnote text; markup that CommonMark does not take as markup
// ("5 * 3", snake_case, an undefined "[^9]") stays as written. A table's
// delimiter row becomes an empty line. A block (paragraph, heading, list
// item, quote, table cell, footnote) that starts on the line of other
// text or the line right after one starts with U+2029, so no sentence
// runs from one cell or item into the next. On words, the reader agrees
// with the HTML of 645 of the 652 examples of the CommonMark
// specification (commonmark_test.go). "[", "](" and ">" nested more than
// 32 deep are read as text, which keeps the parser linear.
//
// html: the visible text of the body, from the tree that
// golang.org/x/net/html's parser builds by the HTML5 algorithm, so end
// tags that may be left out (</li>, </p>, </td>, </head>) end their
// elements where a browser ends them. (A page nested more than 512
// elements deep, which the parser refuses, is read tag by tag with a
// Warning.) Dropped with their content: head (and title, which pages
// repeat as their first heading, so keeping it would count it twice),
// script, style, noscript, template, svg, math, iframe, object, select,
// textarea, canvas, audio, video, and any element with the hidden
// attribute or an inline style display:none or visibility:hidden. Image
// alt text is not shown on a page and is dropped. Tags are removed,
// entities decoded, runs of white space collapsed to one space except in
// <pre>. Each block element (p, div, h1–h6, li, td, th, tr, table,
// blockquote, section, ...) ends a paragraph: a blank line between blocks,
// so table cells and list items never share a sentence. <br> is a line
// break. Token.Line is the line of the extracted text; Document.Origins
// keep where each piece of it stands in the page (below).
//
// docx: the main document part, word/document.xml (headers, footers,
// footnotes and comments are not read). Each w:p paragraph — headings,
// list items and table cells too — is a paragraph, with a blank line
// between non-empty ones; w:t is text, w:tab a tab, w:br and w:cr a line
// break, w:noBreakHyphen a hyphen; deleted revisions (w:delText), field
// codes (w:instrText) and mc:Fallback copies are left out. An archive
// with more than MaxZipEntries entries, declaring more than MaxZipTotal
// unpacked, or whose document part declares or actually inflates to more
// than Options.MaxBytes, is refused with an Error before memory runs out.
// Token.Line is the line of the extracted text.
//
// pdf: the words that the pdftotext program of poppler-utils finds, in
// its reading order (column by column), taken from its -bbox-layout
// output: the words of a line joined by spaces, each line on its own line,
// a blank line after each text block (poppler's grouping of lines into
// paragraphs, headings and list blocks) and after each page. Plain
// pdftotext output lacks the blocks, and -layout sets columns side by
// side, gluing their lines together. Without pdftotext on PATH a PDF is an
// Error that names the package to install; it is never skipped silently.
// One run may take PDFTimeout; the markup read is capped at 16 times
// Options.MaxBytes and the text at Options.MaxBytes. Token.Line is the
// line of the extracted text.
//
// conllu: the tokens and sentence breaks as given (Document.Pretokenized),
// read by package conllu; LEMMA, UPOS and XPOS are kept where given and
// left empty where "_"; a malformed sentence is left out with an Error at
// its line. Each sentence keeps its lines (doc.Sentence.Rows), so that
// CoNLL-U output passes them through, filling only empty annotation
// cells. Token.Line is the token's row in the file.
//
// # Headings
//
// Readers mark the lines of headings and captions (Document.Headings),
// where title case is the norm, so that the tagger does not take their
// capitals for names. md: ATX and setext headings. html: h1–h6, caption
// and figcaption (the title is not read). docx: paragraphs whose style
// is a heading, title, subtitle or caption style — by its name in
// word/styles.xml, or its outline level (w:outlineLvl 0–8), itself or
// through the styles it is based on; without that part, by Word's
// built-in style IDs ("Heading1") — or that have an outline level of
// their own; a styles part that cannot be read is a Warning. txt: a
// single line between a blank line (or the start) and a blank line, of
// at most 12 words and 120 bytes, not starting with a bullet, not ending
// in . ! ? : ; or , and written in title case (every word capitalized
// but the articles, conjunctions and prepositions after the first) or in
// capitals. conllu: the sentences with the comment "# heading = yes"
// (conllu.HeadingComment), as `glossmith tag` writes them. pdf: none.
//
// # Encodings
//
// Text formats are decoded in this order: a byte order mark (UTF-8,
// dropped; UTF-16 LE or BE, converted); Options.Encoding (the CLI's
// --encoding; labels of the WHATWG Encoding Standard, see
// LookupEncoding); for html, the charset the page declares in its first
// 1024 bytes — an XML declaration's encoding or a <meta charset> /
// <meta http-equiv content="...; charset=..."> as the HTML Standard's
// prescan finds it (a declared UTF-16 means UTF-8, as that standard
// says). Otherwise the text must be UTF-8. A file that is not valid UTF-8
// but holds no multi-byte UTF-8 sequence and none of the five bytes
// Windows-1252 leaves undefined is read as Windows-1252, with a Note (so
// Latin-1 "caf\xE9" is "café"). In the rest, a byte that is not valid
// UTF-8 (or an unpaired UTF-16 surrogate, or a sequence not valid in the
// named encoding) becomes U+FFFD with a Warning naming the line — up to 10
// lines per file, then one summary warning — and the rest of the file is
// read.
//
// A NUL byte in the first 8 KiB marks the file as not text (below); a NUL
// further in is dropped with a Warning naming the first line that has one.
//
// # Normalization
//
// The text of every format but conllu (whose forms are kept as given) is
// put in Unicode Normalization Form C, so that "café" typed with U+00E9
// and with e + U+0301 is one word, and the invisible format characters
// are removed before tokenizing: U+00AD SOFT HYPHEN ("pres&shy;sure" is
// "pressure"), the zero width space, non-joiner, joiner and no-break
// space, U+2060 WORD JOINER, and the bidirectional marks and controls of
// UAX #9. Neither touches a line break, so Token.Line stays the line of
// the file (md, txt) or of the extracted text (the other formats). Token
// offsets are of the normalized Text; Document.Shifts map them back to the
// text as read (ReadOffset, ReadEnd) and give columns that count the
// removed and composed characters (ColumnShift), recorded only where the
// offsets stop lining up. Text that needs neither (nearly all) is checked
// in one pass, not copied, and has no shifts. For md and html,
// Document.Origins map on from the text as read to the source as decoded
// (origins.go), with the source's line and column at each, from which
// check takes its positions; an origin is kept only where the offsets
// stop lining up (at markup, references, escapes, collapsed white space
// and added breaks). md: each run of text is found at the offset goldmark
// gives for it. html: the text nodes of the parsed tree, which has no
// source positions, are found again, in order, in the stretches between
// tags that the tokenizer gives (text the parser moves, as a table's
// stray text, is looked for after and before). Both account for
// character references, CommonMark's backslash escapes and white space
// dropped or collapsed (pieces.align). For txt, md and html,
// Document.Source maps on to the bytes of the file (source.go) when they
// differ — a byte-order mark, CRLF, another encoding, replaced or dropped
// bytes, a line left out — so ReadOffset and ReadEnd are offsets of the
// file; a UTF-8 file with LF line ends costs nothing. DOCX and PDF
// offsets are of the extracted text.
//
// # Bad input
//
// An empty or blank file is a Note "no text" and is skipped. Content that
// is not text — a known binary signature (images, archives, executables,
// old Word files, ...), a NUL byte, or more than 10% control bytes in the
// first 8 KiB — is an Error when the file was named and a Note when it was
// met in a directory walk; either way it is skipped. A file larger than
// Options.MaxBytes is refused with an Error before it is read. In txt and
// md, a line longer than MaxLine (1 MiB) is left out — replaced by an
// empty line so the others keep their numbers — with an Error naming the
// line; the rest of the file is read.
package read
