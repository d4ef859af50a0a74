package textout

import (
	"encoding/json"
	"testing"
)

func TestIndentJSON(t *testing.T) {
	in := `{"a":[1,2],"b":{"c":["x,\"y",[]],"d":{}},"e":[{"f":"]"}]}`
	want := "{\n  \"a\": [1, 2],\n  \"b\": {\n    \"c\": [\n      \"x,\\\"y\",\n      []\n    ],\n    \"d\": {}\n  },\n  \"e\": [\n    {\n      \"f\": \"]\"\n    }\n  ]\n}"
	got := string(IndentJSON([]byte(in)))
	if got != want {
		t.Fatalf("got\n%s\nwant\n%s", got, want)
	}
	var v any
	if err := json.Unmarshal([]byte(got), &v); err != nil {
		t.Fatal(err)
	}
}
