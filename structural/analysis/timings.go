package analysis

import (
	"strconv"
	"time"
)

// Stage is the time one stage of a computation took.
type Stage struct {
	Name    string // e.g. "match": written as "match_s"
	Seconds float64
}

// Timings lists stage times in the order the stages ran. It marshals to
// JSON as an object whose keys are the stage names with "_s" appended.
type Timings []Stage

// Add appends a stage that started at t0 and returns t0's successor, the
// time now.
func (t *Timings) Add(name string, t0 time.Time) time.Time {
	now := time.Now()
	*t = append(*t, Stage{name, now.Sub(t0).Seconds()})
	return now
}

// Prepend puts a stage first (reading the network, timed by the caller).
func (t *Timings) Prepend(name string, d time.Duration) {
	*t = append(Timings{{name, d.Seconds()}}, *t...)
}

// Total returns the sum of the stages.
func (t Timings) Total() float64 {
	s := 0.0
	for _, x := range t {
		s += x.Seconds
	}
	return s
}

// MarshalJSON writes {"name_s": seconds, ...} with microsecond precision.
func (t Timings) MarshalJSON() ([]byte, error) {
	b := []byte{'{'}
	for i, s := range t {
		if i > 0 {
			b = append(b, ',')
		}
		b = strconv.AppendQuote(b, s.Name+"_s")
		b = append(b, ':')
		b = strconv.AppendFloat(b, s.Seconds, 'f', 6, 64)
	}
	return append(b, '}'), nil
}
