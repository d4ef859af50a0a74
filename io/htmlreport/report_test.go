package htmlreport

import (
	"bytes"
	"context"
	"encoding/xml"
	"io"
	"strconv"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// hostile are names meant to break out of HTML or SVG.
var hostile = []string{
	`<script>alert(1)</script>`,
	`"><img src=x onerror=alert(2)>`,
	`' onmouseover='alert(3)`,
	`</style><script>alert(4)</script>`,
	`&lt;b&gt;not bold&lt;/b&gt;`,
	`javascript:alert(5)`,
	`<a href="http://example.invalid/">link</a>`,
	`]]><!-- x -->`,
	`名前 ΔP ☃`,
}

// TestSanitizeSVG feeds SVG with active content and external references:
// none of it may survive, and the drawing must.
func TestSanitizeSVG(t *testing.T) {
	in := `<?xml version="1.0"?>
<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">
<!-- comment <script>alert(0)</script> -->
<svg width="100pt" height="50pt" viewBox="0 0 100 50" xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" onload="alert(1)">
<script>alert(2)</script>
<style>@import url(http://example.invalid/x.css);</style>
<g id="node1" class="node" onclick="alert(3)" style="fill:url(http://example.invalid/p)">
<title>n1</title>
<a xlink:href="javascript:alert(4)" xlink:title="tip &lt;b&gt; &amp; more" target="_blank">
<ellipse fill="#56b4e9" stroke="url(http://example.invalid/#x)" cx="10" cy="10" rx="5" ry="5"/>
<text x="1" y="2">&lt;script&gt;alert(5)&lt;/script&gt;</text>
</a>
<image xlink:href="http://example.invalid/x.png" x="0" y="0"/>
<foreignObject><div xmlns="http://www.w3.org/1999/xhtml"><script>alert(6)</script></div></foreignObject>
<use xlink:href="#node1"/>
<animate attributeName="href" to="javascript:alert(7)"/>
<polygon fill="javascript:alert(8)" points="0,0 1,1 2,0"/>
</g>
</svg>`
	out, err := SanitizeSVG([]byte(in))
	if err != nil {
		t.Fatal(err)
	}
	s := string(out)
	for _, bad := range []string{"<script", "onload", "onclick", "<style", "style=", "href", "<image", "foreignObject", "<use", "animate", "javascript", "example.invalid", "DOCTYPE", "<!--", "<?xml", "target", " id="} {
		if strings.Contains(s, bad) {
			t.Errorf("sanitised SVG still holds %q:\n%s", bad, s)
		}
	}
	for _, keep := range []string{`<ellipse fill="#56b4e9" cx="10"`, `&lt;script&gt;alert(5)&lt;/script&gt;`, `<title>tip &lt;b&gt; &amp; more</title>`, `viewBox="0 0 100 50"`} {
		if !strings.Contains(s, keep) {
			t.Errorf("sanitised SVG lost %q:\n%s", keep, s)
		}
	}
	// Well-formed XML.
	dec := xml.NewDecoder(strings.NewReader(s))
	for {
		if _, err := dec.Token(); err == io.EOF {
			break
		} else if err != nil {
			t.Fatalf("sanitised SVG is not well-formed: %v\n%s", err, s)
		}
	}
	for _, bad := range []string{"", "<html/>", "<svg><g></svg>", `<svg><text>&foo;</text></svg>`, "<svg/><svg/>"} {
		if _, err := SanitizeSVG([]byte(bad)); err == nil {
			t.Errorf("SanitizeSVG(%q) accepted", bad)
		}
	}
}

// hostileNetwork is a small network of hostile names.
func hostileNetwork(t testing.TB) *structural.Network {
	b := structural.NewBuilder()
	var ids []int32
	for _, n := range hostile {
		id, err := b.Intern([]byte(n))
		if err != nil {
			t.Fatal(err)
		}
		ids = append(ids, id)
	}
	for i := 0; i+1 < len(ids); i++ {
		b.AddEdge(ids[i], ids[i+1])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// reviewOf builds a review page of g the way the report command does
// (analysis.Analyse, render.FromReview, FromReview), with hostile text in
// every free-text field as well as in the state names.
func reviewOf(t testing.TB, g *structural.Network, title string) *Review {
	rv, err := analysis.Analyse(g, analysis.ReviewRequest{PlaceActuators: true, PlaceSensors: true, Roles: true, Alternatives: 3})
	if err != nil {
		t.Fatal(err)
	}
	in, err := render.FromReview(rv, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	in.Title = title
	var svg bytes.Buffer
	v, err := render.Draw(context.Background(), in, render.Options{}, render.AutoLayout, render.FormatSVG, &svg)
	if err != nil {
		t.Fatal(err)
	}
	c := Context{
		Title: title, Network: title,
		Pictures: []Picture{{SVG: svg.Bytes(), Note: "View: " + v.Desc}},
		Files:    []File{{Role: "network", Name: hostile[8], Size: "1", SHA256: strings.Repeat("0", 64)}},
		Build:    Build{Module: "github.com/netsteer/netsteer", Version: "(devel)", Revision: "0123456789abcdef", Modified: true},
		Command:  []string{"netsteer", "report", hostile[0]},
	}
	r := FromReview(rv, c)
	r.Findings = append(r.Findings, Table{Title: "Unreached states", Intro: hostile[3], Columns: []string{"State"}, Rows: [][]string{{hostile[4]}, {hostile[5]}}})
	r.Tables = append(r.Tables, Table{ID: "extra", Title: "Extra", Columns: []string{"Signal"}, More: 3, Note: hostile[6]})
	r.Numeric = &Table{Title: "Numeric check", Columns: []string{"Property"}, Rows: [][]string{{hostile[7]}}}
	r.Answers[0].Headline += " " + hostile[0]
	r.Answers[0].Facts = append(r.Answers[0].Facts, Fact{Label: hostile[1], Value: hostile[2]})
	return r
}

// pageScan parses an HTML page with encoding/xml in its HTML mode and
// records its text, anything that could run, and every reference.
type pageScan struct {
	text []string
	bad  []string
	refs []string
}

func scanPage(t *testing.T, page []byte) *pageScan {
	t.Helper()
	p := &pageScan{}
	dec := xml.NewDecoder(bytes.NewReader(page))
	dec.Strict = false
	dec.AutoClose = xml.HTMLAutoClose
	dec.Entity = xml.HTMLEntity
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("page does not parse: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			switch strings.ToLower(e.Name.Local) {
			case "script", "iframe", "object", "embed", "img", "link", "image", "use", "foreignobject", "base", "form", "audio", "video", "source":
				p.bad = append(p.bad, "element "+e.Name.Local)
			}
			for _, a := range e.Attr {
				name := strings.ToLower(a.Name.Local)
				switch {
				case strings.HasPrefix(name, "on"):
					p.bad = append(p.bad, "attribute "+name)
				case name == "src" || name == "href" || name == "action" || name == "srcset" || name == "poster" || name == "data":
					p.refs = append(p.refs, a.Value)
				case name == "style" || name == "content":
					if strings.Contains(strings.ToLower(a.Value), "url(") {
						p.refs = append(p.refs, a.Value)
					}
				}
			}
		case xml.CharData:
			if s := strings.TrimSpace(string(e)); s != "" {
				p.text = append(p.text, s)
			}
		}
	}
	return p
}

func writePage(t *testing.T, r *Review) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := Write(&b, r); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// TestPageHostileNames writes a page full of hostile names: nothing may
// run, nothing may be fetched, and every name must read as text.
func TestPageHostileNames(t *testing.T) {
	g := hostileNetwork(t)
	page := writePage(t, reviewOf(t, g, hostile[0]))
	p := scanPage(t, page)
	if len(p.bad) > 0 {
		t.Errorf("active content on the page: %v", p.bad)
	}
	for _, ref := range p.refs {
		if !strings.HasPrefix(ref, "#") {
			t.Errorf("reference to outside the page: %q", ref)
		}
	}
	text := strings.Join(p.text, "\n")
	for _, n := range hostile {
		if !strings.Contains(text, n) {
			t.Errorf("name %q does not appear as text", n)
		}
	}
	// The style sheet is the only <style>, and it imports nothing.
	if c := bytes.Count(page, []byte("<style")); c != 1 {
		t.Errorf("%d style elements, want 1", c)
	}
	if bytes.Contains(page, []byte("@import")) || bytes.Contains(page, []byte("url(")) {
		t.Errorf("the page's style refers to something")
	}
}

// TestPageDemoPlant writes the review page of the demo plant and checks its
// parts are present.
func TestPageDemoPlant(t *testing.T) {
	in, err := netread.ReadFile("../../testdata/plant/heating.edges", netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	page := writePage(t, reviewOf(t, g, "heating.edges"))
	p := scanPage(t, page)
	if len(p.bad) > 0 {
		t.Errorf("active content on the page: %v", p.bad)
	}
	text := strings.Join(p.text, "\n")
	for _, want := range []string{"heating.edges", "Where must dedicated actuators go", "Picture", "Provenance", "Cautions", "screening step", "supply.header_temp", "u1"} {
		if !strings.Contains(text, want) {
			t.Errorf("page lacks %q", want)
		}
	}
	if !bytes.Contains(page, []byte("<svg")) {
		t.Errorf("page has no inline picture")
	}
}

// TestPageEscapesBidi checks that a name carrying bidirectional controls
// (which can make a name read reversed) shows them as escapes in the
// tables, as the text reports write them (io/internal/words).
func TestPageEscapesBidi(t *testing.T) {
	const evil = "valve\u202eenil\u202c.pos"
	in, err := netread.Read(strings.NewReader("\""+evil+"\" a\n"), "t", netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	rv, err := analysis.Analyse(g, analysis.ReviewRequest{PlaceActuators: true})
	if err != nil {
		t.Fatal(err)
	}
	page := writePage(t, FromReview(rv, Context{Title: "t", Network: "t"}))
	if bytes.Contains(page, []byte("\u202e")) {
		t.Errorf("the raw right-to-left override reached the page")
	}
	if !bytes.Contains(page, []byte(`valve\u202eenil\u202c.pos`)) {
		t.Errorf("the name is not shown with its controls escaped")
	}
}

// TestFirstScreenWords checks the cards answer the questions asked in
// their words: a failing design whose sample falls as short is
// "Confirmed", a placement is answered with a count, not "Yes".
func TestFirstScreenWords(t *testing.T) {
	in, err := netread.ReadFile("../../testdata/plant/heating.edges", netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	a, _ := g.Lookup("b1.fuel_flow")
	d, _ := structural.Dedicated(g, []int32{a})
	rv, err := analysis.Analyse(g, analysis.ReviewRequest{Inputs: &d, PlaceSensors: true, Complete: true})
	if err != nil {
		t.Fatal(err)
	}
	dim := rv.Check.Controllability.Dimension
	r := FromReview(rv, Context{Title: "heating", Network: "heating.edges", InputsFile: "one.txt", Inputs: &d,
		Numeric: &Numeric{What: "the given inputs", Seed: 1, Trials: 3, StatesChecked: 48,
			Rows: []NumericRow{{Property: "controllability", Signals: 1, Structural: dim, Sampled: dim}}}})
	want := []struct{ topic, word string }{
		{"Is heating.edges structurally controllable from the inputs in one.txt?", "No"},
		{"Where must dedicated sensors go, at least cost, for heating.edges to be structurally observable?", "18 sensors"},
		{"Do sampled numbers confirm the structural answer?", "Confirmed"},
	}
	for i, w := range want {
		if r.Answers[i].Topic != w.topic || r.Answers[i].Word != w.word {
			t.Errorf("card %d: %q %q, want %q %q", i, r.Answers[i].Topic, r.Answers[i].Word, w.topic, w.word)
		}
	}
	if h := r.Answers[2].Headline; !strings.HasPrefix(h, "Controllability "+strconv.Itoa(dim)+" of 48") {
		t.Errorf("numeric card says %q", h)
	}
}
