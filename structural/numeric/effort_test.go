package numeric

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/placement"
)

// stableDense returns a random n×n A shifted to be stable: continuous
// (every real part below -0.1) or discrete (spectral radius 0.9).
func stableDense(rng *rand.Rand, n int, discrete bool) []float64 {
	a := randDense(rng, n, n)
	var e mat.Eigen
	e.Factorize(mat.NewDense(n, n, append([]float64(nil), a...)), mat.EigenNone)
	absc, rad := math.Inf(-1), 0.0
	for _, l := range e.Values(nil) {
		absc = math.Max(absc, real(l))
		rad = math.Max(rad, math.Hypot(real(l), imag(l)))
	}
	if discrete {
		for i := range a {
			a[i] *= 0.9 / rad
		}
		return a
	}
	for i := 0; i < n; i++ {
		a[i*n+i] -= absc + 0.1
	}
	return a
}

// symExtremes returns the extreme eigenvalues and the trace of the
// symmetric part of w (gonum mat.EigenSym).
func symExtremes(w *mat.Dense) (lo, hi, tr float64) {
	n, _ := w.Dims()
	sym := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		tr += w.At(i, i)
		for j := i; j < n; j++ {
			sym.SetSym(i, j, (w.At(i, j)+w.At(j, i))/2)
		}
	}
	var es mat.EigenSym
	es.Factorize(sym, false)
	v := es.Values(nil)
	return v[0], v[n-1], tr
}

// steinKronecker solves A W Aᵀ - W + BBᵀ = 0 by the Kronecker form
// (I - A⊗A) vec W = vec(BBᵀ) with gonum's dense solver (common practice).
func steinKronecker(a, b []float64, n, m int) *mat.Dense {
	k := mat.NewDense(n*n, n*n, nil)
	rhs := mat.NewVecDense(n*n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			row := i*n + j
			// (A W Aᵀ)_ij = Σ_pq A_ip W_pq A_jq
			for p := 0; p < n; p++ {
				for q := 0; q < n; q++ {
					k.Set(row, p*n+q, k.At(row, p*n+q)-a[i*n+p]*a[j*n+q])
				}
			}
			k.Set(row, row, k.At(row, row)+1)
			var bb float64
			for l := 0; l < m; l++ {
				bb += b[i*m+l] * b[j*m+l]
			}
			rhs.SetVec(row, bb)
		}
	}
	var w mat.VecDense
	if err := w.SolveVec(k, rhs); err != nil {
		panic(err)
	}
	return mat.NewDense(n, n, w.RawVector().Data)
}

func near(a, b, tol float64) bool {
	return math.Abs(a-b) <= tol*math.Max(1, math.Max(math.Abs(a), math.Abs(b)))
}

// Infinite-horizon Gramians against Kronecker solves: the Lyapunov
// equation AW + WAᵀ + BBᵀ = 0 (kronGramian with no shift) for stable
// continuous systems, and the Stein equation AWAᵀ - W + BBᵀ = 0 for
// Schur-stable discrete ones (solved through its Cayley transform here,
// directly there).
func TestEffortAgainstKronecker(t *testing.T) {
	rng := rand.New(rand.NewPCG(51, 52))
	for c := 0; c < 120; c++ {
		n, m := 1+rng.IntN(7), 1+rng.IntN(3)
		discrete := c%2 == 1
		a, b := stableDense(rng, n, discrete), randDense(rng, n, m)
		e, err := GramianEffort(a, b, n, m, EffortRequest{Discrete: discrete})
		if err != nil {
			t.Fatal(err)
		}
		if e.Skipped != "" {
			t.Fatalf("case %d: skipped: %s", c, e.Skipped)
		}
		var w *mat.Dense
		if discrete {
			w = steinKronecker(a, b, n, m)
		} else {
			w = kronGramian(a, b, n, m, 0)
		}
		lo, hi, tr := symExtremes(w)
		if !near(e.GramianMin, lo, 1e-7*hi) || !near(e.GramianMax, hi, 1e-8) || !near(e.GramianTrace, tr, 1e-8) {
			t.Fatalf("case %d (discrete %v, n=%d): Gramian %g..%g trace %g, Kronecker %g..%g trace %g",
				c, discrete, n, e.GramianMin, e.GramianMax, e.GramianTrace, lo, hi, tr)
		}
		if lo > 1e-6*hi && !near(e.WorstCaseEnergy, 1/lo, 1e-6) {
			t.Fatalf("case %d: worst-case energy %g, want %g", c, e.WorstCaseEnergy, 1/lo)
		}
	}
}

