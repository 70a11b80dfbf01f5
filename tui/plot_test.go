package tui

import (
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/charmbracelet/lipgloss"
)

func plainStyle() lipgloss.Style { return asciiRenderer().NewStyle() }

// cellsOf splits a rendered plot row into its cells (one rune each in the ASCII profile).
func cellsOf(row string) []rune { return []rune(row) }

func TestPlotDiagonal(t *testing.T) {
	p := plot{width: 30, height: 10, xmin: 0, xmax: 1, ymin: 0, ymax: 1, axis: plainStyle(),
		series: []plotSeries{{xs: []float64{0, 1}, ys: []float64{0, 1}, pattern: patSolid, style: plainStyle()}}}
	rows := p.render()
	if len(rows) != 10 {
		t.Fatalf("%d rows, want 10", len(rows))
	}
	for i, r := range rows {
		if n := lipgloss.Width(r); n != 30 {
			t.Errorf("row %d is %d cells, want 30: %q", i, n, r)
		}
	}
	// The dot area is rows 0..7; its first column is after the y labels and the axis.
	axis := strings.IndexRune(rows[0], '┤')
	first := len([]rune(rows[0][:axis])) + 1
	top, bottom := cellsOf(rows[0]), cellsOf(rows[7])
	// Braille dots: the line starts at the bottom-left dot (bit 0x40) and ends at the
	// top-right dot (bit 0x08) of the dot area (Unicode braille patterns, U+2800 block).
	if c := bottom[first]; c < 0x2800 || c > 0x28FF || (c-0x2800)&0x40 == 0 {
		t.Errorf("bottom-left cell %q lacks the bottom-left dot", c)
	}
	if c := top[len(top)-1]; c < 0x2800 || c > 0x28FF || (c-0x2800)&0x08 == 0 {
		t.Errorf("top-right cell %q lacks the top-right dot", c)
	}
	if !strings.Contains(rows[8], "└") || !strings.Contains(rows[9], "0") {
		t.Errorf("no x axis: %q / %q", rows[8], rows[9])
	}
}

func TestPlotGapAndMarker(t *testing.T) {
	xs := []float64{0, 0.1, 0.2, 0.8, 0.9, 1}
	ys := []float64{0.5, 0.5, math.NaN(), math.NaN(), 0.5, 0.5}
	p := plot{width: 40, height: 8, xmin: 0, xmax: 1, ymin: 0, ymax: 1, axis: plainStyle(),
		series:  []plotSeries{{xs: xs, ys: ys, pattern: patSolid, style: plainStyle()}},
		markers: []plotMarker{{x: 0.5, y: 0.9, glyph: "●", style: plainStyle()}},
		vlines:  []plotVLine{{x: 0.7, label: "Pb", style: plainStyle()}}}
	out := strings.Join(p.render(), "\n")
	if !strings.Contains(out, "●") || !strings.Contains(out, "┊") || !strings.Contains(out, "Pb") {
		t.Fatalf("marker, Pb line or label missing:\n%s", out)
	}
	// No dots between x = 0.2 and 0.8: the NaN leaves a gap.
	for _, row := range p.render()[:6] {
		cs := cellsOf(row)
		axis := slices.Index(cs, '┤')
		dots := cs[axis+1:]
		for c := len(dots) * 3 / 10; c < len(dots)*7/10; c++ {
			if dots[c] >= 0x2801 && dots[c] <= 0x28FF {
				t.Errorf("dot in the gap at column %d: %q", c, row)
			}
		}
	}
}

func TestPlotTooSmall(t *testing.T) {
	if rows := (plot{width: 8, height: 3, xmin: 0, xmax: 1, ymin: 0, ymax: 1}).render(); rows != nil {
		t.Errorf("a 8×3 plot draws %d rows", len(rows))
	}
	if rows := (plot{width: 30, height: 10, xmin: 1, xmax: 1, ymin: 0, ymax: 1}).render(); rows != nil {
		t.Error("an empty x range draws")
	}
}

// Axis ticks fall on 1, 2, 2.5 or 5 times a power of ten (common practice for chart axes).
func TestTicks(t *testing.T) {
	for _, c := range []struct {
		lo, hi float64
		n      int
		want   []float64
	}{
		{0, 3047, 4, []float64{0, 1000, 2000, 3000}},
		{1.05, 1.36, 3, []float64{1.1, 1.2, 1.3}},
		{0, 1, 4, []float64{0, 0.5, 1}}, // 3 and 5 ticks are as close to 4: the larger step wins
	} {
		got := ticks(c.lo, c.hi, c.n)
		if len(got) != len(c.want) {
			t.Errorf("ticks(%v, %v, %d) = %v, want %v", c.lo, c.hi, c.n, got, c.want)
			continue
		}
		for i := range got {
			if math.Abs(got[i]-c.want[i]) > 1e-9 {
				t.Errorf("ticks(%v, %v, %d) = %v, want %v", c.lo, c.hi, c.n, got, c.want)
			}
		}
	}
	if s := fmtTick(0.25, []float64{0, 0.25, 0.5}); s != "0.25" {
		t.Errorf("fmtTick(0.25) = %q", s)
	}
	if s := fmtTick(2000, []float64{0, 1000, 2000}); s != "2000" {
		t.Errorf("fmtTick(2000) = %q", s)
	}
}
