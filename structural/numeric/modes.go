package numeric

import (
	"math"
	"math/big"
	"math/cmplx"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
)

// Stability classifies a mode for stabilizability (detectability).
type Stability string

const (
	// Stable: Re λ < 0 (continuous time) or |λ| < 1 (discrete time).
	Stable Stability = "stable"
	// Unstable: Re λ > 0, or |λ| > 1.
	Unstable Stability = "unstable"
	// Marginal: exactly on the boundary (Re λ = 0, or |λ| = 1), proved
	// with the exact value: not stable, so feedback cannot stabilise it.
	Marginal Stability = "marginal"
	// Undecided: a floating-point eigenvalue within its error bound of the
	// boundary; the numbers cannot tell.
	Undecided Stability = "undecided"
)

// SupportTolerance is the relative size below which an entry of a
// floating-point left eigenvector is taken as zero when the states a mode
// lives on are listed: |w_i| < SupportTolerance·max_j |w_j|. Mode reports
// the largest entry dropped and the smallest kept, so the gap is seen.
const SupportTolerance = 1e-8

// Mode is an eigenvalue λ of A that the inputs cannot move: rank[A - λI, B]
// < n (Popov–Belevitch–Hautus; Hautus, Proc. KNAW A 72, 1969). For
// observability it is an eigenvalue the outputs cannot see, of (Aᵀ, Cᵀ).
type Mode struct {
	// Eigenvalue is λ; of a complex conjugate pair, the one with a
	// positive imaginary part. Exact modes hold the exact value rounded to
	// float64.
	Eigenvalue complex128
	// Conjugate reports that λ̄ is a mode too, with the same multiplicity
	// and states.
	Conjugate bool
	// Multiplicity is the algebraic multiplicity of λ in the uncontrollable
	// (unobservable) part of the Kalman decomposition: the multiplicities
	// of all modes, conjugates counted, add up to n minus the dimension.
	Multiplicity int
	// Geometric is the number of independent left eigenvectors w with
	// wᵀ[A - λI, B] = 0, n - rank[A - λI, B]; exact modes only (0 when not
	// known).
	Geometric int
	// Exact is the exact value when it is rational ("-1/2") or, for a
	// pair, when its real quadratic factor is ("-1±2i", or "root of
	// x^2+x+1"); empty for a mode known in floating point only.
	Exact string
	// ErrorBound is the first-order error bound of a floating-point
	// eigenvalue: its condition number times the backward error (the
	// Kalman residual plus 10·k·ε·‖A‖_F); 0 for exact modes.
	ErrorBound float64
	// Stability says whether feedback needs to move the mode.
	Stability Stability
	// States are the states its left eigenvectors live on (for
	// observability: its right eigenvectors, the states the unseen motion
	// moves), in increasing order; exact for exact modes, else the entries
	// above SupportTolerance.
	States structural.States
	// SmallestKept and LargestDropped are, for a floating-point mode, the
	// relative sizes of the smallest entry listed and the largest one left
	// out (0 when none was).
	SmallestKept, LargestDropped float64
}

func (m *Mode) fields() []field {
	fs := []field{
		{"re", num(real(m.Eigenvalue))}, {"im", num(imag(m.Eigenvalue))},
		{"conjugate", m.Conjugate}, {"multiplicity", m.Multiplicity},
	}
	if m.Exact != "" {
		fs = append(fs, field{"geometric_multiplicity", m.Geometric}, field{"exact", m.Exact})
	} else {
		fs = append(fs, field{"error_bound", num(m.ErrorBound)},
			field{"smallest_kept", num(m.SmallestKept)}, field{"largest_dropped", num(m.LargestDropped)})
	}
	return append(fs, field{"stability", string(m.Stability)}, field{"states", m.States})
}

// MarshalJSON writes the mode as a flat object; the eigenvalue as re and
// im, the exact-only and float-only figures only where they apply.
func (m Mode) MarshalJSON() ([]byte, error) { return marshalFields(m.fields()) }

