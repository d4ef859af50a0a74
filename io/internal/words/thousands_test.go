package words

import "testing"

func TestThousands(t *testing.T) {
	for in, want := range map[string]string{"0": "0", "999": "999", "1000": "1,000", "327270": "327,270", "1234567.25": "1,234,567.25", "-1000": "-1,000", "2.5": "2.5"} {
		if got := Thousands(in); got != want {
			t.Errorf("Thousands(%q) = %q, want %q", in, got, want)
		}
	}
}
