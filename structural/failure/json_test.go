package failure_test

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
)

// Results marshal with state names and snake_case keys (common practice
// for the project's JSON).
func TestJSON(t *testing.T) {
	g := cooling()
	d, _ := structural.Dedicated(g, ids(g, "pump", "zone1", "chiller"))
	as, err := failure.Assess(g, failure.Request{Design: d, States: true})
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(as)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`"essential_count":2`, `"class":"essential"`, `"class":"useless"`,
		`"from":"supply","to":"zone2"`, `"unreached":["pump"]`, `"replacement":{"feasible":true,"added":["zone2"]`,
		`"breaking_states":[`, `"state":"supply"`} {
		if !strings.Contains(string(b), want) {
			t.Errorf("assessment JSON lacks %s:\n%s", want, b)
		}
	}
	rp, err := failure.Robust(g, failure.RobustRequest{Survive: failure.AnyLink})
	if err != nil {
		t.Fatal(err)
	}
	b, err = json.Marshal(rp)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`"survive":"any link"`, `"feasible":true`, `"optimal":true`, `"lower_bound":`} {
		if !strings.Contains(string(b), want) {
			t.Errorf("robust JSON lacks %s:\n%s", want, b)
		}
	}
}
