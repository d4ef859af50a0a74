package sweepcsv

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
)

const sweepHead = "model,nodes,mean_degree,replicate,seed,edges,driver_count,driver_fraction,predicted_fraction,seconds,params,prediction_from\n"

// A bare quote in a field is a FILE:LINE error, not a panic (issue 11:
// FieldPos was asked before the error was checked); a line without end
// fails after MaxLineBytes; echoed values are clipped.
func TestReadBounds(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{sweepHead + "er,10,2,1,5,10,3,0.3,,0.1,a\"b,model\n", `s.csv:2: bare " in non-quoted-field`},
		{sweepHead + "er,10,2,1,5,10,3,0.3,,0.1,\"x\n", `s.csv:2: extraneous or missing " in quoted-field`},
		{sweepHead + "er," + strings.Repeat("7", 1000) + "x,2,1,5,10,3,0.3,,0.1,p,model\n", `s.csv:2: nodes "` + strings.Repeat("7", 40) + `..." is not a valid number`},
		{strings.Repeat("m", MaxLineBytes+10), "s.csv:1: line longer than 65536 bytes"},
	} {
		_, err := Read(strings.NewReader(c.in), "s.csv")
		var ne *netread.Error
		if err == nil || !errors.As(err, &ne) || !strings.HasPrefix(err.Error(), c.want) || len(err.Error()) > 200 {
			t.Errorf("got %.200v, want a netread.Error starting %q", err, c.want)
		}
	}
}

func FuzzRead(f *testing.F) {
	f.Add([]byte(sweepHead + "er,10,2,1,5,10,3,0.3,,0.1,nodes=10,model\n"))
	f.Add([]byte(sweepHead + "er,10,2,1,5,10,3,0.3,,0.1,a\"b,model\n"))
	f.Add([]byte("model\n\"x"))
	f.Fuzz(func(t *testing.T, data []byte) {
		rows, err := Read(bytes.NewReader(data), "fuzz")
		if err != nil {
			var ne *netread.Error
			if !errors.As(err, &ne) || strings.ContainsAny(err.Error(), "\r\n") {
				t.Fatalf("bad error %T %.200q", err, err.Error())
			}
			return
		}
		for _, r := range rows {
			if err := r.check(); err != nil {
				t.Fatalf("row kept: %v", err)
			}
		}
	})
}
