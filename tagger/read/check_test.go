package read

import (
	"fmt"
	"reflect"
	"strings"
	"testing"
)

// checker holds the few assertions these tests use. (testify is in go.mod
// but its go.sum entries are incomplete, and helpers must not edit go.mod.)
// assert reports and goes on; require stops the test.
type checker struct{ fatal bool }

var (
	assert  = checker{false}
	require = checker{true}
)

func (c checker) fail(t testing.TB, what string, msg []any) {
	t.Helper()
	if len(msg) > 0 {
		if f, ok := msg[0].(string); ok {
			what += ": " + fmt.Sprintf(f, msg[1:]...)
		} else {
			what += fmt.Sprint(msg...)
		}
	}
	if c.fatal {
		t.Fatal(what)
	}
	t.Error(what)
}

func isNil(v any) bool {
	if v == nil {
		return true
	}
	rv := reflect.ValueOf(v)
	switch rv.Kind() {
	case reflect.Pointer, reflect.Slice, reflect.Map, reflect.Interface, reflect.Func, reflect.Chan:
		return rv.IsNil()
	}
	return false
}

func (c checker) Equal(t testing.TB, want, got any, msg ...any) {
	t.Helper()
	if !reflect.DeepEqual(want, got) {
		c.fail(t, fmt.Sprintf("got  %#v\nwant %#v", got, want), msg)
	}
}

func (c checker) NotNil(t testing.TB, v any, msg ...any) {
	t.Helper()
	if isNil(v) {
		c.fail(t, "unexpected nil", msg)
	}
}

func (c checker) Nil(t testing.TB, v any, msg ...any) {
	t.Helper()
	if !isNil(v) {
		c.fail(t, fmt.Sprintf("want nil, got %#v", v), msg)
	}
}

func (c checker) NoError(t testing.TB, err error, msg ...any) {
	t.Helper()
	if err != nil {
		c.fail(t, "unexpected error: "+err.Error(), msg)
	}
}

func (c checker) True(t testing.TB, b bool, msg ...any) {
	t.Helper()
	if !b {
		c.fail(t, "want true", msg)
	}
}

func (c checker) False(t testing.TB, b bool, msg ...any) {
	t.Helper()
	if b {
		c.fail(t, "want false", msg)
	}
}

func (c checker) Len(t testing.TB, v any, n int, msg ...any) {
	t.Helper()
	if l := reflect.ValueOf(v).Len(); l != n {
		c.fail(t, fmt.Sprintf("length %d, want %d: %#v", l, n, v), msg)
	}
}

func (c checker) Empty(t testing.TB, v any, msg ...any) {
	t.Helper()
	if v != nil && reflect.ValueOf(v).Len() != 0 {
		c.fail(t, fmt.Sprintf("want empty, got %#v", v), msg)
	}
}

func (c checker) NotEmpty(t testing.TB, v any, msg ...any) {
	t.Helper()
	if v == nil || reflect.ValueOf(v).Len() == 0 {
		c.fail(t, "want non-empty", msg)
	}
}

func (c checker) Contains(t testing.TB, s, sub string, msg ...any) {
	t.Helper()
	if !strings.Contains(s, sub) {
		c.fail(t, fmt.Sprintf("%q does not contain %q", s, sub), msg)
	}
}

func (c checker) NotContains(t testing.TB, s, sub string, msg ...any) {
	t.Helper()
	if strings.Contains(s, sub) {
		c.fail(t, fmt.Sprintf("%q contains %q", s, sub), msg)
	}
}

func (c checker) Less(t testing.TB, a, b int, msg ...any) {
	t.Helper()
	if a >= b {
		c.fail(t, fmt.Sprintf("%d is not less than %d", a, b), msg)
	}
}