// Closed forms (common practice; from memory, derivable in two lines):
// the scalar x' = -a x + b u has W = b²/(2a) on the infinite horizon; the
// double integrator x1' = x2, x2' = u has W_T = [[T³/3, T²/2], [T²/2, T]]
// (e^{At}B = (t, 1)); the discrete scalar x(k+1) = ρ x(k) + u(k) has W_N =
// (1 - ρ^{2N})/(1 - ρ²).
func TestEffortClosedForms(t *testing.T) {
	for _, tc := range []struct{ a, b float64 }{{2, 3}, {0.1, 1}, {7, 0.5}} {
		e, err := GramianEffort([]float64{-tc.a}, []float64{tc.b}, 1, 1, EffortRequest{})
		if err != nil {
			t.Fatal(err)
		}
		if want := tc.b * tc.b / (2 * tc.a); !near(e.GramianMin, want, 1e-13) || !near(e.WorstCaseEnergy, 1/want, 1e-13) {
			t.Errorf("scalar a=%g b=%g: W = %g, want %g", tc.a, tc.b, e.GramianMin, want)
		}
	}
	for _, T := range []float64{0.5, 1, 3} {
		e, err := GramianEffort([]float64{0, 1, 0, 0}, []float64{0, 1}, 2, 1, EffortRequest{Horizon: T})
		if err != nil {
			t.Fatal(err)
		}
		w := mat.NewDense(2, 2, []float64{T * T * T / 3, T * T / 2, T * T / 2, T})
		lo, hi, tr := symExtremes(w)
		if !near(e.GramianMin, lo, 1e-10) || !near(e.GramianMax, hi, 1e-12) || !near(e.GramianTrace, tr, 1e-12) || e.Horizon != T {
			t.Errorf("double integrator T=%g: %g..%g trace %g, want %g..%g trace %g", T, e.GramianMin, e.GramianMax, e.GramianTrace, lo, hi, tr)
		}
	}
	for _, tc := range []struct {
		rho float64
		N   float64
	}{{0.5, 1}, {0.5, 7}, {2, 5}, {-1.5, 12}} {
		e, err := GramianEffort([]float64{tc.rho}, []float64{1}, 1, 1, EffortRequest{Discrete: true, Horizon: tc.N})
		if err != nil {
			t.Fatal(err)
		}
		want := (1 - math.Pow(tc.rho, 2*tc.N)) / (1 - tc.rho*tc.rho)
		if !near(e.GramianMin, want, 1e-12) {
			t.Errorf("discrete ρ=%g N=%g: W = %g, want %g", tc.rho, tc.N, e.GramianMin, want)
		}
	}
	// An unstable A on the infinite horizon is skipped with the reason;
	// a bad horizon is refused.
	e, err := GramianEffort([]float64{0.5}, []float64{1}, 1, 1, EffortRequest{})
	if err != nil || e.Skipped == "" || e.SpectralAbscissa != 0.5 {
		t.Errorf("unstable: %+v %v", e, err)
	}
	for _, req := range []EffortRequest{{Horizon: -1}, {Horizon: math.NaN()}, {Discrete: true, Horizon: 2.5}} {
		if _, err := GramianEffort([]float64{-1}, []float64{1}, 1, 1, req); err != ErrHorizon {
			t.Errorf("horizon %+v: %v", req, err)
		}
	}
}

