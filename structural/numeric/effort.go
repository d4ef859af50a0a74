package numeric

import (
	"fmt"
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/mat"
)

// EffortRequest chooses the Gramian that measures control effort.
type EffortRequest struct {
	// Discrete reads the system as x(k+1) = A x(k) + B u(k) instead of
	// dx/dt = A x + B u.
	Discrete bool
	// Horizon is the finite horizon T of the Gramian: a time for
	// continuous systems, a whole number of steps for discrete ones. 0
	// means the infinite horizon, which exists only for a stable A.
	Horizon float64
}

// Effort measures how hard the inputs must work: the controllability
// Gramian W of (A, B) over the horizon, W = ∫₀ᵀ e^{At}BBᵀe^{Aᵀt} dt
// (continuous) or Σ_{k<T} AᵏBBᵀ(Aᵀ)ᵏ (discrete), T infinite for a stable A.
// The least input energy that steers the state from 0 to a unit state x
// in time T is xᵀW⁻¹x, so the worst case over unit states is 1/λ_min(W);
// trace(W) is the average controllability, the mean energy the inputs put
// into a random direction (Müller & Weber, Automatica 8:237, 1972;
// Pasqualetti, Zampieri & Bullo, "Controllability metrics, limitations
// and algorithms for complex networks", IEEE TCNS 1(1):40-52, 2014). For
// observability the same figures of (Aᵀ, Cᵀ) measure how well the outputs
// see the state: 1/λ_min is then the worst-case inverse output energy.
type Effort struct {
	// Horizon is the T used; 0 for the infinite horizon.
	Horizon float64
	// SpectralAbscissa is the largest real part of the eigenvalues of A,
	// SpectralRadius their largest magnitude: stability needs
	// SpectralAbscissa < 0 (continuous) or SpectralRadius < 1 (discrete).
	SpectralAbscissa, SpectralRadius float64
	// GramianMin, GramianMax and GramianTrace are the smallest and largest
	// eigenvalues of W and its trace.
	GramianMin, GramianMax, GramianTrace float64
	// WorstCaseEnergy is 1/GramianMin; +Inf when W is singular within
	// rounding (GramianMin <= RoundingLevel(n)·GramianMax): some direction
	// cannot be reached (or not within the precision of the others).
	WorstCaseEnergy float64
	// Skipped says why the figures were not computed (an unstable A with
	// the infinite horizon); empty when they were.
	Skipped string
}

func (e *Effort) fields() []field {
	if e == nil {
		return nil
	}
	fs := []field{{"spectral_abscissa", num(e.SpectralAbscissa)}, {"spectral_radius", num(e.SpectralRadius)}}
	if e.Skipped != "" {
		return append(fs, field{"effort_skipped", e.Skipped})
	}
	if e.Horizon > 0 {
		fs = append(fs, field{"horizon", e.Horizon})
	}
	return append(fs, field{"gramian_min", num(e.GramianMin)}, field{"gramian_max", num(e.GramianMax)},
		field{"gramian_trace", num(e.GramianTrace)}, field{"worst_case_energy", num(e.WorstCaseEnergy)})
}

// MarshalJSON writes the effort as a flat object; an infinite worst-case
// energy (a singular Gramian) is left out.
func (e *Effort) MarshalJSON() ([]byte, error) { return marshalFields(e.fields()) }

// ErrHorizon is returned for a horizon that is negative, not finite, or
// (discrete time) not a whole number of steps.
var ErrHorizon = errorf("the horizon must be a finite number >= 0, and a whole number of steps in discrete time")

// check validates the horizon.
func (req EffortRequest) check() error {
	h := req.Horizon
	if h < 0 || math.IsNaN(h) || math.IsInf(h, 0) || (req.Discrete && (h != math.Trunc(h) || h > 1<<40)) {
		return ErrHorizon
	}
	return nil
}

// effortSolver computes efforts for one A and many input matrices: the
// Schur form of A is shared.
type effortSolver struct {
	sf     *schurForm
	n      int
	req    EffortRequest
	absc   float64
	radius float64
	stable bool
	// Discrete, infinite horizon: the Cayley transform (T+I)⁻¹(T-I) and
	// the LU factors of T+I.
	tc  []float64
	tpi *mat.LU
	// Continuous, finite horizon: the scaled step, and e^{-T·h'·2^i},
	// e^{Tᵀ·h'·2^i} for i = 0..squarings (see blockGramian).
	hs        float64
	squarings int
	f1, f2    []*mat.Dense
}

