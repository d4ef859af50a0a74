package sweep

import (
	"fmt"

	"github.com/netsteer/netsteer/io/sweepcsv"
)

// SeedOf recovers the sweep seed a row was computed from: RowSeed is a
// bijection of the sweep seed for a given key (an XOR with the key's hash,
// then SplitMix64's increment and finaliser, each invertible), so every
// row names the sweep it belongs to.
func SeedOf(row uint64, key string) uint64 {
	z := row
	z ^= z>>31 ^ z>>62
	z *= 0x319642b2d24d8ec3 // inverse of 0x94d049bb133111eb modulo 2^64
	z ^= z>>27 ^ z>>54
	z *= 0x96de1b173f119089 // inverse of 0xbf58476d1ce4e5b9
	z ^= z>>30 ^ z>>60
	z -= 0x9e3779b97f4a7c15
	return z ^ keyHash(key)
}

// MixedSeedsError reports files of different sweeps given to be merged.
type MixedSeedsError struct {
	FileA, FileB string
	SeedA, SeedB uint64
}

func (e *MixedSeedsError) Error() string { return "sweep: " + e.Message() }

// Message is the text without the package name.
func (e *MixedSeedsError) Message() string {
	return fmt.Sprintf("%s comes from a sweep with seed %d and %s from one with seed %d: shards of one sweep share its seed", e.FileA, e.SeedA, e.FileB, e.SeedB)
}

// MergeFiles reads sweep files and merges them into the file a single run
// writes (sweepcsv.Merge), refusing files that come from sweeps with
// different seeds: their rows would not form one sweep.
func MergeFiles(paths ...string) ([]sweepcsv.Row, error) {
	var sets [][]sweepcsv.Row
	first, firstFile := uint64(0), ""
	for _, p := range paths {
		rows, err := sweepcsv.ReadFile(p)
		if err != nil {
			return nil, err
		}
		for _, r := range rows {
			s := SeedOf(r.Seed, r.Key())
			if firstFile == "" {
				first, firstFile = s, p
			} else if s != first {
				return nil, &MixedSeedsError{FileA: firstFile, FileB: p, SeedA: first, SeedB: s}
			}
		}
		sets = append(sets, rows)
	}
	return sweepcsv.Merge(sets...)
}
