package htmlreport

import (
	"bufio"
	"bytes"
	_ "embed"
	"encoding/xml"
	"html/template"
	"io"
	"strconv"
	"strings"
)

// Review is the content of a review page. Only Title is required; empty
// parts are left out.
type Review struct {
	// Title names what is reviewed, usually the network file.
	Title string
	// Question is the question the page answers, in one sentence.
	Question string
	// Answers are the verdicts shown on the first screen.
	Answers []Answer

	// Picture is an SVG document (from io/render); it is sanitised and
	// inlined. PictureNote says which view it is; PictureError replaces
	// the picture when it could not be drawn.
	Picture      []byte
	PictureNote  string
	PictureError string

	// Tables are the detail tables (drivers, actuators, sensors, ...);
	// Findings are the tables of a failing design's witness, shown
	// before them with a warning style; Numeric is the numeric check.
	Findings []Table
	Tables   []Table
	Numeric  *Table

	// Provenance.
	Files     []File
	Tool      string   // name and version
	Options   []string // the command line as run
	Generated string   // when, as text
	// Cautions close the page.
	Cautions []string
}

// Answer is one verdict: a topic, a yes/no (or nil for a plain figure),
// a one-line headline and the figures behind it.
type Answer struct {
	Topic    string
	OK       *bool
	Headline string
	Facts    []Fact
}

// Fact is one labelled figure.
type Fact struct{ Label, Value string }

// Table is a titled table of text cells. More counts the rows left out.
type Table struct {
	ID      string
	Title   string
	Intro   string
	Columns []string
	Rows    [][]string
	More    int
	Note    string
}

// Yes and No are for Answer.OK.
func Yes() *bool { t := true; return &t }
func No() *bool  { f := false; return &f }

//go:embed page.html
var pageTemplate string

var page = template.Must(template.New("page").Funcs(template.FuncMap{
	"verdict": func(ok *bool) string {
		switch {
		case ok == nil:
			return "info"
		case *ok:
			return "yes"
		}
		return "no"
	},
	"join": strings.Join,
}).Parse(pageTemplate))

// Write writes the review page to w.
func Write(w io.Writer, r *Review) error {
	data := struct {
		*Review
		SVG  template.HTML
		Wide bool // print the picture on a landscape page
	}{Review: r}
	if len(r.Picture) > 0 && r.PictureError == "" {
		svg, err := SanitizeSVG(r.Picture)
		if err != nil {
			return err
		}
		data.SVG = svg
		w, h := svgSize(r.Picture)
		data.Wide = w > 1.2*h
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	if err := page.Execute(bw, data); err != nil {
		return err
	}
	return bw.Flush()
}

// svgSize returns the width and height of an SVG document's root element
// in its own units (Graphviz writes points), or zeros.
func svgSize(svg []byte) (w, h float64) {
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, err := dec.RawToken()
		if err != nil {
			return 0, 0
		}
		if e, ok := tok.(xml.StartElement); ok {
			for _, a := range e.Attr {
				v, _ := strconv.ParseFloat(strings.TrimRight(a.Value, "ptxm"), 64)
				switch a.Name.Local {
				case "width":
					w = v
				case "height":
					h = v
				}
			}
			return w, h
		}
	}
}
