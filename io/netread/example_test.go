package netread_test

import (
	"fmt"
	"strings"

	"github.com/netsteer/netsteer/io/netread"
)

func ExampleRead() {
	// A fictional greenhouse: "u v" means u acts on v.
	const net = `# heater and vents act on the air; the air on the plants
heater_power   air_temperature
roof_vent      air_temperature
roof_vent      air_humidity
air_temperature "leaf wetness, bed 2"
air_humidity   "leaf wetness, bed 2"
heater_power   air_temperature
`
	g, err := netread.Read(strings.NewReader(net), "greenhouse.edges", netread.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d states, %d edges, %d repeat merged\n", g.N(), g.Edges(), g.DuplicatesMerged())
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			fmt.Printf("%s -> %s\n", g.Name(u), g.Name(v))
		}
	}

	_, err = netread.Read(strings.NewReader("a b\nc\n"), "typo.edges", netread.Options{})
	fmt.Println(err)
	// Output:
	// 5 states, 5 edges, 1 repeat merged
	// heater_power -> air_temperature
	// air_temperature -> leaf wetness, bed 2
	// roof_vent -> air_temperature
	// roof_vent -> air_humidity
	// air_humidity -> leaf wetness, bed 2
	// typo.edges:2: want "source target [weight]", found one field "c"
}
