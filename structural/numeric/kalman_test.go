package numeric

import (
	"math/big"
	"testing"
)

// ratRank is the rank of a rational matrix by Gaussian elimination
// (math/big, exact).
func ratRank(m [][]*big.Rat) int {
	rows := make([][]*big.Rat, len(m))
	for i, r := range m {
		rows[i] = make([]*big.Rat, len(r))
		for j, x := range r {
			rows[i][j] = new(big.Rat).Set(x)
		}
	}
	rank := 0
	for c := 0; len(rows) > 0 && c < len(rows[0]) && rank < len(rows); c++ {
		p := -1
		for i := rank; i < len(rows); i++ {
			if rows[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		rows[p], rows[rank] = rows[rank], rows[p]
		for i := rank + 1; i < len(rows); i++ {
			if rows[i][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(rows[i][c], rows[rank][c])
			for j := c; j < len(rows[i]); j++ {
				rows[i][j].Sub(rows[i][j], new(big.Rat).Mul(f, rows[rank][j]))
			}
		}
		rank++
	}
	return rank
}

func ratMul(a, b [][]*big.Rat) [][]*big.Rat {
	out := make([][]*big.Rat, len(a))
	for i := range a {
		out[i] = make([]*big.Rat, len(b[0]))
		for j := range b[0] {
			s := new(big.Rat)
			for k := range b {
				s.Add(s, new(big.Rat).Mul(a[i][k], b[k][j]))
			}
			out[i][j] = s
		}
	}
	return out
}

func ratZero(r, c int) [][]*big.Rat {
	m := make([][]*big.Rat, r)
	for i := range m {
		m[i] = make([]*big.Rat, c)
		for j := range m[i] {
			m[i][j] = new(big.Rat)
		}
	}
	return m
}

// ratKalman returns the sizes of the four Kalman parts of (A, B, C) in
// exact rational arithmetic: rc = rank K, ro = rank O and co = rank(O·K)
// for the controllability matrix K = [B AB ... A^(n-1)B] and the
// observability matrix O = [C; CA; ...; CA^(n-1)] (Kalman 1963; the rank
// of O·K is the dimension of the controllable and observable part, from
// memory).
func ratKalman(a, b, c [][]*big.Rat) KalmanParts {
	n := len(a)
	var k, o [][]*big.Rat
	k = ratZero(n, 0)
	col := b
	row := c
	for range n {
		for i := range n {
			k[i] = append(k[i], col[i]...)
		}
		o = append(o, row...)
		col = ratMul(a, col)
		row = ratMul(row, a)
	}
	rc, ro, co := ratRank(k), ratRank(o), ratRank(ratMul(o, k))
	return KalmanParts{Trial: 1, ControllableObservable: co, ControllableUnobservable: rc - co,
		UncontrollableObservable: ro - co, UncontrollableUnobservable: n - rc - ro + co}
}

// The Kalman parts when one property's rank needs the second prime: a
// pair x0, x1 whose 2x2 Kalman minor is 32768²·2^31 - 1 = 2^61 - 1, zero
// modulo the first prime and not the second (by hand), beside a pair x2,
// x3 where the inputs move only x2 + x3 and the outputs see only x2 - x3
// (by hand). The deficient property is observability in one case and
// controllability in the other; both properties must then be computed on
// the second prime, and the parts match those of the same system in exact
// rational arithmetic.
func TestKalmanPartsSecondPrime(t *testing.T) {
	const big31 = 1 << 31
	for _, tc := range []struct {
		name      string
		edges     []wedge
		in, out   []string
		inW, outW []float64
	}{
		{"observability on the second prime",
			[]wedge{{"x0", "x1", 1}, {"x1", "x0", big31}, {"x2", "x0", 1}, {"x3", "x0", -1}, {"x2", "x2", -1}, {"x3", "x3", -1}},
			[]string{"x2", "x3"}, []string{"x0", "x1"}, []float64{1, 1}, []float64{32768, 1}},
		{"controllability on the second prime",
			[]wedge{{"x0", "x1", big31}, {"x1", "x0", 1}, {"x0", "x2", 1}, {"x0", "x3", 1}, {"x2", "x2", -1}, {"x3", "x3", -1}},
			[]string{"x0", "x1"}, []string{"x2", "x3"}, []float64{32768, 1}, []float64{1, -1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			g := weighted(t, tc.edges)
			n := g.N()
			in := mustDesign(g, [][]int32{lookup(t, g, tc.in...)})
			out := mustDesign(g, [][]int32{lookup(t, g, tc.out...)})
			res, err := Verify(g, Request{Inputs: &in, Outputs: &out, Weights: true, Modes: true,
				InputWeights: [][]float64{tc.inW}, OutputWeights: [][]float64{tc.outW}})
			if err != nil {
				t.Fatal(err)
			}
			a := ratZero(n, n)
			for _, e := range tc.edges {
				u, v := lookup(t, g, e.u)[0], lookup(t, g, e.v)[0]
				a[v][u].SetFloat64(e.w) // A[v][u]: u acts on v
			}
			b, c := ratZero(n, 1), ratZero(1, n)
			for i, s := range lookup(t, g, tc.in...) {
				b[s][0].SetFloat64(tc.inW[i])
			}
			for i, s := range lookup(t, g, tc.out...) {
				c[0][s].SetFloat64(tc.outW[i])
			}
			want := ratKalman(a, b, c)
			if len(res.Kalman) != 1 || res.Kalman[0] != want {
				t.Fatalf("Kalman parts %+v, exact rational %+v", res.Kalman, want)
			}
		})
	}
}
