package numeric

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"sort"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
)

// denseNetwork builds a weighted network of n states named 0..n-1 from
// the dense A (edge u -> v with weight A[v][u] for every nonzero entry)
// and a design whose signal j drives the states where column j of B is
// nonzero, with those values.
func denseNetwork(t testing.TB, a, b [][]float64) (*structural.Network, structural.Design, [][]float64) {
	t.Helper()
	n := len(a)
	bl := structural.NewIntBuilder(n, 0)
	for v := 0; v < n; v++ {
		for u := 0; u < n; u++ {
			if a[v][u] != 0 {
				bl.AddWeightedEdge(int32(u), int32(v), a[v][u])
			}
		}
	}
	g, err := bl.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var sig [][]int32
	var w [][]float64
	for j := range b[0] {
		var s []int32
		var x []float64
		for i := 0; i < n; i++ {
			if b[i][j] != 0 {
				s = append(s, int32(i))
				x = append(x, b[i][j])
			}
		}
		sig = append(sig, s)
		w = append(w, x)
	}
	d, err := structural.NewDesign(g, sig, nil)
	if err != nil {
		t.Fatal(err)
	}
	return g, d, w
}

// modesOf verifies (a, b) with its own numbers and returns the modes of
// the controllability trial.
func modesOf(t *testing.T, a, b [][]float64, discrete bool) (*Modes, *Result) {
	t.Helper()
	g, d, w := denseNetwork(t, a, b)
	res, err := Verify(g, Request{Inputs: &d, InputWeights: w, Weights: true, Modes: true, Discrete: discrete})
	if err != nil {
		t.Fatal(err)
	}
	return res.Controllability.Trials[0].Modes, res
}

type wantMode struct {
	exact     string
	mult, geo int
	stability Stability
	states    []string
}

func checkModes(t *testing.T, name string, got *Modes, want []wantMode, stable bool) {
	t.Helper()
	if len(got.List) != len(want) {
		t.Fatalf("%s: %d modes %+v, want %d", name, len(got.List), got.List, len(want))
	}
	for i, w := range want {
		m := got.List[i]
		if m.Exact != w.exact || m.Multiplicity != w.mult || m.Geometric != w.geo || m.Stability != w.stability || !slices.Equal(m.States.Names(), w.states) {
			t.Errorf("%s: mode %d = %s mult %d geo %d %s on %v, want %s mult %d geo %d %s on %v", name, i,
				m.Exact, m.Multiplicity, m.Geometric, m.Stability, m.States.Names(), w.exact, w.mult, w.geo, w.stability, w.states)
		}
	}
	if got.Stable != stable {
		t.Errorf("%s: stabilizable %v, want %v", name, got.Stable, stable)
	}
}

