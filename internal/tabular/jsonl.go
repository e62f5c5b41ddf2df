package tabular

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"reflect"
	"slices"
	"strconv"
	"strings"
	"sync"
)

// JSONL writes one JSON value per line. It encodes as encoding/json does
// (field names and omitempty from the json tags, map keys sorted, HTML
// characters left alone), except that a float is always written with a
// fraction or an exponent and a nil slice as [] rather than null: a reader
// that infers a column's type from its values (a data-frame reader, a
// JSON schema) then sees one type in every line.
type JSONL struct {
	w   *bufio.Writer
	buf bytes.Buffer
	enc *json.Encoder
	err error
}

// NewJSONL returns a JSON Lines writer.
func NewJSONL(w io.Writer) *JSONL {
	j := &JSONL{w: bufio.NewWriter(w)}
	j.enc = json.NewEncoder(&j.buf)
	j.enc.SetEscapeHTML(false)
	return j
}

// Encode writes v and a line break.
func (j *JSONL) Encode(v any) error {
	if j.err != nil {
		return j.err
	}
	if err := j.value(reflect.ValueOf(v)); err != nil {
		j.err = err
		return err
	}
	_, j.err = j.w.WriteString("\n")
	return j.err
}

// Flush writes what is buffered.
func (j *JSONL) Flush() error {
	if j.err != nil {
		return j.err
	}
	j.err = j.w.Flush()
	return j.err
}

// plain writes v through encoding/json.
func (j *JSONL) plain(v reflect.Value) error {
	j.buf.Reset()
	if err := j.enc.Encode(v.Interface()); err != nil {
		return err
	}
	_, err := j.w.Write(bytes.TrimSuffix(j.buf.Bytes(), []byte("\n")))
	return err
}

var marshaler = reflect.TypeFor[json.Marshaler]()

func (j *JSONL) value(v reflect.Value) error {
	if !v.IsValid() {
		_, err := j.w.WriteString("null")
		return err
	}
	t := v.Type()
	if t.Implements(marshaler) || !hasFloatOrSlice(t) {
		return j.plain(v)
	}
	switch t.Kind() {
	case reflect.Float32, reflect.Float64:
		return j.float(v.Float(), t.Bits())
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			_, err := j.w.WriteString("null")
			return err
		}
		return j.value(v.Elem())
	case reflect.Slice, reflect.Array:
		j.w.WriteByte('[')
		for i := 0; i < v.Len(); i++ {
			if i > 0 {
				j.w.WriteByte(',')
			}
			if err := j.value(v.Index(i)); err != nil {
				return err
			}
		}
		j.w.WriteByte(']')
		return nil
	case reflect.Struct:
		return j.object(v)
	case reflect.Map:
		if t.Key().Kind() != reflect.String || v.IsNil() {
			return j.plain(v)
		}
		keys := v.MapKeys()
		slices.SortFunc(keys, func(a, b reflect.Value) int { return strings.Compare(a.String(), b.String()) })
		j.w.WriteByte('{')
		for i, k := range keys {
			if i > 0 {
				j.w.WriteByte(',')
			}
			if err := j.plain(reflect.ValueOf(k.String())); err != nil {
				return err
			}
			j.w.WriteByte(':')
			if err := j.value(v.MapIndex(k)); err != nil {
				return err
			}
		}
		j.w.WriteByte('}')
		return nil
	}
	return j.plain(v)
}

func (j *JSONL) float(x float64, bits int) error {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return fmt.Errorf("json: unsupported value: %v", x)
	}
	// encoding/json's choice of notation, so values read the same.
	f := byte('f')
	if a := math.Abs(x); a != 0 && (bits == 64 && (a < 1e-6 || a >= 1e21) || bits == 32 && (float32(a) < 1e-6 || float32(a) >= 1e21)) {
		f = 'e'
	}
	b := strconv.AppendFloat(nil, x, f, -1, bits)
	if f == 'e' {
		// clean up e-09 to e-9, as encoding/json does
		if n := len(b); n >= 4 && b[n-4] == 'e' && b[n-3] == '-' && b[n-2] == '0' {
			b[n-2] = b[n-1]
			b = b[:n-1]
		}
	} else if bytes.IndexByte(b, '.') < 0 {
		b = append(b, ".0"...)
	}
	_, err := j.w.Write(b)
	return err
}