// newEffortSolver prepares the efforts of A given by its Schur form.
func newEffortSolver(sf *schurForm, req EffortRequest) (*effortSolver, error) {
	if err := req.check(); err != nil {
		return nil, err
	}
	n := sf.n
	s := &effortSolver{sf: sf, n: n, req: req, absc: math.Inf(-1)}
	var normT float64
	for _, v := range sf.t {
		normT += v * v
	}
	normT = math.Sqrt(normT)
	for i := 0; i < n; i++ {
		s.absc = math.Max(s.absc, sf.wr[i])
		s.radius = math.Max(s.radius, cmplx.Abs(complex(sf.wr[i], sf.wi[i])))
	}
	tol := RoundingLevel(n) * math.Max(normT, 1)
	if req.Discrete {
		s.stable = s.radius < 1-tol
	} else {
		s.stable = s.absc < -tol
	}
	if !req.Discrete && req.Horizon > 0 {
		s.prepareHorizon(normOne(sf.t, n))
	}
	if req.Discrete && req.Horizon == 0 && s.stable {
		// Stein equation A W Aᵀ - W + Q = 0 as the Lyapunov equation of its
		// Cayley transform: with M = A + I (invertible, since |λ| < 1),
		// A_c = M⁻¹(A - I) satisfies A_c W + W A_cᵀ + 2M⁻¹QM⁻ᵀ = 0, and A_c
		// is stable exactly when A is Schur stable (multiply the Stein
		// equation by M⁻¹ on the left and M⁻ᵀ on the right; common
		// practice). In Schur coordinates M⁻¹ keeps T's block structure.
		tp := mat.NewDense(n, n, append([]float64(nil), sf.t...))
		tm := mat.NewDense(n, n, append([]float64(nil), sf.t...))
		for i := 0; i < n; i++ {
			tp.Set(i, i, tp.At(i, i)+1)
			tm.Set(i, i, tm.At(i, i)-1)
		}
		s.tpi = &mat.LU{}
		s.tpi.Factorize(tp)
		var tc mat.Dense
		if err := s.tpi.SolveTo(&tc, false, tm); err != nil {
			return nil, errorf("Cayley transform of A: %w", err)
		}
		s.tc = make([]float64, n*n)
		start, size := sf.blocks()
		for b, i0 := range start {
			for i := i0; i < i0+size[b]; i++ {
				for j := i0; j < n; j++ { // block upper triangular part only
					s.tc[i*n+j] = tc.At(i, j)
				}
			}
		}
	}
	return s, nil
}

// effort returns the effort of the inputs c = ZᵀB (n×m, Schur
// coordinates of A).
func (s *effortSolver) effort(c []float64, m int) (*Effort, error) {
	n := s.n
	e := &Effort{Horizon: s.req.Horizon, SpectralAbscissa: s.absc, SpectralRadius: s.radius}
	if s.req.Horizon == 0 && !s.stable {
		if s.req.Discrete {
			e.Skipped = fmt.Sprintf("A is not stable in discrete time (spectral radius %.4g): the infinite-horizon Gramian does not exist; a finite horizon is needed", s.radius)
		} else {
			e.Skipped = fmt.Sprintf("A is not stable (largest real part of an eigenvalue %.4g): the infinite-horizon Gramian does not exist; a finite horizon is needed", s.absc)
		}
		return e, nil
	}
	q := make([]float64, n*n)
	outer(q, c, n, m, 1)
	var x []float64
	var err error
	start, size := s.sf.blocks()
	switch {
	case s.req.Horizon == 0 && !s.req.Discrete:
		x, err = lyapunov(s.sf.t, q, n, start, size)
	case s.req.Horizon == 0:
		var d mat.Dense
		if err = s.tpi.SolveTo(&d, false, mat.NewDense(n, m, append([]float64(nil), c...))); err != nil {
			return nil, err
		}
		qc := make([]float64, n*n)
		outer(qc, d.RawMatrix().Data, n, m, 2)
		x, err = lyapunov(s.tc, qc, n, start, size)
	case s.req.Discrete:
		x = steinSum(s.sf.t, q, n, int64(s.req.Horizon))
	default:
		x, err = s.blockGramian(c, m)
	}
	if err != nil {
		return nil, err
	}
	if err := extremes(x, n, e); err != nil {
		return nil, err
	}
	return e, nil
}

