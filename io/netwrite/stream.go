package netwrite

import (
	"bufio"
	"io"
	"strconv"
)

// EdgeWriter streams an edge list of integer-named states straight to a
// writer, for generators: state i is written as i+Base. It implements
// gen.Sink. The first write error sticks and is returned by Flush.
type EdgeWriter struct {
	Base  int
	w     *bufio.Writer
	line  []byte
	edges int64
	err   error
}

// NewEdgeWriter returns an EdgeWriter on w with states named from base.
func NewEdgeWriter(w io.Writer, base int) *EdgeWriter {
	return &EdgeWriter{Base: base, w: bufio.NewWriterSize(w, 1<<20), line: make([]byte, 0, 32)}
}

// AddEdge writes the line "u v".
func (e *EdgeWriter) AddEdge(u, v int32) {
	if e.err != nil {
		return
	}
	b := strconv.AppendInt(e.line[:0], int64(u)+int64(e.Base), 10)
	b = append(b, ' ')
	b = strconv.AppendInt(b, int64(v)+int64(e.Base), 10)
	b = append(b, '\n')
	e.line = b
	_, e.err = e.w.Write(b)
	e.edges++
}

// Edges returns the number of edges written.
func (e *EdgeWriter) Edges() int64 { return e.edges }

// Flush writes out buffered lines and returns the first error met.
func (e *EdgeWriter) Flush() error {
	if e.err != nil {
		return e.err
	}
	return e.w.Flush()
}
