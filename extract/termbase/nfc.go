package termbase

import "golang.org/x/text/unicode/norm"

// nfc is the text of a term as the termbase stores and looks it up:
// Unicode Normalization Form C (UAX #15), the form documents are read in
// (tagger/read), so that "Kältemittel" typed or pasted with a combining
// diaeresis (U+0061 U+0308, as some systems and PDF copies give it) is
// the term the documents write with "ä" (U+00E4).
func nfc(s string) string { return norm.NFC.String(s) }

func nfcAll(ss []string) []string {
	for i, s := range ss {
		if !norm.NFC.IsNormalString(s) {
			ss = append([]string(nil), ss...)
			for j := i; j < len(ss); j++ {
				ss[j] = nfc(ss[j])
			}
			return ss
		}
	}
	return ss
}