// Modes is the stuck-mode analysis of one system for one property.
type Modes struct {
	// Dimension is the exact dimension of the controllable (observable)
	// subspace of the system analysed: the model's, or with random samples
	// the floating-point sample's values taken exactly.
	Dimension int
	// KalmanResidual is ‖Q⊥ᵀ·A·Q‖_F / ‖A‖_F for the floating-point
	// orthonormal basis Q of that subspace: zero for an exactly invariant
	// subspace; the part of the error bounds that the basis contributes.
	KalmanResidual float64
	// Stable reports that every mode is proved stable: the pair is
	// stabilizable (detectable, for outputs). It is true when there are no
	// modes (a controllable pair).
	Stable bool
	// Undecided counts the modes whose stability the numbers cannot tell.
	Undecided int
	// List holds the modes, exact ones first, then by decreasing real
	// part (magnitude in discrete time): the most dangerous first.
	List []Mode
}

func (m *Modes) fields() []field {
	if m == nil {
		return nil
	}
	list := m.List
	if list == nil {
		list = []Mode{}
	}
	return []field{{"modes_dimension", m.Dimension}, {"kalman_residual", num(m.KalmanResidual)},
		{"modes_stable", m.Stable}, {"modes_undecided", m.Undecided}, {"modes", list}}
}

// system is one real sample with its exact image: the values of A (and
// Aᵀ), of B (Cᵀ), dense and exact.
type realSystem struct {
	p         *Pattern
	re        *Real
	transpose bool
	n, m      int
	a, b      []float64 // dense, row-major: n×n and n×m
	exact     *Exact    // the same values, exactly, in GF(2^61-1)
	alt       func() *Exact
	decimal   bool // values read as the decimals they denote
}

// modeCandidate is an exact value to test for a root of the
// uncontrollable characteristic polynomial: real c, or the real quadratic
// x² - s·x + t of a conjugate pair.
type modeCandidate struct {
	pair    bool
	c, s, t *big.Rat
}

func (c modeCandidate) key() string {
	if c.pair {
		return "q" + c.s.RatString() + "," + c.t.RatString()
	}
	return "r" + c.c.RatString()
}

