package export

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"regexp"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"

	"labmatch/fit"
	"labmatch/lab"
)

// The report's colours (a scheme of our own): deep teal for the tuned curve, copper for the
// published one, slate for lab points, brick red for excluded points, muted violet for Pb.
var (
	colInk       = color.RGBA{0x22, 0x2e, 0x36, 0xff}
	colTuned     = color.RGBA{0x0b, 0x6e, 0x69, 0xff}
	colPublished = color.RGBA{0xc0, 0x6c, 0x2a, 0xff}
	colExcluded  = color.RGBA{0xa4, 0x24, 0x3b, 0xff}
	colPb        = color.RGBA{0x75, 0x5f, 0x9a, 0xff}
	colGrid      = color.RGBA{0xe3, 0xdf, 0xd5, 0xff}
)

const (
	plotWidth  = 16 * vg.Centimeter
	plotHeight = 9 * vg.Centimeter
	plotPoints = 160 // pressures per curve
)

// plotAxis describes the y axis of a property plot in the converter's units: its label and
// the factor that turns field values into the values shown (co in 1e−6/psi or 1e−5/bar).
// Every y quantity converts by a scale alone (no offset).
func plotAxis(p fit.PropertyID, c *converter) (label string, scale float64) {
	per := func(q lab.Quantity) float64 { return c.to(q, 1) - c.to(q, 0) }
	switch p {
	case fit.Pb:
		return "Rs [" + displayUnit(c, lab.GOR) + "]", per(lab.GOR)
	case fit.Bo:
		return "Bo [" + displayUnit(c, lab.FVF) + "]", per(lab.FVF)
	case fit.Co:
		// Per bar a compressibility is 14.5 times its value per psi: one decade less.
		show := 1e6
		if c.unit(lab.Compressibility) != lab.Compressibility.FieldUnit() {
			show = 1e5
		}
		unit := strings.TrimPrefix(displayUnit(c, lab.Compressibility), "1/")
		return fmt.Sprintf("average co from Psat [1e-%.0f/%s]", math.Log10(show), unit), show * per(lab.Compressibility)
	case fit.MuDead, fit.MuSat, fit.MuUnder:
		return "oil viscosity [" + displayUnit(c, lab.Viscosity) + "]", per(lab.Viscosity)
	case fit.Z:
		return "Z", 1
	}
	return string(p), 1
}

