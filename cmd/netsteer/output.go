package main

import (
	"bufio"
	"io"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/io/textout"
)

// outFlags select the output format and file.
type outFlags struct {
	format string
	output string
	all    bool
	// labels and groups of the states, for graph files (nil: none).
	labels, groups []string
}

func (f *outFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&f.format, "format", "", "output format: text, json, csv, or the network with the answer as attributes: graphml or nodelink (default: from -o's extension, else text)")
	fs.StringVarP(&f.output, "output", "o", "-", "write the result to this file (- for standard output; a name ending in .gz is gzip-compressed)")
	fs.BoolVar(&f.all, "all", false, "list every state in the text report (long lists are capped otherwise)")
}

// resolve settles the format: --format (any case), else the extension of
// -o (.json, .csv; anything else is text). A --format that contradicts the
// extension is a usage error.
func (f *outFlags) resolve() error {
	ext := ""
	// A .gz output is compressed (see write); the extension before it
	// says the format.
	name := strings.TrimSuffix(strings.ToLower(f.output), ".gz")
	switch {
	case strings.HasSuffix(name, ".nodelink.json"):
		ext = "nodelink"
	case strings.HasSuffix(name, ".json"):
		ext = "json"
	case strings.HasSuffix(name, ".csv"):
		ext = "csv"
	case strings.HasSuffix(name, ".graphml"):
		ext = "graphml"
	}
	f.format = strings.ToLower(f.format)
	switch f.format {
	case "":
		f.format = ext
		if f.format == "" {
			f.format = "text"
		}
	case "text", "json", "csv", "graphml", "nodelink":
		if f.format == "json" && ext == "nodelink" {
			break
		}
		if ext != "" && ext != f.format {
			return usagef("--format %s contradicts -o %s", f.format, f.output)
		}
	default:
		return usagef("--format %q: want text, json, csv, graphml or nodelink", f.format)
	}
	return nil
}

// annotator is a report that can give the network with its answer as
// attributes (drivers, check, actuators, sensors).
type annotator interface {
	Annotated() *netwrite.Annotated
}

// report is a result the command line can write in each format: JSON by
// encoding/json on the value itself, text and CSV by io/textout.
type report interface {
	Text(w io.Writer, o textout.Options) error
	CSV(w io.Writer) error
	Value() any
}

// write prints r in the chosen format to the chosen output through fileout.
func (f *outFlags) write(e *env, r report) error {
	return fileout.Write(f.output, e.Stdout, func(w io.Writer) error {
		return netwrite.Compressed(f.output, w, func(w io.Writer) error { return f.fill(e, r, w) })
	})
}

// fill writes r in the chosen format to w.
func (f *outFlags) fill(e *env, r report, w io.Writer) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	var err error
	switch f.format {
	case "json":
		err = textout.JSON(bw, r.Value())
	case "csv":
		err = r.CSV(bw)
	case "graphml", "nodelink":
		an, ok := r.(annotator)
		if !ok {
			return usagef("--format %s: this command's answer is not a network", f.format)
		}
		a := an.Annotated()
		a.AddLabels(f.labels, f.groups)
		if f.format == "graphml" {
			err = netwrite.WriteGraphML(bw, a)
		} else {
			err = netwrite.WriteNodeLink(bw, a)
		}
	default:
		o := textout.Options{Width: e.Width, All: f.all, MoreHint: "--all lists them"}
		if f.output != "-" {
			o.Width = 100
		}
		err = r.Text(bw, o)
	}
	if err != nil {
		return err
	}
	return bw.Flush()
}

// isGzipName reports whether path names a gzip file by its extension.
func isGzipName(path string) bool { return strings.HasSuffix(strings.ToLower(path), ".gz") }

// refuseGzip refuses a .gz name for an output that is not compressed, so
// that the file is not plain text under a name that says gzip.
func refuseGzip(flag, path, why string) error {
	if !isGzipName(path) {
		return nil
	}
	return usagef("%s %s: this output is not compressed (%s); give a name without .gz", flag, path, why)
}
