package sweepcsv

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/internal/source"
	"github.com/netsteer/netsteer/io/netread"
)

// Columns are the CSV columns in order. The first ten are a stable
// contract; later ones may be added.
var Columns = []string{
	"model", "nodes", "mean_degree", "replicate", "seed", "edges",
	"driver_count", "driver_fraction", "predicted_fraction", "seconds",
	"params", "prediction_from",
}

// Row is one measured grid point.
type Row struct {
	// Model is the generating model, or "base" for variants of a given
	// network.
	Model string
	// Nodes is N of the network measured, isolated states included.
	Nodes int
	// MeanDegree is its <k> = 2L/N.
	MeanDegree float64
	// Replicate numbers the repeats of a grid point from 1.
	Replicate int
	// Seed is the row's own seed, derived from the sweep seed and the
	// key (structural/sweep).
	Seed uint64
	// Edges is L, self-loops included.
	Edges int64
	// DriverCount is N_D = max(N - |M*|, 1) and DriverFraction N_D/N.
	DriverCount    int
	DriverFraction float64
	// PredictedFraction is the cavity prediction (NaN when there is none).
	PredictedFraction float64
	// Seconds is the wall-clock time the row took.
	Seconds float64
	// Params lists the row's coordinates (see the package comment).
	Params string
	// PredictionFrom is "model" when the prediction comes from the
	// model's own degree distributions, "degrees" when from the measured
	// network's degree sequence (the degree-preserving expectation).
	PredictionFrom string
}

// Key returns the row's identity.
func (r *Row) Key() string { return Key(r.Model, r.Params, r.Replicate) }

// Key builds a row identity.
func Key(model, params string, replicate int) string {
	return model + "|" + params + "|" + strconv.Itoa(replicate)
}

func (r *Row) record() []string {
	pred := ""
	if !math.IsNaN(r.PredictedFraction) {
		pred = strconv.FormatFloat(r.PredictedFraction, 'g', 10, 64)
	}
	return []string{
		r.Model,
		strconv.Itoa(r.Nodes),
		strconv.FormatFloat(r.MeanDegree, 'g', 12, 64),
		strconv.Itoa(r.Replicate),
		strconv.FormatUint(r.Seed, 10),
		strconv.FormatInt(r.Edges, 10),
		strconv.Itoa(r.DriverCount),
		strconv.FormatFloat(r.DriverFraction, 'g', 12, 64),
		pred,
		strconv.FormatFloat(r.Seconds, 'f', 3, 64),
		r.Params,
		r.PredictionFrom,
	}
}

// Write writes a header and rows, in the order given.
func Write(w io.Writer, rows []Row) error {
	cw := csv.NewWriter(w)
	cw.Write(Columns)
	for i := range rows {
		cw.Write(rows[i].record())
	}
	cw.Flush()
	return cw.Error()
}

// WriteFile writes rows, sorted canonically, to path through a temporary
// file that is renamed over path when complete.
func WriteFile(path string, rows []Row, stdout io.Writer) error {
	Sort(rows)
	return fileout.Write(path, stdout, func(w io.Writer) error {
		bw := bufio.NewWriter(w)
		if err := Write(bw, rows); err != nil {
			return err
		}
		return bw.Flush()
	})
}

// MaxLineBytes bounds a line of a sweep file: a file without line breaks
// fails after this many bytes.
const MaxLineBytes = 1 << 16

// ReadFile reads a sweep file. Columns may come in any order and extra
// columns are ignored; the contract columns and params must be present.
// Errors are *netread.Error values ("FILE:LINE: message").
func ReadFile(path string) ([]Row, error) {
	f, name, err := netread.Open(path, nil, "sweep file")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return Read(f, name)
}

// Read reads a sweep file from r; file names it in errors. Lines are
// bounded by MaxLineBytes and values echoed in messages are clipped.
func Read(r io.Reader, file string) ([]Row, error) {
	cr := csv.NewReader(bufio.NewReader(source.LineLimit(r, MaxLineBytes)))
	cr.ReuseRecord = true
	header, err := cr.Read()
	if err == io.EOF {
		return nil, &netread.Error{File: file, Line: 1, Msg: "empty sweep file (no header)"}
	}
	if err != nil {
		return nil, csvError(file, err)
	}
	col := map[string]int{}
	for i, h := range header {
		col[strings.TrimSpace(h)] = i
	}
	need := []string{"model", "nodes", "mean_degree", "replicate", "seed", "edges", "driver_count", "driver_fraction", "predicted_fraction", "seconds", "params"}
	for _, c := range need {
		if _, ok := col[c]; !ok {
			return nil, &netread.Error{File: file, Line: 1, Msg: fmt.Sprintf("not a sweep file: no %q column", c)}
		}
	}
	var rows []Row
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(file, err)
		}
		line, _ := cr.FieldPos(0)
		get := func(c string) string {
			if i, ok := col[c]; ok && i < len(rec) {
				return rec[i]
			}
			return ""
		}
		var row Row
		var perr error
		num := func(c string, dst any) {
			if perr != nil {
				return
			}
			s := get(c)
			var err error
			switch d := dst.(type) {
			case *int:
				*d, err = strconv.Atoi(s)
			case *int64:
				*d, err = strconv.ParseInt(s, 10, 64)
			case *uint64:
				*d, err = strconv.ParseUint(s, 10, 64)
			case *float64:
				if s == "" && c == "predicted_fraction" {
					*d = math.NaN()
					return
				}
				*d, err = strconv.ParseFloat(s, 64)
			}
			if err != nil {
				perr = fmt.Errorf("%s %q is not a valid number", c, netread.Clip(s))
			}
		}
		row.Model = get("model")
		row.Params = get("params")
		row.PredictionFrom = get("prediction_from")
		num("nodes", &row.Nodes)
		num("mean_degree", &row.MeanDegree)
		num("replicate", &row.Replicate)
		num("seed", &row.Seed)
		num("edges", &row.Edges)
		num("driver_count", &row.DriverCount)
		num("driver_fraction", &row.DriverFraction)
		num("predicted_fraction", &row.PredictedFraction)
		num("seconds", &row.Seconds)
		if perr == nil {
			perr = row.check()
		}
		if perr != nil {
			return nil, &netread.Error{File: file, Line: line, Msg: perr.Error()}
		}
		rows = append(rows, row)
	}
	return rows, nil
}

