package sweepcsv_test

import (
	"fmt"

	"github.com/netsteer/netsteer/io/sweepcsv"
)

func ExampleParseValues() {
	v, _ := sweepcsv.ParseValues("0:0.3:0.05", true, false)
	fmt.Println(v)
	// Output: [0 0.05 0.1 0.15 0.2 0.25 0.3]
}
