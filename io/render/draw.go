package render

import (
	"bytes"
	"context"
	"io"
)

// SlowNodes is the size of a view past which a layout may take minutes
// (see BenchmarkLayout); callers may warn before drawing more.
const SlowNodes = 400

// Draw selects the view of in, writes its DOT text and, for SVG and PNG,
// lays it out: the whole pipeline behind "netsteer render". It returns the
// view drawn.
func Draw(ctx context.Context, in *Input, opt Options, layout string, f Format, w io.Writer) (*View, error) {
	v, err := Select(in, opt)
	if err != nil {
		return nil, err
	}
	return v, DrawView(ctx, in, v, layout, f, w)
}

// DrawView draws a view chosen by Select.
func DrawView(ctx context.Context, in *Input, v *View, layout string, f Format, w io.Writer) error {
	layout, err := ChooseLayout(layout, v)
	if err != nil {
		return err
	}
	var dot bytes.Buffer
	if err := DOT(&dot, in, v, layout); err != nil {
		return err
	}
	if f == FormatDOT {
		_, err := w.Write(dot.Bytes())
		return err
	}
	return Layout(ctx, dot.Bytes(), layout, f, w)
}

// Nodes returns the number of nodes the view draws (states or components;
// signal nodes not counted).
func (v *View) Nodes() int { return len(v.States) + len(v.Comps) }
