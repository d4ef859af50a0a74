package htmlreport

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"html"
	"html/template"
	"io"
	"strings"
)

// The drawing elements and presentation attributes Graphviz's SVG uses;
// everything else is dropped.
var (
	svgElements = map[string]bool{
		"svg": true, "g": true, "title": true, "desc": true,
		"polygon": true, "polyline": true, "path": true, "ellipse": true,
		"circle": true, "rect": true, "line": true, "text": true, "tspan": true,
	}
	svgAttrs = map[string]bool{
		"class": true, "width": true, "height": true, "viewBox": true,
		"transform": true, "fill": true, "fill-opacity": true, "stroke": true,
		"stroke-width": true, "stroke-dasharray": true, "stroke-opacity": true,
		"stroke-linecap": true, "stroke-linejoin": true, "points": true, "d": true,
		"cx": true, "cy": true, "rx": true, "ry": true, "r": true, "x": true, "y": true,
		"x1": true, "y1": true, "x2": true, "y2": true, "text-anchor": true,
		"font-family": true, "font-size": true, "font-weight": true,
		"font-style": true, "text-decoration": true, "baseline-shift": true,
		"opacity": true, "preserveAspectRatio": true,
	}
)

// maxSVGDepth bounds element nesting, as a guard on hostile input.
const maxSVGDepth = 64

// SanitizeSVG parses an SVG document and rewrites it as one <svg> element
// for inline use in HTML. It keeps only drawing elements and presentation
// attributes from an allowlist (no script, style, foreignObject, image,
// use, gradient or animation elements; no id, event, href or style
// attributes; no url() references), drops comments, processing
// instructions and the DOCTYPE, and escapes all text and attribute values
// afresh. Without ids the picture can be inlined more than once. Graphviz's tooltip links (<a xlink:title=...>)
// become groups with a <title>, which browsers show as tooltips, so the
// result holds no links at all.
func SanitizeSVG(svg []byte) (template.HTML, error) {
	dec := xml.NewDecoder(bytes.NewReader(svg))
	dec.Strict = true
	var b strings.Builder
	depth, skip := 0, 0 // skip > 0: inside a dropped element, at that depth
	seenRoot := false
	var stack []string
	for {
		tok, err := dec.RawToken()
		if err == io.EOF {
			break
		}
		if err != nil {
			return "", fmt.Errorf("htmlreport: picture is not well-formed SVG: %v", err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			depth++
			if depth > maxSVGDepth {
				return "", errors.New("htmlreport: picture nests too deep")
			}
			name := t.Name.Local
			if skip > 0 {
				continue
			}
			if depth == 1 {
				if name != "svg" || t.Name.Space != "" || seenRoot {
					return "", errors.New("htmlreport: picture is not an SVG document")
				}
				seenRoot = true
			}
			tip := ""
			if name == "a" && t.Name.Space == "" {
				for _, a := range t.Attr {
					if a.Name.Space == "xlink" && a.Name.Local == "title" {
						tip = a.Value
					}
				}
				b.WriteString("<g>")
				if tip != "" {
					b.WriteString("<title>")
					xmlEscape(&b, tip)
					b.WriteString("</title>")
				}
				stack = append(stack, "g")
				continue
			}
			if !svgElements[name] || t.Name.Space != "" {
				skip = depth
				continue
			}
			b.WriteByte('<')
			b.WriteString(name)
			if depth == 1 {
				b.WriteString(` xmlns="http://www.w3.org/2000/svg" role="img"`)
			}
			for _, a := range t.Attr {
				if a.Name.Space != "" || !svgAttrs[a.Name.Local] || !safeValue(a.Value) {
					continue
				}
				b.WriteByte(' ')
				b.WriteString(a.Name.Local)
				b.WriteString(`="`)
				xmlEscape(&b, a.Value)
				b.WriteByte('"')
			}
			b.WriteByte('>')
			stack = append(stack, name)
		case xml.EndElement:
			if skip > 0 {
				if depth == skip {
					skip = 0
				}
				depth--
				continue
			}
			depth--
			if len(stack) == 0 {
				return "", errors.New("htmlreport: picture is not well-formed SVG")
			}
			b.WriteString("</" + stack[len(stack)-1] + ">")
			stack = stack[:len(stack)-1]
		case xml.CharData:
			if skip > 0 || depth == 0 {
				continue
			}
			xmlEscape(&b, string(t))
		}
	}
	if !seenRoot || len(stack) != 0 {
		return "", errors.New("htmlreport: picture has no complete <svg> element")
	}
	return template.HTML(b.String()), nil
}

// safeValue rejects attribute values that could refer to anything or run
// code: a url() reference or a scheme.
func safeValue(v string) bool {
	l := strings.ToLower(v)
	return !strings.Contains(l, "url(") && !strings.Contains(l, "javascript:") &&
		!strings.Contains(l, "data:") && !strings.Contains(l, "expression(")
}

// xmlEscape writes s with &, <, >, " and ' escaped (html.EscapeString).
func xmlEscape(b *strings.Builder, s string) { b.WriteString(html.EscapeString(s)) }
