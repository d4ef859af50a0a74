package htmlreport

import (
	"bytes"
	"context"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/netsteer/netsteer/io/netread"
)

const chromium = "/usr/bin/chromium"

// runChromium runs headless Chromium on the page with the given extra
// flags and returns its standard output. Networking is off as far as
// flags allow: the page must need none.
func runChromium(t *testing.T, dir string, extra ...string) []byte {
	t.Helper()
	args := []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir=" + filepath.Join(dir, "profile"), "--hide-scrollbars"}
	args = append(args, extra...)
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, chromium, args...)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium %v: %v\n%s", extra, err, stderr.Bytes())
	}
	return stdout.Bytes()
}

// TestBrowser opens the demo plant's review page in a real headless
// Chromium (Debian package chromium; skipped when absent): a screenshot,
// the DOM as the browser parsed it, and a print to PDF.
func TestBrowser(t *testing.T) {
	if _, err := os.Stat(chromium); err != nil {
		t.Skip("no", chromium, "(apt-get install chromium)")
	}
	if testing.Short() {
		t.Skip("starts a browser")
	}
	in, err := netread.ReadFile("../../testdata/plant/heating.edges", netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	r := reviewOf(t, g, "heating.edges")
	// A hostile name among the findings, to see what the browser makes of it.
	r.Findings[0].Rows = append(r.Findings[0].Rows, []string{`<script>document.title="pwned"</script><img src=x onerror="document.title='pwned'">`})
	dir := t.TempDir()
	page := filepath.Join(dir, "review.html")
	var b bytes.Buffer
	if err := Write(&b, r); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(page, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	url := "file://" + page

	// The screenshot: a first screen of real content.
	shot := filepath.Join(dir, "shot.png")
	runChromium(t, dir, "--window-size=1280,1600", "--screenshot="+shot, url)
	data, err := os.ReadFile(shot)
	if err != nil {
		t.Fatal(err)
	}
	if len(data) < 50_000 {
		t.Errorf("screenshot of %d bytes: the page looks empty", len(data))
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	if b := img.Bounds(); b.Dx() != 1280 || b.Dy() != 1600 {
		t.Errorf("screenshot %dx%d, want 1280x1600", b.Dx(), b.Dy())
	}
	t.Logf("screenshot %s: %d bytes", shot, len(data))
	if dst := os.Getenv("NETSTEER_KEEP_SCREENSHOT"); dst != "" {
		os.WriteFile(dst, data, 0o644)
	}

	// The DOM after parsing: no script ran (the title is unchanged), no
	// element that runs or loads, no reference outside the page.
	dom := string(runChromium(t, dir, "--dump-dom", url))
	if !strings.Contains(dom, "<title>Review: heating.edges</title>") {
		t.Errorf("page title changed or missing: a script ran?")
	}
	p := scanPage(t, []byte(dom))
	if len(p.bad) > 0 {
		t.Errorf("active content in the browser's DOM: %v", p.bad)
	}
	for _, ref := range p.refs {
		if !strings.HasPrefix(ref, "#") {
			t.Errorf("reference outside the page: %q", ref)
		}
	}
	if !strings.Contains(strings.Join(p.text, "\n"), `<script>document.title="pwned"</script>`) {
		t.Errorf("the hostile name is not shown as text")
	}

	// The first screen, 1,400 x 900 pixels at 100 %: every answer card
	// lies within it. A copy of the page gets a script that measures the
	// cards and writes the result into the title (the page itself has no
	// script).
	probe := filepath.Join(dir, "probe.html")
	js := `<script>var c=document.querySelectorAll('.card');var n=0;for(const e of c){if(e.getBoundingClientRect().bottom<=900)n++;}document.title='first screen: '+n+' of '+c.length+' cards';</script></body>`
	if err := os.WriteFile(probe, bytes.Replace(b.Bytes(), []byte("</body>"), []byte(js), 1), 0o644); err != nil {
		t.Fatal(err)
	}
	probed := string(runChromium(t, dir, "--window-size=1400,900", "--dump-dom", "file://"+probe))
	m := regexp.MustCompile(`<title>first screen: (\d+) of (\d+) cards</title>`).FindStringSubmatch(probed)
	if m == nil || m[1] != m[2] || m[2] == "0" {
		t.Errorf("answer cards on the first screen: %v", m)
	}

	// Printing: a PDF of a few pages.
	pdf := filepath.Join(dir, "review.pdf")
	runChromium(t, dir, "--no-pdf-header-footer", "--print-to-pdf="+pdf, url)
	data, err = os.ReadFile(pdf)
	if err != nil {
		t.Fatal(err)
	}
	pages := len(regexp.MustCompile(`/Type\s*/Page[^s]`).FindAll(data, -1))
	if !bytes.HasPrefix(data, []byte("%PDF")) || pages < 2 || pages > 12 {
		t.Errorf("PDF of %d bytes and %d pages, want 2..12 pages", len(data), pages)
	}
	// The wide picture gets a landscape page of its own.
	landscape := 0
	for _, m := range regexp.MustCompile(`/MediaBox\s*\[\s*0 0 ([0-9.]+) ([0-9.]+)\s*\]`).FindAllSubmatch(data, -1) {
		w, _ := strconv.ParseFloat(string(m[1]), 64)
		h, _ := strconv.ParseFloat(string(m[2]), 64)
		if w > h {
			landscape++
		}
	}
	if landscape > 1 {
		t.Errorf("%d landscape pages, want at most 1 (the picture's)", landscape)
	}
	t.Logf("printed to %d pages", pages)
}