func (j *JSONL) object(v reflect.Value) error {
	j.w.WriteByte('{')
	first := true
	for _, f := range fieldsOf(v.Type()) {
		fv := v.Field(f.index)
		if f.omitEmpty && isEmpty(fv) {
			continue
		}
		if !first {
			j.w.WriteByte(',')
		}
		first = false
		j.w.Write(f.key)
		if f.quoted && fv.Kind() != reflect.String {
			j.buf.Reset()
			if err := j.enc.Encode(fv.Interface()); err != nil {
				return err
			}
			if err := j.plain(reflect.ValueOf(strings.TrimSpace(j.buf.String()))); err != nil {
				return err
			}
			continue
		}
		if err := j.value(fv); err != nil {
			return err
		}
	}
	j.w.WriteByte('}')
	return nil
}

type field struct {
	index     int
	key       []byte // `"name":`
	omitEmpty bool
	quoted    bool // ",string"
}

var fieldCache sync.Map // reflect.Type → []field

// fieldsOf lists the encoded fields of a struct type the way encoding/json
// names them. Embedded structs are not flattened: glossmith's records
// have none (a type with one is written through encoding/json when it
// has no float field).
func fieldsOf(t reflect.Type) []field {
	if fs, ok := fieldCache.Load(t); ok {
		return fs.([]field)
	}
	var fs []field
	for i := 0; i < t.NumField(); i++ {
		sf := t.Field(i)
		if !sf.IsExported() {
			continue
		}
		tag := sf.Tag.Get("json")
		if tag == "-" {
			continue
		}
		name, opts, _ := strings.Cut(tag, ",")
		if name == "" {
			name = sf.Name
		}
		key, _ := json.Marshal(name)
		f := field{index: i, key: append(key, ':')}
		for _, o := range strings.Split(opts, ",") {
			switch o {
			case "omitempty":
				f.omitEmpty = true
			case "string":
				f.quoted = true
			}
		}
		fs = append(fs, f)
	}
	fieldCache.Store(t, fs)
	return fs
}

func isEmpty(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Array, reflect.Map, reflect.Slice, reflect.String:
		return v.Len() == 0
	case reflect.Bool, reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64,
		reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr,
		reflect.Float32, reflect.Float64, reflect.Interface, reflect.Pointer:
		return v.IsZero()
	}
	return false
}

var floatCache sync.Map // reflect.Type → bool

// hasFloatOrSlice reports whether values of t may hold a float or a slice
// (which encoding/json would write as 1 or null); other types go to
// encoding/json whole.
func hasFloatOrSlice(t reflect.Type) bool {
	if b, ok := floatCache.Load(t); ok {
		return b.(bool)
	}
	floatCache.Store(t, true) // a recursive type: assume so while looking
	b := false
	switch t.Kind() {
	case reflect.Float32, reflect.Float64, reflect.Interface:
		b = true
	case reflect.Slice:
		b = t.Elem().Kind() != reflect.Uint8 // []byte is base64 in encoding/json
	case reflect.Pointer, reflect.Array:
		b = hasFloatOrSlice(t.Elem())
	case reflect.Map:
		b = hasFloatOrSlice(t.Elem())
	case reflect.Struct:
		for i := 0; i < t.NumField(); i++ {
			sf := t.Field(i)
			if sf.Anonymous { // embedded fields are flattened: left to encoding/json
				b = false
				break
			}
			if sf.IsExported() && hasFloatOrSlice(sf.Type) {
				b = true
			}
		}
	}
	floatCache.Store(t, b)
	return b
}
