package textout

import (
	"bufio"
	"fmt"
	"io"
	"strings"

	"github.com/netsteer/netsteer/io/internal/words"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/strong"
)

// Options shape a text report.
type Options struct {
	// Width is the column lines are wrapped to; 0 means 100.
	Width int
	// All lists every state; otherwise lists stop after Max names with a
	// count of the rest.
	All bool
	// Max is the number of names listed before a list is capped; 0 means
	// 12 in summary lines (ten times that in detail sections).
	Max int
	// MoreHint is appended to the count of a capped list, e.g. how to list
	// them all.
	MoreHint string
}

func (o Options) width() int {
	if o.Width <= 0 {
		return 100
	}
	return max(o.Width, 40)
}

func (o Options) max() int {
	if o.Max <= 0 {
		return 12
	}
	return o.Max
}

// Caution closes every structural text report without a strong answer,
// wrapped to the report's width like the rest of it.
const Caution = "Structural result: it holds for almost all parameter values, not for every one. Use it as a screening step; it does not replace dynamic studies, safety analysis, local codes or licensed engineering review."

// StrongCaution closes a report with a strong answer: the generic answers
// beside it hold for almost all values, the strong one for every value of
// its class.
const StrongCaution = "Generic structural result: it holds for almost all parameter values, not for every one. " + strong.Caution

// tw writes a report: wrapped paragraphs and capped name lists.
type tw struct {
	w   *bufio.Writer
	o   Options
	err error
	// strong: a strong answer was written, so StrongCaution closes.
	strong bool
}

func newTW(w io.Writer, o Options) *tw { return &tw{w: bufio.NewWriter(w), o: o} }

// p writes a paragraph wrapped at the width, continuation lines indented
// by indent.
func (t *tw) p(indent string, format string, args ...any) {
	t.w.WriteString(words.Wrap(fmt.Sprintf(format, args...), t.o.width(), "", indent))
}

// ip writes an indented paragraph.
func (t *tw) ip(indent string, format string, args ...any) {
	t.w.WriteString(words.Wrap(fmt.Sprintf(format, args...), t.o.width(), indent, indent+"  "))
}

// row writes a table row: prefix kept as it is (aligned columns), the text
// after it wrapped under itself.
func (t *tw) row(prefix string, format string, args ...any) {
	t.w.WriteString(words.Wrap(fmt.Sprintf(format, args...), t.o.width(), prefix, strings.Repeat(" ", len(prefix))))
}

func (t *tw) blank() { t.w.WriteByte('\n') }

func (t *tw) raw(s string) { t.w.WriteString(s) }

// names lists states, capped at max names (detail lists at ten times it).
func (t *tw) names(s structural.States, detail bool) string {
	m := t.o.max()
	if detail {
		m *= 10
	}
	n := s.Len()
	shown := min(n, m)
	if t.o.All {
		shown = n
	}
	items := make([]string, shown, shown+1)
	for i := range items {
		items[i] = words.Quote(s.Name(i))
	}
	if shown < n {
		more := fmt.Sprintf("(%d more", n-shown)
		if t.o.MoreHint != "" {
			more += "; " + t.o.MoreHint
		}
		return strings.Join(items, ", ") + " " + more + ")"
	}
	return strings.Join(items, ", ")
}

func (t *tw) done() error {
	if t.strong {
		t.blank()
		t.p("", "%s", StrongCaution)
		return t.w.Flush()
	}
	t.w.WriteString("\n" + words.Wrap(Caution, t.o.width(), "", ""))
	return t.w.Flush()
}

func displayFile(path string) string {
	switch path {
	case "-", "stdin":
		return "standard input"
	case "":
		return "the network"
	}
	return path
}

var (
	plural = words.Plural
	count  = words.Count
	quote  = words.Quote
)

func orNone(s string) string {
	if s == "" {
		return "none"
	}
	return s
}

// network writes the one-line description of the network.
func (t *tw) network(nodes, edges, loops, merged int) {
	s := fmt.Sprintf("Network: %s, %s (%s", count(nodes, "state", "states"), count(edges, "edge", "edges"), count(loops, "self-loop", "self-loops"))
	s += fmt.Sprintf(", %s merged", count(merged, "repeated edge", "repeated edges"))
	t.p("  ", "%s).", s)
}
