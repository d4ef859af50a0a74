package nodetable_test

import (
	"fmt"
	"strings"

	"github.com/netsteer/netsteer/io/nodetable"
)

func Example() {
	table := "node,actuator_cost,can_actuate,has_actuator\n" +
		"feed_pump,120.5,,\n" +
		"reactor_temp,,no,\n" +
		"coolant_valve,80,,yes\n"
	tab, err := nodetable.Read(strings.NewReader(table), "units.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range tab.Rows {
		fmt.Printf("%s: cost %s, can actuate %v, has one %v\n", r.Node, nodetable.FormatCost(r.ActuatorCost), r.CanActuate, r.HasActuator)
	}
	// Output:
	// feed_pump: cost 120.5, can actuate true, has one false
	// reactor_temp: cost 1, can actuate false, has one false
	// coolant_valve: cost 80, can actuate true, has one true
}
