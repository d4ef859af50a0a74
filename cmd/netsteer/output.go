package main

import (
	"bufio"
	"encoding/json"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/textout"
)

// outFlags select the output format and file.
type outFlags struct {
	format string
	output string
	all    bool
}

func (f *outFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&f.format, "format", "", "output format: text, json or csv (default: from -o's extension, else text)")
	fs.StringVarP(&f.output, "output", "o", "-", "write the result to this file (- for standard output)")
	fs.BoolVar(&f.all, "all", false, "list every state in the text report (long lists are capped otherwise)")
}

// resolve settles the format: --format (any case), else the extension of
// -o (.json, .csv; anything else is text). A --format that contradicts the
// extension is a usage error.
func (f *outFlags) resolve() error {
	ext := ""
	switch strings.ToLower(filepath.Ext(strings.TrimSuffix(strings.ToLower(f.output), ".gz"))) {
	case ".json":
		ext = "json"
	case ".csv":
		ext = "csv"
	}
	f.format = strings.ToLower(f.format)
	switch f.format {
	case "":
		f.format = ext
		if f.format == "" {
			f.format = "text"
		}
	case "text", "json", "csv":
		if ext != "" && ext != f.format {
			return usagef("--format %s contradicts -o %s", f.format, f.output)
		}
	default:
		return usagef("--format %q: want text, json or csv", f.format)
	}
	return nil
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
		bw := bufio.NewWriterSize(w, 1<<16)
		var err error
		switch f.format {
		case "json":
			enc := json.NewEncoder(bw)
			enc.SetIndent("", "  ")
			err = enc.Encode(r.Value())
		case "csv":
			err = r.CSV(bw)
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
	})
}