// Worked examples of uncontrollable pairs, stabilizable or not. The
// first two are the standard diagonal illustration of stabilizability
// (from memory; as in Hespanha, Linear Systems Theory, Princeton 2009,
// chapter on stabilizability, and most control texts): with
// x1' = x1 + u, x2' = a·x2 the mode a of x2 cannot be moved by any
// feedback, so the pair is stabilizable exactly when a < 0, although the
// unstable mode 1 is there: feedback moves it. The others are worked by
// hand: an integrator nothing reaches (mode 0, marginal: not stabilizable
// in continuous time, but |0| < 1 in discrete time), the tied branches of
// TestWeightsTiedBranches (mode -1/2 living on both branches: the left
// eigenvector (0, 3, -2) of [A - λI, B] for b = (1, 0, 0)), an unreached
// damped oscillator (the pair -1 ± 2i of [[-1, -2], [2, -1]]), and a
// Jordan block at -1 (algebraic multiplicity 2, one eigenvector).
func TestModesWorkedExamples(t *testing.T) {
	b1 := [][]float64{{1}, {0}}
	m, _ := modesOf(t, [][]float64{{1, 0}, {0, -2}}, b1, false)
	checkModes(t, "x2' = -2 x2", m, []wantMode{{"-2", 1, 1, Stable, []string{"1"}}}, true)
	if m.Dimension != 1 {
		t.Errorf("controllable dimension %d, want 1", m.Dimension)
	}
	m, _ = modesOf(t, [][]float64{{1, 0}, {0, 2}}, b1, false)
	checkModes(t, "x2' = 2 x2", m, []wantMode{{"2", 1, 1, Unstable, []string{"1"}}}, false)

	// An integrator next to a driven state (x1' = -x1 + u, x2' = 0): a
	// self-loop of weight zero would be a zero entry, so x2 has none.
	integ := [][]float64{{-1, 0}, {0, 0}}
	m, _ = modesOf(t, integ, b1, false)
	checkModes(t, "integrator, continuous", m, []wantMode{{"0", 1, 1, Marginal, []string{"1"}}}, false)
	m, _ = modesOf(t, integ, b1, true)
	checkModes(t, "integrator, discrete", m, []wantMode{{"0", 1, 1, Stable, []string{"1"}}}, true)
	// x2(k+1) = 0.5 x2(k): unstable in continuous time, stable in discrete.
	half := [][]float64{{1, 0}, {0, 0.5}}
	m, _ = modesOf(t, half, b1, false)
	checkModes(t, "0.5, continuous", m, []wantMode{{"1/2", 1, 1, Unstable, []string{"1"}}}, false)
	m, _ = modesOf(t, half, b1, true)
	checkModes(t, "0.5, discrete", m, []wantMode{{"1/2", 1, 1, Stable, []string{"1"}}}, true)

	tied := [][]float64{{0, 0, 0}, {2, -0.5, 0}, {3, 0, -0.5}}
	m, _ = modesOf(t, tied, [][]float64{{1.5}, {0}, {0}}, false)
	checkModes(t, "tied branches", m, []wantMode{{"-1/2", 1, 1, Stable, []string{"1", "2"}}}, true)

	osc := [][]float64{{-3, 0, 0}, {0, -1, -2}, {0, 2, -1}}
	m, _ = modesOf(t, osc, [][]float64{{1}, {0}, {0}}, false)
	checkModes(t, "damped oscillator", m, []wantMode{{"-1±2i", 1, 1, Stable, []string{"1", "2"}}}, true)
	if !m.List[0].Conjugate || math.Abs(imag(m.List[0].Eigenvalue)-2) > 1e-15 {
		t.Errorf("oscillator eigenvalue %v conjugate %v", m.List[0].Eigenvalue, m.List[0].Conjugate)
	}
	undamped := [][]float64{{-3, 0, 0}, {0, 0, -2}, {0, 2, 0}}
	m, _ = modesOf(t, undamped, [][]float64{{1}, {0}, {0}}, false)
	checkModes(t, "undamped oscillator", m, []wantMode{{"0±2i", 1, 1, Marginal, []string{"1", "2"}}}, false)

	// x1' = -x1 + x2, x2' = -x2: a Jordan block J = [[-1, 1], [0, -1]] at
	// -1, unreached. Its one left eigenvector is (0, 1) (wᵀJ = -wᵀ forces
	// w1 = 0): it lives on x2, the state that drives the other.
	jordan := [][]float64{{-2, 0, 0}, {0, -1, 1}, {0, 0, -1}}
	m, _ = modesOf(t, jordan, [][]float64{{1}, {0}, {0}}, false)
	checkModes(t, "Jordan block", m, []wantMode{{"-1", 2, 1, Stable, []string{"2"}}}, true)
}

