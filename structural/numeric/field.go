package numeric

import "math/bits"

// The prime moduli. Mersenne61 is the main one; Alt61 is a second prime of
// the same size used to confirm a rank deficiency found with fixed weights.
const (
	Mersenne61 uint64 = 1<<61 - 1  // 2305843009213693951, a Mersenne prime
	Alt61      uint64 = 1<<61 - 31 // 2305843009213693921, the next prime below
)

// Field is the prime field GF(p) for an odd prime p < 2^61. Elements
// are kept in Montgomery form x·2^64 mod p, so that a product costs one
// 64x64->128-bit multiplication and one reduction with no division; zero is
// zero in both forms, and a uniformly random form is a uniformly random
// element. Sums of up to eight products fit the reduction (8p² < p·2^64),
// which the elimination uses to defer reductions.
type Field struct {
	P    uint64
	pinv uint64 // P⁻¹ mod 2^64
	r2   uint64 // 2^128 mod P
	one  uint64 // 2^64 mod P: the Montgomery form of 1
}

// NewField returns GF(p). p must be an odd prime below 2^61; that it is
// prime is the caller's promise.
func NewField(p uint64) Field {
	if p%2 == 0 || p >= 1<<61 || p < 3 {
		panic("numeric: modulus must be odd, at least 3 and below 2^61")
	}
	inv := p // correct to 3 bits: p·p ≡ 1 mod 8 for odd p
	for i := 0; i < 5; i++ {
		inv *= 2 - p*inv // Newton's step doubles the correct bits
	}
	_, one := bits.Div64(1, 0, p) // 2^64 mod p
	f := Field{P: p, pinv: inv, one: one}
	hi, lo := bits.Mul64(one, one)
	_, f.r2 = bits.Div64(hi, lo, p) // 2^128 mod p
	return f
}

// redc returns hi·2^64+lo divided by 2^64 modulo P, for hi·2^64+lo < P·2^64.
func (f *Field) redc(hi, lo uint64) uint64 {
	m := lo * f.pinv
	mh, _ := bits.Mul64(m, f.P)
	r := hi - mh
	if hi < mh {
		r += f.P
	}
	return r
}

// Mul returns a·b.
func (f *Field) Mul(a, b uint64) uint64 {
	hi, lo := bits.Mul64(a, b)
	return f.redc(hi, lo)
}

// Add returns a+b.
func (f *Field) Add(a, b uint64) uint64 {
	s := a + b
	if s >= f.P {
		s -= f.P
	}
	return s
}

// Sub returns a-b.
func (f *Field) Sub(a, b uint64) uint64 {
	d := a - b
	if a < b {
		d += f.P
	}
	return d
}

// Neg returns -a.
func (f *Field) Neg(a uint64) uint64 {
	if a == 0 {
		return 0
	}
	return f.P - a
}

// One returns the multiplicative identity.
func (f *Field) One() uint64 { return f.one }

// FromUint returns the element x mod P.
func (f *Field) FromUint(x uint64) uint64 {
	return f.Mul(x%f.P, f.r2)
}

// FromInt returns the element x mod P for a signed x.
func (f *Field) FromInt(x int64) uint64 {
	if x < 0 {
		return f.Neg(f.FromUint(uint64(-x)))
	}
	return f.FromUint(uint64(x))
}

// Uint returns the integer in [0, P) that a stands for.
func (f *Field) Uint(a uint64) uint64 { return f.redc(0, a) }

// Pow returns a^e.
func (f *Field) Pow(a, e uint64) uint64 {
	r := f.one
	for e > 0 {
		if e&1 != 0 {
			r = f.Mul(r, a)
		}
		a = f.Mul(a, a)
		e >>= 1
	}
	return r
}

// Inv returns 1/a for a != 0 (Fermat: a^(P-2)).
func (f *Field) Inv(a uint64) uint64 {
	if a == 0 {
		panic("numeric: inverse of zero")
	}
	return f.Pow(a, f.P-2)
}
