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
	in, err := netread.Read(strings.NewReader(net), "greenhouse.edges", netread.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	g := in.Network
	fmt.Printf("%d states, %d edges, %d repeat merged\n", g.N(), g.Edges(), g.DuplicatesMerged())
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			fmt.Printf("%s -> %s\n", g.Name(u), g.Name(v))
		}
	}

	// A spreadsheet export with a header row and more columns: refused as
	// an edge list, read by choosing the columns by name.
	const export = "id;from;to;kind\n1;pump;valve;pipe\n2;valve;tank;pipe\n"
	_, err = netread.Read(strings.NewReader(export), "export.csv", netread.Options{})
	fmt.Println(err)
	in, err = netread.Read(strings.NewReader(export), "export.csv", netread.Options{Columns: &netread.Columns{Names: []string{"from", "to"}}})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d states, %d edges\n", in.Network.N(), in.Network.Edges())
	// Output:
	// 5 states, 5 edges, 1 repeat merged
	// heater_power -> air_temperature
	// air_temperature -> leaf wetness, bed 2
	// roof_vent -> air_temperature
	// roof_vent -> air_humidity
	// air_humidity -> leaf wetness, bed 2
	// export.csv:1: want "source target [weight]" separated by semicolon, found 4 fields (choose columns to read a wider table)
	// 3 states, 2 edges
}
