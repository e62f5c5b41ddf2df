// Package model holds glossmith's default tagger model, embedded in the
// binary so that tagging works offline with no set-up.
//
// The file en-ewt.glsm is a derived work of the Universal Dependencies
// English Web Treebank (UD English EWT 2.15, CC BY-SA 4.0) and is
// distributed under CC BY-SA 4.0; see NOTICE.md. It is rebuilt, byte for
// byte, from the treebank by
//
//	go run ./tagger/model/build
//
// run from the module root with the treebank at ../shared/data/ud-en-ewt.
// The model also holds wordnet-classes.tsv, word classes derived from
// WordNet 3.0 (WordNet 3.0 license, notice in NOTICE.md), which
//
//	go run ./tagger/model/lexicon
//
// regenerates from Debian's package wordnet-base, and general-en-bands.tsv,
// general-English frequency bands derived from the SUBTLEX-US word list
// (ISC license, notice in NOTICE.md), which
//
//	go run ./tagger/model/genfreq
//
// regenerates from ../shared/data/general-en.
// (Bootstrapping a tree without the file: create an empty en-ewt.glsm
// first, so that the packages compile, then run the command above.)
package model

import _ "embed"

// EnglishEWT is the default English model file (the hmm package decodes it).
//
//go:embed en-ewt.glsm
var EnglishEWT []byte

// EnglishWordClasses is the table of word classes learned from unlabeled
// text (package wordclass parses it) that a model trained with them reads
// (hmm.TrainOptions.LearnedClasses; the default model is not), made by
//
//	go run ./tagger/model/wordclasses
//
// It is a derived work of the treebank's training text and of WordNet 3.0's
// glosses; see NOTICE.md.
//
//go:embed en-wordclasses.txt.gz
var EnglishWordClasses []byte

// WordClassesName is the file name of the word class table, for messages.
const WordClassesName = "en-wordclasses.txt.gz"

// Name is the file name of the default model, for messages.
const Name = "en-ewt.glsm"
