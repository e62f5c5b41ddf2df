package hmm

import (
	"bytes"
	"compress/flate"
	"encoding/binary"
	"errors"
	"fmt"
	"hash/crc32"
	"io"
	"maps"
	"math"
	"os"
	"slices"

	"glossmith/tagger/lemma"
)

// The model file format, version 3:
//
//	magic    "GLSMTAG\x00" (8 bytes)
//	version  uint16, little endian
//	length   uint64, little endian: bytes of the payload as stored
//	size     uint64, little endian: bytes of the payload inflated
//	payload  the model, in varints and length-prefixed strings, compressed
//	         with DEFLATE (RFC 1951) at the best compression level
//	crc      uint32, little endian: CRC-32 (IEEE) of everything before it
//
// Version 5 adds after it the table of general-English frequency bands
// (package genfreq; empty when the model has none). Version 4 adds to the
// payload the table of WordNet word classes the
// perceptron's features read (empty when the model has none). Version 3
// is the same without it, version 2 also without the size field, version
// 1 also stores the payload uncompressed; all are still read. Compression keeps the
// treebank's vocabulary, which the model carries for reference counts,
// out of plain sight in the binary. The size lets a reader inflate into a
// buffer of exactly that size and refuse a payload that inflates further,
// so a small crafted file cannot make it allocate far beyond what it says.
//
// Every map is written in sorted order, so a model always encodes to the
// same bytes. Perceptron weights are stored as integer multiples of
// weightStep; the model in memory holds the same rounded values.
const (
	fileMagic   = "GLSMTAG\x00"
	fileVersion = 5
	// headerSize is the header of version 3, headerSizeV2 that of
	// versions 1 and 2 (no size field).
	headerSizeV2 = len(fileMagic) + 2 + 8
	headerSize   = headerSizeV2 + 8
	// MaxFileSize bounds a model file and MaxPayloadSize its inflated
	// payload (the README states both): the default model is 2.2 MB and
	// inflates to 4.2 MB, so the caps leave room for models of treebanks
	// some fifteen times larger while a crafted file or a device such as
	// /dev/zero cannot make Load or Decode allocate without limit.
	MaxFileSize    = 64 << 20
	MaxPayloadSize = 64 << 20
)

// FormatError describes a model file that cannot be used.
type FormatError struct {
	File string // may be empty for in-memory data
	Msg  string
}

func (e *FormatError) Error() string {
	if e.File == "" {
		return "tagger model: " + e.Msg
	}
	return e.File + ": tagger model: " + e.Msg
}

// Load reads a model file written by Save.
func Load(path string) (*Model, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	data, err := readModelFile(f)
	var m *Model
	if err == nil {
		m, err = Decode(data)
	}
	var fe *FormatError
	if errors.As(err, &fe) {
		fe.File = path
	}
	return m, err
}

// readModelFile reads the bytes of a model file: its header, then no more
// than the header announces (and one byte past it, so that Decode sees
// trailing data), never more than MaxFileSize. Anything that is not a
// model — a text file, a device such as /dev/zero — costs the read of a
// header; Decode says what is wrong with it.
func readModelFile(r io.Reader) ([]byte, error) {
	head := make([]byte, headerSize)
	k, err := io.ReadFull(r, head)
	if err != nil && err != io.EOF && err != io.ErrUnexpectedEOF {
		return nil, err
	}
	head = head[:k]
	if k < headerSizeV2 || string(head[:len(fileMagic)]) != fileMagic {
		return head, nil
	}
	version := binary.LittleEndian.Uint16(head[len(fileMagic):])
	hs := headerSizeV2
	if version >= 3 {
		hs = headerSize
	}
	n := binary.LittleEndian.Uint64(head[len(fileMagic)+2:])
	if n > MaxFileSize || uint64(hs)+n+4 > MaxFileSize {
		return nil, &FormatError{Msg: fmt.Sprintf("the header announces %d bytes of payload; a model file may have at most %d bytes (%d MiB)", n, MaxFileSize, MaxFileSize>>20)}
	}
	want := hs + int(n) + 4 + 1
	if want <= len(head) {
		return head, nil
	}
	data := make([]byte, want)
	copy(data, head)
	k, err = io.ReadFull(r, data[len(head):])
	if err != nil && err != io.EOF && err != io.ErrUnexpectedEOF {
		return nil, err
	}
	return data[:len(head)+k], nil
}

