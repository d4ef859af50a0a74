package target

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// The results marshal with encoding/json: state lists as names, the
// documented keys present (common practice for the CLI's JSON output).
func TestJSON(t *testing.T) {
	g := testnet.Network(t, 5, []testnet.Edge{{0, 1}, {1, 2}, {1, 3}, {4, 0}})
	v, err := Check(g, CheckRequest{Targets: []int32{2, 3, 4}, Inputs: testnet.Design(t, g, [][]int32{{0}})})
	if err != nil {
		t.Fatal(err)
	}
	sel, err := Select(g, SelectRequest{Targets: []int32{2, 3}, Mode: Actuators})
	if err != nil {
		t.Fatal(err)
	}
	res, err := Sample(g, SampleRequest{Targets: []int32{2, 3}, Inputs: sel.Inputs})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		v    any
		keys []string
	}{
		{v, []string{`"targets":["2","3","4"]`, `"status":"not_controllable"`, `"holds":false`, `"dimension":1`, `"dimension_upper":1`,
			`"exact":true`, `"unreached":["4"]`, `"bottleneck":{"targets":["2","3"],"in_neighbours":["1"],"input_lines":[],"in_capacity":1,"shortfall":1}`,
			`"funnel":null`, `"bounds":[`, `"relevant_states":`, `"failure_bound":`, `"dimension_from":`, `"linking":`, `"by_theorem":false`,
			`"sample_below_linking":false`}},
		{sel, []string{`"targets":["2","3"]`, `"feasible":true`, `"inputs":[[`, `"driven":[`, `"added":[`, `"existing":[]`, `"signal_count":2`,
			`"total_cost":2`, `"lower_bound":`, `"optimal":true`, `"method":`, `"proof":`, `"full_control":{"feasible":true,"signal_count":2,"total_cost":2}`,
			`"signals_saved":0`, `"cost_saved":0`, `"candidates":[`, `"unreachable_targets":[]`, `"region_states":5`, `"infeasible":false`,
			`"unsure_rejections":0`, `"stopped_rejections":0`}},
		{res, []string{`"sampled_dimension":2`, `"trial_dimensions":[2,2,2]`, `"holds":true`, `"agrees":true`, `"prime":2305843009213693951`}},
	} {
		b, err := json.Marshal(tc.v)
		if err != nil {
			t.Fatal(err)
		}
		for _, k := range tc.keys {
			if !strings.Contains(string(b), k) {
				t.Errorf("%s lacks %s", b, k)
			}
		}
	}
}