// stuckModes analyses the modes of sys that its signals cannot move (see):
// the uncontrollable part of the Kalman decomposition. Its size n - r is
// the exact dimension (kb, the exact Krylov basis of sys.exact); the
// values come from a floating-point orthonormal basis that repeats the
// exact chains (so it spans the same subspace up to rounding), and every
// eigenvalue that could be rational (or a conjugate pair with a rational
// real quadratic) is tested exactly against the characteristic
// polynomial of the exact quotient (see quotient), with its multiplicity,
// over two primes.
func stuckModes(sys *realSystem, kb *krylovBasis, discrete bool, names func([]int32) structural.States) (*Modes, error) {
	n := sys.n
	r := len(kb.rows)
	k := n - r
	res := &Modes{Dimension: r, Stable: true, List: []Mode{}}
	if k == 0 {
		return res, nil
	}
	// Floating-point basis of the controllable subspace, chain by chain.
	aF := mat.NewDense(n, n, sys.a)
	qcols := make([][]float64, 0, n)
	orth := func(v []float64) float64 {
		// Classical Gram–Schmidt with one reorthogonalisation when the
		// norm falls below 1/√2 of what it was (Daniel, Gragg, Kaufman &
		// Stewart, Math. Comp. 30, 1976).
		before := floats.Norm(v, 2)
		for pass := 0; pass < 2; pass++ {
			for _, q := range qcols {
				floats.AddScaled(v, -floats.Dot(q, v), q)
			}
			after := floats.Norm(v, 2)
			if after >= before/math.Sqrt2 {
				return after
			}
			before = after
		}
		return floats.Norm(v, 2)
	}
	piv := 0
	for j, c := range kb.chains {
		var prev []float64
		for step := 0; step < c; step++ {
			v := make([]float64, n)
			if step == 0 {
				for i := 0; i < n; i++ {
					v[i] = sys.b[i*sys.m+j]
				}
			} else {
				mat.NewVecDense(n, v).MulVec(aF, mat.NewVecDense(n, prev))
			}
			nrm := orth(v)
			if nrm == 0 {
				// Rounding lost a direction the exact basis has: continue
				// with the unit vector at that basis row's pivot; the
				// residual below shows the damage.
				v = make([]float64, n)
				v[kb.piv[piv]] = 1
				nrm = orth(v)
				if nrm == 0 {
					return nil, errorf("the floating-point basis of the controllable subspace collapsed")
				}
			}
			floats.Scale(1/nrm, v)
			qcols = append(qcols, v)
			prev = v
			piv++
		}
	}
	// The orthogonal complement Q⊥: k fixed pseudo-random vectors
	// orthogonalised against Q and each other. Then only the blocks that
	// matter are formed, in O(n²k): A_uu = Q⊥ᵀAQ⊥ and the residual block
	// Q⊥ᵀAQ = (AᵀQ⊥)ᵀQ.
	prng := rand.New(rand.NewPCG(0x6b616c6d, uint64(n)))
	for len(qcols) < n {
		v := make([]float64, n)
		for i := range v {
			v[i] = prng.NormFloat64()
		}
		nrm := orth(v)
		if nrm < 1e-8 {
			continue // (practically never) nearly in the span: draw again
		}
		floats.Scale(1/nrm, v)
		qcols = append(qcols, v)
	}
	qperp := mat.NewDense(n, k, nil)
	for j := 0; j < k; j++ {
		qperp.SetCol(j, qcols[r+j])
	}
	var aq, atq, auuM mat.Dense
	aq.Mul(aF, qperp)        // n×k
	atq.Mul(aF.T(), qperp)   // n×k
	auuM.Mul(qperp.T(), &aq) // k×k
	resid := 0.0
	if r > 0 {
		qd := mat.NewDense(n, r, nil)
		for j := 0; j < r; j++ {
			qd.SetCol(j, qcols[j])
		}
		var e mat.Dense
		e.Mul(atq.T(), qd) // k×r: Q⊥ᵀAQ
		resid = mat.Norm(&e, 2)
		resid *= resid
	}
	normF := mat.Norm(aF, 2) // Frobenius
	res.KalmanResidual = 0
	if normF > 0 {
		res.KalmanResidual = math.Sqrt(resid) / normF
	}
	auu := make([]float64, k*k)
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			auu[i*k+j] = auuM.At(i, j)
		}
	}
	ev, err := eigenAll(auu, k)
	if err != nil {
		return nil, err
	}
	backward := math.Sqrt(resid) + 10*float64(k)*0x1p-52*normF
	for i := range ev {
		ev[i].bound = ev[i].cond * backward
	}
	// The exact side: the quotient's characteristic polynomial, over the
	// second prime too when a candidate passes the first.
	q := newQuotient(sys.p, sys.exact, sys.transpose, kb)
	f := &sys.exact.F
	chi := charPoly(f, append([]uint64(nil), q.abar...), k)
	var q2 *quotient
	var chi2 []uint64
	second := func() (*quotient, []uint64, bool) {
		if q2 == nil && sys.alt != nil {
			x2 := sys.alt()
			kb2 := krylov(sys.p, x2, sys.transpose, nil)
			if len(kb2.rows) != r {
				return nil, nil, false
			}
			q2 = newQuotient(sys.p, x2, sys.transpose, kb2)
			chi2 = charPoly(&x2.F, append([]uint64(nil), q2.abar...), k)
		}
		return q2, chi2, q2 != nil
	}
	den, diag := exactScale(sys)
	// Candidates from each floating-point eigenvalue.
	type exactMode struct {
		cand  modeCandidate
		order int
	}
	var found []exactMode
	tried := map[string]bool{}
	remaining := k
	for _, e := range ev {
		if remaining == 0 {
			break
		}
		for _, c := range candidates(e, den, diag) {
			if tried[c.key()] {
				continue
			}
			tried[c.key()] = true
			o := testCandidate(f, chi, c)
			if o == 0 {
				continue
			}
			if _, chi2, ok := second(); ok {
				o = min(o, testCandidate(q2.f, chi2, c))
			}
			if o > 0 {
				found = append(found, exactMode{c, o})
				if c.pair {
					remaining -= 2 * o
				} else {
					remaining -= o
				}
			}
		}
	}
	// Float eigenvalues as a multiset; each exact mode claims the nearest
	// ones.
	claimed := make([]bool, len(ev))
	claim := func(z complex128, cnt int) []int {
		var idx []int
		for c := 0; c < cnt; c++ {
			best, bd := -1, math.Inf(1)
			for i, e := range ev {
				if !claimed[i] {
					if d := cmplx.Abs(e.lam - z); d < bd {
						best, bd = i, d
					}
				}
			}
			if best < 0 {
				break
			}
			claimed[best] = true
			idx = append(idx, best)
		}
		return idx
	}
	for _, fm := range found {
		md := Mode{Multiplicity: fm.order}
		var nullMat []uint64
		if fm.cand.pair {
			re, im, text := pairValue(fm.cand.s, fm.cand.t)
			md.Eigenvalue, md.Conjugate, md.Exact = complex(re, im), true, text
			claim(complex(re, im), fm.order)
			claim(complex(re, -im), fm.order)
			s, _ := fromRat(f, fm.cand.s)
			t, _ := fromRat(f, fm.cand.t)
			nullMat = quadMatrix(f, q.abar, k, s, t)
			md.Stability = exactStability(fm.cand, discrete)
		} else {
			v, _ := fm.cand.c.Float64()
			md.Eigenvalue, md.Exact = complex(v, 0), fm.cand.c.RatString()
			claim(complex(v, 0), fm.order)
			c, _ := fromRat(f, fm.cand.c)
			nullMat = shifted(f, q.abar, k, c)
			md.Stability = exactStability(fm.cand, discrete)
		}
		basis := leftNull(f, nullMat, k)
		md.Geometric = len(basis)
		if fm.cand.pair {
			md.Geometric /= 2
		}
		on := make([]bool, n)
		for _, wbar := range basis {
			for i, x := range q.lift(wbar) {
				if x != 0 {
					on[i] = true
				}
			}
		}
		md.States = names(statesOf(on))
		res.List = append(res.List, md)
	}
	// The rest: floating-point modes, clustered within their bounds.
	var rest []int
	for i := range ev {
		if !claimed[i] && imag(ev[i].lam) >= 0 {
			rest = append(rest, i)
		}
	}
	used := make([]bool, len(ev))
	for _, i := range rest {
		if used[i] {
			continue
		}
		cl := []int{i}
		used[i] = true
		for _, j := range rest {
			if !used[j] && cmplx.Abs(ev[i].lam-ev[j].lam) <= ev[i].bound+ev[j].bound {
				cl = append(cl, j)
				used[j] = true
			}
		}
		var sum complex128
		bound := 0.0
		reals, pairs := 0, 0
		for _, j := range cl {
			sum += ev[j].lam
			bound = math.Max(bound, ev[j].bound)
			if ev[j].pairTop {
				pairs++
			} else {
				reals++
			}
		}
		lam := sum / complex(float64(len(cl)), 0)
		md := Mode{Eigenvalue: lam, Conjugate: true, Multiplicity: pairs, ErrorBound: bound}
		if reals > 0 || math.Abs(imag(lam)) <= bound {
			// A real eigenvalue, or a cluster that straddles the real axis
			// within its bound (a defective real eigenvalue split by
			// rounding): one real mode, conjugates counted.
			md.Eigenvalue, md.Conjugate, md.Multiplicity = complex(real(lam), 0), false, reals+2*pairs
		}
		md.Stability = floatStability(md.Eigenvalue, bound, discrete)
		// Support: union over the cluster of the lifted left eigenvectors.
		mag := make([]float64, n)
		for _, j := range cl {
			yr, yi := make([]float64, k), make([]float64, k)
			for l, y := range ev[j].left {
				yr[l], yi[l] = real(y), imag(y)
			}
			var wr, wi mat.VecDense
			wr.MulVec(qperp, mat.NewVecDense(k, yr))
			wi.MulVec(qperp, mat.NewVecDense(k, yi))
			top := 0.0
			w := make([]float64, n)
			for i := range w {
				w[i] = math.Hypot(wr.AtVec(i), wi.AtVec(i))
				top = math.Max(top, w[i])
			}
			for i, x := range w {
				if top > 0 {
					mag[i] = math.Max(mag[i], x/top)
				}
			}
		}
		on := make([]bool, n)
		md.SmallestKept = 1
		for i, x := range mag {
			if x >= SupportTolerance {
				on[i] = true
				md.SmallestKept = math.Min(md.SmallestKept, x)
			} else {
				md.LargestDropped = math.Max(md.LargestDropped, x)
			}
		}
		md.States = names(statesOf(on))
		res.List = append(res.List, md)
	}
	nExact := len(found)
	tail := res.List[nExact:]
	key := func(m Mode) float64 {
		if discrete {
			return cmplx.Abs(m.Eigenvalue)
		}
		return real(m.Eigenvalue)
	}
	sort.SliceStable(res.List[:nExact], func(a, b int) bool { return key(res.List[a]) > key(res.List[b]) })
	sort.SliceStable(tail, func(a, b int) bool { return key(tail[a]) > key(tail[b]) })
	for _, m := range res.List {
		if m.Stability != Stable {
			res.Stable = false
		}
		if m.Stability == Undecided {
			res.Undecided++
		}
	}
	return res, nil
}