// Finite horizons on random systems, stable or not: continuous against
// composite Simpson quadrature of e^{At}BBᵀe^{Aᵀt} with gonum's matrix
// exponential at the nodes (an independent route to Van Loan's block
// exponential), discrete against the plain sum Σ AᵏBBᵀ(Aᵀ)ᵏ.
func TestEffortFiniteHorizon(t *testing.T) {
	rng := rand.New(rand.NewPCG(53, 54))
	for c := 0; c < 40; c++ {
		n, m := 1+rng.IntN(5), 1+rng.IntN(2)
		a, b := randDense(rng, n, n), randDense(rng, n, m)
		am, bm := mat.NewDense(n, n, a), mat.NewDense(n, m, b)
		if c%2 == 0 {
			T := 0.3 + rng.Float64()
			e, err := GramianEffort(a, b, n, m, EffortRequest{Horizon: T})
			if err != nil {
				t.Fatal(err)
			}
			const steps = 400
			w := mat.NewDense(n, n, nil)
			for s := 0; s <= steps; s++ {
				var ex, eb, term mat.Dense
				var at mat.Dense
				at.Scale(T*float64(s)/steps, am)
				ex.Exp(&at)
				eb.Mul(&ex, bm)
				term.Mul(&eb, eb.T())
				wt := 2.0
				switch {
				case s == 0 || s == steps:
					wt = 1
				case s%2 == 1:
					wt = 4
				}
				term.Scale(wt*T/(3*steps), &term)
				w.Add(w, &term)
			}
			lo, hi, tr := symExtremes(w)
			if !near(e.GramianMax, hi, 1e-7) || !near(e.GramianTrace, tr, 1e-7) || math.Abs(e.GramianMin-lo) > 1e-7*hi {
				t.Fatalf("case %d: Van Loan %g..%g trace %g, Simpson %g..%g trace %g", c, e.GramianMin, e.GramianMax, e.GramianTrace, lo, hi, tr)
			}
		} else {
			N := 1 + rng.IntN(12)
			e, err := GramianEffort(a, b, n, m, EffortRequest{Discrete: true, Horizon: float64(N)})
			if err != nil {
				t.Fatal(err)
			}
			w := mat.NewDense(n, n, nil)
			pb := mat.DenseCopyOf(bm)
			for k := 0; k < N; k++ {
				var term mat.Dense
				term.Mul(pb, pb.T())
				w.Add(w, &term)
				var next mat.Dense
				next.Mul(am, pb)
				pb = &next
			}
			lo, hi, tr := symExtremes(w)
			if !near(e.GramianMax, hi, 1e-9) || !near(e.GramianTrace, tr, 1e-9) || math.Abs(e.GramianMin-lo) > 1e-9*hi {
				t.Fatalf("case %d: doubling %g..%g trace %g, sum %g..%g trace %g", c, e.GramianMin, e.GramianMax, e.GramianTrace, lo, hi, tr)
			}
		}
	}
}

