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
	// More are further pictures (other views), each with a title.
	More []Picture

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
	Topic string
	// OK colours the card: true good, false bad, nil neutral. Word is
	// the answer in one or two words, in the question's terms.
	OK       *bool
	Word     string
	Headline string
	Facts    []Fact
}

// Picture is one drawn view: an SVG document (from io/render), sanitised
// and inlined, with its title and a note.
type Picture struct {
	Title, Note string
	SVG         []byte
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
	type pic struct {
		Title, Note string
		SVG         template.HTML
		MinWidth    string
		Wide        bool
	}
	data := struct {
		*Review
		Main  *pic
		Other []pic
	}{Review: r}
	mk := func(title, note string, svg []byte) (*pic, error) {
		s, err := SanitizeSVG(svg)
		if err != nil {
			return nil, err
		}
		w, h, min := svgSize(svg)
		return &pic{Title: title, Note: note, SVG: s, MinWidth: strconv.Itoa(int(min)) + "px", Wide: w > 1.2*h}, nil
	}
	if len(r.Picture) > 0 {
		p, err := mk("", r.PictureNote, r.Picture)
		if err != nil {
			return err
		}
		data.Main = p
	}
	for _, m := range r.More {
		p, err := mk(m.Title, m.Note, m.SVG)
		if err != nil {
			return err
		}
		data.Other = append(data.Other, *p)
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	if err := page.Execute(bw, data); err != nil {
		return err
	}
	return bw.Flush()
}

// svgSize returns the width and height of an SVG document's viewBox and
// the CSS min-width its root asks for (0 when none).
func svgSize(svg []byte) (w, h, min float64) {
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, err := dec.RawToken()
		if err != nil {
			return 0, 0, 0
		}
		if e, ok := tok.(xml.StartElement); ok {
			for _, a := range e.Attr {
				switch a.Name.Local {
				case "viewBox":
					f := strings.Fields(a.Value)
					if len(f) == 4 {
						w, _ = strconv.ParseFloat(f[2], 64)
						h, _ = strconv.ParseFloat(f[3], 64)
					}
				case "style":
					if v, ok := strings.CutPrefix(a.Value, "min-width:"); ok {
						min, _ = strconv.ParseFloat(strings.TrimSuffix(v, "px"), 64)
					}
				}
			}
			return w, h, min
		}
	}
}