func eye(n int) *mat.Dense {
	d := mat.NewDense(n, n, nil)
	for i := 0; i < n; i++ {
		d.Set(i, i, 1)
	}
	return d
}

func statesOf(on []bool) []int32 {
	var out []int32
	for i, b := range on {
		if b {
			out = append(out, int32(i))
		}
	}
	return out
}

// eigen is one eigenvalue of a real matrix with its left eigenvector
// (yᴴM = λyᴴ) and condition number ‖x‖‖y‖/|yᴴx|.
type eigen struct {
	lam     complex128
	left    []complex128
	cond    float64
	bound   float64
	pairTop bool // the member of a complex pair with a positive imaginary part
}

// eigenAll returns every eigenvalue of the k×k row-major matrix m (not
// modified), conjugates included, with left eigenvectors and condition
// numbers: real Schur form (Dhseqr), then Dtrevc3 for both sides,
// back-transformed.
func eigenAll(m []float64, k int) ([]eigen, error) {
	sf, err := newSchur(append([]float64(nil), m...), k)
	if err != nil {
		return nil, err
	}
	vl := append([]float64(nil), sf.z...)
	vr := append([]float64(nil), sf.z...)
	work := make([]float64, 1)
	impl.Dtrevc3(lapack.EVBoth, lapack.EVAllMulQ, nil, k, sf.t, k, vl, k, vr, k, k, work, -1)
	work = make([]float64, max(int(work[0]), 3*k))
	impl.Dtrevc3(lapack.EVBoth, lapack.EVAllMulQ, nil, k, sf.t, k, vl, k, vr, k, k, work, len(work))
	col := func(v []float64, j int) []float64 {
		out := make([]float64, k)
		for i := 0; i < k; i++ {
			out[i] = v[i*k+j]
		}
		return out
	}
	var out []eigen
	for i := 0; i < k; i++ {
		var y, x []complex128
		switch {
		case sf.wi[i] == 0:
			yl, xr := col(vl, i), col(vr, i)
			y, x = make([]complex128, k), make([]complex128, k)
			for l := 0; l < k; l++ {
				y[l], x[l] = complex(yl[l], 0), complex(xr[l], 0)
			}
		case sf.wi[i] > 0:
			y, x = pairVec(col(vl, i), col(vl, i+1), 1), pairVec(col(vr, i), col(vr, i+1), 1)
		default:
			y, x = pairVec(col(vl, i-1), col(vl, i), -1), pairVec(col(vr, i-1), col(vr, i), -1)
		}
		var yx complex128
		var ny, nx float64
		for l := 0; l < k; l++ {
			yx += cmplx.Conj(y[l]) * x[l]
			ny += real(y[l])*real(y[l]) + imag(y[l])*imag(y[l])
			nx += real(x[l])*real(x[l]) + imag(x[l])*imag(x[l])
		}
		cond := math.Inf(1)
		if a := cmplx.Abs(yx); a > 0 {
			cond = math.Sqrt(ny*nx) / a
		}
		out = append(out, eigen{lam: complex(sf.wr[i], sf.wi[i]), left: y, cond: cond, pairTop: sf.wi[i] > 0})
	}
	return out, nil
}

