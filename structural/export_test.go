package structural

// Unexported helpers that the external tests use as they are: the
// reference cover flow (dimension_ref_test.go) differs from
// ControllableDimension only in the flow, not in these.
var (
	Reach           = reach
	InNeighbourCSR  = inNeighbourCSR
	InNeighbourCSRT = inNeighbourCSRT
	SCCThrough      = sccThrough
)
