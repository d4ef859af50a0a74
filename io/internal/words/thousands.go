package words

import "strings"

// Thousands writes a decimal number's integer part with a comma between
// groups of three digits ("327270.5" becomes "327,270.5"), so that counts
// and costs in one report read alike.
func Thousands(s string) string {
	sign := ""
	if strings.HasPrefix(s, "-") {
		sign, s = "-", s[1:]
	}
	whole, frac, dot := strings.Cut(s, ".")
	var b strings.Builder
	for i, r := range whole {
		if i > 0 && (len(whole)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(r)
	}
	if dot {
		b.WriteByte('.')
		b.WriteString(frac)
	}
	return sign + b.String()
}
