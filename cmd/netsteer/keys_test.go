package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"sort"
	"strings"
	"testing"
)

// readmeKeys reads the JSON key reference of README.md: in the block after
// the line "<!-- json-keys -->", lines "COMMAND: key key.sub list[].key
// obj.*". A key ending in ".*" allows any key under it; "obj.@NAME" stands
// for obj.K for every key K listed under NAME (a shape used in several
// places, such as a property object).
func readmeKeys(path string) (map[string]map[string]bool, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	_, block, ok := bytes.Cut(b, []byte("<!-- json-keys -->"))
	if !ok {
		return nil, fmt.Errorf("%s: no <!-- json-keys --> block", path)
	}
	_, block, _ = bytes.Cut(block, []byte("```"))
	block, _, _ = bytes.Cut(block, []byte("```"))
	out := map[string]map[string]bool{}
	cmd := ""
	for _, line := range strings.Split(string(block), "\n") {
		if name, rest, ok := strings.Cut(line, ":"); ok && !strings.HasPrefix(line, " ") {
			cmd = strings.TrimSpace(name)
			out[cmd] = map[string]bool{}
			line = rest
		}
		for _, k := range strings.Fields(line) {
			if cmd == "" {
				return nil, fmt.Errorf("%s: key %q before any command", path, k)
			}
			out[cmd][k] = true
		}
	}
	// Expand shapes until none is left (a shape may use another).
	for round := 0; ; round++ {
		changed := false
		for cmd, keys := range out {
			for k := range keys {
				prefix, name, ok := strings.Cut(k, "@")
				if !ok {
					continue
				}
				shape, ok := out[name]
				if !ok {
					return nil, fmt.Errorf("%s: %s uses the unknown shape %q", path, cmd, name)
				}
				delete(keys, k)
				for sk := range shape {
					keys[prefix+sk] = true
				}
				changed = true
			}
		}
		if !changed {
			return out, nil
		}
		if round > 10 {
			return nil, fmt.Errorf("%s: shapes refer to each other in a loop", path)
		}
	}
}

// checkKeys returns the key paths of the JSON document data that the
// reference does not list for cmd.
func checkKeys(ref map[string]map[string]bool, cmd string, data []byte) ([]string, error) {
	allowed, ok := ref[cmd]
	if !ok {
		return nil, fmt.Errorf("README.md lists no JSON keys for %q", cmd)
	}
	var doc any
	if err := json.Unmarshal(data, &doc); err != nil {
		return nil, fmt.Errorf("%s output is not JSON: %v", cmd, err)
	}
	seen := map[string]bool{}
	var bad []string
	var walk func(prefix string, v any)
	walk = func(prefix string, v any) {
		switch x := v.(type) {
		case map[string]any:
			for k, sub := range x {
				p := k
				if prefix != "" {
					p = prefix + "." + k
				}
				if strings.HasSuffix(prefix, "timings") && !strings.HasSuffix(k, "_s") {
					bad = append(bad, p+" (a timing key must end in _s)")
				}
				seen[p] = true
				walk(p, sub)
			}
		case []any:
			for _, sub := range x {
				walk(prefix+"[]", sub)
			}
		}
	}
	walk("", doc)
	var missing []string
	for p := range seen {
		if !listed(allowed, p) {
			missing = append(missing, p)
		}
	}
	missing = append(missing, bad...)
	sort.Strings(missing)
	return missing, nil
}

func listed(allowed map[string]bool, p string) bool {
	if allowed[p] {
		return true
	}
	for i := len(p) - 1; i > 0; i-- {
		if p[i] == '.' && allowed[p[:i]+".*"] {
			return true
		}
	}
	return false
}

func TestCheckKeys(t *testing.T) {
	ref := map[string]map[string]bool{"x": {"a": true, "b": true, "b.c": true, "timings": true, "timings.*": true, "l": true, "l[].k": true}}
	missing, err := checkKeys(ref, "x", []byte(`{"a":1,"b":{"c":2,"d":3},"timings":{"read_s":1,"bad":2},"l":[{"k":1},{"z":2}]}`))
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"b.d", "l[].z", "timings.bad (a timing key must end in _s)"}
	if strings.Join(missing, ",") != strings.Join(want, ",") {
		t.Fatalf("missing = %v, want %v", missing, want)
	}
	if _, err := checkKeys(ref, "y", []byte(`{}`)); err == nil {
		t.Fatal("unknown command accepted")
	}
}