// Decode builds a model from the bytes of a model file.
func Decode(data []byte) (*Model, error) {
	fail := func(format string, args ...any) (*Model, error) {
		return nil, &FormatError{Msg: fmt.Sprintf(format, args...)}
	}
	if len(data) < len(fileMagic) || string(data[:len(fileMagic)]) != fileMagic {
		return fail("not a glossmith tagger model (wrong magic bytes)")
	}
	if len(data) < headerSizeV2 {
		return fail("truncated: %d bytes, shorter than the %d-byte header", len(data), headerSizeV2)
	}
	version := binary.LittleEndian.Uint16(data[len(fileMagic):])
	if version > fileVersion {
		return fail("format version %d is newer than this glossmith reads (up to %d); use a newer glossmith or retrain the model", version, fileVersion)
	}
	if version == 0 {
		return fail("invalid format version 0")
	}
	hs := headerSizeV2
	if version >= 3 {
		hs = headerSize
		if len(data) < hs {
			return fail("truncated: %d bytes, shorter than the %d-byte header", len(data), hs)
		}
	}
	n := binary.LittleEndian.Uint64(data[len(fileMagic)+2:])
	want := uint64(hs) + n + 4
	if n > uint64(len(data)) || uint64(len(data)) < want {
		return fail("truncated: %d bytes, the header announces %d", len(data), want)
	}
	if uint64(len(data)) > want {
		return fail("%d bytes of unexpected data after the model", uint64(len(data))-want)
	}
	body := data[:hs+int(n)]
	sum := binary.LittleEndian.Uint32(data[hs+int(n):])
	if crc32.ChecksumIEEE(body) != sum {
		return fail("checksum mismatch: the file is corrupt")
	}
	payload := body[hs:]
	if version >= 2 {
		size := uint64(MaxPayloadSize) // version 2 declares no size: the cap bounds it
		if version >= 3 {
			size = binary.LittleEndian.Uint64(data[headerSizeV2:])
			if size > MaxPayloadSize {
				return fail("the header announces a payload of %d bytes inflated; at most %d (%d MiB) are read", size, MaxPayloadSize, MaxPayloadSize>>20)
			}
		}
		raw, err := inflate(payload, int(size), version >= 3)
		if err != nil {
			return fail("%v", err)
		}
		payload = raw
	}
	m, err := decodePayload(payload, version)
	if err != nil {
		return fail("malformed payload: %v", err)
	}
	return m, nil
}

// inflate decompresses a payload of at most size bytes, exactly size when
// exact is set (the size the header declares). It allocates no more than
// that, whatever the stream would inflate to.
func inflate(payload []byte, size int, exact bool) ([]byte, error) {
	r := flate.NewReader(bytes.NewReader(payload))
	var raw []byte
	var err error
	if exact {
		raw = make([]byte, size)
		if _, err = io.ReadFull(r, raw); err != nil {
			return nil, fmt.Errorf("malformed compressed payload: it inflates to less than the %d bytes the header announces (%v)", size, err)
		}
	} else if raw, err = io.ReadAll(io.LimitReader(r, int64(size))); err != nil {
		return nil, fmt.Errorf("malformed compressed payload: %v", err)
	}
	// One byte more than allowed, or a stream that does not end, is an error.
	if more, err := io.ReadAll(io.LimitReader(r, 1)); err != nil || len(more) > 0 {
		if err != nil {
			return nil, fmt.Errorf("malformed compressed payload: %v", err)
		}
		if exact {
			return nil, fmt.Errorf("payload inflates beyond the %d bytes the header announces", size)
		}
		return nil, fmt.Errorf("payload inflates beyond %d bytes (%d MiB)", size, size>>20)
	}
	return raw, nil
}