// pairVec returns re + sign·i·im.
func pairVec(re, im []float64, sign float64) []complex128 {
	out := make([]complex128, len(re))
	for i := range re {
		out[i] = complex(re[i], sign*im[i])
	}
	return out
}

// exactScale returns the common denominator D of the exact values of A
// (D·A is an integer matrix, so every rational eigenvalue of A is an
// integer over D, and every rational quadratic factor of its
// characteristic polynomial is x² - (σ/D)x + τ/D² with integers σ, τ, by
// Gauss's lemma; common practice) and the distinct exact diagonal entries,
// which are the eigenvalues of any triangular block.
func exactScale(sys *realSystem) (*big.Int, []*big.Rat) {
	den := big.NewInt(1)
	var diag []*big.Rat
	seen := map[string]bool{}
	g := sys.p.Out
	var gcd big.Int
	for u := 0; u < g.Rows; u++ {
		for t := g.Ptr[u]; t < g.Ptr[u+1]; t++ {
			x := sys.re.A[t]
			if x == 0 {
				continue
			}
			r := exactRat(x, sys.decimal)
			d := r.Denom()
			gcd.GCD(nil, nil, den, d)
			den.Mul(den, new(big.Int).Quo(d, &gcd))
			if int(g.Adj[t]) == u {
				if s := r.RatString(); !seen[s] {
					seen[s] = true
					diag = append(diag, r)
				}
			}
		}
	}
	return den, diag
}

