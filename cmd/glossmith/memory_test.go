package main

import "testing"

func TestMemorySize(t *testing.T) {
	for in, want := range map[string]memorySize{
		"1GiB": 1 << 30, "512MiB": 512 << 20, "800MB": 800 << 20, "2g": 2 << 30,
		"1.5G": 3 << 29, "67108864": 64 << 20, "1.0 GiB": 1 << 30, // the default as printed
	} {
		var m memorySize
		if err := m.Set(in); err != nil || m != want {
			t.Errorf("--memory %s = %d, %v; want %d", in, m, err, want)
		}
	}
	for _, bad := range []string{"", "lots", "1MB", "-2G", "GiB"} {
		var m memorySize
		if err := m.Set(bad); err == nil {
			t.Errorf("--memory %q accepted as %d", bad, m)
		}
	}
	m := defaultMemory
	if got := m.String(); got != "1.0 GiB" {
		t.Errorf("default prints as %q", got)
	}
}
