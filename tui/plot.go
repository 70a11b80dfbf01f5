package tui

import (
	"math"
	"strconv"
	"strings"

	"github.com/charmbracelet/lipgloss"
)

// A small braille plotter: each character cell holds 2×4 dots, so a 40×12 cell plot has
// 80×48 dots. Curves are drawn dot by dot with a dash pattern (so they differ without
// colour); lab points are whole-cell glyphs drawn over the curves; a vertical marker line
// (Pb) is drawn where nothing else is. Axis tick labels are drawn around the dots.

// dash patterns: a dot is set where pattern[k%len] is true, k counting dots along the curve.
var (
	patSolid  = []bool{true}
	patDotted = []bool{true, false, false}
	patDashed = []bool{true, true, true, true, false, false}
)

type plotSeries struct {
	xs, ys  []float64 // NaN y leaves a gap
	pattern []bool
	style   lipgloss.Style
}

type plotMarker struct {
	x, y  float64
	glyph string
	style lipgloss.Style
}

type plotVLine struct {
	x     float64
	label string
	style lipgloss.Style
}

type plot struct {
	width, height int // whole plot in cells, axes and labels included
	xmin, xmax    float64
	ymin, ymax    float64
	series        []plotSeries
	markers       []plotMarker
	vlines        []plotVLine
	axis          lipgloss.Style
}

// braille dot bits, indexed [row][col] within a cell (Unicode braille patterns, U+2800).
var brailleBit = [4][2]rune{{0x01, 0x08}, {0x02, 0x10}, {0x04, 0x20}, {0x40, 0x80}}

// render draws the plot as lines of exactly width cells (fewer lines when too small).
func (p plot) render() []string {
	if p.width < 12 || p.height < 4 || !(p.xmax > p.xmin) || !(p.ymax > p.ymin) {
		return nil
	}
	yt := ticks(p.ymin, p.ymax, max(2, p.height/3))
	labels := make([]string, len(yt))
	lw := 0
	for i, v := range yt {
		labels[i] = fmtTick(v, yt)
		lw = max(lw, len(labels[i]))
	}
	cw, ch := p.width-lw-1, p.height-2 // dot area in cells; two rows for the x axis
	if cw < 6 || ch < 2 {
		return nil
	}
	dw, dh := cw*2, ch*4
	dots := make([]rune, cw*ch)
	owner := make([]int, cw*ch) // series index+1 that last set a dot in the cell
	toDot := func(x, y float64) (int, int) {
		dx := (x - p.xmin) / (p.xmax - p.xmin) * float64(dw-1)
		dy := (p.ymax - y) / (p.ymax - p.ymin) * float64(dh-1)
		return int(math.Round(dx)), int(math.Round(dy))
	}
	for si, s := range p.series {
		k := 0
		set := func(x, y int) {
			if x < 0 || y < 0 || x >= dw || y >= dh {
				return
			}
			if s.pattern[k%len(s.pattern)] {
				c := (y/4)*cw + x/2
				dots[c] |= brailleBit[y%4][x%2]
				owner[c] = si + 1
			}
			k++
		}
		havePrev := false
		var px, py int
		for i := range s.xs {
			x, y := s.xs[i], s.ys[i]
			if math.IsNaN(y) || math.IsInf(y, 0) || math.IsNaN(x) {
				havePrev = false
				continue
			}
			// Clamp far-off values so that a line leaving the plot still points the right way.
			y = math.Max(p.ymin-(p.ymax-p.ymin), math.Min(p.ymax+(p.ymax-p.ymin), y))
			cx, cy := toDot(x, y)
			if havePrev {
				line(px, py, cx, cy, set)
			} else {
				set(cx, cy)
			}
			px, py, havePrev = cx, cy, true
		}
	}
	// Cells: a marker glyph, else braille dots, else a vertical line, else blank.
	cells := make([]string, cw*ch)
	for c := range cells {
		switch {
		case dots[c] != 0:
			cells[c] = p.series[owner[c]-1].style.Render(string(0x2800 + dots[c]))
		default:
			cells[c] = " "
		}
	}
	var xlabels []struct {
		col   int
		label string
		style lipgloss.Style
	}
	for _, v := range p.vlines {
		if v.x < p.xmin || v.x > p.xmax {
			continue
		}
		dx, _ := toDot(v.x, p.ymin)
		col := dx / 2
		for r := 0; r < ch; r++ {
			if dots[r*cw+col] == 0 {
				cells[r*cw+col] = v.style.Render("┊")
			}
		}
		xlabels = append(xlabels, struct {
			col   int
			label string
			style lipgloss.Style
		}{col, v.label, v.style})
	}
	busy := make([]bool, cw*ch)
	for c := range busy {
		busy[c] = dots[c] != 0
	}
	for _, m := range p.markers {
		if math.IsNaN(m.y) || m.x < p.xmin || m.x > p.xmax || m.y < p.ymin || m.y > p.ymax {
			continue
		}
		dx, dy := toDot(m.x, m.y)
		c := (dy/4)*cw + dx/2
		cells[c], busy[c] = m.style.Render(m.glyph), true
	}
	// A vertical line's label goes at its top, beside it, where the cells are free; else
	// under the axis.
	var below []struct {
		col   int
		label string
	}
	for _, xl := range xlabels {
		rs := []rune(xl.label)
		placed := false
		for _, start := range []int{xl.col + 1, xl.col - len(rs)} {
			if start < 0 || start+len(rs) > cw {
				continue
			}
			free := true
			for i := range rs {
				free = free && !busy[start+i]
			}
			if free {
				for i, r := range rs {
					cells[start+i] = xl.style.Render(string(r))
				}
				placed = true
				break
			}
		}
		if !placed {
			below = append(below, struct {
				col   int
				label string
			}{xl.col, xl.label})
		}
	}
	out := make([]string, 0, p.height)
	for r := 0; r < ch; r++ {
		lab := ""
		for i, v := range yt { // a label on the row its value falls in
			_, dy := toDot(0, v)
			if dy/4 == r {
				lab = labels[i]
			}
		}
		var b strings.Builder
		b.WriteString(p.axis.Render(padLeft(lab, lw) + "┤"))
		for c := 0; c < cw; c++ {
			b.WriteString(cells[r*cw+c])
		}
		out = append(out, b.String())
	}
	// x axis: a rule with ticks, then the labels under them (and the Pb label).
	xt := ticks(p.xmin, p.xmax, max(2, cw/8))
	rule := []rune(strings.Repeat("─", cw))
	under := []rune(strings.Repeat(" ", cw))
	place := func(col int, s string) {
		rs := []rune(s)
		start := max(0, min(col-len(rs)/2, cw-len(rs)))
		for i := start - 1; i <= start+len(rs); i++ { // keep a blank either side
			if i >= 0 && i < cw && under[i] != ' ' {
				return
			}
		}
		copy(under[start:], rs)
	}
	for _, v := range xt {
		dx, _ := toDot(v, p.ymin)
		col := dx / 2
		if col >= 0 && col < cw {
			rule[col] = '┬'
			place(col, fmtTick(v, xt))
		}
	}
	for _, u := range below {
		place(u.col, u.label)
	}
	out = append(out, p.axis.Render(strings.Repeat(" ", lw)+"└"+string(rule)))
	out = append(out, p.axis.Render(strings.Repeat(" ", lw+1)+string(under)))
	return out
}

