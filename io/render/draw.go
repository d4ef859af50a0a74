package render

import (
	"bytes"
	"context"
	"io"
	"strings"
	"sync"
	"time"

	"github.com/netsteer/netsteer/io/internal/words"
)

// Draw selects the view of in and draws it in format f: the whole pipeline
// behind "netsteer render". It returns the view drawn.
func Draw(ctx context.Context, in *Input, opt Options, layout string, f Format, w io.Writer) (*View, error) {
	v, err := Select(in, opt)
	if err != nil {
		return nil, err
	}
	return v, DrawView(ctx, in, v, layout, f, w)
}

// Progress, when set on a context with WithProgress, is called about once
// a second while a Graphviz layout runs, with the time spent and the
// estimate.
type Progress func(elapsed, estimate time.Duration)

type progressKey struct{}

// WithProgress returns a context whose layouts report to p.
func WithProgress(ctx context.Context, p Progress) context.Context {
	return context.WithValue(ctx, progressKey{}, p)
}

// DrawView draws a view chosen by Select. The Graphviz views (View.Graph)
// are laid out by the layout program, framed by netsteer's title and
// legend (DOT writes the DOT text with the title as a plain label); the
// other views are laid out here and need no layout program.
func DrawView(ctx context.Context, in *Input, v *View, layout string, f Format, w io.Writer) error {
	in.prep()
	if !v.Graph() {
		var s *scene
		switch v.Kind {
		case Control:
			s, _ = controlScene(in, v)
		case Groups:
			s, _ = groupsScene(in, v)
		default:
			s, _ = degreesScene(in, v)
		}
		switch f {
		case FormatPNG:
			return s.writePNG(w)
		case FormatSVG:
			return s.writeSVG(w)
		}
		return &FormatError{View: v.Kind, Format: f}
	}
	layout, err := ChooseLayout(layout, v)
	if err != nil {
		return err
	}
	var dot bytes.Buffer
	has, err := writeDOT(&dot, in, v, layout, f == FormatDOT)
	if err != nil {
		return err
	}
	if f == FormatDOT {
		_, err := w.Write(dot.Bytes())
		return err
	}
	if p, ok := ctx.Value(progressKey{}).(Progress); ok && p != nil {
		// The reporter stops before DrawView returns: no report comes
		// after the picture is written.
		done := make(chan struct{})
		var wg sync.WaitGroup
		wg.Add(1)
		defer func() { close(done); wg.Wait() }()
		start := time.Now()
		go func() {
			defer wg.Done()
			t := time.NewTicker(time.Second)
			defer t.Stop()
			for {
				select {
				case <-done:
					return
				case <-t.C:
					p(time.Since(start), v.Estimate)
				}
			}
		}()
	}
	return drawFramed(ctx, in, v, dot.Bytes(), layout, has, f, w)
}

// FormatError reports a view that cannot be written in a format: only
// the Graphviz views have DOT text.
type FormatError struct {
	View   Kind
	Format Format
}

func (e *FormatError) Error() string {
	return "render: the " + e.View.String() + " view is drawn by netsteer itself and has no " + string(e.Format) + " text; write SVG or PNG"
}

// Nodes returns the number of nodes a Graphviz view draws (states or
// components; signal nodes not counted), 0 for the others.
func (v *View) Nodes() int { return len(v.States) + len(v.Comps) }

// WriteSummary writes what a terminal shows after a picture is written:
// the file and the title's numbers, the view, and one line per answer,
// wrapped to width columns without breaking a name.
func WriteSummary(w io.Writer, file string, in *Input, v *View, width int) error {
	var b strings.Builder
	b.WriteString(words.Wrap(file+": "+Summary(in)+".", width, "", "  "))
	b.WriteString(words.Wrap("View: "+v.Desc+".", width, "", "  "))
	for _, n := range in.Notes {
		b.WriteString(words.Wrap(n, width, "", "  "))
	}
	_, err := io.WriteString(w, b.String())
	return err
}
