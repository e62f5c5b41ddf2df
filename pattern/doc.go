// Package pattern compiles glossmith rules (package grammar) to automata
// and finds their matches in tagged sentences, in time linear in the number
// of tokens for every rule.
//
// # Compiling
//
// Compile inlines the rules a rule refers to and turns each compiled rule
// into a Thompson NFA whose steps test one token. Each distinct token test
// (an "atom": a UPOS name, a word, a tag pattern, …) is evaluated once per
// token; tests combined with !, & and | become one predicate over atoms.
// Tokens with the same atom results form a class, and the matcher runs
// lazily built deterministic automata over class numbers, caching every
// state and transition it has built. Nothing backtracks: a rule such as
// (_*)*NOUN costs per token what NOUN costs (see BenchmarkPathological).
//
// # What FindAll returns (the default mode)
//
// Matches never cross a sentence: every call gets one sentence. Empty
// matches are never reported. For each rule separately, FindAll scans the
// sentence from the left: the match starts at the first token where some
// non-empty match of the rule starts (leftmost), and ends at the farthest
// token at which a match from that start ends (longest). The scan goes on
// after the match, so one rule's matches never overlap; matches of
// different rules may. This is the leftmost-longest rule of POSIX, and the
// test suite checks it against Go's regexp in Longest mode. Results are
// sorted by start, then by the order of the rules in the Matcher.
//
// # What FindNested returns
//
// FindNested reports, for each rule, every span [start,end) of the sentence
// that the rule matches, each once, sorted by start, then end, then rule
// order. For `(ADJ|NOUN)* NOUN` over "stainless steel valve" that is
// [0,2) [0,3) [1,2) [1,3) [2,3): the nested candidates term extraction
// needs. Its cost is the total length of the reported spans' longest
// extensions, at most the number of tokens times the longest match.
//
// # Labels
//
// Labels become slots: Match.Slots maps each label that took part in the
// match to its token span (possibly empty, as for `@mods ADJ*` with no
// adjective); a rule without labels has nil Slots. When a span can be
// parsed in several ways, the slots come from the parse a backtracking
// matcher would find first among the parses of exactly that span: the
// alternatives of | tried in written order, repetitions taking as many
// rounds as they can. A label inside a repetition holds its last round.
// Slots are recovered by a Pike VM run over the matched tokens only.
//
// # How matching stays linear
//
// One reverse sweep over the sentence computes, for every rule and every
// position j, the set of NFA steps from which a match can still be
// completed with tokens j, j+1, … (a lazily built DFA over token classes,
// run right to left); the same sweep marks where non-empty matches begin. A
// forward DFA then starts only at those positions and stops as soon as its
// state has nothing in common with the set at its position — right after
// the longest match. So every token is read once by the reverse sweep and
// once per match that covers it. A rule is skipped without any sweep when
// the sentence lacks a token for a test that every match needs.
//
// A Matcher is safe for concurrent use: each call takes its working memory
// and its lazily built automata from a sync.Pool. Caches are bounded;
// when they outgrow their limits they are dropped and rebuilt.
package pattern
