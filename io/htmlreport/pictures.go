package htmlreport

import (
	"bytes"
	"context"
	"errors"
	"strings"

	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/structural/analysis"
)

// Drawing says how DrawPictures draws a page's views.
type Drawing struct {
	// Options choose the main view and bound every view.
	Options render.Options
	// Layout names the Graphviz layout (render.AutoLayout for the view's
	// own choice).
	Layout string
	// Progress, when not nil, gives the context of a layout of so many
	// nodes (for a progress display).
	Progress func(nodes int) context.Context
	// Warn, when not nil, hears what could not be drawn.
	Warn func(msg string)
	// Explain, when not nil, rewords a view's refusal (to name the
	// options that lift it).
	Explain func(error) error
}

// DrawPictures adds the page's views to c: the one d.Options choose (the
// control structure instead when that view cannot be drawn), then the
// control structure, the groups and the distributions, and for a network
// above Options.MaxNodes its components. A view that cannot be drawn is
// told to d.Warn and, for the main view, said on the page.
func DrawPictures(c *Context, in *render.Input, d Drawing) {
	warn := func(msg string) {
		if d.Warn != nil {
			d.Warn(msg)
		}
	}
	plain := func(err error) string { return strings.TrimPrefix(err.Error(), "render: ") }
	draw := func(opt render.Options) (*render.View, []byte, error) {
		v, err := render.Select(in, opt)
		if err != nil {
			if d.Explain != nil {
				err = d.Explain(err)
			}
			return nil, nil, errors.New(plain(err))
		}
		ctx := context.Background()
		if d.Progress != nil {
			ctx = d.Progress(v.Nodes())
		}
		var b bytes.Buffer
		if err := render.DrawView(ctx, in, v, d.Layout, render.FormatSVG, &b); err != nil {
			return v, nil, err
		}
		return v, b.Bytes(), nil
	}
	opt := d.Options
	v, svg, err := draw(opt)
	main := render.Auto
	if v != nil {
		main = v.Kind
	}
	if err != nil && v != nil && v.Graph() && in.In != nil {
		why := plain(err)
		warn("the " + v.Kind.String() + " view could not be drawn (" + why + "); the page shows the control structure instead")
		c.PictureError = "The " + v.Kind.String() + " view could not be drawn: " + why + ". The control structure is shown instead."
		opt.View = render.Control
		v, svg, err = draw(opt)
		main = render.Control
	}
	if err != nil {
		c.PictureError = "The picture could not be drawn: " + plain(err)
		warn("the page has no picture: " + plain(err))
	} else {
		c.Pictures = append(c.Pictures, Picture{SVG: svg, Note: "View: " + v.Desc + ". Hover over a node for its full name and findings."})
	}
	extra := []render.Kind{render.Control, render.Groups, render.Degrees}
	if in.Net.N() > opt.MaxNodes {
		// A large network's components, labelled by what they are.
		extra = append(extra, render.Components)
	}
	titles := map[render.Kind]string{render.Control: "Control structure", render.Groups: "By group of the node table",
		render.Degrees: "Distributions", render.Components: "Strongly connected components"}
	for _, k := range extra {
		if k == main || (k == render.Groups && in.Group == nil) || (k == render.Control && in.In == nil) {
			continue
		}
		o := opt
		o.View = k
		v, svg, err := draw(o)
		if err != nil {
			warn("the " + k.String() + " view could not be drawn: " + plain(err))
			continue
		}
		c.Pictures = append(c.Pictures, Picture{Title: titles[k], SVG: svg, Note: "View: " + v.Desc + "."})
	}
}

// NumericFrom is the page's numeric check from a review that ran it
// (analysis.ReviewRequest.Verify): its rows, or why it did not run.
func NumericFrom(rv *analysis.Review) *Numeric {
	n := &Numeric{What: strings.Join(rv.NumericChecked, " and ")}
	switch {
	case rv.Numeric != nil:
		FillNumeric(n, rv.Numeric)
	case errors.Is(rv.NumericError, analysis.ErrNothingToVerify):
		n.NotRun = "nothing to check: no inputs or outputs."
	case rv.NumericError != nil:
		n.NotRun = strings.TrimPrefix(rv.NumericError.Error(), "numeric: ")
	default:
		n.NotRun = "the numeric check was not asked."
	}
	return n
}