// exactRat is the rational that FromFloat (decimal) or the exact binary
// mapping gives x.
func exactRat(x float64, decimal bool) *big.Rat {
	if decimal {
		if s, ok := decimalText(x); ok {
			r, _ := new(big.Rat).SetString(s)
			return r
		}
	}
	return new(big.Rat).SetFloat64(x)
}

// candidates returns the exact values worth testing for eigenvalue e: for
// a real one (its imaginary part within its bound), zero, the diagonal
// entries within the bound, the nearest integer over D and the simplest
// fraction within the bound; for a pair, the nearest and the simplest
// rational real quadratic.
func candidates(e eigen, den *big.Int, diag []*big.Rat) []modeCandidate {
	tol := math.Max(e.bound, 8*0x1p-52*cmplx.Abs(e.lam))
	if math.IsInf(tol, 0) || math.IsNaN(tol) {
		tol = math.Max(1, cmplx.Abs(e.lam))
	}
	var out []modeCandidate
	re, im := real(e.lam), imag(e.lam)
	if math.Abs(im) <= tol {
		if math.Abs(re) <= tol {
			out = append(out, modeCandidate{c: new(big.Rat)})
		}
		for _, d := range diag {
			if v, _ := d.Float64(); math.Abs(v-re) <= tol+4*0x1p-52*math.Abs(v) {
				out = append(out, modeCandidate{c: d})
			}
		}
		if c := nearestOver(re, den); c != nil {
			out = append(out, modeCandidate{c: c})
		}
		if c := simplest(re, tol); c != nil {
			out = append(out, modeCandidate{c: c})
		}
		return out
	}
	if im < 0 {
		return nil // the pair is tried from its upper member
	}
	s, t := 2*re, re*re+im*im
	tolS, tolT := 2*tol, 2*cmplx.Abs(e.lam)*tol+tol*tol
	den2 := new(big.Int).Mul(den, den)
	if cs, ct := nearestOver(s, den), nearestOver(t, den2); cs != nil && ct != nil {
		out = append(out, modeCandidate{pair: true, s: cs, t: ct})
	}
	if cs, ct := simplest(s, tolS), simplest(t, tolT); cs != nil && ct != nil {
		out = append(out, modeCandidate{pair: true, s: cs, t: ct})
	}
	return out
}