// outer sets q = scale·c·cᵀ for the n×m row-major c.
func outer(q, c []float64, n, m int, scale float64) {
	for i := 0; i < n; i++ {
		ci := c[i*m : (i+1)*m]
		for k := 0; k <= i; k++ {
			ck := c[k*m : (k+1)*m]
			var acc float64
			for j, v := range ci {
				acc += v * ck[j]
			}
			acc *= scale
			q[i*n+k], q[k*n+i] = acc, acc
		}
	}
}

// extremes fills the Gramian figures of e from the symmetric part of x.
func extremes(x []float64, n int, e *Effort) error {
	sym := mat.NewSymDense(n, nil)
	tr := 0.0
	for i := 0; i < n; i++ {
		tr += x[i*n+i]
		for k := i; k < n; k++ {
			sym.SetSym(i, k, (x[i*n+k]+x[k*n+i])/2)
		}
	}
	var es mat.EigenSym
	if !es.Factorize(sym, false) {
		return errorf("symmetric eigenvalue solver failed on the Gramian")
	}
	vals := es.Values(nil)
	e.GramianMin, e.GramianMax, e.GramianTrace = vals[0], vals[n-1], tr
	e.WorstCaseEnergy = math.Inf(1)
	if e.GramianMin > RoundingLevel(n)*e.GramianMax && e.GramianMin > 0 {
		e.WorstCaseEnergy = 1 / e.GramianMin
	}
	return nil
}

// steinSum returns Σ_{k<steps} TᵏQ(Tᵀ)ᵏ by doubling: X_{2c} = X_c +
// TᶜX_c(Tᶜ)ᵀ and X_{c+1} = Q + T·X_c·Tᵀ, bit by bit from the top. Time
// O(n³ log steps).
func steinSum(t, q []float64, n int, steps int64) []float64 {
	tm := mat.NewDense(n, n, t)
	qm := mat.NewDense(n, n, q)
	x := mat.NewDense(n, n, nil)
	r := eye(n)
	var tmp, tmp2 mat.Dense
	for bit := 62; bit >= 0; bit-- {
		if steps>>uint(bit) == 0 {
			continue
		}
		// Doubling.
		tmp.Mul(r, x)
		tmp2.Mul(&tmp, r.T())
		x.Add(x, &tmp2)
		tmp.Mul(r, r)
		r.Copy(&tmp)
		if steps>>uint(bit)&1 == 1 {
			tmp.Mul(tm, x)
			tmp2.Mul(&tmp, tm.T())
			x.Add(qm, &tmp2)
			tmp.Mul(tm, r)
			r.Copy(&tmp)
		}
	}
	return x.RawMatrix().Data
}

// normOne is the largest absolute column sum of the n×n row-major t.
func normOne(t []float64, n int) float64 {
	best := 0.0
	for j := 0; j < n; j++ {
		var sum float64
		for i := 0; i < n; i++ {
			sum += math.Abs(t[i*n+j])
		}
		best = math.Max(best, sum)
	}
	return best
}

// prepareHorizon chooses the scaled step h' = h/2^s with ‖T‖₁·h' <= 1/4
// and computes the exponentials every input matrix shares.
func (s *effortSolver) prepareHorizon(norm1 float64) {
	n, h := s.n, s.req.Horizon
	sq := 0
	if x := norm1 * h / 0.25; x > 1 {
		sq = int(math.Ceil(math.Log2(x)))
	}
	s.squarings, s.hs = sq, h/math.Ldexp(1, sq)
	neg := mat.NewDense(n, n, nil)
	tr := mat.NewDense(n, n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			neg.Set(i, j, -s.sf.t[i*n+j]*s.hs)
			tr.Set(j, i, s.sf.t[i*n+j]*s.hs)
		}
	}
	var e1, e2 mat.Dense
	e1.Exp(neg)
	e2.Exp(tr)
	s.f1, s.f2 = []*mat.Dense{&e1}, []*mat.Dense{&e2}
	for i := 0; i < sq; i++ {
		var a, b mat.Dense
		a.Mul(s.f1[i], s.f1[i])
		b.Mul(s.f2[i], s.f2[i])
		s.f1, s.f2 = append(s.f1, &a), append(s.f2, &b)
	}
}

