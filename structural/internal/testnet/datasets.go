package testnet

import (
	"os"
	"path/filepath"
	"testing"
)

// Dataset returns the path of a public network in the shared datasets
// folder beside the repository (../shared/datasets from its root). The
// test is skipped when the file is absent, except under CI (CI=true),
// where the folder is promised and its absence fails the test.
func Dataset(t testing.TB, name string) string {
	t.Helper()
	dir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	for {
		if _, err := os.Stat(filepath.Join(dir, "go.mod")); err == nil {
			break
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			t.Fatal("testnet: no go.mod above the test's directory")
		}
		dir = parent
	}
	path := filepath.Join(dir, "..", "shared", "datasets", name)
	if _, err := os.Stat(path); err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("shared dataset %s missing under CI: %v", path, err)
		}
		t.Skipf("shared dataset %s absent: %v", path, err)
	}
	return path
}