// nearestOver returns round(x·d)/d.
func nearestOver(x float64, d *big.Int) *big.Rat {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	bf := new(big.Float).SetPrec(256).SetFloat64(x)
	bf.Mul(bf, new(big.Float).SetPrec(256).SetInt(d))
	if bf.Sign() >= 0 {
		bf.Add(bf, big.NewFloat(0.5))
	} else {
		bf.Sub(bf, big.NewFloat(0.5))
	}
	num, _ := bf.Int(nil) // truncates toward zero
	return new(big.Rat).SetFrac(num, d)
}

// simplest returns the fraction with the smallest denominator (at most
// 10^9) within tol of x, by the continued fraction of x (its convergents
// are the best approximations; common practice); nil when none is.
func simplest(x, tol float64) *big.Rat {
	if math.IsNaN(x) || math.IsInf(x, 0) || math.Abs(x) > 1e15 {
		return nil
	}
	// Convergents h/k of x.
	h0, h1 := big.NewInt(0), big.NewInt(1)
	k0, k1 := big.NewInt(1), big.NewInt(0)
	r := new(big.Rat).SetFloat64(x)
	limit := big.NewInt(1_000_000_000)
	for i := 0; i < 64; i++ {
		a := new(big.Int).Div(r.Num(), r.Denom()) // floor
		h2 := new(big.Int).Add(new(big.Int).Mul(a, h1), h0)
		k2 := new(big.Int).Add(new(big.Int).Mul(a, k1), k0)
		if k2.Cmp(limit) > 0 {
			return nil
		}
		c := new(big.Rat).SetFrac(h2, k2)
		if v, _ := c.Float64(); math.Abs(v-x) <= tol {
			return c
		}
		frac := new(big.Rat).Sub(r, new(big.Rat).SetInt(a))
		if frac.Sign() == 0 {
			return nil
		}
		r = frac.Inv(frac)
		h0, h1, k0, k1 = h1, h2, k1, k2
	}
	return nil
}

// testCandidate returns the multiplicity of the candidate as a root
// (factor) of chi over f, 0 when it is none or not representable.
func testCandidate(f *Field, chi []uint64, c modeCandidate) int {
	if c.pair {
		s, ok1 := fromRat(f, c.s)
		t, ok2 := fromRat(f, c.t)
		if !ok1 || !ok2 {
			return 0
		}
		// A rational real root pair is two real modes, not a complex pair:
		// only a quadratic irreducible over the rationals counts here.
		disc := new(big.Rat).Sub(new(big.Rat).Mul(c.s, c.s), new(big.Rat).Mul(big.NewRat(4, 1), c.t))
		if disc.Sign() >= 0 {
			return 0
		}
		return quadOrder(f, chi, s, t)
	}
	v, ok := fromRat(f, c.c)
	if !ok {
		return 0
	}
	return rootOrder(f, chi, v)
}

