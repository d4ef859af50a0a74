package main

import (
	"slices"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
)

// TestFormatsHelpCoversReaders checks "netsteer help formats" against the
// reader itself: one entry per format of netread.Formats, in its order,
// each extension listed being one netread.FormatOf maps to that format,
// and every extension FormatOf recognises listed.
func TestFormatsHelpCoversReaders(t *testing.T) {
	var got []netread.Format
	listed := map[string]bool{}
	for _, f := range inputFormats {
		got = append(got, f.format)
		for _, ext := range f.exts {
			listed[ext] = true
			if r := netread.FormatOf("plant" + ext); r != f.format {
				t.Errorf("help lists %s under %s, but the reader takes it as %s", ext, f.format, r)
			}
		}
		if !strings.Contains(formatsHelp, "  "+string(f.format)+" (") {
			t.Errorf("help formats has no entry for %s", f.format)
		}
	}
	if !slices.Equal(got, netread.Formats) {
		t.Errorf("help formats lists %v, the reader reads %v", got, netread.Formats)
	}
	// The extensions FormatOf's doc comment names (a .gz suffix is looked
	// through).
	for _, ext := range []string{".mtx", ".dot", ".gv", ".graphml", ".xml", ".gml", ".net", ".paj", ".json"} {
		if !listed[ext] {
			t.Errorf("help formats does not list %s", ext)
		}
	}
}