// A quadratic irrational is known in floating point only: the modes of
// [[0, 1], [1, 1]] (unreached) are (1 ± √5)/2 (by hand), each with a tiny
// error bound and its stability decided; the pair is not stabilizable.
func TestModesIrrational(t *testing.T) {
	a := [][]float64{{-1, 0, 0}, {0, 0, 1}, {0, 1, 1}}
	m, _ := modesOf(t, a, [][]float64{{1}, {0}, {0}}, false)
	if len(m.List) != 2 {
		t.Fatalf("modes %+v", m.List)
	}
	phi := (1 + math.Sqrt(5)) / 2
	for i, want := range []float64{phi, 1 - phi} {
		md := m.List[i]
		if md.Exact != "" || math.Abs(real(md.Eigenvalue)-want) > 1e-12 || md.ErrorBound <= 0 || md.ErrorBound > 1e-10 {
			t.Errorf("mode %d: %+v, want %g", i, md, want)
		}
		if !slices.Equal(md.States.Names(), []string{"1", "2"}) {
			t.Errorf("mode %d lives on %v", i, md.States.Names())
		}
	}
	if m.List[0].Stability != Unstable || m.List[1].Stability != Stable || m.Stable {
		t.Errorf("stability %s %s, stabilizable %v", m.List[0].Stability, m.List[1].Stability, m.Stable)
	}
	// Defective and irrational: the companion matrix of (x² - 2)² =
	// x⁴ - 4x² + 4 has ±√2, each a double eigenvalue with one eigenvector
	// (by hand); rounding splits each by about √ε, and the error bounds
	// (huge condition numbers) put each pair back together as one mode of
	// multiplicity 2.
	a = [][]float64{
		{-1, 0, 0, 0, 0},
		{0, 0, 1, 0, 0},
		{0, 0, 0, 1, 0},
		{0, 0, 0, 0, 1},
		{0, -4, 0, 4, 0},
	}
	m, _ = modesOf(t, a, [][]float64{{1}, {0}, {0}, {0}, {0}}, false)
	if len(m.List) != 2 {
		t.Fatalf("defective modes %+v", m.List)
	}
	for i, want := range []float64{math.Sqrt2, -math.Sqrt2} {
		md := m.List[i]
		if md.Exact != "" || md.Multiplicity != 2 || md.Conjugate || math.Abs(real(md.Eigenvalue)-want) > 1e-6 {
			t.Errorf("defective mode %d: %+v, want %g twice", i, md, want)
		}
	}
}

// The four parts of the Kalman decomposition on a hand example with one
// state of each kind: A = diag(-1, -2, -3, -4), the input on x0 and x1,
// the output on x0 and x2 (distinct eigenvalues, so each part is one
// state; Kalman 1963, by hand).
func TestKalmanParts(t *testing.T) {
	g := weighted(t, []wedge{{"x0", "x0", -1}, {"x1", "x1", -2}, {"x2", "x2", -3}, {"x3", "x3", -4}})
	in := mustDesign(g, [][]int32{lookup(t, g, "x0", "x1")})
	out := mustDesign(g, [][]int32{lookup(t, g, "x0", "x2")})
	res, err := Verify(g, Request{Inputs: &in, Outputs: &out, Weights: true, Modes: true})
	if err != nil {
		t.Fatal(err)
	}
	want := KalmanParts{Trial: 1, ControllableObservable: 1, ControllableUnobservable: 1, UncontrollableObservable: 1, UncontrollableUnobservable: 1}
	if len(res.Kalman) != 1 || res.Kalman[0] != want {
		t.Errorf("Kalman parts %+v, want %+v", res.Kalman, want)
	}
	// The unobservable modes are -2 (x1) and -4 (x3): the pair is
	// detectable.
	om := res.Observability.Trials[0].Modes
	var got []string
	for _, md := range om.List {
		got = append(got, md.Exact+"@"+md.States.Name(0))
	}
	if !slices.Equal(got, []string{"-2@x1", "-4@x3"}) || !om.Stable || !*res.Observability.ModesStable {
		t.Errorf("unobservable modes %v, detectable %v", got, om.Stable)
	}
}

// eigvals returns gonum's eigenvalues of a dense matrix (reference
// library: gonum mat.Eigen).
func eigvals(a [][]float64) []complex128 {
	n := len(a)
	d := mat.NewDense(n, n, nil)
	for i := range a {
		for j := range a[i] {
			d.Set(i, j, a[i][j])
		}
	}
	var e mat.Eigen
	if !e.Factorize(d, mat.EigenNone) {
		panic("eigen failed")
	}
	return e.Values(nil)
}

