package netread

import (
	"bufio"

	"github.com/netsteer/netsteer/structural"
)

func readMatrixMarket(r *bufio.Reader, file string, opt Options) (*structural.Network, error) {
	return nil, &Error{File: file, Msg: "Matrix Market reader not built yet"}
}

func readDOT(r *bufio.Reader, file string, opt Options) (*structural.Network, error) {
	return nil, &Error{File: file, Msg: "DOT reader not built yet"}
}
