package textout

import (
	"bufio"
	"encoding"
	"encoding/json"
	"io"
	"reflect"
	"slices"
	"strings"
	"sync"

	"github.com/netsteer/netsteer/structural"
)

// The streaming route of JSON. encoding/json holds a value's whole JSON in
// memory, and copies what a MarshalJSON method returns once more to check
// it; with a name per state or per edge (drivers --roles on 10^8 edges
// writes 3 GB) that costs several times the output in memory and time. So
// JSON walks structs itself, lets the values that can be large
// (structural.JSONWriter) write themselves in pieces, hands every other
// value to encoding/json, and lays the compact bytes out as they pass
// (indenter), never holding the whole output. The bytes are those of
// IndentJSON(json.Marshal(v)); TestJSONStreamMatchesMarshal compares the
// two routes on the results of every question.

var (
	marshalerType     = reflect.TypeFor[json.Marshaler]()
	textMarshalerType = reflect.TypeFor[encoding.TextMarshaler]()
	jsonWriterType    = reflect.TypeFor[structural.JSONWriter]()
)

// encoder writes compact JSON of Go values to w.
type encoder struct {
	w   io.Writer
	err error
}

func (e *encoder) write(b []byte) {
	if e.err == nil {
		_, e.err = e.w.Write(b)
	}
}

// value writes v as encoding/json would.
func (e *encoder) value(v reflect.Value) {
	if e.err != nil {
		return
	}
	if !v.IsValid() {
		e.write([]byte("null"))
		return
	}
	t := v.Type()
	if (t.Kind() == reflect.Pointer || t.Kind() == reflect.Interface) && v.IsNil() {
		e.write([]byte("null"))
		return
	}
	// Methods as encoding/json finds them: on the value, or on its address
	// when it has one.
	if t.Implements(jsonWriterType) && t.Implements(marshalerType) {
		e.stream(v.Interface().(structural.JSONWriter))
		return
	}
	if t.Kind() != reflect.Pointer && v.CanAddr() && reflect.PointerTo(t).Implements(jsonWriterType) && reflect.PointerTo(t).Implements(marshalerType) {
		e.stream(v.Addr().Interface().(structural.JSONWriter))
		return
	}
	if t.Implements(marshalerType) || t.Implements(textMarshalerType) ||
		t.Kind() != reflect.Pointer && v.CanAddr() && (reflect.PointerTo(t).Implements(marshalerType) || reflect.PointerTo(t).Implements(textMarshalerType)) {
		e.marshal(v)
		return
	}
	switch t.Kind() {
	case reflect.Pointer, reflect.Interface:
		e.value(v.Elem())
	case reflect.Struct:
		fields, ok := structFields(t)
		if !ok {
			e.marshal(v)
			return
		}
		e.write([]byte{'{'})
		first := true
		for _, f := range fields {
			fv, ok := fieldValue(v, f.index)
			if !ok || f.omitEmpty && isEmpty(fv) {
				continue
			}
			if !first {
				e.write([]byte{','})
			}
			first = false
			e.write(f.key)
			e.value(fv)
		}
		e.write([]byte{'}'})
	default:
		e.marshal(v)
	}
}

// stream writes a value that writes itself: laid out by itself, on all
// cores, when the indenter is between values outside an array of scalars
// (where the value begins at the indenter's depth), else compact through
// the indenter.
func (e *encoder) stream(x structural.JSONWriter) {
	if d, ok := e.w.(*indenter); ok && d.between() {
		e.err = x.WriteJSONIndent(d.w, d.depth)
		return
	}
	e.err = x.WriteJSON(e.w)
}

// marshal writes v by encoding/json, through its address when it has one
// (so that methods on pointers are found as encoding/json finds them).
func (e *encoder) marshal(v reflect.Value) {
	x := v.Interface()
	if v.Kind() != reflect.Pointer && v.CanAddr() {
		x = v.Addr().Interface()
	}
	b, err := json.Marshal(x)
	if err != nil {
		e.err = err
		return
	}
	e.write(b)
}

// field is a struct field encoding/json writes: its index path (through
// embedded structs), its key (the quoted name and a colon) and omitempty.
type field struct {
	index     []int
	key       []byte
	omitEmpty bool
	name      string
	tagged    bool
}

var fieldCache sync.Map // reflect.Type -> []field, or nil when not handled

// structFields returns the fields of struct type t in encoding/json's
// order, the fields of embedded structs promoted by its rules (the
// shallower name wins, a tagged one among equals, none when still tied),
// or false for a struct this route leaves to encoding/json (the string
// option, an embedded non-struct, a tag name it would not take).
func structFields(t reflect.Type) ([]field, bool) {
	if f, ok := fieldCache.Load(t); ok {
		fs := f.([]field)
		return fs, fs != nil
	}
	var all []field
	ok := collectFields(t, nil, &all, map[reflect.Type]bool{})
	var fs []field
	if ok {
		// Dominance: by name, the shortest index path, then a tag.
		byName := map[string][]field{}
		for _, f := range all {
			byName[f.name] = append(byName[f.name], f)
		}
		for _, f := range all {
			group := byName[f.name]
			if dominant(f, group) {
				fs = append(fs, f)
			}
		}
		slices.SortFunc(fs, func(a, b field) int { return slices.Compare(a.index, b.index) })
		if fs == nil {
			fs = []field{}
		}
	}
	fieldCache.Store(t, fs)
	return fs, ok
}

