package htmlreport

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"time"
)

// BrowserEnv names the environment variable that gives the headless
// browser's path for PrintPDF.
const BrowserEnv = "NETSTEER_BROWSER"

// browsers are looked for on $PATH, in order, when BrowserEnv is unset.
var browsers = []string{"chromium", "chromium-browser", "google-chrome", "google-chrome-stable"}

// ErrNoBrowser is returned by FindBrowser when no headless browser is
// found.
var ErrNoBrowser = errors.New("htmlreport: no headless browser (chromium) found to print the PDF: install one (Debian: apt-get install chromium) or set " + BrowserEnv + " to its path; open the HTML page and print it instead")

// FindBrowser returns the path of a Chromium-family browser: $NETSTEER_BROWSER
// when set, else the first of chromium, chromium-browser, google-chrome on
// $PATH.
func FindBrowser() (string, error) {
	if p := os.Getenv(BrowserEnv); p != "" {
		path, err := exec.LookPath(p)
		if err != nil {
			return "", fmt.Errorf("htmlreport: %s=%s: no such program", BrowserEnv, p)
		}
		return path, nil
	}
	for _, b := range browsers {
		if p, err := exec.LookPath(b); err == nil {
			return p, nil
		}
	}
	return "", ErrNoBrowser
}

// PrintPDF prints the HTML page at page with a headless browser
// (FindBrowser), networking off as far as flags allow, and returns the
// PDF.
func PrintPDF(ctx context.Context, page string) ([]byte, error) {
	browser, err := FindBrowser()
	if err != nil {
		return nil, err
	}
	abs, err := filepath.Abs(page)
	if err != nil {
		return nil, err
	}
	tmp, err := os.MkdirTemp("", "netsteer-pdf-")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(tmp)
	out := filepath.Join(tmp, "page.pdf")
	ctx, cancel := context.WithTimeout(ctx, 2*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser, "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir="+filepath.Join(tmp, "profile"), "--no-pdf-header-footer", "--print-to-pdf="+out, "file://"+abs)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil {
		return nil, fmt.Errorf("htmlreport: %s could not print the page: %v (%s)", filepath.Base(browser), err, lastLine(stderr.String()))
	}
	data, err := os.ReadFile(out)
	if err != nil || !bytes.HasPrefix(data, []byte("%PDF")) {
		return nil, fmt.Errorf("htmlreport: %s wrote no PDF", filepath.Base(browser))
	}
	return data, nil
}

func lastLine(s string) string {
	lines := strings.Split(strings.TrimSpace(s), "\n")
	return strings.TrimSpace(lines[len(lines)-1])
}
