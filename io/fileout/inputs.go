package fileout

import (
	"fmt"
	"os"
)

// InputError reports an output path that is one of the files a command
// reads.
type InputError struct{ Output, Input string }

func (e *InputError) Error() string {
	return fmt.Sprintf("fileout: output %s is the input %s", e.Output, e.Input)
}

// NotAnInput returns an *InputError when out names the same file as one of
// inputs, compared by device and inode after following links, so hard
// links and symbolic links are caught. "" and "-" are never files.
func NotAnInput(out string, inputs ...string) error {
	if out == "" || out == "-" {
		return nil
	}
	ost, err := os.Stat(out)
	if err != nil {
		return nil
	}
	for _, in := range inputs {
		if in == "" || in == "-" {
			continue
		}
		if ist, err := os.Stat(in); err == nil && os.SameFile(ost, ist) {
			return &InputError{Output: out, Input: in}
		}
	}
	return nil
}