// pairValue returns the roots s/2 ± i·sqrt(t - s²/4) of x² - s x + t and
// their exact text.
func pairValue(s, t *big.Rat) (re, im float64, text string) {
	half := new(big.Rat).Quo(s, big.NewRat(2, 1))
	im2 := new(big.Rat).Sub(t, new(big.Rat).Mul(half, half))
	re, _ = half.Float64()
	v, _ := im2.Float64()
	im = math.Sqrt(v)
	if sq := ratSqrt(im2); sq != nil {
		b := sq.RatString()
		if b == "1" {
			b = ""
		}
		return re, im, half.RatString() + "±" + b + "i"
	}
	return re, im, "root of x^2" + signed(new(big.Rat).Neg(s)) + "x" + signed(t)
}

func signed(r *big.Rat) string {
	if r.Sign() < 0 {
		return r.RatString()
	}
	return "+" + r.RatString()
}

// ratSqrt returns the rational square root of x, nil when it is none.
func ratSqrt(x *big.Rat) *big.Rat {
	if x.Sign() < 0 {
		return nil
	}
	n, d := new(big.Int).Sqrt(x.Num()), new(big.Int).Sqrt(x.Denom())
	if new(big.Int).Mul(n, n).Cmp(x.Num()) != 0 || new(big.Int).Mul(d, d).Cmp(x.Denom()) != 0 {
		return nil
	}
	return new(big.Rat).SetFrac(n, d)
}

// exactStability classifies an exact mode: real c, or the pair with real
// part s/2 and squared magnitude t.
func exactStability(c modeCandidate, discrete bool) Stability {
	var sign int
	if discrete {
		mag2 := c.t
		if !c.pair {
			mag2 = new(big.Rat).Mul(c.c, c.c)
		}
		sign = mag2.Cmp(big.NewRat(1, 1))
	} else if c.pair {
		sign = c.s.Sign()
	} else {
		sign = c.c.Sign()
	}
	switch {
	case sign < 0:
		return Stable
	case sign > 0:
		return Unstable
	}
	return Marginal
}

// floatStability classifies a floating-point mode with its error bound.
func floatStability(lam complex128, bound float64, discrete bool) Stability {
	x := real(lam)
	if discrete {
		x = cmplx.Abs(lam) - 1
	}
	switch {
	case x+bound < 0:
		return Stable
	case x-bound > 0:
		return Unstable
	}
	return Undecided
}

// jointRank returns the rank of Bc·Boᵀ over f for the bases of the
// controllable subspace (rows bc) and of the row space of the
// observability matrix (rows bo): the dimension of the controllable and
// observable part. Time O(rc·ro·n).
func jointRank(f *Field, bc, bo [][]uint64) int {
	rc, ro := len(bc), len(bo)
	if rc == 0 || ro == 0 {
		return 0
	}
	m := make([]uint64, rc*ro)
	for i, x := range bc {
		for j, y := range bo {
			var acc uint64
			for l, v := range x {
				if v != 0 && y[l] != 0 {
					acc = f.Add(acc, f.Mul(v, y[l]))
				}
			}
			m[i*ro+j] = acc
		}
	}
	// Rank by elimination (rows of m).
	rank := 0
	for c := 0; c < ro && rank < rc; c++ {
		p := -1
		for i := rank; i < rc; i++ {
			if m[i*ro+c] != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		if p != rank {
			for j := 0; j < ro; j++ {
				m[p*ro+j], m[rank*ro+j] = m[rank*ro+j], m[p*ro+j]
			}
		}
		inv := f.Inv(m[rank*ro+c])
		for i := rank + 1; i < rc; i++ {
			u := f.Mul(m[i*ro+c], inv)
			if u == 0 {
				continue
			}
			for j := c; j < ro; j++ {
				m[i*ro+j] = f.Sub(m[i*ro+j], f.Mul(u, m[rank*ro+j]))
			}
		}
		rank++
	}
	return rank
}
