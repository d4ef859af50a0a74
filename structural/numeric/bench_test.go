package numeric

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// erNetwork returns a directed Erdős–Rényi network G(n, L) with L = k·n/2
// edges and a minimum driver design for it (structurally controllable).
func erNetwork(n int, k float64, seed uint64) (*structural.Network, [][]int32) {
	rng := rand.New(rand.NewPCG(seed, 1))
	b := structural.NewIntBuilder(n, 0)
	l := int(k * float64(n) / 2)
	for i := 0; i < l; i++ {
		b.AddEdge(int32(rng.IntN(n)), int32(rng.IntN(n)))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		panic(err)
	}
	return g, structural.Drivers(g).Inputs.Signals()
}

// BenchmarkDimension measures one exact trial on a controllable design
// (the worst case: r = n). Run: go test -run XXX -bench Dimension
// ./structural/numeric. The goal is 2,000 states within 60 s for a whole
// verify run.
func BenchmarkDimension(b *testing.B) {
	for _, n := range []int{250, 500, 1000, 2000} {
		g, in := erNetwork(n, 6, 42)
		p := &Pattern{Out: g.Out(), Signals: in}
		f := NewField(Mersenne61)
		x := DrawExact(p, f, rand.New(rand.NewPCG(1, 2)))
		b.Run("n="+itoa(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if d := Dimension(p, x, false, nil); d != n {
					b.Fatalf("dimension %d, want %d", d, n)
				}
			}
		})
	}
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var buf [20]byte
	i := len(buf)
	for n > 0 {
		i--
		buf[i] = byte('0' + n%10)
		n /= 10
	}
	return string(buf[i:])
}

// BenchmarkFloat measures the floating-point check (Schur form, margin over
// every eigenvalue, Gramian) on the same designs.
func BenchmarkFloat(b *testing.B) {
	for _, n := range []int{250, 500, 1000} {
		g, in := erNetwork(n, 6, 42)
		p := &Pattern{Out: g.Out(), Signals: in}
		x := DrawReal(p, rand.New(rand.NewPCG(1, 2)))
		a, bb := x.Dense(p, false)
		b.Run("n="+itoa(n)+"/m="+itoa(len(in)), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Float(a, bb, n, len(in), nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkVerify measures a whole default run (3 trials, exact check only)
// at 2,000 states: the goal is well under 60 s. Run: go test -run XXX
// -bench Verify ./structural/numeric.
func BenchmarkVerify(b *testing.B) {
	g, in := erNetwork(2000, 6, 42)
	for i := 0; i < b.N; i++ {
		rep, err := Verify(g, Request{Inputs: dz(g, in), Seed: uint64(i), MaxFloatStates: -1})
		if err != nil {
			b.Fatal(err)
		}
		if !rep.Controllability.SampledHolds {
			b.Fatal("design not confirmed")
		}
	}
}

// modesBench prepares the modes analysis of a random sample of an ER
// network whose minimum driver design lost a tenth of its signals, so that
// about that many states' worth of modes are stuck.
func modesBench(n int) (*realSystem, *Pattern) {
	g, in := erNetwork(n, 6, 42)
	in = in[:len(in)-max(1, len(in)/10)]
	p := &Pattern{Out: g.Out(), Signals: in}
	re := DrawReal(p, rand.New(rand.NewPCG(1, 2)))
	a, b := re.Dense(p, false)
	f := NewField(Mersenne61)
	sys := &realSystem{p: p, re: re, n: n, m: len(in), a: a, b: b, exact: exactOf(re, f, false),
		alt: func() *Exact { return exactOf(re, NewField(Alt61), false) }}
	return sys, p
}

// BenchmarkModes measures the stuck-mode analysis of one system: the exact
// Krylov basis, the floating-point Kalman basis and decomposition, the
// eigenvalues of the uncontrollable part with their vectors, the exact
// quotient and its characteristic polynomial. Run: go test -run XXX
// -bench Modes -benchtime 1x ./structural/numeric.
func BenchmarkModes(b *testing.B) {
	for _, n := range []int{250, 500, 1000} {
		sys, p := modesBench(n)
		b.Run("n="+itoa(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				kb := krylov(p, sys.exact, false, nil)
				m, err := stuckModes(sys, kb, false, func(ids []int32) structural.States { return structural.States{} })
				if err != nil {
					b.Fatal(err)
				}
				if i == 0 {
					b.ReportMetric(float64(n-m.Dimension), "stuck")
				}
			}
		})
	}
}

// BenchmarkEffort measures the Gramian figures of a stable system with a
// tenth of the states driven: the Schur form, the Lyapunov (Stein) solve
// and the symmetric eigensolver; "horizon" adds the 2n×2n exponential.
func BenchmarkEffort(b *testing.B) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, tc := range []struct {
		n        int
		discrete bool
		horizon  float64
	}{{250, false, 0}, {500, false, 0}, {1000, false, 0}, {500, true, 0}, {500, false, 1}} {
		a := stableDense(rng, tc.n, tc.discrete)
		m := tc.n / 10
		bm := make([]float64, tc.n*m)
		for j := 0; j < m; j++ {
			bm[(10*j)*m+j] = 1
		}
		name := "n=" + itoa(tc.n)
		if tc.discrete {
			name += "/discrete"
		}
		if tc.horizon > 0 {
			name += "/horizon"
		}
		b.Run(name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := GramianEffort(a, bm, tc.n, m, EffortRequest{Discrete: tc.discrete, Horizon: tc.horizon}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkRank ranks ten single-actuator candidates on one stable sampled
// A (a ring with self-loops, so every state is a possible place): one
// Schur form, then a Lyapunov solve and an eigensolver per candidate.
func BenchmarkRank(b *testing.B) {
	for _, n := range []int{250, 500} {
		bl := structural.NewIntBuilder(n, 0)
		for i := 0; i < n; i++ {
			bl.AddEdge(int32(i), int32((i+1)%n))
			bl.AddEdge(int32(i), int32(i))
		}
		g, err := bl.Build(structural.BuildOptions{})
		if err != nil {
			b.Fatal(err)
		}
		var ds []structural.Design
		for c := 0; c < 10; c++ {
			d, _ := structural.Dedicated(g, []int32{int32(c * n / 10)})
			ds = append(ds, d)
		}
		b.Run("n="+itoa(n)+"/candidates=10", func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				// Seed 3 draws a stable A for both sizes; an unstable one
				// is an error on the infinite horizon.
				if _, err := RankDesigns(g, ds, RankRequest{Seed: 3, Effort: EffortRequest{Horizon: 1}}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
