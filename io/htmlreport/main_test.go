package htmlreport

import (
	"fmt"
	"os"
	"testing"

	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/io/render/gvlayout"
)

// TestMain makes this test binary the layout program that render starts
// to draw the pictures on the review pages (see render.FindLayoutProgram).
func TestMain(m *testing.M) {
	const child = "NETSTEER_HTMLREPORT_TEST_LAYOUT"
	if os.Getenv(child) != "" {
		os.Exit(gvlayout.Main(os.Stdin, os.Stdout, os.Stderr, os.Args[1:]))
	}
	exe, err := os.Executable()
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	os.Setenv(render.LayoutEnv, exe)
	os.Setenv(child, "1")
	os.Exit(m.Run())
}