// check reports a row whose numbers contradict each other, as a damaged
// or hand-edited file has them: a resumed sweep must not keep it.
func (r *Row) check() error {
	switch {
	case r.Model == "":
		return errors.New("empty model")
	case r.Nodes < 1:
		return fmt.Errorf("nodes %d: want at least 1", r.Nodes)
	case r.Replicate < 1:
		return fmt.Errorf("replicate %d: want at least 1", r.Replicate)
	case r.Edges < 0:
		return fmt.Errorf("edges %d: want 0 or more", r.Edges)
	case r.DriverCount < 1 || r.DriverCount > r.Nodes:
		return fmt.Errorf("driver_count %d out of range [1, %d] (nodes)", r.DriverCount, r.Nodes)
	case math.Abs(r.DriverFraction-float64(r.DriverCount)/float64(r.Nodes)) > 1e-9:
		return fmt.Errorf("driver_fraction %v is not driver_count/nodes = %d/%d", r.DriverFraction, r.DriverCount, r.Nodes)
	case !math.IsNaN(r.PredictedFraction) && !(r.PredictedFraction >= 0 && r.PredictedFraction <= 1):
		return fmt.Errorf("predicted_fraction %v is not in [0, 1]", r.PredictedFraction)
	case r.PredictionFrom != "" && r.PredictionFrom != "model" && r.PredictionFrom != "degrees":
		return fmt.Errorf("prediction_from %q: want model or degrees", netread.Clip(r.PredictionFrom))
	}
	return nil
}

func csvError(file string, err error) error {
	var pe *csv.ParseError
	var lt *source.LineTooLong
	switch {
	case errors.As(err, &lt):
		return &netread.Error{File: file, Line: lt.Line, Msg: lt.Error(), Err: err}
	case errors.As(err, &pe):
		return &netread.Error{File: file, Line: pe.Line, Msg: pe.Err.Error(), Err: err}
	}
	return &netread.Error{File: file, Msg: err.Error(), Err: err}
}

// Sort puts rows in the canonical order.
func Sort(rows []Row) {
	slices.SortStableFunc(rows, func(a, b Row) int {
		if c := strings.Compare(a.Model, b.Model); c != 0 {
			return c
		}
		if c := compareParams(a.Params, b.Params); c != 0 {
			return c
		}
		return a.Replicate - b.Replicate
	})
}

// compareParams compares coordinate lists entry by entry: names as
// strings, values as numbers when both parse, else as strings.
func compareParams(a, b string) int {
	as, bs := strings.Split(a, ";"), strings.Split(b, ";")
	for i := 0; i < len(as) && i < len(bs); i++ {
		an, av, _ := strings.Cut(as[i], "=")
		bn, bv, _ := strings.Cut(bs[i], "=")
		if c := strings.Compare(an, bn); c != 0 {
			return c
		}
		x, errx := strconv.ParseFloat(av, 64)
		y, erry := strconv.ParseFloat(bv, 64)
		if errx == nil && erry == nil {
			if x < y {
				return -1
			}
			if x > y {
				return 1
			}
			continue
		}
		if c := strings.Compare(av, bv); c != 0 {
			return c
		}
	}
	return len(as) - len(bs)
}

// Merge combines row sets (shards, partial runs) into one canonical set.
// Rows with the same key must agree on seed, edges and driver count (they
// then count once; the first is kept); a disagreement means the sets come
// from different sweeps and is an error.
func Merge(sets ...[]Row) ([]Row, error) {
	seen := map[string]int{}
	var out []Row
	for _, set := range sets {
		for _, r := range set {
			k := r.Key()
			if i, ok := seen[k]; ok {
				o := out[i]
				if o.Seed != r.Seed {
					return nil, fmt.Errorf("sweepcsv: row %s appears with seeds %d and %d (sweeps run with different seeds)", k, o.Seed, r.Seed)
				}
				if o.Edges != r.Edges || o.DriverCount != r.DriverCount || o.Nodes != r.Nodes {
					return nil, fmt.Errorf("sweepcsv: row %s appears twice with different results", k)
				}
				continue
			}
			seen[k] = len(out)
			out = append(out, r)
		}
	}
	Sort(out)
	return out, nil
}

// MergeFiles reads and merges sweep files.
func MergeFiles(paths ...string) ([]Row, error) {
	var sets [][]Row
	for _, p := range paths {
		rows, err := ReadFile(p)
		if err != nil {
			return nil, err
		}
		sets = append(sets, rows)
	}
	return Merge(sets...)
}