// blockGramian returns ∫₀ʰ e^{Ts}ccᵀe^{Tᵀs} ds by Van Loan's block
// exponential (Van Loan, "Computing integrals involving the matrix
// exponential", IEEE TAC 23(3):395-404, 1978): exp([[-T, Q], [0, Tᵀ]]·h)
// = [[F₁, G], [0, F₂]] with F₂ = e^{Tᵀh}, and the integral is F₂ᵀG. It
// needs no stability and no Lyapunov solve, so eigenvalues at zero or
// symmetric about the imaginary axis are no trouble. The diagonal blocks
// do not depend on the inputs and are shared (prepareHorizon); only G is
// computed per input matrix, by scaling and squaring: at the step h' the
// Taylor series G = Σ_k P_k/k! with P₁ = h'Q and P_{k+1} = -h'T·P_k +
// h'Q·(h'Tᵀ)^k converges fast (‖T‖₁h' <= 1/4: about 12 terms reach
// 2^-53), and squaring gives G_{2t} = F₁(t)·G_t +
// G_t·F₂(t). Q = ccᵀ has rank m, so Q·(h'Tᵀ)^k = c·((h'T)^k c)ᵀ costs n²m.
// Time O((K + 2s)·n³) per input matrix for K terms and s squarings.
// F₁ = e^{-Th} grows when h·‖T‖ does, so the horizon should be of the
// order of the slowest time constants.
func (s *effortSolver) blockGramian(c []float64, m int) ([]float64, error) {
	n, hs := s.n, s.hs
	tau := mat.NewDense(n, n, nil) // h'·T
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			tau.Set(i, j, s.sf.t[i*n+j]*hs)
		}
	}
	cm := mat.NewDense(n, max(m, 1), nil)
	for i := 0; i < n; i++ {
		for j := 0; j < m; j++ {
			cm.Set(i, j, c[i*m+j])
		}
	}
	var p mat.Dense // P_k
	p.Mul(cm, cm.T())
	p.Scale(hs, &p)
	g := mat.DenseCopyOf(&p) // Σ P_k/k!
	v := mat.DenseCopyOf(cm) // (h'T)^k c
	// ‖P_k‖ <= k·θ^{k-1}·‖h'Q‖ for θ = ‖h'T‖₁ <= 1/4 (P_k is a sum of k
	// products (-h'T)^i·h'Q·(h'Tᵀ)^j, i + j = k - 1), and G is h'Q plus
	// terms of relative size θ: the series stops once k·θ^{k-1}/k! falls
	// below 2^-53. (A test on the terms themselves would stop early: P₂ of
	// a scalar system is zero.)
	theta := normOne(s.sf.t, n) * hs
	fact := 1.0
	for k := 1; k < 60; k++ {
		if float64(k+1)*math.Pow(theta, float64(k))/(fact*float64(k+1)) < 0x1p-53 {
			break
		}
		var tp, vv, low mat.Dense
		tp.Mul(tau, &p)
		vv.Mul(tau, v)
		v = &vv
		low.Mul(cm, v.T())
		low.Scale(hs, &low)
		p.Sub(&low, &tp)
		fact *= float64(k + 1)
		var term mat.Dense
		term.Scale(1/fact, &p)
		g.Add(g, &term)
	}
	for i := 0; i < s.squarings; i++ {
		var a, b mat.Dense
		a.Mul(s.f1[i], g)
		b.Mul(g, s.f2[i])
		g.Add(&a, &b)
	}
	var x mat.Dense
	x.Mul(s.f2[s.squarings].T(), g)
	data := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			v := x.At(i, j)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, errorf("the finite-horizon Gramian overflowed: horizon %g is too long for the fastest modes of A", s.req.Horizon)
			}
			data[i*n+j] = v
		}
	}
	return data, nil
}

// GramianEffort computes the effort of the dense system (A, B), a n×n and
// b n×m row-major (neither modified). Time O(n³): the Schur form, a
// Lyapunov solve (or, with a continuous horizon, two n×n exponentials and
// a scaling and squaring of the coupling block; in discrete time a
// doubling) and a symmetric eigensolver.
func GramianEffort(a, b []float64, n, m int, req EffortRequest) (*Effort, error) {
	if n == 0 {
		return nil, errorf("empty system")
	}
	sf, err := newSchur(append([]float64(nil), a...), n)
	if err != nil {
		return nil, err
	}
	s, err := newEffortSolver(sf, req)
	if err != nil {
		return nil, err
	}
	c := make([]float64, n*m)
	if m > 0 {
		cm := mat.NewDense(n, m, c)
		cm.Mul(mat.NewDense(n, n, sf.z).T(), mat.NewDense(n, m, append([]float64(nil), b...)))
	}
	return s.effort(c, m)
}
