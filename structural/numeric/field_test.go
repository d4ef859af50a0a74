package numeric

import (
	"math/big"
	"math/rand/v2"
	"testing"
)

// The moduli are prime (math/big's Miller–Rabin plus Baillie–PSW, which
// is exact below 2^64 per its documentation).
func TestModuliPrime(t *testing.T) {
	for _, p := range []uint64{Mersenne61, Alt61} {
		if !new(big.Int).SetUint64(p).ProbablyPrime(20) {
			t.Errorf("%d is not prime", p)
		}
	}
	// Alt61 is the largest prime below Mersenne61.
	for q := Mersenne61 - 2; q > Alt61; q -= 2 {
		if new(big.Int).SetUint64(q).ProbablyPrime(20) {
			t.Errorf("%d is prime and lies between Alt61 and Mersenne61", q)
		}
	}
}

// Field operations against math/big on random operands.
func TestFieldAgainstBig(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, p := range []uint64{Mersenne61, Alt61, 1000003, 3} {
		f := NewField(p)
		bp := new(big.Int).SetUint64(p)
		for i := 0; i < 2000; i++ {
			a, b := rng.Uint64N(p), rng.Uint64N(p)
			ma, mb := f.FromUint(a), f.FromUint(b)
			if got := f.Uint(ma); got != a {
				t.Fatalf("p=%d: Uint(FromUint(%d)) = %d", p, a, got)
			}
			want := new(big.Int).Mul(new(big.Int).SetUint64(a), new(big.Int).SetUint64(b))
			want.Mod(want, bp)
			if got := f.Uint(f.Mul(ma, mb)); got != want.Uint64() {
				t.Fatalf("p=%d: %d*%d = %d, want %d", p, a, b, got, want.Uint64())
			}
			if got, want := f.Uint(f.Add(ma, mb)), (a+b)%p; got != want {
				t.Fatalf("p=%d: %d+%d = %d, want %d", p, a, b, got, want)
			}
			if got, want := f.Uint(f.Sub(ma, mb)), (a+p-b)%p; got != want {
				t.Fatalf("p=%d: %d-%d = %d, want %d", p, a, b, got, want)
			}
			if a != 0 {
				inv := f.Inv(ma)
				if got := f.Mul(inv, ma); got != f.One() {
					t.Fatalf("p=%d: %d * inverse = %d, want one", p, a, f.Uint(got))
				}
			}
		}
		if got := f.Uint(f.FromInt(-1)); got != p-1 {
			t.Errorf("p=%d: FromInt(-1) = %d, want %d", p, got, p-1)
		}
	}
}

// Deferred reduction: a sum of eight products reduced once equals the sum of
// the products reduced one by one.
func TestFieldGroupSum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, p := range []uint64{Mersenne61, Alt61} {
		f := NewField(p)
		for i := 0; i < 1000; i++ {
			// Worst case first: every operand is p-1.
			v := make([]uint64, 1)
			coef := make([]uint64, group)
			rows := make([][]uint64, group)
			want := uint64(0)
			for k := range coef {
				a, b := p-1, p-1
				if i > 0 {
					a, b = rng.Uint64N(p), rng.Uint64N(p)
				}
				coef[k], rows[k] = a, []uint64{b}
				want = f.Sub(want, f.Mul(a, b))
			}
			subRows(&f, v, coef, rows)
			if v[0] != want {
				t.Fatalf("p=%d case %d: grouped %d, one by one %d", p, i, v[0], want)
			}
		}
	}
}

// Decimal weights map to the rationals they denote (checked against
// math/big.Rat reduced mod p); values beyond 15 digits fall back to the
// exact binary value and say so.
func TestFromFloat(t *testing.T) {
	f := NewField(Mersenne61)
	bp := new(big.Int).SetUint64(Mersenne61)
	ratMod := func(r *big.Rat) uint64 {
		num := new(big.Int).Mod(r.Num(), bp)
		den := new(big.Int).ModInverse(new(big.Int).Mod(r.Denom(), bp), bp)
		return num.Mul(num, den).Mod(num, bp).Uint64()
	}
	for _, tc := range []struct {
		text    string
		decimal bool
	}{
		{"0.1", true}, {"-2.5", true}, {"3", true}, {"1e-300", true}, {"123456789012345", true},
		{"-0.000123", true}, {"6.02214076e23", true}, {"0.30000000000000004", false},
		{"3.141592653589793", false}, {"5e-324", true},
	} {
		var x float64
		r, _ := new(big.Rat).SetString(tc.text)
		x, _ = r.Float64()
		got, dec := FromFloat(&f, x)
		if dec != tc.decimal {
			t.Errorf("%s: decimal = %v, want %v", tc.text, dec, tc.decimal)
		}
		want := r
		if !dec {
			want = new(big.Rat).SetFloat64(x) // the exact binary value
		}
		if f.Uint(got) != ratMod(want) {
			t.Errorf("%s: maps to %d, want %d", tc.text, f.Uint(got), ratMod(want))
		}
	}
}