// Ranking equally cheap placements: on a fictional cooling loop every
// state of the loop can take the one actuator the placement needs (the
// loop is one source component with a perfect matching), and the roles
// list the alternatives. RankCandidates orders them by worst-case energy,
// each figure checked against the Kronecker solve of the Lyapunov
// equation for that candidate's B (kronGramian, no shift).
func TestRankPlacement(t *testing.T) {
	g := weighted(t, []wedge{
		{"pump", "pump", -1}, {"pump", "valve", 2}, {"valve", "valve", -3},
		{"valve", "tank", 0.5}, {"tank", "tank", -0.5}, {"tank", "pump", 0.1},
	})
	pl, err := placement.Place(g, structural.Controllability, structural.Devices{})
	if err != nil {
		t.Fatal(err)
	}
	roles := pl.Roles(10)
	cands, err := PlacementCandidates(g, pl, roles)
	if err != nil {
		t.Fatal(err)
	}
	if len(cands) != 3 || pl.Devices.Len() != 1 {
		t.Fatalf("%d candidates for %d devices: %+v", len(cands), pl.Devices.Len(), roles)
	}
	rk, err := RankCandidates(g, cands, RankRequest{Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	n := g.N()
	a, _ := RealFromWeights(&Pattern{Out: g.Out()}, g.Weights(), nil).Dense(&Pattern{Out: g.Out()}, false)
	last := 0.0
	seen := map[int]bool{}
	for i, rd := range rk.Candidates {
		b := make([]float64, n)
		b[rd.Design.Signal(0)[0]] = 1
		lo, _, tr := symExtremes(kronGramian(a, b, n, 1, 0))
		if !near(rd.WorstCaseEnergy, 1/lo, 1e-7) || !near(rd.GramianTrace, tr, 1e-9) {
			t.Errorf("candidate %d: energy %g trace %g, Kronecker %g, %g", rd.Candidate, rd.WorstCaseEnergy, rd.GramianTrace, 1/lo, tr)
		}
		if rd.WorstCaseEnergy < last || rd.Rank != i+1 {
			t.Errorf("order: %d at rank %d after energy %g", rd.Candidate, rd.Rank, last)
		}
		last = rd.WorstCaseEnergy
		seen[rd.Candidate] = true
		t.Logf("rank %d: %v energy %.4g trace %.4g", rd.Rank, rd.Design.Signal(0), rd.WorstCaseEnergy, rd.GramianTrace)
		if (rd.Swap == nil) != (rd.Candidate == 1) {
			t.Errorf("candidate %d swap %+v", rd.Candidate, rd.Swap)
		}
	}
	if len(seen) != 3 {
		t.Errorf("candidates %v", seen)
	}
	// The same ranking from the designs alone.
	var ds []structural.Design
	for _, c := range cands {
		ds = append(ds, c.Design)
	}
	rk2, err := RankDesigns(g, ds, RankRequest{Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	var o1, o2 []int
	for i := range rk.Candidates {
		o1, o2 = append(o1, rk.Candidates[i].Candidate), append(o2, rk2.Candidates[i].Candidate)
	}
	if !slices.Equal(o1, o2) {
		t.Errorf("orders %v and %v", o1, o2)
	}
}

// fullVanLoan is the finite-horizon Gramian from gonum's exponential of
// the whole 2n×2n block matrix [[-A, BBᵀ], [0, Aᵀ]]·T (Van Loan 1978; the
// reference route that blockGramian shortens).
func fullVanLoan(a, b []float64, n, m int, h float64) *mat.Dense {
	big := mat.NewDense(2*n, 2*n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			var q float64
			for l := 0; l < m; l++ {
				q += b[i*m+l] * b[j*m+l]
			}
			big.Set(i, j, -a[i*n+j]*h)
			big.Set(i, n+j, q*h)
			big.Set(n+i, n+j, a[j*n+i]*h)
		}
	}
	var ex mat.Dense
	ex.Exp(big)
	var x mat.Dense
	x.Mul(ex.Slice(n, 2*n, n, 2*n).T(), ex.Slice(0, n, n, 2*n))
	return &x
}

// The shared-exponential route agrees with gonum's exponential of the
// whole block matrix, for horizons that need many squarings too.
func TestEffortBlockGramian(t *testing.T) {
	rng := rand.New(rand.NewPCG(55, 56))
	for c := 0; c < 40; c++ {
		n, m := 1+rng.IntN(8), 1+rng.IntN(3)
		a, b := randDense(rng, n, n), randDense(rng, n, m)
		h := []float64{0.05, 0.7, 3}[c%3]
		e, err := GramianEffort(a, b, n, m, EffortRequest{Horizon: h})
		if err != nil {
			t.Fatal(err)
		}
		lo, hi, tr := symExtremes(fullVanLoan(a, b, n, m, h))
		if !near(e.GramianMax, hi, 1e-9) || !near(e.GramianTrace, tr, 1e-9) || math.Abs(e.GramianMin-lo) > 1e-9*hi {
			t.Fatalf("case %d (h=%g): %g..%g trace %g, full block exponential %g..%g trace %g", c, h, e.GramianMin, e.GramianMax, e.GramianTrace, lo, hi, tr)
		}
	}
}

// TestRankedDesignConditioning checks that Conditioning picks the trial
// with the smallest ratio of the Gramian's extreme eigenvalues (worked by
// hand from the figures given), a non-positive smallest eigenvalue
// counting as zero.
func TestRankedDesignConditioning(t *testing.T) {
	for _, c := range []struct {
		name     string
		efforts  []*Effort
		ratio    float64
		trial    int
		singular bool
	}{
		{"none", nil, math.Inf(1), 0, false},
		{"well conditioned", []*Effort{{GramianMin: 1, GramianMax: 4}, {GramianMin: 2, GramianMax: 4}}, 0.25, 1, false},
		{"tiny second", []*Effort{{GramianMin: 1, GramianMax: 4}, {GramianMin: 1.4e-13, GramianMax: 1}}, 1.4e-13, 2, true},
		{"negative", []*Effort{{GramianMin: 1e-20, GramianMax: 1}, {GramianMin: -3e-33, GramianMax: 1}}, 0, 2, true},
	} {
		r, tr := RankedDesign{Efforts: c.efforts}.Conditioning()
		if r != c.ratio || tr != c.trial {
			t.Errorf("%s: Conditioning = %g, %d; want %g, %d", c.name, r, tr, c.ratio, c.trial)
		}
		if got := r <= RoundingLevel(48); got != c.singular {
			t.Errorf("%s: singular within rounding = %v, want %v", c.name, got, c.singular)
		}
	}
}
