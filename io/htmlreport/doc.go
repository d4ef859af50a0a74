// Package htmlreport writes a design-review page: one self-contained HTML
// file whose first screen asks the questions of the review in their words
// and answers them (is this design controllable, observable; where do the
// cheapest devices go; do sampled numbers confirm the structural answer),
// then shows the pictures inline, the witness of a failing design with its
// cheapest completion, the design, device and driver tables with one
// numbering of signals shared with the picture, the numeric check, and the
// provenance (each input's size and SHA-256 as read, the build's module
// version and VCS revision, the command line, the time) and the cautions.
//
// FromReview builds the page from an analysis.Review and a Context (the
// question's files, the pictures from io/render, the numeric check, the
// provenance); it words the answers and computes nothing. Write writes
// it; PrintPDF prints it with a headless Chromium when one is installed.
//
// The page needs nothing but itself: no scripts, no style sheets, fonts or
// images from elsewhere, and it prints cleanly. Every name is escaped by
// html/template, and characters that could hide or reorder text
// (controls, bidirectional marks) are shown as the escapes the text
// reports use; the pictures are SVG parsed and rewritten here from an
// allowlist of drawing elements and attributes (SanitizeSVG), so nothing
// in them can run or fetch anything.
package htmlreport
