package render

import (
	"bytes"
	"context"
	"io"
)

// Draw selects the view of in, writes its DOT text and, for SVG and PNG,
// lays it out: the whole pipeline behind "netsteer render". It returns the
// view drawn.
func Draw(ctx context.Context, in *Input, opt Options, layout string, f Format, w io.Writer) (*View, error) {
	v, err := Select(in, opt)
	if err != nil {
		return nil, err
	}
	layout, err = ChooseLayout(layout, v)
	if err != nil {
		return nil, err
	}
	var dot bytes.Buffer
	if err := DOT(&dot, in, v, layout); err != nil {
		return nil, err
	}
	if f == FormatDOT {
		_, err := w.Write(dot.Bytes())
		return v, err
	}
	return v, Layout(ctx, dot.Bytes(), layout, f, w)
}