// pbhRank is rank[A - λI, B] by gonum's SVD of the real embedding of the
// complex matrix (singular values of M, each twice; common practice), with
// the tolerance 1e-8 of the largest.
func pbhRank(a, b [][]float64, lam complex128) int {
	n, m := len(a), len(b[0])
	af := make([]float64, n*n)
	bf := make([]float64, n*m)
	for i := 0; i < n; i++ {
		copy(af[i*n:], a[i])
		copy(bf[i*m:], b[i])
	}
	w := n + m
	e := mat.NewDense(2*n, 2*w, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < w; j++ {
			var re, im float64
			if j < n {
				re = af[i*n+j]
				if i == j {
					re -= real(lam)
					im = -imag(lam)
				}
			} else {
				re = bf[i*m+j-n]
			}
			e.Set(i, j, re)
			e.Set(i+n, j+w, re)
			e.Set(i, j+w, -im)
			e.Set(i+n, j, im)
		}
	}
	var svd mat.SVD
	svd.Factorize(e, mat.SVDNone)
	s := svd.Values(nil)
	r := 0
	for _, v := range s {
		if v > 1e-8*s[0] {
			r++
		}
	}
	return r / 2
}

// PBH modes against the Kalman decomposition on random weighted systems:
// systems built in disguised Kalman form (kalmanSystem: A = T·[[A11,
// A12], [0, A22]]·T⁻¹, B = T·[B1; 0], T unimodular) have as uncontrollable
// modes exactly the eigenvalues of A22 (Kalman 1963). The modes found, with
// their multiplicities, equal gonum's eigenvalues of A22 (mat.Eigen);
// every exact mode λ has rank[A - λI, B] = n - geometric multiplicity by
// gonum's SVD (the PBH test, Hautus 1969); and A22 is triangular with
// integer diagonal in half the cases, so that exact modes, repeated ones
// included, are frequent.
func TestModesAgainstKalmanDecomposition(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	exactSeen, floatSeen, repeated := 0, 0, 0
	for c := 0; c < 150; c++ {
		n := 3 + rng.IntN(5)
		k := 1 + rng.IntN(n-1)
		ai, bi, a22 := kalmanSystem(rng, n, k, 1+rng.IntN(2))
		if c%2 == 0 {
			// Triangular A22: rebuild the system with it.
			for i := range a22 {
				for j := 0; j < i; j++ {
					a22[i][j] = 0
				}
				a22[i][i] = int64(rng.IntN(5) - 2)
			}
			ai, bi = kalmanWith(rng, n, k, len(bi[0]), a22)
		}
		a, b := toFloat(ai), toFloat(bi)
		if !nonzeroColumns(b) {
			continue
		}
		m, _ := modesOf(t, a, b, false)
		if m.Dimension != n-k {
			continue // A11, B1 happened to be uncontrollable too
		}
		// Multiset of mode eigenvalues, conjugates included.
		var got []complex128
		for _, md := range m.List {
			for r := 0; r < md.Multiplicity; r++ {
				got = append(got, md.Eigenvalue)
				if md.Conjugate {
					got = append(got, cmplx.Conj(md.Eigenvalue))
				}
			}
			if md.Exact != "" {
				exactSeen++
				if md.Multiplicity > 1 {
					repeated++
				}
				if r := pbhRank(a, b, md.Eigenvalue); r != n-md.Geometric {
					t.Errorf("case %d: mode %s: SVD rank of [A - λI, B] is %d, want n - %d", c, md.Exact, r, md.Geometric)
				}
			} else {
				floatSeen++
			}
		}
		want := eigvals(toFloat(a22))
		if !sameMultiset(got, want, 1e-6) {
			t.Fatalf("case %d: modes %v, eigenvalues of A22 %v", c, got, want)
		}
	}
	t.Logf("%d exact modes (%d repeated), %d floating-point", exactSeen, repeated, floatSeen)
	if exactSeen < 100 || floatSeen < 20 || repeated < 10 {
		t.Errorf("too few informative modes: %d exact, %d repeated, %d float", exactSeen, repeated, floatSeen)
	}
}