// line calls set for every dot of a line from (x0, y0) to (x1, y1), Bresenham's algorithm.
func line(x0, y0, x1, y1 int, set func(x, y int)) {
	dx, dy := abs(x1-x0), -abs(y1-y0)
	sx, sy := 1, 1
	if x0 > x1 {
		sx = -1
	}
	if y0 > y1 {
		sy = -1
	}
	e := dx + dy
	for n := 0; n < 10000; n++ { // bounded: the clamped ends keep lines short
		if n > 0 {
			set(x0, y0)
		}
		if x0 == x1 && y0 == y1 {
			return
		}
		e2 := 2 * e
		if e2 >= dy {
			e += dy
			x0 += sx
		}
		if e2 <= dx {
			e += dx
			y0 += sy
		}
	}
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

// ticks returns round values spanning [lo, hi], as close to n of them as a step of 1, 2, 2.5
// or 5 times a power of ten allows (at least two where the range holds two).
func ticks(lo, hi float64, n int) []float64 {
	if !(hi > lo) || math.IsInf(hi-lo, 0) {
		return nil
	}
	e := math.Pow(10, math.Floor(math.Log10((hi-lo)/float64(max(n, 1)))))
	best, bestScore := 0.0, math.Inf(1)
	for _, k := range []float64{0.1, 1, 10} {
		for _, f := range []float64{1, 2, 2.5, 5} {
			step := f * e * k
			count := math.Floor(hi/step+1e-9) - math.Ceil(lo/step-1e-9) + 1
			score := math.Abs(count - float64(n))
			if count < 2 {
				score += 100
			}
			if score < bestScore || (score == bestScore && step > best) {
				best, bestScore = step, score
			}
		}
	}
	var out []float64
	for i := math.Ceil(lo/best - 1e-9); i*best <= hi+best*1e-9; i++ {
		v := i * best
		if math.Abs(v) < best*1e-9 {
			v = 0
		}
		out = append(out, v)
	}
	return out
}

// fmtTick formats a tick value with as few decimals as its neighbours need.
func fmtTick(v float64, all []float64) string {
	if len(all) < 2 {
		return strconv.FormatFloat(v, 'g', 4, 64)
	}
	step := math.Abs(all[1] - all[0])
	mag := math.Max(math.Abs(all[0]), math.Abs(all[len(all)-1]))
	if mag >= 1e5 || (mag > 0 && mag < 1e-3) {
		return strconv.FormatFloat(v, 'g', 3, 64)
	}
	dec := 0
	for s := step; dec < 6 && math.Abs(s-math.Round(s)) > 1e-9*math.Max(1, step); s *= 10 {
		dec++
	}
	return strconv.FormatFloat(v, 'f', dec, 64)
}

// padLeft right-aligns s in w cells.
func padLeft(s string, w int) string {
	if n := lipgloss.Width(s); n < w {
		return strings.Repeat(" ", w-n) + s
	}
	return s
}
