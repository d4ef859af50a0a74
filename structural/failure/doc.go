// Package failure answers the design-review question "what if this device
// fails, or this link is cut?" for structural controllability and
// observability, and places devices that survive any one such failure.
//
// Conventions are those of package structural: an edge u -> v means u acts
// on v (A[v][u] != 0); a design's signals are inputs (columns of B) for
// Controllability and outputs (rows of C) for Observability, which is
// answered on the transposed network. Results name edges in the network's
// own orientation.
//
// Assess judges every single failure of a design that works: the loss of
// each device (signal), of each edge, and on request of each state (held
// constant: its row and column removed). Each loss is judged by Lin's two
// conditions: the states no signal reaches any more, from one dominator
// tree of the reachability graph (Lengauer & Tarjan 1979); and whether a
// dilation opens, from one maximum matching of [A B] and its
// Dulmage–Mendelsohn structure (the columns and edges that every maximum
// matching uses). No loss is recomputed from scratch. Devices are
// classified after Commault, Dion & Trinh ("Observability preservation
// under sensor failure", IEEE TAC 53(6):1554-1559, 2008: title, journal,
// volume, pages and year checked against a periodical index, the author
// list from memory; and its dual for actuators): essential (its loss
// alone breaks the design), useful (it matters once some other devices
// are lost too, with those devices named), useless (it belongs to no
// minimal working sub-design); for each of Lin's conditions alone, and
// overall. After each essential loss and each breaking link, the
// cheapest new dedicated devices that restore the design are given.
//
// Robust places the cheapest dedicated devices (actuators or sensors) that
// keep the network structurally controllable (observable) after the loss
// of any one device, or of any one link; a second device on the same state
// (a spare) may be allowed. The problem is NP-hard (Liu, Mo, Pequito,
// Sinopoli, Kar & Aguiar, IEEE TCNS 2017): small networks are solved
// exactly by branch and bound, larger ones by that paper's two-step method
// (a cheapest placement, then the fewest-cost additions as a weighted set
// cover), always with a proven lower bound and the gap to it.
//
// Structural results hold for almost all values of the free parameters;
// they screen designs and do not replace dynamic studies, safety analysis,
// local codes or licensed engineering review.
package failure
