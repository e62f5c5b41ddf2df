package main

import (
	"regexp"
	"testing"

	"github.com/stretchr/testify/assert"
)

// TBX carries the documents' language in xml:lang (ISO 30042: on <tbx>
// and on every langSec); --lang sets it, and a value that is no BCP 47
// language tag is a usage error before any input is read.
func TestTermsLangInTBX(t *testing.T) {
	r := run(t, "", "terms", "--lang", "en-GB", "--to", "tbx", "--limit", "3", "testdata/demo")
	assert.Equal(t, 0, r.code, r.stderr)
	langs := regexp.MustCompile(`xml:lang="([^"]*)"`).FindAllStringSubmatch(r.stdout, -1)
	assert.GreaterOrEqual(t, len(langs), 4, "on <tbx> and on the entries' language sections")
	for _, m := range langs {
		assert.Equal(t, "en-GB", m[1])
	}

	r = run(t, "", "terms", "--lang", "english!", "--to", "tbx", "testdata/demo")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, "BCP 47")
}
