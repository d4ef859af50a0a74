package structural

// Unexported helpers that the external tests compare with independent
// routes (plain Kuhn matching, a transposed CSR, Tarjan's components).
var (
	InNeighbourCSR  = inNeighbourCSR
	InNeighbourCSRT = inNeighbourCSRT
	SCCThrough      = sccThrough
)
