package main

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestMemorySize(t *testing.T) {
	for in, want := range map[string]memorySize{
		"1GiB": 1 << 30, "512MiB": 512 << 20, "800MB": 800 << 20, "2g": 2 << 30,
		"1.5G": 3 << 29, "67108864": 64 << 20, "1.0 GiB": 1 << 30, // the default as printed
		"16MiB": minMemory, "65536G": maxMemory,
	} {
		var m memorySize
		if assert.NoError(t, m.Set(in), "--memory %s", in) {
			assert.Equal(t, want, m, "--memory %s", in)
		}
	}
	// NaN and infinities are numbers to strconv.ParseFloat; 1e30 bytes is
	// no machine's memory.
	for _, bad := range []string{"", "lots", "1MB", "-2G", "GiB", "NaN", "nan", "Inf", "+Inf", "-Inf", "1e30", "1e400", "65537G"} {
		var m memorySize
		assert.Error(t, m.Set(bad), "--memory %q accepted as %d", bad, m)
	}
	m := defaultMemory
	assert.Equal(t, "1.0 GiB", m.String())
}