// kalmanWith is kalmanSystem with the uncontrollable block given.
func kalmanWith(rng *rand.Rand, n, k, m int, a22 [][]int64) ([][]int64, [][]int64) {
	r := n - k
	blk := make([][]int64, n)
	for i := range blk {
		blk[i] = make([]int64, n)
	}
	small := func() int64 { return int64(rng.IntN(5) - 2) }
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			switch {
			case i >= r && j >= r:
				blk[i][j] = a22[i-r][j-r]
			case i < r:
				blk[i][j] = small()
			}
		}
	}
	bb := make([][]int64, n)
	for i := range bb {
		bb[i] = make([]int64, m)
		if i < r {
			for j := range bb[i] {
				bb[i][j] = small()
			}
		}
	}
	// T: a random permutation times a unit lower triangular matrix.
	perm := rng.Perm(n)
	l := make([][]int64, n)
	for i := range l {
		l[i] = make([]int64, n)
		l[i][i] = 1
		for j := 0; j < i; j++ {
			l[i][j] = int64(rng.IntN(3) - 1)
		}
	}
	linv := make([][]int64, n)
	for i := range linv {
		linv[i] = make([]int64, n)
		linv[i][i] = 1
		for j := 0; j < i; j++ {
			var s int64
			for q := j; q < i; q++ {
				s += l[i][q] * linv[q][j]
			}
			linv[i][j] = -s
		}
	}
	mul := func(x, y [][]int64) [][]int64 {
		out := make([][]int64, len(x))
		for i := range x {
			out[i] = make([]int64, len(y[0]))
			for j := range y[0] {
				for q := range y {
					out[i][j] += x[i][q] * y[q][j]
				}
			}
		}
		return out
	}
	pm := make([][]int64, n)
	pinv := make([][]int64, n)
	for i := range pm {
		pm[i] = make([]int64, n)
		pinv[i] = make([]int64, n)
	}
	for i, j := range perm {
		pm[i][j] = 1
		pinv[j][i] = 1
	}
	tt := mul(pm, l)
	return mul(mul(tt, blk), mul(linv, pinv)), mul(tt, bb)
}

func toFloat(x [][]int64) [][]float64 {
	out := make([][]float64, len(x))
	for i := range x {
		out[i] = make([]float64, len(x[i]))
		for j, v := range x[i] {
			out[i][j] = float64(v)
		}
	}
	return out
}

func nonzeroColumns(b [][]float64) bool {
	for j := range b[0] {
		nz := false
		for i := range b {
			nz = nz || b[i][j] != 0
		}
		if !nz {
			return false
		}
	}
	return true
}

// sameMultiset matches two lists of complex numbers within tol (relative
// to 1 + |z|), greedily nearest first.
func sameMultiset(a, b []complex128, tol float64) bool {
	if len(a) != len(b) {
		return false
	}
	used := make([]bool, len(b))
	sort.Slice(a, func(i, j int) bool { return real(a[i]) < real(a[j]) })
	for _, z := range a {
		best, bd := -1, math.Inf(1)
		for j, w := range b {
			if !used[j] {
				if d := cmplx.Abs(z - w); d < bd {
					best, bd = j, d
				}
			}
		}
		// A defective eigenvalue of multiplicity m moves by about ε^(1/m)
		// in floating point: compare with the square root of the tolerance
		// to allow for double roots.
		if best < 0 || bd > math.Sqrt(tol)*(1+cmplx.Abs(z)) {
			return false
		}
		used[best] = true
	}
	return true
}