// propertyPlot draws one property: lab points (excluded ones marked), the published and the
// tuned curve of its family, and Pb. It returns an SVG fragment for inlining in HTML.
// Values are computed in field units and drawn in the converter's.
func propertyPlot(ds *fit.Dataset, res fit.Result, opts fit.Options, c *converter) (string, error) {
	prop := res.Property
	label, scale := plotAxis(prop, c)
	px := func(p float64) float64 { return c.to(lab.Pressure, p) }
	// Pressure range: from atmospheric (or Psat, Pb where the curve starts) to a little past
	// the highest lab point.
	lo, hi := 0.0, ds.Pb
	minLab := math.Inf(1)
	for _, r := range res.Residuals {
		hi = math.Max(hi, r.Pressure)
		minLab = math.Min(minLab, r.Pressure)
	}
	hi *= 1.05
	xmin, xmax := 0.0, hi
	switch prop {
	case fit.Co:
		lo, xmin = ds.CCEPsat, ds.CCEPsat
	case fit.MuUnder:
		lo, xmin = ds.Pb, 0.9*ds.Pb
	case fit.Bo, fit.MuSat:
		// Saturated curves: from the lowest lab pressure (below it the lab Rs that the curve
		// needs is not known) to Pb (above it the oil is undersaturated).
		lo, hi, xmax = minLab, ds.Pb, 1.05*ds.Pb
	case fit.MuDead:
		hi = math.Max(hi, 1.2*ds.Pb)
		xmax = hi
	}
	ps := make([]float64, plotPoints)
	for i := range ps {
		ps[i] = lo + (hi-lo)*float64(i)/float64(plotPoints-1)
	}
	if ps[0] <= 0 {
		ps[0] = 1
	}
	pub, err := fit.Curve(ds, prop, res.Family, fit.Published, opts, ps)
	if err != nil {
		return "", err
	}
	tun, err := fit.Curve(ds, prop, res.Family, res.Params, opts, ps)
	if err != nil {
		return "", err
	}
	// From here on pressures are the axis's: xs for the curves, pb, xmin and xmax.
	xs := make([]float64, len(ps))
	for i, p := range ps {
		xs[i] = px(p)
	}
	xmin, xmax = px(xmin), px(xmax)
	pb := px(ds.Pb)

	p := plot.New()
	sans := func(size vg.Length) font.Font {
		return font.Font{Typeface: "Liberation", Variant: "Sans", Size: size}
	}
	p.X.Label.Text = "pressure [" + displayUnit(c, lab.Pressure) + "]"
	p.Y.Label.Text = label
	p.X.Label.TextStyle.Font, p.Y.Label.TextStyle.Font = sans(10), sans(10)
	p.X.Tick.Label.Font, p.Y.Tick.Label.Font = sans(9), sans(9)
	p.X.Label.TextStyle.Color, p.Y.Label.TextStyle.Color = colInk, colInk
	p.Legend.TextStyle.Font = sans(9)
	p.Legend.TextStyle.Color = colInk
	p.Legend.Padding = vg.Points(2)
	p.X.Tick.Marker, p.Y.Tick.Marker = tickFormat{}, tickFormat{}
	p.X.Min, p.X.Max = xmin, xmax
	p.BackgroundColor = color.White
	grid := plotter.NewGrid()
	grid.Vertical.Color, grid.Horizontal.Color = colGrid, colGrid
	p.Add(grid)

	ymin, ymax := math.Inf(1), math.Inf(-1)
	track := func(v float64) {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			ymin, ymax = math.Min(ymin, v), math.Max(ymax, v)
		}
	}
	for i := range ps {
		track(pub[i] * scale)
		track(tun[i] * scale)
	}
	var used, excluded plotter.XYs
	for _, r := range res.Residuals {
		x, y := px(r.Pressure), r.Lab*scale
		if r.Quantity == "Pb" { // the bubble point is a point of the Rs curve at Rsb
			y = ds.Rsb * scale
		}
		track(y)
		if r.Excluded {
			excluded = append(excluded, plotter.XY{X: x, Y: y})
		} else {
			used = append(used, plotter.XY{X: x, Y: y})
		}
	}
	if math.IsInf(ymin, 0) {
		return "", fmt.Errorf("export: plot %s: nothing to draw", prop)
	}
	pad := 0.08 * (ymax - ymin)
	if pad == 0 {
		pad = 0.05 * math.Max(math.Abs(ymax), 1e-9)
	}
	p.Y.Min, p.Y.Max = ymin-pad, ymax+3*pad // room for the legend
	if prop == fit.Pb {
		p.Y.Min = math.Max(p.Y.Min, 0)
	}
	place := func() (top, left bool, n int) {
		occupied := append(append(plotter.XYs{}, used...), excluded...)
		if pb > xmin && pb < xmax { // the Pb line and its label
			for k := 0; k <= 10; k++ {
				occupied = append(occupied, plotter.XY{X: pb, Y: p.Y.Min + float64(k)/10*(p.Y.Max-p.Y.Min)})
			}
		}
		return legendCorner(xs, [][]float64{pub, tun}, occupied, scale, xmin, xmax, p.Y.Min, p.Y.Max)
	}
	top, left, n := place()
	if n > 0 {
		// Every corner holds a curve, a lab point or the Pb line: raise the top of the axis
		// by half its range, which leaves the top third to the legend (the data end below
		// 2/3 of the new range), and place it again, away from the Pb line.
		p.Y.Max += 0.5 * (p.Y.Max - p.Y.Min)
		top, left, _ = place()
	}
	p.Legend.Top, p.Legend.Left = top, left

	// Pb: a dotted vertical line with its label.
	if pb > xmin && pb < xmax {
		pbLine, err := plotter.NewLine(plotter.XYs{{X: pb, Y: p.Y.Min}, {X: pb, Y: p.Y.Max}})
		if err != nil {
			return "", err
		}
		pbLine.Color, pbLine.Width, pbLine.Dashes = colPb, vg.Points(1), []vg.Length{vg.Points(1.5), vg.Points(2.5)}
		p.Add(pbLine)
		lab, err := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{{X: pb, Y: p.Y.Max}}, Labels: []string{" Pb"}})
		if err != nil {
			return "", err
		}
		for i := range lab.TextStyle {
			lab.TextStyle[i].Font = sans(9)
			lab.TextStyle[i].Color = colPb
			lab.TextStyle[i].YAlign = draw.YTop
		}
		p.Add(lab)
	}
	addCurve := func(vals []float64, c color.Color, dashes []vg.Length, width vg.Length, name string) error {
		first := true
		for _, seg := range segments(xs, vals, scale) {
			l, err := plotter.NewLine(seg)
			if err != nil {
				return err
			}
			l.Color, l.Width, l.Dashes = c, width, dashes
			p.Add(l)
			if first {
				p.Legend.Add(name, l)
				first = false
			}
		}
		return nil
	}
	depth := string(res.Depth)
	if depth == "" {
		depth = "n/a"
	}
	if err := addCurve(pub, colPublished, []vg.Length{vg.Points(5), vg.Points(3)}, vg.Points(1.4), "published "+res.Family); err != nil {
		return "", err
	}
	if err := addCurve(tun, colTuned, nil, vg.Points(2), "tuned, depth "+depth); err != nil {
		return "", err
	}
	if len(used) > 0 {
		s, err := plotter.NewScatter(used)
		if err != nil {
			return "", err
		}
		s.GlyphStyle = draw.GlyphStyle{Color: colInk, Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
		p.Add(s)
		p.Legend.Add("lab", s)
	}
	if len(excluded) > 0 {
		s, err := plotter.NewScatter(excluded)
		if err != nil {
			return "", err
		}
		s.GlyphStyle = draw.GlyphStyle{Color: colExcluded, Radius: vg.Points(4), Shape: draw.CrossGlyph{}}
		p.Add(s)
		p.Legend.Add("lab, excluded", s)
	}
	return renderSVG(p)
}

