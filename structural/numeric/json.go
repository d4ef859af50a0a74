package numeric

import (
	"encoding/json"
	"math"
	"strconv"
)

// field is one key of a flat JSON object, kept in order. A nil value is
// left out. The same list writes a trial's JSON object and its CSV row, so
// the two cannot drift apart.
type field struct {
	key string
	val any
}

// num returns x for JSON, or nil (the key is left out) when x is NaN or
// infinite: such values never reach JSON.
func num(x float64) any {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	return x
}

// marshalFields writes the fields as one JSON object.
func marshalFields(fs []field) ([]byte, error) {
	b := []byte{'{'}
	first := true
	for _, f := range fs {
		if f.val == nil {
			continue
		}
		v, err := json.Marshal(f.val)
		if err != nil {
			return nil, err
		}
		if !first {
			b = append(b, ',')
		}
		first = false
		b = strconv.AppendQuote(b, f.key)
		b = append(b, ':')
		b = append(b, v...)
	}
	return append(b, '}'), nil
}

// cell formats a scalar field for CSV: numbers as strconv's shortest
// form, booleans as true/false, nil as empty.
func cell(v any) string {
	switch x := v.(type) {
	case nil:
		return ""
	case float64:
		return strconv.FormatFloat(x, 'g', -1, 64)
	case int:
		return strconv.Itoa(x)
	case bool:
		return strconv.FormatBool(x)
	case string:
		return x
	}
	b, _ := json.Marshal(v)
	return string(b)
}

// fields lists the floating-point check's keys.
func (f *FloatResult) fields() []field {
	if f == nil {
		return nil
	}
	return []field{
		{"margin", num(f.Margin)},
		{"smallest_singular_value", num(f.Sigma)},
		{"at_re", num(real(f.At))},
		{"at_im", num(imag(f.At))},
		{"scale", num(f.Scale)},
		{"eigenvalues", f.Eigenvalues},
		{"eigenvalues_evaluated", f.Evaluated},
		{"next_bound", num(f.NextBound)},
		{"shift", num(f.Shift)},
		{"shifted_gramian_min", num(f.GramianMin)},
		{"shifted_gramian_max", num(f.GramianMax)},
	}
}

// MarshalJSON writes the floating-point check as a flat object; At is
// written as at_re and at_im, and NextBound is left out when no
// eigenvalue was left out.
func (f *FloatResult) MarshalJSON() ([]byte, error) { return marshalFields(f.fields()) }

// fields lists a trial's scalar keys, then its lists.
func (t *Trial) fields() []field {
	fs := []field{{"trial", t.Number}, {"sampled_dimension", t.Dimension}}
	if t.SecondPrime != nil {
		fs = append(fs, field{"second_prime_dimension", *t.SecondPrime})
	}
	fs = append(fs, t.Float.fields()...)
	fs = append(fs, t.Modes.fields()...)
	return append(fs, t.Effort.fields()...)
}

// MarshalJSON writes the trial as one flat object: its number, dimensions
// and the floating-point figures.
func (t Trial) MarshalJSON() ([]byte, error) { return marshalFields(t.fields()) }

// TrialColumns are the columns of Table, in order: "property", then the
// JSON keys of a trial's scalar figures.
var TrialColumns = []string{"property", "trial", "sampled_dimension", "second_prime_dimension",
	"margin", "smallest_singular_value", "at_re", "at_im", "scale", "eigenvalues", "eigenvalues_evaluated",
	"next_bound", "shift", "shifted_gramian_min", "shifted_gramian_max",
	"modes_dimension", "kalman_residual", "modes_stable", "modes_undecided",
	"spectral_abscissa", "spectral_radius", "effort_skipped", "horizon",
	"gramian_min", "gramian_max", "gramian_trace", "worst_case_energy"}

// ModeColumns are the columns of ModeTable: "property" and "trial", then
// the JSON keys of a mode.
var ModeColumns = []string{"property", "trial", "re", "im", "conjugate", "multiplicity", "geometric_multiplicity",
	"exact", "error_bound", "smallest_kept", "largest_dropped", "stability", "states"}

// Table returns the trials as CSV rows, one per property and trial, under
// TrialColumns: the column names are the keys of the trials' JSON
// objects, and a figure left out of the JSON is an empty cell.
func (r *Result) Table() (header []string, rows [][]string) {
	col := make(map[string]int, len(TrialColumns))
	for i, c := range TrialColumns {
		col[c] = i
	}
	for _, p := range r.Properties() {
		for i := range p.Trials {
			row := make([]string, len(TrialColumns))
			row[0] = p.Property.String()
			for _, f := range p.Trials[i].fields() {
				if j, ok := col[f.key]; ok {
					row[j] = cell(f.val)
				}
			}
			rows = append(rows, row)
		}
	}
	return append([]string(nil), TrialColumns...), rows
}

// ModeTable returns the modes as CSV rows, one per property, trial and
// mode, under ModeColumns (the states as a JSON array of names).
func (r *Result) ModeTable() (header []string, rows [][]string) {
	col := make(map[string]int, len(ModeColumns))
	for i, c := range ModeColumns {
		col[c] = i
	}
	for _, p := range r.Properties() {
		for _, tr := range p.Trials {
			if tr.Modes == nil {
				continue
			}
			for i := range tr.Modes.List {
				row := make([]string, len(ModeColumns))
				row[0], row[1] = p.Property.String(), strconv.Itoa(tr.Number)
				for _, f := range tr.Modes.List[i].fields() {
					if j, ok := col[f.key]; ok {
						row[j] = cell(f.val)
					}
				}
				rows = append(rows, row)
			}
		}
	}
	return append([]string(nil), ModeColumns...), rows
}