// Observability modes are the controllability modes of (Aᵀ, Cᵀ), and live
// on the states their right eigenvector moves: a chain x0 -> x1 -> x2
// sensed at x1 cannot see x2 (by hand: x2 acts on nothing); the mode of
// x2, its self-loop -3, is unobservable and lives on x2.
func TestModesObservability(t *testing.T) {
	g := weighted(t, []wedge{{"x0", "x1", 1}, {"x1", "x2", 1}, {"x2", "x2", -3}})
	out := mustDesign(g, [][]int32{lookup(t, g, "x1")})
	res, err := Verify(g, Request{Outputs: &out, Weights: true, Modes: true})
	if err != nil {
		t.Fatal(err)
	}
	m := res.Observability.Trials[0].Modes
	if len(m.List) != 1 || m.List[0].Exact != "-3" || m.List[0].States.Names()[0] != "x2" || !m.Stable {
		t.Errorf("unobservable modes %+v", m.List)
	}
}

// With random samples the modes that the structure forces are exact in
// every trial: an unreached state without dynamics is the mode 0 in any
// sample, and its self-looped neighbour a mode equal to the sampled
// self-loop (a binary fraction, found exactly among the diagonal
// entries). Common practice: an unreached state's dynamics stay
// unreached.
func TestModesSampled(t *testing.T) {
	// x0 driven; u1 -> u2 unreached, u2 with a self-loop.
	g := weighted(t, []wedge{{"x0", "x0", 1}, {"u1", "u2", 1}, {"u2", "u2", 1}})
	in := mustDesign(g, [][]int32{lookup(t, g, "x0")})
	res, err := Verify(g, Request{Inputs: &in, Seed: 5, Trials: 3, Modes: true})
	if err != nil {
		t.Fatal(err)
	}
	for _, tr := range res.Controllability.Trials {
		m := tr.Modes
		if len(m.List) != 2 {
			t.Fatalf("trial %d: modes %+v", tr.Number, m.List)
		}
		var exact []string
		for _, md := range m.List {
			if md.Exact == "" {
				t.Errorf("trial %d: mode %v not exact", tr.Number, md.Eigenvalue)
			}
			exact = append(exact, md.Exact)
		}
		if !slices.Contains(exact, "0") {
			t.Errorf("trial %d: no exact zero mode: %v", tr.Number, exact)
		}
		for _, md := range m.List {
			if md.Exact != "0" {
				v, _ := strconv.ParseFloat(strconv.FormatFloat(real(md.Eigenvalue), 'g', -1, 64), 64)
				if math.Abs(v) < 0.5 || math.Abs(v) > 1.5 {
					t.Errorf("trial %d: self-loop mode %g outside the sampling range", tr.Number, v)
				}
			}
		}
	}
}

// The companion matrix of x⁴ + 3x² + 1, unreached, has the purely
// imaginary modes ±i·sqrt((3 ± √5)/2) (x² = (-3 ± √5)/2, by hand): not
// rational, so known in floating point only, and on the boundary within
// their bounds: undecided, with a warning. Effort on the infinite horizon
// is skipped for this A (not stable) with a warning too.
func TestModesUndecidedAndEffortSkipped(t *testing.T) {
	a := [][]float64{
		{-1, 0, 0, 0, 0},
		{0, 0, 1, 0, 0},
		{0, 0, 0, 1, 0},
		{0, 0, 0, 0, 1},
		{0, -1, 0, -3, 0},
	}
	g, d, w := denseNetwork(t, a, [][]float64{{1}, {0}, {0}, {0}, {0}})
	res, err := Verify(g, Request{Inputs: &d, InputWeights: w, Weights: true, Modes: true, Effort: true})
	if err != nil {
		t.Fatal(err)
	}
	m := res.Controllability.Trials[0].Modes
	if len(m.List) != 2 || m.Undecided != 2 || m.Stable {
		t.Fatalf("modes %+v", m)
	}
	for _, md := range m.List {
		im := imag(md.Eigenvalue)
		if md.Exact != "" || md.Stability != Undecided || !md.Conjugate ||
			(math.Abs(im*im-(3+math.Sqrt(5))/2) > 1e-9 && math.Abs(im*im-(3-math.Sqrt(5))/2) > 1e-9) {
			t.Errorf("mode %+v", md)
		}
	}
	kinds := map[WarningKind]bool{}
	for _, w := range res.Warnings {
		kinds[w.Kind] = true
	}
	if !kinds[WarnModesUndecided] || !kinds[WarnEffortSkipped] {
		t.Errorf("warnings %v", res.Warnings)
	}
	if e := res.Controllability.Trials[0].Effort; e == nil || e.Skipped == "" {
		t.Errorf("effort %+v", e)
	}
}

