package tui

import (
	"math"
	"strconv"
	"strings"

	"github.com/charmbracelet/lipgloss"
	"github.com/charmbracelet/x/ansi"
)

// cell cuts s to w cells (ending in "…" when cut) and pads it with spaces to exactly w.
func cell(s string, w int) string {
	if w <= 0 {
		return ""
	}
	n := lipgloss.Width(s)
	if n > w {
		s = ansi.Truncate(s, w, "…")
		n = lipgloss.Width(s)
	}
	return s + strings.Repeat(" ", max(0, w-n))
}

// cellRight right-aligns s in w cells, cutting it when too long.
func cellRight(s string, w int) string {
	n := lipgloss.Width(s)
	if n >= w {
		return cell(s, w)
	}
	return strings.Repeat(" ", w-n) + s
}

// frame makes s exactly w cells wide and h lines high: long lines are cut, short ones padded,
// missing lines added, extra ones dropped.
func frame(s string, w, h int) string {
	lines := strings.Split(s, "\n")
	if len(lines) > h {
		lines = lines[:h]
	}
	for len(lines) < h {
		lines = append(lines, "")
	}
	for i, l := range lines {
		lines[i] = cell(l, w)
	}
	return strings.Join(lines, "\n")
}

// sideBySide joins two blocks of lines, the left padded to lw cells, with gap spaces between.
func sideBySide(left []string, lw int, right []string, gap int) []string {
	n := max(len(left), len(right))
	out := make([]string, n)
	for i := range out {
		l, r := "", ""
		if i < len(left) {
			l = left[i]
		}
		if i < len(right) {
			r = right[i]
		}
		out[i] = cell(l, lw) + strings.Repeat(" ", gap) + r
	}
	return out
}

// wrap breaks text into lines of at most w cells at spaces, keeping the text's leading spaces
// and indenting continuation lines.
func wrap(text string, w int, indent string) []string {
	if w <= len(indent)+4 {
		return []string{cell(text, max(w, 0))}
	}
	lead := text[:len(text)-len(strings.TrimLeft(text, " "))]
	text = strings.TrimLeft(text, " ")
	var words []string
	for _, word := range strings.Split(text, " ") { // a no-break space ( ) holds words together
		switch {
		case word == "":
		case strings.HasPrefix(word, "%") && len(words) > 0: // "3.4 %" is not broken before the %
			words[len(words)-1] += "\u00a0" + word
		default:
			words = append(words, word)
		}
	}
	var out []string
	line := lead
	for _, word := range words {
		switch {
		case strings.TrimSpace(line) == "":
			line += word
		case lipgloss.Width(line)+1+lipgloss.Width(word) <= w:
			line += " " + word
		default:
			out = append(out, line)
			line = indent + word
		}
	}
	if strings.TrimSpace(line) != "" {
		out = append(out, line)
	}
	for i, l := range out {
		if lipgloss.Width(l) > w {
			out[i] = cell(l, w)
		}
	}
	return out
}

// num formats v with the given decimals, "—" for NaN or ±Inf.
func num(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	return strconv.FormatFloat(v, 'f', dec, 64)
}

// sig formats v with n significant digits in plain notation where it is short enough.
func sig(v float64, n int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	if v == 0 {
		return "0"
	}
	mag := int(math.Floor(math.Log10(math.Abs(v))))
	if mag >= 7 || mag < -4 {
		return strconv.FormatFloat(v, 'g', n, 64)
	}
	return strconv.FormatFloat(v, 'f', max(0, n-1-mag), 64)
}

// pct formats a percentage, "n/a" for a nil pointer.
func pctp(v *float64) string {
	if v == nil {
		return "n/a"
	}
	return num(*v, 2)
}

// optional formats a measured value that a report may leave out (0 = not given).
func optional(v float64, dec int) string {
	if v == 0 {
		return ""
	}
	return num(v, dec)
}