// Save writes the model in the format above.
func (m *Model) Save(w io.Writer) error {
	var e enc
	m.encodePayload(&e, fileVersion)
	if len(e.b) > MaxPayloadSize {
		return fmt.Errorf("tagger model: the model's payload is %d bytes; a model file holds at most %d (%d MiB)", len(e.b), MaxPayloadSize, MaxPayloadSize>>20)
	}
	var z bytes.Buffer
	fw, err := flate.NewWriter(&z, flate.BestCompression)
	if err != nil {
		return err
	}
	if _, err := fw.Write(e.b); err != nil {
		return err
	}
	if err := fw.Close(); err != nil {
		return err
	}
	var out bytes.Buffer
	out.WriteString(fileMagic)
	out.Write(binary.LittleEndian.AppendUint16(nil, fileVersion))
	out.Write(binary.LittleEndian.AppendUint64(nil, uint64(z.Len())))
	out.Write(binary.LittleEndian.AppendUint64(nil, uint64(len(e.b))))
	out.Write(z.Bytes())
	out.Write(binary.LittleEndian.AppendUint32(nil, crc32.ChecksumIEEE(out.Bytes())))
	_, err = w.Write(out.Bytes())
	return err
}

type enc struct{ b []byte }

func (e *enc) uint(v uint64)  { e.b = binary.AppendUvarint(e.b, v) }
func (e *enc) int(v int64)    { e.b = binary.AppendVarint(e.b, v) }
func (e *enc) str(s string)   { e.uint(uint64(len(s))); e.b = append(e.b, s...) }
func (e *enc) f32(v float32)  { e.b = binary.LittleEndian.AppendUint32(e.b, math.Float32bits(v)) }
func (e *enc) bytes(b []byte) { e.uint(uint64(len(b))); e.b = append(e.b, b...) }

type dec struct {
	b   []byte
	err error
}

func (d *dec) fail(msg string) {
	if d.err == nil {
		d.err = errors.New(msg)
	}
}

func (d *dec) uint() uint64 { return varint(d, binary.Uvarint) }

func (d *dec) int() int64 { return varint(d, binary.Varint) }

// varint reads one varint with read (binary.Uvarint or binary.Varint).
func varint[T uint64 | int64](d *dec, read func([]byte) (T, int)) T {
	if d.err != nil {
		return 0
	}
	v, n := read(d.b)
	if n <= 0 {
		d.fail("bad varint")
		return 0
	}
	d.b = d.b[n:]
	return v
}

// count reads a length and checks it against the bytes left, each item
// taking at least minBytes, so corrupt data cannot ask for huge memory.
func (d *dec) count(minBytes int) int {
	v := d.uint()
	if v > uint64(len(d.b)/max(1, minBytes)+1) {
		d.fail("count out of range")
		return 0
	}
	return int(v)
}

func (d *dec) raw(n int) []byte {
	if d.err != nil {
		return nil
	}
	if n > len(d.b) {
		d.fail("unexpected end of data")
		return nil
	}
	b := d.b[:n]
	d.b = d.b[n:]
	return b
}

func (d *dec) str() string   { return string(d.raw(d.count(1))) }
func (d *dec) bytes() []byte { return d.raw(d.count(1)) }
func (d *dec) f32() float32 {
	b := d.raw(4)
	if b == nil {
		return 0
	}
	return math.Float32frombits(binary.LittleEndian.Uint32(b))
}

func (d *dec) tag(nt int) uint8 {
	v := d.uint()
	if v >= uint64(nt) {
		d.fail("tag index out of range")
		return 0
	}
	return uint8(v)
}