// On random patterns with random samples, the stuck modes are a part of
// the spectrum of A (gonum's eigenvalues), their multiplicities add up to
// n minus the dimension, and at every one of them [A - λI, B] loses rank
// by gonum's SVD (PBH): the modes of the floating-point path, tested
// independently.
func TestModesSampledPatterns(t *testing.T) {
	rng := rand.New(rand.NewPCG(43, 44))
	modes := 0
	for c := 0; c < 60; c++ {
		n := 5 + rng.IntN(20)
		p := randomPattern(rng, n, 1.5/float64(n), 1+rng.IntN(2))
		bl := structural.NewIntBuilder(n, 0)
		for u := 0; u < n; u++ {
			for k := p.Out.Ptr[u]; k < p.Out.Ptr[u+1]; k++ {
				bl.AddEdge(int32(u), p.Out.Adj[k])
			}
		}
		g, err := bl.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		d := mustDesign(g, p.Signals)
		res, err := Verify(g, Request{Inputs: &d, Seed: uint64(c), Trials: 1, Modes: true})
		if err != nil {
			t.Fatal(err)
		}
		tr := res.Controllability.Trials[0]
		m := tr.Modes
		// The floating-point sample of this trial, as Verify drew it.
		pat := &Pattern{Out: g.Out(), Signals: d.Signals()}
		rr := rand.New(rand.NewPCG(uint64(c), 1))
		av := make([]float64, g.Edges())
		for k := range av {
			av[k] = drawReal(rr)
		}
		rs := rand.New(rand.NewPCG(uint64(c), 2))
		drawExactSignals(pat.Signals, NewField(Mersenne61), rs) // the exact draw comes first
		re := &Real{A: av, B: drawRealSignals(pat.Signals, rs)}
		ad, bd := re.Dense(pat, false)
		a, b := make([][]float64, n), make([][]float64, n)
		for i := 0; i < n; i++ {
			a[i] = ad[i*n : (i+1)*n]
			b[i] = bd[i*len(pat.Signals) : (i+1)*len(pat.Signals)]
		}
		sum := 0
		var got []complex128
		for _, md := range m.List {
			mult := md.Multiplicity
			if md.Conjugate {
				mult *= 2
			}
			sum += mult
			for r := 0; r < md.Multiplicity; r++ {
				got = append(got, md.Eigenvalue)
				if md.Conjugate {
					got = append(got, cmplx.Conj(md.Eigenvalue))
				}
			}
			if r := pbhRank(a, b, md.Eigenvalue); r >= n {
				t.Errorf("case %d: [A - λI, B] has full rank at the mode %v", c, md.Eigenvalue)
			}
			modes++
		}
		if sum != n-m.Dimension || m.Dimension != res.Controllability.Dimension {
			t.Fatalf("case %d: multiplicities add to %d, dimension %d of %d (structural %d)", c, sum, m.Dimension, n, res.Controllability.Dimension)
		}
		if !subMultiset(got, eigvals(a), 1e-6) {
			t.Fatalf("case %d: modes %v not in the spectrum %v", c, got, eigvals(a))
		}
	}
	if modes < 100 {
		t.Errorf("only %d modes", modes)
	}
}

// subMultiset reports whether every element of a matches a distinct
// element of b within tol (square root allowance for defective ones).
func subMultiset(a, b []complex128, tol float64) bool {
	used := make([]bool, len(b))
	for _, z := range a {
		best, bd := -1, math.Inf(1)
		for j, w := range b {
			if !used[j] {
				if d := cmplx.Abs(z - w); d < bd {
					best, bd = j, d
				}
			}
		}
		if best < 0 || bd > math.Sqrt(tol)*(1+cmplx.Abs(z)) {
			return false
		}
		used[best] = true
	}
	return true
}