// segments splits a curve at its gaps (NaN) into drawable pieces.
func segments(ps, vals []float64, scale float64) []plotter.XYs {
	var out []plotter.XYs
	var cur plotter.XYs
	for i, v := range vals {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			if len(cur) > 1 {
				out = append(out, cur)
			}
			cur = nil
			continue
		}
		cur = append(cur, plotter.XY{X: ps[i], Y: v * scale})
	}
	if len(cur) > 1 {
		out = append(out, cur)
	}
	return out
}

var (
	svgProlog = regexp.MustCompile(`(?s)^.*?<svg`)
	svgSize   = regexp.MustCompile(`<svg width="[^"]*" height="[^"]*"`)
	svgNS     = regexp.MustCompile(`\s+xmlns(:xlink)?="[^"]*"`)
)

// renderSVG draws the plot as an SVG fragment for inlining: no XML prolog, no namespace
// attributes (HTML parsers add them), scaled by its viewBox to the width of the page.
func renderSVG(p *plot.Plot) (string, error) {
	c := vgsvg.New(plotWidth, plotHeight)
	p.Draw(draw.New(c))
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return "", fmt.Errorf("export: plot: %w", err)
	}
	s := svgProlog.ReplaceAllString(b.String(), "<svg")
	s = svgSize.ReplaceAllString(s, `<svg class="plot" role="img" preserveAspectRatio="xMidYMid meet"`)
	s = svgNS.ReplaceAllString(s, "")
	return strings.TrimSpace(s), nil
}

// legendCorner picks the corner of the plot that holds the fewest curve and lab points, so
// that the legend hides nothing (top corners first on a tie), and gives their weighted count
// there (lab points count four).
func legendCorner(ps []float64, curves [][]float64, pts plotter.XYs, scale, x0, x1, y0, y1 float64) (top, left bool, n int) {
	type corner struct{ top, left bool }
	count := func(c corner, x, y float64) int {
		fx, fy := (x-x0)/(x1-x0), (y-y0)/(y1-y0)
		inX := (c.left && fx < 0.5) || (!c.left && fx > 0.5)
		inY := (c.top && fy > 0.68) || (!c.top && fy < 0.32)
		if inX && inY {
			return 1
		}
		return 0
	}
	best, bestN := corner{true, false}, math.MaxInt
	for _, c := range []corner{{true, false}, {true, true}, {false, false}, {false, true}} {
		n := 0
		for _, vals := range curves {
			for i, v := range vals {
				if !math.IsNaN(v) {
					n += count(c, ps[i], v*scale)
				}
			}
		}
		for _, pt := range pts {
			n += 4 * count(c, pt.X, pt.Y)
		}
		if n < bestN {
			best, bestN = c, n
		}
	}
	return best.top, best.left, bestN
}

// tickFormat labels the default ticks with up to six significant digits and no trailing
// zeros ("500", "1.25", "2.87").
type tickFormat struct{}

func (tickFormat) Ticks(min, max float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(min, max)
	for i := range ts {
		if ts[i].Label == "" {
			continue
		}
		v := ts[i].Value
		if math.Abs(v) < 1e-9*(max-min) {
			v = 0
		}
		ts[i].Label = strconv.FormatFloat(v, 'g', 6, 64)
	}
	return ts
}
