package grammar

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// adversarialFiles are rule files built to make a parser or the set checks
// take quadratic time or memory: long runs of one operator, deep nesting,
// and many rules on one line under a long comment.
func adversarialFiles() map[string]string {
	const n = 100_000
	return map[string]string{
		"bangs":      "r = " + strings.Repeat("!", n) + "NOUN ;\n",
		"ands":       "r = NOUN" + strings.Repeat(" & NOUN", n) + " ;\n",
		"open":       "r = " + strings.Repeat("(", n) + "NOUN ;\n",
		"nested":     "r = " + strings.Repeat("(", n) + "NOUN" + strings.Repeat(")", n) + " ;\n",
		"alts":       "r = NOUN" + strings.Repeat(" | NOUN", n) + " ;\n",
		"seq":        "r =" + strings.Repeat(" NOUN", n) + " ;\n",
		"rules":      strings.Repeat("# doc\n", n) + strings.Repeat("r = NOUN ; ", n/10) + "\n",
		"errors":     strings.Repeat("a = % ;\n", n/8),
		"unclosed":   strings.Repeat("a = \"x ;\n", n/8),
		"labels":     "r =" + strings.Repeat(" @x NOUN |", n/10) + " NOUN ;\n",
		"semicolons": strings.Repeat(";", n),
		"groups":     "r =" + strings.Repeat(" @x (NOUN | ADJ & !VERB)?", n/30) + " ;\n",
		"quoted":     "r =" + strings.Repeat(` "a b" 'c' /d/ xpos:NN`, n/25) + " ;\n",
	}
}

// allocPerByte bounds the bytes a parse may allocate in all (most of it
// garbage at once) per byte of rules: the parser builds a tree node per
// token and tries the alternatives of an atom in turn, some 800 to 1,800
// bytes per byte on these files. A quadratic parse of 100 KB exceeds it
// a hundredfold.
const allocPerByte = 4000

// TestAdversarialRuleFiles holds parsing and checking to time and memory
// proportional to the file: each file of about 100 KB must be done well
// within a bound that a quadratic algorithm misses by far (100,000 '!' took
// 50 s, 100,000 unclosed '(' 1 GB, before the checks were linear and the
// nesting bounded), and deep
// nesting is a positioned error.
func TestAdversarialRuleFiles(t *testing.T) {
	for name, src := range adversarialFiles() {
		var before, after runtime.MemStats
		runtime.ReadMemStats(&before)
		start := time.Now()
		f, err := ParseString(name+".gsr", src)
		if err == nil {
			_, err = LoadFiles(f)
		}
		elapsed := time.Since(start)
		runtime.ReadMemStats(&after)
		assert.Less(t, elapsed, 30*time.Second, name)
		assert.Less(t, after.TotalAlloc-before.TotalAlloc, uint64(allocPerByte*len(src)+(8<<20)), "%s: bytes allocated for %d bytes of rules", name, len(src))
		if name == "open" || name == "nested" || name == "bangs" {
			require.Error(t, err, name)
			assert.Contains(t, err.Error(), fmt.Sprintf("%s.gsr:1:%d: nested too deeply: more than %d levels", name, 5+MaxNesting, MaxNesting), name)
		}
	}
}

func TestNestingLimit(t *testing.T) {
	deep := func(n int) string {
		return "r = " + strings.Repeat("(", n) + "NOUN" + strings.Repeat(")", n) + " ;"
	}
	_, err := ParseString("ok.gsr", deep(MaxNesting))
	assert.NoError(t, err, "nesting up to the limit is allowed")
	_, err = ParseString("deep.gsr", deep(MaxNesting+1))
	assert.ErrorContains(t, err, fmt.Sprintf("deep.gsr:1:%d: nested too deeply", 5+MaxNesting))
	// ! and ( count together.
	_, err = ParseString("mix.gsr", "r = "+strings.Repeat("!(", MaxNesting/2)+"!NOUN"+strings.Repeat(")", MaxNesting/2)+" ;")
	assert.ErrorContains(t, err, "nested too deeply")
	_, err = ParsePattern(strings.Repeat("(", MaxNesting+1)+"NOUN", nil)
	assert.ErrorContains(t, err, "nested too deeply")
}

func BenchmarkParseAdversarial(b *testing.B) {
	files := adversarialFiles()
	for _, name := range []string{"bangs", "ands", "open", "nested", "alts", "rules"} {
		src := files[name]
		b.Run(name, func(b *testing.B) {
			b.SetBytes(int64(len(src)))
			b.ReportAllocs()
			for b.Loop() {
				if f, err := ParseString(name, src); err == nil {
					LoadFiles(f)
				}
			}
		})
	}
}

func BenchmarkParseStock(b *testing.B) {
	var src string
	for _, name := range StockNames() {
		b, _ := stockFS.ReadFile("stock/" + name + ".gsr")
		src += string(b)
	}
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	for b.Loop() {
		ParseString("stock.gsr", src)
	}
}

// Only rule files are read, and at most MaxFileSize bytes of them: a used
// file that is not one is refused by its name, so no message can quote its
// contents, and an endless file (a device) cannot grow memory.
func TestRuleFilesOnly(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"secret.txt": "root:S3CRET-HASH:19000:0:99999:7:::\n",
		"main.gsr":   "use \"secret.txt\"\nuse \"/dev/zero\"\nr = NOUN ;\n",
		"big.gsr":    "r = NOUN ;\n#" + strings.Repeat("x", MaxFileSize) + "\n",
		"uses.gsr":   "use \"big.gsr\"\n",
	})
	_, err := Load(filepath.Join(dir, "main.gsr"))
	var list ErrorList
	require.ErrorAs(t, err, &list)
	require.Len(t, list, 2)
	assert.Equal(t, "use reads only rule files, whose names end in .gsr: secret.txt", list[0].Msg)
	assert.Equal(t, 1, list[0].Pos.Line)
	assert.Equal(t, "use reads only rule files, whose names end in .gsr: /dev/zero", list[1].Msg)
	assert.NotContains(t, list.Format(), "S3CRET")

	for _, top := range []string{filepath.Join(dir, "secret.txt"), "/dev/zero"} {
		_, err = Load(top)
		require.Error(t, err, top)
		assert.Contains(t, err.Error(), top+": not a rule file")
		assert.NotContains(t, err.Error(), "S3CRET")
	}

	_, err = Load(filepath.Join(dir, "uses.gsr"))
	assert.ErrorContains(t, err, fmt.Sprintf("larger than %d bytes", MaxFileSize))
	_, err = Load(filepath.Join(dir, "big.gsr"))
	assert.ErrorContains(t, err, fmt.Sprintf("larger than %d bytes", MaxFileSize))

	// A device behind a rule file's name is read only up to the cap.
	zero := filepath.Join(dir, "zero.gsr")
	if os.Symlink("/dev/zero", zero) == nil {
		var before, after runtime.MemStats
		runtime.ReadMemStats(&before)
		_, err = Load(zero)
		runtime.ReadMemStats(&after)
		assert.ErrorContains(t, err, "larger than")
		assert.Less(t, after.TotalAlloc-before.TotalAlloc, uint64(16*MaxFileSize))
	}
}
