package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/htmlreport"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/numeric"
)

var reportCmd = &command{
	name:    "report",
	summary: "write one self-contained HTML page (and PDF) for a design review",
	usage: `Usage: netsteer report [options] NET -o review.html

Writes one HTML file a reviewer can open offline, print and sign. The first
screen asks the questions of the command line and answers them in their
words: with --inputs (--outputs), whether that design is structurally
controllable (observable); without a design, where the cheapest dedicated
actuators and sensors go (--show chooses which). A reference card gives
the network's own figures. Below come the pictures (the view --view
chooses, as "netsteer render" draws it, and the distributions), the
witness when a design fails (unreached states, the dilation and the
cheapest completion), tables of the design, the devices and the driver
nodes, with one numbering of signals shared with the picture, the numeric
check with --verify, and the provenance: every input's name, size and
SHA-256 of the bytes actually read, the build (module version and VCS
revision, clean or dirty), the command line and the time.

The page needs nothing else: no scripts, fonts, style sheets or images from
elsewhere. Every name is escaped; characters that could hide or reorder
text are shown as escapes.

The whole-network picture needs the layout program netsteer-layout (see
"netsteer render --help"); without it the page shows the control structure
instead and says so. --pdf FILE also prints the page to PDF with a headless
Chromium (Debian: apt-get install chromium).

Exit status: 0 when the page was written and every design holds, 1 when a
judged design fails or no placement can succeed (the page is written), 2
on error.

Example:
  netsteer report testdata/plant/heating.edges -o review.html
  netsteer report --inputs testdata/plant/heating-actuators.txt --verify --pdf review.pdf -o review.html testdata/plant/heating.edges
`,
	flags: func(e *env, fs *pflag.FlagSet) func([]string) error {
		var nf netFlags
		var pf pictureFlags
		nf.register(e, fs)
		pf.registerDesign(fs)
		fs.StringVar(&pf.show, "show", "", "what to place when no design is given: actuators, sensors (default both)")
		pf.registerView(fs)
		output := fs.StringP("output", "o", "", "the review page, FILE.html (- for standard output)")
		pdf := fs.String("pdf", "", "also print the page to this PDF file (needs a headless Chromium)")
		verify := fs.Bool("verify", false, "add the numeric check on sampled parameters (as netsteer verify)")
		seed := fs.Uint64("seed", 0, "seed of the numeric check's samples (default: a fresh one, printed)")
		var sf strongFlags
		sf.register(fs, "add the strong structural verdict of each design (every value of the couplings)")
		title := fs.String("title", "", "what the page reviews (default: the network file's name)")
		return func(args []string) error {
			path, err := oneArg(args)
			if err != nil {
				return err
			}
			if *output == "" {
				return usagef("give the page's file with -o FILE.html")
			}
			if err := refuseGzip("-o", *output, "the page is plain HTML, which a browser and --pdf open"); err != nil {
				return err
			}
			if err := refuseGzip("--pdf", *pdf, "Chromium writes the PDF as it is"); err != nil {
				return err
			}
			if *pdf != "" && *output == "-" {
				return usagef("--pdf prints the page from its file: give -o FILE.html")
			}
			if fileout.SamePath(*pdf, *output) {
				return usagef("--pdf %s and -o %s name the same file: the PDF would replace the page it is printed from", *pdf, *output)
			}
			pf.nodeTable = nf.nodeTable
			if err := pf.check(); err != nil {
				return err
			}
			sh, err := parseShow(pf.show)
			if err != nil {
				return err
			}
			if sh.drivers {
				return usagef("--show drivers: the page always gives the driver nodes; --show takes actuators, sensors")
			}
			if pf.show == "" && pf.inputs == "" && pf.outputs == "" {
				// Without a design the question is where the devices go;
				// with one, only what it asks is answered.
				sh = showSet{actuators: true, sensors: true}
			}
			if !fs.Changed("seed") {
				*seed = rand.Uint64N(1_000_000_000)
			}
			start := time.Now()
			if err := sf.check(); err != nil {
				return err
			}
			if sf.on && pf.inputs == "" && pf.outputs == "" {
				return usagef("--strong judges a design: give --inputs or --outputs")
			}
			l, err := loadAll(e, &nf, &pf, path, *output, sf.mayBeZero)
			if err != nil {
				return err
			}
			class, err := sf.class(l.input)
			if err != nil {
				return err
			}
			if *pdf != "" {
				if in := fileout.SameFile(*pdf, path, nf.nodeTable, pf.inputs, pf.outputs); in != "" {
					return usagef("--pdf %s would overwrite %s, which this command reads", *pdf, in)
				}
			}
			req := l.review(sh, true, true, 5)
			req.Strong = class
			if *verify {
				req.Verify = &numeric.Request{Seed: *seed}
			}
			rv, err := l.analyse(e, req)
			if err != nil {
				return err
			}
			t := *title
			if t == "" {
				t = filepath.Base(displayFile(path))
			}
			c := htmlreport.Context{
				Title: t, Network: displayFile(path), InputsFile: displayFile(pf.inputs), OutputsFile: displayFile(pf.outputs),
				Inputs: l.inputs, Outputs: l.outputs, Costed: l.table != nil, Files: pageFiles(l.files),
				Build: htmlreport.ReadBuild(), Command: append([]string{"netsteer", "report"}, args...), Generated: generated(start),
			}
			if c.Command = commandLine(); len(c.Command) == 0 {
				c.Command = append([]string{"netsteer", "report"}, args...)
			}
			in, err := l.picture(rv, t, pf.roles)
			if err != nil {
				return err
			}
			if in.Label != nil {
				c.Label = in.Label
			}
			if opt, err := pf.options(l.g); err != nil {
				c.PictureError = "The picture could not be drawn: " + err.Error()
			} else {
				htmlreport.DrawPictures(&c, in, htmlreport.Drawing{Options: opt, Layout: pf.layout,
					Progress: func(n int) context.Context { return progress(e, n) },
					Warn:     func(msg string) { e.warn("%s", msg) }, Explain: describeView})
			}
			if *verify {
				c.Numeric = htmlreport.NumericFrom(rv)
				if rv.NumericError != nil && !errors.Is(rv.NumericError, analysis.ErrNothingToVerify) {
					c.Numeric.NotRun = numericRefusal(rv.NumericError)
					e.warn("the numeric check was not run: %s", c.Numeric.NotRun)
				}
			}
			page := htmlreport.FromReview(rv, c)
			var html bytes.Buffer
			if err := htmlreport.Write(&html, page); err != nil {
				return err
			}
			err = fileout.Write(*output, e.Stdout, func(w io.Writer) error {
				_, err := w.Write(html.Bytes())
				return err
			})
			if err != nil {
				return err
			}
			if *output != "-" {
				if err := htmlreport.WriteSummary(e.Stdout, *output, displayFile(path), page, e.Width); err != nil {
					return err
				}
			}
			if *pdf != "" {
				e.status("printing %s to PDF", *output)
				data, err := htmlreport.PrintPDF(context.Background(), *output)
				e.status("")
				if err != nil {
					return fmt.Errorf("%s was written; the PDF was not: %s", *output, strings.TrimPrefix(err.Error(), "htmlreport: "))
				}
				if err := fileout.Write(*pdf, nil, func(w io.Writer) error { _, err := w.Write(data); return err }); err != nil {
					return err
				}
				fmt.Fprintf(e.Stdout, "%s: the page printed to PDF.\n", *pdf)
			}
			if !rv.Holds() {
				return errNo
			}
			return nil
		}
	},
}

