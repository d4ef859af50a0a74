package htmlreport

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"os"
	"strconv"
)

// File describes an input file: what it is for, its name, size and
// SHA-256, so that a reader can tell whether the page still matches it.
type File struct {
	Role, Name, Size, SHA256 string
}

// Describe reads the file at path and returns its description. The
// standard input ("-") cannot be read twice and is described as such.
func Describe(role, path string) (File, error) {
	if path == "-" {
		return File{Role: role, Name: "standard input", Size: "", SHA256: "(not recorded: read from standard input)"}, nil
	}
	f, err := os.Open(path)
	if err != nil {
		return File{}, fmt.Errorf("htmlreport: %v", err)
	}
	defer f.Close()
	h := sha256.New()
	n, err := io.Copy(h, f)
	if err != nil {
		return File{}, fmt.Errorf("htmlreport: reading %s: %v", path, err)
	}
	return File{Role: role, Name: path, Size: strconv.FormatInt(n, 10), SHA256: hex.EncodeToString(h.Sum(nil))}, nil
}
