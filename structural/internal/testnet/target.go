package testnet

import (
	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// KalmanRankRows returns the numerical rank of C·[B AB ... A^(n-1)B] for
// the C that selects the given rows (target states), and whether a
// singular value fell in the grey band (see KalmanRank). The Kalman
// columns are scaled as in KalmanRank, which leaves the rank of any row
// selection unchanged.
func KalmanRankRows(a, b *mat.Dense, rows []int32) (int, bool) {
	n, _ := a.Dims()
	if b == nil || len(rows) == 0 {
		return 0, false
	}
	_, m := b.Dims()
	k := mat.NewDense(len(rows), n*m, nil)
	cur := mat.DenseCopyOf(b)
	col := make([]float64, n)
	for blk := 0; blk < n; blk++ {
		for j := 0; j < m; j++ {
			mat.Col(col, j, cur)
			if nrm := floats.Norm(col, 2); nrm > 0 {
				floats.Scale(1/nrm, col)
			}
			cur.SetCol(j, col)
			for i, r := range rows {
				k.Set(i, blk*m+j, col[r])
			}
		}
		var next mat.Dense
		next.Mul(a, cur)
		cur = &next
	}
	var svd mat.SVD
	if !svd.Factorize(k, mat.SVDNone) {
		return -1, true
	}
	s := svd.Values(nil)
	if len(s) == 0 || s[0] == 0 {
		return 0, false
	}
	rank, grey := 0, false
	for _, x := range s {
		r := x / s[0]
		if r > rankTol {
			rank++
		}
		if r > greyBottom && r < greyTop {
			grey = true
		}
	}
	return rank, grey
}