// dominant reports whether f is the field encoding/json keeps among the
// fields of its name.
func dominant(f field, group []field) bool {
	for _, g := range group {
		if len(g.index) < len(f.index) {
			return false
		}
	}
	rivals := 0
	for _, g := range group {
		if len(g.index) == len(f.index) && !slices.Equal(g.index, f.index) {
			if g.tagged && !f.tagged {
				return false
			}
			if g.tagged == f.tagged {
				rivals++
			}
		}
	}
	return rivals == 0
}

// collectFields appends the fields of struct type t reached by the index
// path at, descending into embedded structs.
func collectFields(t reflect.Type, at []int, out *[]field, seen map[reflect.Type]bool) bool {
	if seen[t] {
		return false
	}
	seen[t] = true
	defer delete(seen, t)
	for i := 0; i < t.NumField(); i++ {
		sf := t.Field(i)
		tag := sf.Tag.Get("json")
		if tag == "-" {
			continue
		}
		name, opts, _ := strings.Cut(tag, ",")
		if strings.Contains(","+opts+",", ",string,") || !validKey(name) {
			return false
		}
		index := append(slices.Clone(at), i)
		if sf.Anonymous && name == "" {
			ft := sf.Type
			if ft.Kind() == reflect.Pointer {
				ft = ft.Elem()
			}
			if ft.Kind() != reflect.Struct {
				return false
			}
			if !collectFields(ft, index, out, seen) {
				return false
			}
			continue
		}
		if !sf.IsExported() {
			continue
		}
		tagged := name != ""
		if name == "" {
			name = sf.Name
		}
		key := append(structural.AppendJSONString(nil, name), ':')
		*out = append(*out, field{index: index, key: key, omitEmpty: strings.Contains(","+opts+",", ",omitempty,"), name: name, tagged: tagged})
	}
	return true
}

// fieldValue returns the field at the index path, false when an embedded
// pointer on the way is nil (encoding/json then leaves the field out).
func fieldValue(v reflect.Value, index []int) (reflect.Value, bool) {
	for k, i := range index {
		if k > 0 && v.Kind() == reflect.Pointer {
			if v.IsNil() {
				return reflect.Value{}, false
			}
			v = v.Elem()
		}
		v = v.Field(i)
	}
	return v, true
}

// validKey reports whether encoding/json takes the tag name as it is:
// letters, digits and a few punctuation characters (else it falls back to
// the field name, which this route leaves to it).
func validKey(s string) bool {
	for _, c := range s {
		switch {
		case strings.ContainsRune("!#$%&()*+-./:;<=>?@[]^_{|}~ ", c):
		case c >= 'a' && c <= 'z', c >= 'A' && c <= 'Z', c >= '0' && c <= '9':
		default:
			return false
		}
	}
	return true
}

// isEmpty is encoding/json's omitempty test.
func isEmpty(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Array, reflect.Map, reflect.Slice, reflect.String:
		return v.Len() == 0
	case reflect.Bool:
		return !v.Bool()
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return v.Int() == 0
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		return v.Uint() == 0
	case reflect.Float32, reflect.Float64:
		return v.Float() == 0
	case reflect.Interface, reflect.Pointer:
		return v.IsNil()
	}
	return false
}

// indenter lays out compact JSON as IndentJSON does, as it is written: one
// key per line, two spaces a level, arrays of scalars on one line. An
// array is told to hold scalars by its first element (the arrays of Go
// values are of one type).
type indenter struct {
	w      *bufio.Writer
	depth  int
	flat   int  // > 0 inside an array of scalars
	inStr  bool // inside a string
	esc    bool // after a backslash in a string
	opened byte // '{' or '[' just written, its layout not yet decided
}

// between reports whether a value written now begins at d.depth, laid
// out with nothing pending: not inside a string, an array of scalars, or a
// container whose layout waits on its first element.
func (d *indenter) between() bool { return !d.inStr && d.flat == 0 && d.opened == 0 }

func (d *indenter) newline() {
	d.w.WriteByte('\n')
	for i := 0; i < d.depth; i++ {
		d.w.WriteString("  ")
	}
}

func (d *indenter) Write(p []byte) (int, error) {
	for i := 0; i < len(p); i++ {
		c := p[i]
		if d.inStr {
			// Copy the run of the string up to its closing quote.
			j := i
			for ; j < len(p); j++ {
				if d.esc {
					d.esc = false
					continue
				}
				if p[j] == '\\' {
					d.esc = true
				} else if p[j] == '"' {
					d.inStr = false
					break
				}
			}
			if j == len(p) {
				d.w.Write(p[i:])
				break
			}
			d.w.Write(p[i : j+1])
			i = j
			continue
		}
		if d.opened != 0 {
			o := d.opened
			d.opened = 0
			switch {
			case o == '{' && c == '}', o == '[' && c == ']':
				d.w.WriteByte(c)
				continue
			case o == '[' && c != '[' && c != '{':
				d.flat++
			default:
				d.depth++
				d.newline()
			}
		}
		switch {
		case c == '"':
			d.w.WriteByte(c)
			d.inStr = true
		case d.flat > 0:
			d.w.WriteByte(c)
			if c == ',' {
				d.w.WriteByte(' ')
			}
			if c == ']' {
				d.flat--
			}
		case c == '{' || c == '[':
			d.w.WriteByte(c)
			d.opened = c
		case c == '}' || c == ']':
			d.depth--
			d.newline()
			d.w.WriteByte(c)
		case c == ',':
			d.w.WriteByte(c)
			d.newline()
		case c == ':':
			d.w.WriteString(": ")
		default:
			d.w.WriteByte(c)
		}
	}
	return len(p), nil
}
