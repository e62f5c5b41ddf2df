// Package grammar is the front end of glossmith's rule language: the lexer
// and parser of .gsr files, the syntax tree, the resolution of `use`
// statements, the checks that run before any text is matched, and the
// built-in (stock) rule sets. Package pattern compiles the rules this
// package produces and matches them; LANGUAGE.md in this directory is the
// user's guide.
//
// # Files and statements
//
// A rule file is UTF-8 text of at most MaxFileSize bytes whose name ends in
// ".gsr" (RuleFileExt); other files are refused by name, unread. `#` starts
// a comment that runs to the end of the line. The comment lines directly
// above a rule (no blank line between) are the rule's documentation.
// Statements:
//
//	File      = { Statement } .
//	Statement = Use | Rule | Example .
//	Use       = "use" ( String | "stock" Name ) [ ";" ] .
//	Rule      = Name "=" Alt ";" .
//	Example   = ( "expect" | "reject" ) Name ":" String ";" .
//
// A `use "path"` loads another file, the path relative to the file that
// says it; `use stock NAME` loads a built-in set (StockNames). Each file is
// loaded once however often it is used; a chain of uses that comes back to
// a file is an error ("use cycle"). Rule names are global to the loaded set
// and must be unique; "use", "stock", "expect", "reject", "_" and the UPOS
// names cannot name rules. By convention a name starting with "_" marks a
// helper rule that commands do not report on its own.
//
// # Rule bodies
//
//	Alt     = Seq { "|" Seq } .
//	Seq     = Element { Element } .
//	Element = [ Label ] Conj [ Quant ] .
//	Conj    = Not { "&" Not } .
//	Not     = { "!" } Atom .
//	Atom    = Test | Name | "(" Alt ")" | "^" | "$" .
//	Quant   = "?" | "*" | "+" | "{" Int "}" | "{" Int "," "}" | "{" Int "," Int "}" .
//	Label   = "@" Name .
//	Test    = UPOS | "_" | String | Raw | Regexp | Field .
//	Field   = ( "xpos" | "lemma" | "chars" ) ":" ( Value | Regexp )
//	        | ( "begins" | "ends" ) ":" Value .
//
// Parentheses and `!` nest at most MaxNesting levels deep.
//
// Binding, tightest first: `!`, then `&`, then repetition, then sequence,
// then `|`. So `ADJ | VERB & xpos:VBN` is an adjective or a past participle,
// `!ADJ & NOUN` is a noun that is not an adjective, and `ADJ NOUN | VERB`
// is either the pair or the verb. Operands of `&` and `!` must each match
// exactly one token (tests, and `|`, `&`, `!` of tests, also through rule
// names); anything else is an error.
//
// Token tests:
//
//	NOUN, ADJ, …     the UPOS tag (the 17 tags of Universal Dependencies)
//	xpos:NNS         the fine tag (the XPOS column of UD), exactly; xpos:/^VB/ by regexp
//	"valve"          the word, ignoring case
//	'Valve'          the word, exactly
//	/^[A-Z]{2,5}$/   the word against a regular expression (RE2 syntax)
//	lemma:valve      the lemma, ignoring case; lemma:/^valv/ by regexp
//	begins:un        the word begins with un (ignoring case)
//	ends:ing         the word ends with ing (ignoring case)
//	chars:Aa+-9      the word's character classes (CharClasses); chars:/^A\+$/
//	_                any token
//
// Regular expressions are Go's (RE2) and are not anchored: write ^ and $
// inside the slashes to match the whole value. A quoted string with spaces,
// "in order to", stands for the sequence of its words. A bare field value
// runs up to white space or one of ; | & ( ) { } ! * + ? # " ' /, so
// xpos:PRP$ is the tag PRP$ (put a space before a following $ anchor);
// quote other values: xpos:"#". A chars: value may also hold '+'. Escapes
// in quotes: \" \' \\ \n \t, and \[ \] for literal brackets in examples.
// The field names of earlier versions (tag:, prefix:, suffix:, shape:) are
// errors that name today's.
//
// A rule's name inside another rule stands for that rule's body. Rules may
// not refer to themselves, directly or through others ("rule cycle"). `^`
// and `$` match no token: at the start and at the end of the sentence. A
// label @name names the span the next element matched (an element with its
// repetition: `@mods ADJ*`); labels of a referenced rule stay inside it, so
// write `@node term` to name the span of a referenced rule.
//
// Examples are tests that live beside the rules: `expect RULE: "text with
// [a span]"` requires the bracketed span to be one of RULE's matches (in
// the default mode) once the text is tokenized and tagged, `reject RULE:
// "text"` requires RULE to match nowhere in it. pattern.CheckExamples runs
// them.
//
// # Errors
//
// Every problem is an *Error with a position (file, line, column counted in
// characters, all 1-based) and the source line, so Error.Caret can show
// where it is; ParseString, Load and friends return all of them at once as
// an ErrorList. Syntax errors do not stop the parse: the broken statement
// is skipped and the next one is read. Names close to a known tag, rule,
// field or stock set get a "did you mean" suggestion from package
// internal/suggest, the program's one way of suggesting.
package grammar
