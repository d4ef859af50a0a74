// Package words holds the text-formatting helpers of the io packages: how a
// state name is shown, plurals, capped lists and wrapped paragraphs.
package words
