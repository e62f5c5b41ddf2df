// Package termstat computes the statistics glossmith ranks term candidates
// by: termhood (C-value), dispersion over the parts of a corpus (Gries' DP)
// and domain specificity against a reference corpus (log-likelihood
// keyness, weirdness), plus a helper that combines several scores into one
// ranking.
//
// The package works on counts only; finding candidates and counting them is
// the caller's job. Each formula's doc comment names the publication it
// comes from, and the tests check the implementations against worked
// examples written out by hand.
package termstat
