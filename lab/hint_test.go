package lab

import (
	"strings"
	"testing"
)

// A unit typed into a number cell gets the header hint; a typo does not.
func TestNumberHints(t *testing.T) {
	for _, c := range []struct {
		cell, hint string
	}{
		{"2930psia", "name [unit]"},
		{"93 degC", "name [unit]"},
		{"5x9", ""},
		{"12,5", "decimal separator"},
	} {
		_, pe := parseNumber(c.cell)
		if pe == nil {
			t.Fatalf("%q: want an error", c.cell)
		}
		if c.hint == "" && pe.Hint != "" || !strings.Contains(pe.Hint, c.hint) {
			t.Errorf("%q: hint %q, want %q", c.cell, pe.Hint, c.hint)
		}
	}
}