func init() { register(reportCmd) }

func pageFiles(fs []inputFile) []htmlreport.File {
	out := make([]htmlreport.File, len(fs))
	for i, f := range fs {
		out[i] = htmlreport.File{Role: f.Role, Name: f.Name, Size: strconv.FormatInt(f.Size, 10), SHA256: f.SHA256}
	}
	return out
}

// commandLine is the command as run, when it is this process's.
func commandLine() []string {
	if len(os.Args) < 2 || os.Args[1] != "report" {
		return nil
	}
	return append([]string{filepath.Base(os.Args[0])}, os.Args[1:]...)
}

// generated is the page's time stamp: now, or SOURCE_DATE_EPOCH when set
// (reproducible builds convention), in UTC.
func generated(now time.Time) string {
	if s := os.Getenv("SOURCE_DATE_EPOCH"); s != "" {
		if sec, err := strconv.ParseInt(s, 10, 64); err == nil {
			now = time.Unix(sec, 0)
		}
	}
	return now.UTC().Format("2006-01-02 15:04:05 UTC")
}

// numericRefusal words why the page's numeric check did not run, with the
// options that would make it run.
func numericRefusal(err error) string {
	var se *numeric.SizeError
	if errors.As(err, &se) {
		return fmt.Sprintf("%d states exceed the limit of %d for the exact check, which would take up to about %s and %s of memory; run netsteer verify with --max-states, --around or --sample.",
			se.States, se.Limit, numeric.FormatSeconds(se.Estimate.Seconds), numeric.FormatBytes(se.Estimate.Bytes))
	}
	return describe(err)
}