// encodePayload writes the payload of a file of the given version (only
// tests write older ones).
func (m *Model) encodePayload(e *enc, version int) {
	e.str(m.method)
	e.str(m.tagset)
	e.str(m.source)
	e.uint(uint64(m.epochs))
	e.f32(m.beam)
	e.uint(uint64(len(m.tags)))
	for _, t := range m.tags {
		e.str(t)
	}
	forms := slices.Sorted(maps.Keys(m.lex))
	e.uint(uint64(len(forms)))
	for _, f := range forms {
		w := m.words[m.lex[f]]
		e.str(f)
		e.uint(uint64(w.ntags))
		for j := w.first; j < w.first+w.ntags; j++ {
			e.uint(uint64(m.wtags[j]))
			e.uint(uint64(m.wcount[j]))
		}
	}
	e.uint(uint64(len(m.uposByTag)))
	for _, u := range m.uposByTag {
		e.str(u)
	}
	ws := slices.Sorted(maps.Keys(m.uposByWord))
	e.uint(uint64(len(ws)))
	for _, w := range ws {
		e.str(w)
		e.uint(uint64(len(m.uposByWord[w])))
		for _, c := range m.uposByWord[w] {
			e.uint(uint64(c.xpos))
			e.str(c.upos)
		}
	}
	lb, _ := m.lem.MarshalBinary()
	e.bytes(lb)
	for _, ref := range []map[string]int32{m.refForm, m.refLemma} {
		ks := slices.Sorted(maps.Keys(ref))
		e.uint(uint64(len(ks)))
		for _, k := range ks {
			e.str(k)
			e.uint(uint64(ref[k]))
		}
	}
	e.uint(uint64(m.refSize))
	if version >= 4 {
		e.str(m.wnText)
	}
	if version >= 5 {
		e.str(m.freqText)
	}
	switch m.method {
	case MethodHMM:
		m.gen.encode(e)
	case MethodPerceptron:
		m.perc.encode(e)
	}
}

func decodePayload(b []byte, version uint16) (*Model, error) {
	d := &dec{b: b}
	m := &Model{}
	m.method = d.str()
	m.tagset = d.str()
	m.source = d.str()
	m.epochs = int(d.uint())
	m.beam = d.f32()
	if d.err == nil && m.method != MethodHMM && m.method != MethodPerceptron {
		return nil, fmt.Errorf("unknown method %q", m.method)
	}
	if d.err == nil && m.tagset != TagsetJoint && m.tagset != TagsetXPOS {
		return nil, fmt.Errorf("unknown tag set %q", m.tagset)
	}
	nt := d.count(1)
	if d.err == nil && (nt == 0 || nt > maxTags) {
		return nil, fmt.Errorf("%d tags", nt)
	}
	for i := 0; i < nt && d.err == nil; i++ {
		m.tags = append(m.tags, d.str())
	}
	m.splitTags()
	if d.err == nil && m.tagset == TagsetJoint {
		for _, u := range m.tagU {
			if u == "" {
				return nil, errors.New("joint tag without UPOS")
			}
		}
	}
	nw := d.count(2)
	m.lex = make(map[string]int32, nw)
	for i := 0; i < nw && d.err == nil; i++ {
		f := d.str()
		w := wordEntry{first: int32(len(m.wtags))}
		k := d.count(2)
		for j := 0; j < k && d.err == nil; j++ {
			m.wtags = append(m.wtags, d.tag(nt))
			c := int32(d.uint())
			m.wcount = append(m.wcount, c)
			w.count += c
		}
		w.ntags = int32(k)
		m.lex[f] = int32(len(m.words))
		m.words = append(m.words, w)
	}
	nu := d.count(1)
	if d.err == nil && nu != 0 && nu != nt {
		return nil, errors.New("UPOS table does not match the tags")
	}
	for i := 0; i < nu && d.err == nil; i++ {
		m.uposByTag = append(m.uposByTag, d.str())
	}
	nw = d.count(2)
	m.uposByWord = make(map[string][]uposChoice, nw)
	for i := 0; i < nw && d.err == nil; i++ {
		w := d.str()
		k := d.count(2)
		cs := make([]uposChoice, 0, k)
		for j := 0; j < k && d.err == nil; j++ {
			x := d.tag(nt)
			cs = append(cs, uposChoice{x, d.str()})
		}
		m.uposByWord[w] = cs
	}
	if d.err == nil && m.tagset == TagsetXPOS && nu != nt {
		return nil, errors.New("UPOS table missing")
	}
	lb := d.bytes()
	if d.err != nil {
		return nil, d.err
	}
	m.lem = &lemma.Lemmatizer{}
	if err := m.lem.UnmarshalBinary(lb); err != nil {
		return nil, err
	}
	m.refForm = map[string]int32{}
	m.refLemma = map[string]int32{}
	for _, ref := range []map[string]int32{m.refForm, m.refLemma} {
		k := d.count(2)
		for i := 0; i < k && d.err == nil; i++ {
			s := d.str()
			ref[s] = int32(d.uint())
		}
	}
	m.refSize = int(d.uint())
	if version >= 4 {
		if text := d.str(); d.err == nil && text != "" {
			if err := m.setWordClasses(text); err != nil {
				return nil, err
			}
		}
	}
	if version >= 5 {
		if text := d.str(); d.err == nil && text != "" {
			if err := m.setGeneralFrequencies(text); err != nil {
				return nil, err
			}
		}
	}
	if d.err == nil {
		m.prepareLexicon()
	}
	switch m.method {
	case MethodHMM:
		m.gen = decodeGenerative(d, nt)
		if d.err == nil {
			m.gen.finish(m)
		}
	case MethodPerceptron:
		m.perc = decodePerceptron(d, m)
	}
	if d.err != nil {
		return nil, d.err
	}
	if len(d.b) != 0 {
		return nil, fmt.Errorf("%d unread bytes", len(d.b))
	}
	return m, nil
}

