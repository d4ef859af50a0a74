package numeric

import (
	"math"
	"strconv"
	"strings"
)

// maxExactDigits is the number of significant decimal digits that survive a
// trip through float64 and back (DBL_DIG, IEEE 754 binary64): a decimal of
// at most 15 significant digits is the shortest decimal that rounds to its
// float64, so strconv's shortest formatting recovers it exactly.
const maxExactDigits = 15

// FromFloat maps the real number x into f exactly. Weights reach this
// package as float64 values parsed from the user's decimal text; when the
// shortest decimal that rounds to x has at most 15 significant digits, that
// decimal (an integer over a power of ten) is what the user wrote and it is
// mapped as the rational it is: 0.1 becomes 1/10, not the binary fraction
// nearest to it. Otherwise the decimal cannot be recovered from the float64,
// and the exact binary value of x (an integer times a power of two) is used
// instead; decimal is false then. A nonzero x never maps to zero: its
// numerator is below 10^17 < P, and 10 and 2 are invertible. x must be
// finite (FromFloat panics otherwise, as on a programming error: Build
// refuses non-finite weights and Verify non-finite signal values).
func FromFloat(f *Field, x float64) (v uint64, decimal bool) {
	if x == 0 {
		return 0, true
	}
	if math.IsNaN(x) || math.IsInf(x, 0) {
		panic("numeric: FromFloat of a non-finite value")
	}
	s := strconv.FormatFloat(x, 'e', -1, 64) // [-]d[.ddd]e±xx
	neg := s[0] == '-'
	if neg {
		s = s[1:]
	}
	mant, exp, _ := strings.Cut(s, "e")
	e10, _ := strconv.Atoi(exp)
	digits := strings.Replace(mant, ".", "", 1)
	if len(digits) > maxExactDigits {
		v = fromBinary(f, math.Abs(x))
	} else {
		m, _ := strconv.ParseUint(digits, 10, 64)
		v = f.FromUint(m)
		e10 -= len(digits) - 1
		v = f.Mul(v, powInt(f, 10, e10))
		decimal = true
	}
	if neg {
		v = f.Neg(v)
	}
	return v, decimal
}

// fromBinary maps the exact binary value of x >= 0 into f.
func fromBinary(f *Field, x float64) uint64 {
	frac, e2 := math.Frexp(x)         // x = frac·2^e2, frac in [0.5, 1)
	m := uint64(math.Ldexp(frac, 53)) // exact: 53 significant bits
	return f.Mul(f.FromUint(m), powInt(f, 2, e2-53))
}

// FromBinary maps the real number x into f as the exact binary fraction a
// float64 holds: the image of a sample drawn in floating point.
func FromBinary(f *Field, x float64) uint64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		panic("numeric: FromBinary of a non-finite value")
	}
	if x < 0 {
		return f.Neg(fromBinary(f, -x))
	}
	if x == 0 {
		return 0
	}
	return fromBinary(f, x)
}

// decimalText returns the shortest decimal that rounds to x, when it has
// at most 15 significant digits (the text FromFloat maps exactly).
func decimalText(x float64) (string, bool) {
	s := strconv.FormatFloat(x, 'e', -1, 64)
	mant, _, _ := strings.Cut(strings.TrimPrefix(s, "-"), "e")
	return s, len(strings.Replace(mant, ".", "", 1)) <= maxExactDigits
}

// exactOf returns the exact image in f of the real sample re: as the
// decimals the values denote (decimal, as FromFloat) or as their binary
// values (FromBinary, for values drawn in floating point).
func exactOf(re *Real, f Field, decimal bool) *Exact {
	conv := func(x float64) uint64 {
		if decimal {
			v, _ := FromFloat(&f, x)
			return v
		}
		return FromBinary(&f, x)
	}
	x := &Exact{F: f, A: make([]uint64, len(re.A)), B: make([][]uint64, len(re.B))}
	for k, v := range re.A {
		x.A[k] = conv(v)
	}
	for j, s := range re.B {
		x.B[j] = make([]uint64, len(s))
		for i, v := range s {
			x.B[j][i] = conv(v)
		}
	}
	return x
}

// powInt returns base^e in f for any integer e.
func powInt(f *Field, base uint64, e int) uint64 {
	b := f.FromUint(base)
	if e < 0 {
		return f.Inv(f.Pow(b, uint64(-e)))
	}
	return f.Pow(b, uint64(e))
}

// ExactFromWeights maps the model's own values into f: a[k] is the entry of
// the edge Out.Adj[k] (nil means every entry is 1), b[j][i] that of signal j
// at state Signals[j][i] (nil means 1). It returns the number of values
// whose decimal text could not be recovered (see FromFloat). Every value
// must be finite, as FromFloat requires.
func ExactFromWeights(p *Pattern, f Field, a []float64, b [][]float64) (*Exact, int) {
	x := &Exact{F: f, A: make([]uint64, len(p.Out.Adj))}
	inexact := 0
	for k := range x.A {
		x.A[k] = x.F.one
		if a != nil {
			v, ok := FromFloat(&x.F, a[k])
			if !ok {
				inexact++
			}
			x.A[k] = v
		}
	}
	var bad int
	x.B, bad = exactSignals(&x.F, p.Signals, b)
	return x, inexact + bad
}

// exactSignals maps signal values into f (nil lists mean 1).
func exactSignals(f *Field, signals [][]int32, b [][]float64) ([][]uint64, int) {
	out := make([][]uint64, len(signals))
	inexact := 0
	for j, s := range signals {
		out[j] = make([]uint64, len(s))
		for i := range s {
			out[j][i] = f.one
			if b != nil && b[j] != nil {
				v, ok := FromFloat(f, b[j][i])
				if !ok {
					inexact++
				}
				out[j][i] = v
			}
		}
	}
	return out, inexact
}

// RealFromWeights returns the model's own values as a Real sample, with
// the same conventions for nil as ExactFromWeights.
func RealFromWeights(p *Pattern, a []float64, b [][]float64) *Real {
	x := &Real{A: make([]float64, len(p.Out.Adj))}
	for k := range x.A {
		x.A[k] = 1
		if a != nil {
			x.A[k] = a[k]
		}
	}
	x.B = realSignals(p.Signals, b)
	return x
}

// realSignals returns signal values (nil lists mean 1).
func realSignals(signals [][]int32, b [][]float64) [][]float64 {
	out := make([][]float64, len(signals))
	for j, s := range signals {
		out[j] = make([]float64, len(s))
		for i := range s {
			out[j][i] = 1
			if b != nil && b[j] != nil {
				out[j][i] = b[j][i]
			}
		}
	}
	return out
}
