// Package tagger holds, in its sub-packages, the whole way from the bytes of
// a user's files to tagged tokens; everything that extracts terms,
// collocations or matches builds on what comes out of it. It has no code
// of its own: this is the map.
//
//	files ──read──▶ doc.Document ──tokenize──▶ sentences ──hmm──▶ tagged tokens ──emit──▶ tag's output
//	  │   (text, HTML, Markdown,      (UD EWT         (model: weights;   (CoNLL-U via conllu,
//	  │    DOCX, PDF)                  conventions)    lemma: lemmas)     TSV, JSON Lines, text)
//	  └──read──▶ conllu ──▶ doc.Document with sentences (tokenized, perhaps tagged) ──▶ hmm, or as it is
//
//	pipeline runs read → tokenize → tag and the caller's per-document work
//	on every core, and hands the documents back in input order.
//
// The packages, each with one job:
//
//   - doc: the data model — a document's text and its sentences of tokens,
//     each token with its offsets and line in the source.
//   - read: files to documents (format detection, decoding, extraction).
//   - conllu: the CoNLL-U reader and writer (pretokenized input, training
//     and evaluation data, output).
//   - tokenize: text to sentences of tokens.
//   - hmm: the part-of-speech tagger (perceptron and generative trigram
//     models, Viterbi decoding), its training and its model file.
//   - lemma: the learned lemmatizer the tagger carries.
//   - model: the embedded default model (UD English EWT).
//   - pipeline: the stages above on many documents at once, in order.
//   - emit: the output formats of `glossmith tag`.
package tagger
