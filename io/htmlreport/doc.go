// Package htmlreport writes a design-review page: one self-contained HTML
// file that states the question and the answer first, shows the annotated
// picture inline, lists drivers, actuators and sensors with their roles and
// costs, gives the witness when a design fails and the numeric check when
// one was run, and ends with the provenance (input files with their SHA-256,
// tool version, options) and the cautions.
//
// The page needs nothing but itself: no scripts, no style sheets, fonts or
// images from elsewhere, and it prints cleanly. Every name is escaped by
// html/template; the picture is an SVG produced by Graphviz that is parsed
// and rewritten here from an allowlist of drawing elements and attributes
// (SanitizeSVG), so nothing in it can run or fetch anything.
//
// The package formats; it computes nothing. A Review is filled by the
// caller from the structural, placement and numeric results.
package htmlreport