func (g *generative) encode(e *enc) {
	e.uint(uint64(g.suffixLen))
	for _, tab := range [][]int32{g.uni, g.bi, g.ctx2} {
		for _, c := range tab {
			e.uint(uint64(c))
		}
	}
	keys := slices.Sorted(maps.Keys(g.tri))
	e.uint(uint64(len(keys)))
	prev := int32(0)
	for _, k := range keys {
		e.uint(uint64(k - prev))
		e.uint(uint64(g.tri[k]))
		prev = k
	}
	for _, st := range g.suf {
		sufs := slices.Sorted(maps.Keys(st.entries))
		e.uint(uint64(len(sufs)))
		for _, s := range sufs {
			en := st.entries[s]
			e.str(s)
			e.uint(uint64(len(en.tags)))
			for j, t := range en.tags {
				e.uint(uint64(t))
				e.uint(uint64(en.count[j]))
			}
		}
	}
}

func decodeGenerative(d *dec, nt int) *generative {
	t1 := nt + 1
	g := &generative{suffixLen: int(d.uint()), tri: map[int32]int32{}}
	read := func(n int) []int32 {
		out := make([]int32, n)
		for i := range out {
			out[i] = int32(d.uint())
		}
		return out
	}
	g.uni = read(t1)
	g.bi = read(t1 * t1)
	g.ctx2 = read(t1 * t1)
	k := d.count(2)
	prev := int32(0)
	for i := 0; i < k && d.err == nil; i++ {
		prev += int32(d.uint())
		if prev < 0 || int(prev) >= t1*t1*t1 {
			d.fail("trigram index out of range")
			break
		}
		g.tri[prev] = int32(d.uint())
	}
	var total int64
	for _, c := range g.uni {
		total += int64(c)
	}
	if d.err == nil && total == 0 {
		d.fail("empty tag counts")
	}
	for i := range g.suf {
		st := &suffixTable{entries: map[string]suffixEntry{}}
		n := d.count(2)
		for j := 0; j < n && d.err == nil; j++ {
			s := d.str()
			var en suffixEntry
			nt2 := d.count(2)
			for x := 0; x < nt2 && d.err == nil; x++ {
				en.tags = append(en.tags, d.tag(nt))
				c := int32(d.uint())
				en.count = append(en.count, c)
				en.total += c
			}
			if en.total <= 0 {
				d.fail("empty suffix entry")
			}
			st.entries[s] = en
		}
		g.suf[i] = st
	}
	return g
}

