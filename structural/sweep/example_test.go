package sweep_test

import (
	"context"
	"fmt"
	"os"

	"github.com/netsteer/netsteer/structural/sweep"
)

func ExampleParseValues() {
	v, _ := sweep.ParseValues("0:0.3:0.05", true, false)
	fmt.Println(v)
	// Output: [0 0.05 0.1 0.15 0.2 0.25 0.3]
}

func ExamplePlan_Run() {
	// Driver fractions of directed ER networks of 2000 states at two mean
	// degrees, one replicate each, written as CSV to standard output
	// (NoTiming: zero seconds, so reruns give the same bytes).
	axes, err := sweep.ModelAxes("er", map[string]string{"nodes": "2000", "mean_degree": "2,6"})
	if err != nil {
		panic(err)
	}
	pl := &sweep.Plan{Model: "er", Axes: axes, Replicates: 1, Seed: 1}
	res, err := pl.Run(context.Background(), sweep.RunOptions{Output: "-", Stdout: os.Stdout, NoTiming: true})
	if err != nil {
		panic(err)
	}
	fmt.Println(res.Computed, "rows")
	// The measured n_D lies near the cavity prediction (Liu, Slotine &
	// Barabási 2011, Fig. 3a).
	// Output:
	// model,nodes,mean_degree,replicate,seed,edges,driver_count,driver_fraction,predicted_fraction,seconds,params,prediction_from
	// er,2000,2,1,3430300786430144281,2000,917,0.4585,0.4559380927,0.000,nodes=2000;mean_degree=2,model
	// er,2000,6,1,13788370309496159406,6000,143,0.0715,0.07231254211,0.000,nodes=2000;mean_degree=6,model
	// 2 rows
}