func (p *perceptron) encode(e *enc) {
	e.uint(uint64(p.dictMin))
	e.uint(uint64(p.maxCands))
	e.uint(uint64(len(p.keys)))
	prev := uint64(0)
	for i, k := range p.keys {
		e.uint(k - prev)
		prev = k
		a, b := p.rowStart[i], p.rowStart[i+1]
		e.uint(uint64(b - a))
		for _, c := range p.cells[a:b] {
			e.uint(uint64(c.t))
			e.int(int64(c.q))
		}
	}
	e.uint(uint64(len(p.layers)))
	for _, y := range p.layers {
		e.uint(uint64(y.n1))
		for _, c := range y.proj {
			e.uint(uint64(c))
		}
		for _, tab := range [][]float32{y.tri, y.bi} {
			nz := 0
			for _, v := range tab {
				if v != 0 {
					nz++
				}
			}
			e.uint(uint64(nz))
			last := -1
			for i, v := range tab {
				if v != 0 {
					e.uint(uint64(i - last))
					e.int(int64(math.Round(float64(v) / weightStep)))
					last = i
				}
			}
		}
	}
}

func decodePerceptron(d *dec, m *Model) *perceptron {
	nt := len(m.tags)
	t1 := nt + 1
	p := &perceptron{dictMin: int32(d.uint()), maxCands: int(d.uint())}
	if d.err == nil && (p.maxCands <= 0 || p.maxCands > nt) {
		p.maxCands = min(max(p.maxCands, 1), nt)
	}
	n := d.count(2)
	p.keys = make([]uint64, 0, n)
	p.rowStart = append(make([]int32, 0, n+1), 0)
	prev := uint64(0)
	for i := 0; i < n && d.err == nil; i++ {
		delta := d.uint()
		if i > 0 && delta == 0 {
			d.fail("feature keys not increasing")
		}
		prev += delta
		p.keys = append(p.keys, prev)
		k := d.count(2)
		for j := 0; j < k && d.err == nil; j++ {
			t := d.tag(nt)
			q := d.int()
			if q < math.MinInt16 || q > math.MaxInt16 {
				d.fail("feature weight out of range")
			}
			p.cells = append(p.cells, cell{q: int16(q), t: t})
		}
		p.rowStart = append(p.rowStart, int32(len(p.cells)))
	}
	nl := d.count(1)
	if d.err == nil && (nl == 0 || nl > 3) {
		d.fail("bad number of transition layers")
	}
	for l := 0; l < nl && d.err == nil; l++ {
		n1 := int(d.uint())
		if n1 < 2 || n1 > t1 {
			d.fail("bad transition layer size")
			break
		}
		y := transLayer{n1: n1, proj: make([]uint8, t1), tri: make([]float32, n1*n1*n1), bi: make([]float32, n1*n1)}
		for i := range y.proj {
			y.proj[i] = d.tag(n1)
		}
		for _, tab := range [][]float32{y.tri, y.bi} {
			nz := d.count(2)
			pos := -1
			for i := 0; i < nz && d.err == nil; i++ {
				pos += int(d.uint())
				if pos < 0 || pos >= len(tab) {
					d.fail("transition index out of range")
					break
				}
				tab[pos] = float32(float64(d.int()) * weightStep)
			}
		}
		p.layers = append(p.layers, y)
	}
	if d.err != nil {
		return nil
	}
	p.prepare(m)
	return p
}
