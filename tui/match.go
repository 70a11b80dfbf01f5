package tui

import (
	"fmt"
	"math"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"

	"labmatch/fit"
)

// matchScreen is the heart of the workbench: for the focused property, the residual table on
// the left, the plot of the lab points with the published and tuned curves on the right, and
// below them the parameters, the ladder of depths and the remarks.
type matchScreen struct {
	keys   matchKeys
	cursor map[fit.PropertyID]int // point under the cursor, per property
}

func newMatchScreen() matchScreen {
	return matchScreen{keys: newMatchKeys(), cursor: map[fit.PropertyID]int{}}
}

// depthCycle is the order the depth keys step through: "" is the rung chosen by
// leave-one-out.
var depthCycle = append([]fit.Depth{""}, fit.Depths...)

func (m matchScreen) update(msg tea.KeyMsg, c *common) (matchScreen, tea.Cmd, string) {
	s := c.s
	p := c.property()
	if p == "" || s.ds == nil {
		return m, nil, ""
	}
	n := len(s.ds.Points[p])
	switch {
	case key.Matches(msg, m.keys.Prev):
		c.stepProperty(-1)
	case key.Matches(msg, m.keys.Next):
		c.stepProperty(1)
	case key.Matches(msg, m.keys.Up):
		m.cursor[p] = max(0, m.cursor[p]-1)
	case key.Matches(msg, m.keys.Down):
		m.cursor[p] = min(n-1, m.cursor[p]+1)
	case key.Matches(msg, m.keys.Exclude):
		if !s.started {
			return m, nil, "wait for the first fit"
		}
		if err := s.toggleExcluded(p, m.cursor[p]); err != nil {
			return m, nil, err.Error()
		}
		return m, s.refit(p), ""
	case key.Matches(msg, m.keys.RestoreAll):
		if !s.started {
			return m, nil, "wait for the first fit"
		}
		if len(s.excluded[p]) == 0 {
			return m, nil, "every point of " + string(p) + " is in the fit already"
		}
		s.excluded[p] = nil
		return m, s.refit(p), ""
	case key.Matches(msg, m.keys.DeeperRung), key.Matches(msg, m.keys.ShallowerRung):
		if !s.started {
			return m, nil, "wait for the first fit"
		}
		step := 1
		if key.Matches(msg, m.keys.ShallowerRung) {
			step = len(depthCycle) - 1
		}
		i := 0
		for k, d := range depthCycle {
			if d == s.depth[p] {
				i = k
			}
		}
		s.depth[p] = depthCycle[(i+step)%len(depthCycle)]
		delete(s.fromFile, p)
		return m, s.refit(p), ""
	case key.Matches(msg, m.keys.Objective):
		if !s.started {
			return m, nil, "wait for the first fit"
		}
		if s.loss == fit.Absolute {
			s.loss = fit.Relative
		} else {
			s.loss = fit.Absolute
		}
		return m, s.refitAll(), ""
	}
	return m, nil, ""
}

// matchTableWidth is the width of the residual table.
func matchTableWidth(w int) int {
	if w >= 110 {
		return 54
	}
	return 42
}

func (m matchScreen) view(c *common, w, h int) string {
	s, st := c.s, c.styles
	if s.dsErr != nil {
		return noTuningView(c, w)
	}
	p := c.property()
	if p == "" {
		return st.Dim.Render("no property of this report has lab data to tune")
	}
	r, ok := s.results[p]
	title := st.Title.Render(propertyTitle(p))
	if w < 100 {
		title = st.Title.Render(string(p))
	}
	if !ok {
		lines := []string{title, ""}
		if err := s.fitErr[p]; err != nil {
			lines = append(lines, wrap(st.Err.Render("not tuned: ")+err.Error(), w, "  ")...)
		} else {
			lines = append(lines, st.Dim.Render("fitting…"))
		}
		return strings.Join(lines, "\n")
	}
	loss := string(s.loss)
	busy := ""
	if s.busy[p] {
		busy = "  " + st.Busy.Render("refitting…")
	}
	// Narrow windows drop the words that the layout makes clear, never the values.
	head := fmt.Sprintf("%s   %s %s · depth %s · %s errors", title, st.Dim.Render("family"), st.Bold.Render(r.Family), depthText(s, p, r), loss) + busy
	if lipgloss.Width(head) > w {
		head = fmt.Sprintf("%s  %s · depth %s · %s", title, st.Bold.Render(r.Family), depthText(s, p, r), loss) + busy
	}
	if lipgloss.Width(head) > w {
		head = fmt.Sprintf("%s  %s · %s · %s", title, st.Bold.Render(r.Family), depthText(s, p, r), loss) + busy
	}
	if lipgloss.Width(head) > w { // the objective goes last: it is the same for every property
		head = fmt.Sprintf("%s  %s · %s", title, st.Bold.Render(r.Family), depthText(s, p, r)) + busy
	}
	bottom := m.bottomLines(c, p, r, w, h)
	topH := max(5, h-1-len(bottom))
	if 1+topH+len(bottom) > h { // too little room: keep the table and plot, cut the rest
		bottom = bottom[:max(0, h-1-topH)]
	}
	tw := matchTableWidth(w)
	table := m.tableLines(c, p, r, tw, topH)
	pl := m.plotLines(c, p, r, w-tw-1, topH)
	out := []string{cell(head, w)}
	out = append(out, sideBySide(table, tw, pl, 1)...)
	for len(out) < 1+topH {
		out = append(out, "")
	}
	out = append(out, bottom...)
	return strings.Join(out, "\n")
}

// tableLines is the residual table: pressure, lab, published, tuned and the tuned error, one
// row per point; the cursor row is marked, left-out points are marked and dimmed.
func (m matchScreen) tableLines(c *common, p fit.PropertyID, r fit.Result, w, h int) []string {
	st := c.styles
	wide := w >= 54
	u := unitOf(p, r)
	hdr := fmt.Sprintf("  %s %s %s %s %s", cellRight("p psia", 6), cellRight("lab", 8), cellRight("publ.", 8), cellRight("tuned", 8), cellRight("err %", 6))
	if wide {
		hdr = fmt.Sprintf("  %s %s %s %s %s %s", cellRight("p psia", 6), cellRight("lab", 9), cellRight("published", 9), cellRight("tuned", 9), cellRight("publ %", 7), cellRight("err %", 6))
	}
	lines := []string{st.Header.Render(cell(hdr, w)), st.Dim.Render(cell(valuesIn(u), w))}
	rows := len(r.Residuals)
	room := h - 3 // header, unit line, legend
	cur := min(m.cursor[p], rows-1)
	top := 0
	if cur >= room {
		top = cur - room + 1
	}
	for i := top; i < rows && i < top+room; i++ {
		res := r.Residuals[i]
		sc := scaleOf(p)
		dec := decimalsOf(res.Quantity)
		lab, pub, tun := res.Lab*sc, res.Published*sc, res.Tuned*sc
		if res.Quantity == "Pb" {
			sc = 1
			lab, pub, tun = res.Lab, res.Published, res.Tuned
		}
		errPct := relErr(res.Tuned, res.Lab)
		pubPct := relErr(res.Published, res.Lab)
		out := c.s.isExcluded(p, i)
		mark := "●"
		if out {
			mark = "○"
		}
		if i == cur {
			mark = "▸" + mark
		} else {
			mark = " " + mark
		}
		label := num(res.Pressure, 0)
		if res.Quantity == "Pb" {
			label = "Pb"
		}
		var row string
		if wide {
			row = fmt.Sprintf("%s%s %s %s %s %s %s", mark, cellRight(label, 6), cellRight(num(lab, dec), 9), cellRight(num(pub, dec), 9), cellRight(num(tun, dec), 9), cellRight(signed(pubPct), 7), cellRight(signed(errPct), 6))
		} else {
			row = fmt.Sprintf("%s%s %s %s %s %s", mark, cellRight(label, 6), cellRight(num(lab, dec), 8), cellRight(num(pub, dec), 8), cellRight(num(tun, dec), 8), cellRight(signed(errPct), 6))
		}
		row = cell(row, w)
		switch {
		case i == cur:
			row = st.Cursor.Render(row)
		case out:
			row = st.Excluded.Render(row)
		}
		lines = append(lines, row)
	}
	legend := "● in fit  ○ left out"
	if rows > room {
		legend += fmt.Sprintf("  (%d–%d of %d)", top+1, min(rows, top+room), rows)
	}
	for len(lines) < h-1 {
		lines = append(lines, "")
	}
	lines = append(lines, st.Dim.Render(cell(legend, w)))
	return lines
}

// plotLines draws the lab points, the published (dotted) and tuned (solid) curves and the
// compared families (dashed), with Pb marked.
func (m matchScreen) plotLines(c *common, p fit.PropertyID, r fit.Result, w, h int) []string {
	s, st := c.s, c.styles
	if w < 16 || h < 6 {
		return nil
	}
	cs := s.curves[p]
	sc := scaleOf(p)
	scaled := func(v []float64) []float64 {
		out := make([]float64, len(v))
		for i, x := range v {
			out[i] = x * sc
		}
		return out
	}
	xlo, xhi := plotRange(s.ds, p)
	pl := plot{width: w, xmin: xlo, xmax: xhi, axis: st.Axis}
	ys := []float64{}
	add := func(vs []float64) {
		for _, v := range vs {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				ys = append(ys, v)
			}
		}
	}
	cur := min(m.cursor[p], len(r.Residuals)-1)
	for i, res := range r.Residuals {
		x, y := res.Pressure, res.Lab*sc
		if res.Quantity == "Pb" {
			y = s.ds.Rsb
		}
		ys = append(ys, y)
		g, gs := "●", st.Lab
		if s.isExcluded(p, i) {
			g, gs = "○", st.Excluded
		}
		if i == cur {
			g = map[string]string{"●": "◆", "○": "◇"}[g]
			gs = gs.Reverse(true)
		}
		pl.markers = append(pl.markers, plotMarker{x: x, y: y, glyph: g, style: gs})
	}
	// The lab points set the y range; the curves widen it only within reason, so that a
	// published curve far off does not flatten the points.
	lo, hi := minMax(ys)
	span := math.Max(hi-lo, 0.05*math.Abs(hi))
	if span == 0 {
		span = 1
	}
	var curves [][]float64
	if cs.published != nil {
		curves = append(curves, scaled(cs.published))
	}
	if cs.tuned != nil {
		curves = append(curves, scaled(cs.tuned))
	}
	for _, v := range curves {
		var in []float64
		for _, y := range v {
			if y >= lo-span && y <= hi+span {
				in = append(in, y)
			}
		}
		add(in)
	}
	ylo, yhi := minMax(ys)
	pad := 0.06 * math.Max(yhi-ylo, 0.02*math.Abs(yhi))
	if pad == 0 {
		pad = 0.5
	}
	pl.ymin, pl.ymax = ylo-pad, yhi+pad
	if pl.ymin < 0 && ylo >= 0 {
		pl.ymin = 0
	}
	var legend []string
	for i, f := range s.compare[p] {
		cf, ok := s.compared[p][f]
		if !ok || cf.err != nil || cf.curve == nil {
			continue
		}
		style := st.overlayStyle(i)
		pl.series = append(pl.series, plotSeries{xs: cs.ps, ys: scaled(cf.curve), pattern: patDashed, style: style})
		legend = append(legend, style.Render("╌╌ "+f+" "+num(cf.res.Tuned.AARE, 2)+"\u00a0%"))
	}
	if cs.published != nil {
		pl.series = append(pl.series, plotSeries{xs: cs.ps, ys: scaled(cs.published), pattern: patDotted, style: st.Published})
	}
	if cs.tuned != nil {
		pl.series = append(pl.series, plotSeries{xs: cs.ps, ys: scaled(cs.tuned), pattern: patSolid, style: st.Tuned})
	}
	if p != fit.MuDead {
		pl.vlines = append(pl.vlines, plotVLine{x: s.ds.Pb, label: "Pb", style: st.Pb})
	}
	legend = append([]string{st.Tuned.Render("── tuned"), st.Published.Render("·· published"), st.Lab.Render("● lab")}, legend...)
	var legendLines []string
	line := ""
	for _, item := range legend {
		if line != "" && lipgloss.Width(line)+2+lipgloss.Width(item) > w {
			legendLines = append(legendLines, line)
			line = ""
		}
		if line != "" {
			line += "  "
		}
		line += item
	}
	legendLines = append(legendLines, line)
	pl.height = h - 1 - len(legendLines)
	out := []string{st.Dim.Render(cell(yAxisTitle(p, r)+"  vs  p [psia]", w))}
	out = append(out, pl.render()...)
	for _, l := range legendLines {
		out = append(out, cell(l, w))
	}
	return out
}

// bottomLines are the parameters with their intervals, the statistics, the ladder and the
// remarks.
func (m matchScreen) bottomLines(c *common, p fit.PropertyID, r fit.Result, w, h int) []string {
	s, st := c.s, c.styles
	var out []string
	out = append(out, wrap(st.Bold.Render("parameters ")+strings.Join(paramTexts(p, r, w < 100), " · "), w, "           ")...)
	rmse, rmseUnit := r.Tuned.RMSE, r.Tuned.RMSEUnit
	if p == fit.Co {
		rmse, rmseUnit = rmse*1e6, "1e-6/psi"
	}
	stats := fmt.Sprintf("AARE published %s\u00a0%% → tuned %s\u00a0%% · bias %s\u00a0%% · max |RE| %s\u00a0%% · RMSE %s\u00a0%s · leave-one-out AARE %s",
		num(r.Published.AARE, 2), num(r.Tuned.AARE, 2), signed(r.Tuned.Bias), num(r.Tuned.MaxARE, 2),
		sig(rmse, 3), rmseUnit, pctWithUnit(r.LOO))
	out = append(out, wrap(st.Bold.Render("errors ")+stats, w, "       ")...)
	out = append(out, m.ladderLines(c, p, r, w, h)...)
	var remarks []string
	if r.NoFit != "" {
		remarks = append(remarks, st.Warn.Render("no family fits: ")+r.NoFit)
	}
	for _, f := range r.Flags {
		remarks = append(remarks, st.Warn.Render("! ")+f)
	}
	for _, o := range r.OutOfRange {
		remarks = append(remarks, st.Warn.Render("outside its data: ")+o)
	}
	if err := s.fitErr[p]; err != nil {
		remarks = append(remarks, st.Err.Render("last refit failed: ")+err.Error())
	}
	for _, rm := range remarks {
		out = append(out, wrap(rm, w, "   ")...)
	}
	return out
}

// ladderLines show every rung of the ladder with its training and leave-one-out errors; the
// rung in use is marked. Short windows get one line.
func (m matchScreen) ladderLines(c *common, p fit.PropertyID, r fit.Result, w, h int) []string {
	st := c.styles
	rungs := map[fit.Depth]fit.Rung{}
	for _, g := range r.Ladder {
		rungs[g.Depth] = g
	}
	current := r.Depth
	if current == "" {
		current = c.s.depth[p]
	}
	if h < 22 {
		var parts []string
		for _, d := range fit.Depths {
			g, ok := rungs[d]
			t := string(d) + "\u00a0" // one rung is not broken across lines
			switch {
			case !ok:
				t += "n/a"
			case g.Skipped != "":
				t += "skipped"
			default:
				t += num(g.Tuned.AARE, 2) + "/" + pctp(g.LOO)
			}
			if d == current {
				t = st.Bold.Render("▸" + t)
			}
			parts = append(parts, t)
		}
		return wrap(st.Bold.Render("ladder ")+st.Dim.Render("AARE train/LOO %: ")+strings.Join(parts, st.Dim.Render(" · ")), w, "       ")
	}
	out := []string{st.Header.Render(cell(fmt.Sprintf("  %-11s %4s  %11s  %10s  %s", "depth", "free", "AARE train %", "AARE LOO %", "note"), w))}
	for _, d := range fit.Depths {
		g, ok := rungs[d]
		free, train, loo, note := "n/a", "n/a", "n/a", ""
		if ok {
			free, train, loo, note = fmt.Sprint(g.Free), num(g.Tuned.AARE, 2), pctp(g.LOO), g.LOONote
			if g.Skipped != "" {
				train, loo, note = "—", "—", "skipped: "+g.Skipped
			}
			if g.Chosen {
				note = strings.TrimSpace("chosen " + note)
			}
		}
		mark := "  "
		if d == current {
			mark = "▸ "
		}
		line := cell(fmt.Sprintf("%s%-11s %4s  %11s  %10s  %s", mark, d, free, train, loo, note), w)
		if d == current {
			line = st.Bold.Render(line)
		}
		out = append(out, line)
	}
	if c.s.depth[p] == "" && len(r.Ladder) > 0 {
		out = append(out, st.Dim.Render(cell("  by LOO: the rung with the smallest leave-one-out error; a deeper one only when it is clearly lower", w)))
	}
	return out
}

// ---- helpers shared with the other screens

// propertyTitle names a property for a screen title.
func propertyTitle(p fit.PropertyID) string {
	switch p {
	case fit.Pb:
		return "pb · bubble point and solution GOR"
	case fit.Bo:
		return "bo · saturated oil FVF"
	case fit.Co:
		return "co · undersaturated compressibility"
	case fit.MuDead:
		return "mu_dead · dead-oil viscosity"
	case fit.MuSat:
		return "mu_sat · saturated oil viscosity"
	case fit.MuUnder:
		return "mu_under · undersaturated viscosity"
	case fit.Z:
		return "z · gas Z-factor"
	}
	return string(p)
}

// yAxisTitle names the plotted quantity with its unit.
func yAxisTitle(p fit.PropertyID, r fit.Result) string {
	switch p {
	case fit.Pb:
		return "Rs [scf/STB]"
	case fit.Bo:
		return "Bo [rb/STB]"
	case fit.Co:
		return "co, average from Psat [1e-6/psi]"
	case fit.MuDead, fit.MuSat, fit.MuUnder:
		return "oil viscosity [cP]"
	case fit.Z:
		return "Z of the DL gas"
	}
	return unitOf(p, r)
}

// unitOf is the unit of a property's values as the table shows them.
func unitOf(p fit.PropertyID, r fit.Result) string {
	if p == fit.Co {
		return "1e-6/psi"
	}
	if p == fit.Pb {
		return "scf/STB (the Pb row in psia)"
	}
	for _, res := range r.Residuals {
		if res.Unit != "" {
			return res.Unit
		}
	}
	return "dimensionless"
}

// valuesIn is the table's unit line.
func valuesIn(u string) string {
	if u == "dimensionless" {
		return "  values dimensionless"
	}
	return "  values in " + u
}

// scaleOf is the display scale of a property's values: compressibility in 1e-6/psi.
func scaleOf(p fit.PropertyID) float64 {
	if p == fit.Co {
		return 1e6
	}
	return 1
}

// decimalsOf is how many decimals a quantity is shown with.
func decimalsOf(q string) int {
	switch q {
	case "Pb", "Rs":
		return 0
	case "Bo", "Z", "z":
		return 4
	case "co", "co avg":
		return 2
	}
	return 3
}

func relErr(v, lab float64) float64 {
	if lab == 0 {
		return math.NaN()
	}
	return 100 * (v - lab) / lab
}

func signed(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	if math.Abs(v) < 0.005 {
		v = 0 // no "-0.00"
	}
	return fmt.Sprintf("%+.2f", v)
}

// paramTexts describes the tuned parameters with their 95 % intervals.
// compact leaves the refitted coefficients' intervals out (narrow windows).
func paramTexts(p fit.PropertyID, r fit.Result, compact bool) []string {
	if r.Depth == fit.DepthPublished {
		return []string{"none: the published correlation"}
	}
	var out []string
	if p == fit.Pb && r.Anchored {
		out = append(out, "pressure scale "+num(r.Params.Multiplier, 4)+" fixed by the report's Pb (Pb exact)")
	} else {
		out = append(out, "multiplier "+num(r.Params.Multiplier, 4)+" "+interval(r, "multiplier", 4))
	}
	if r.Shifted {
		sc, unit := 1.0, r.ShiftUnit
		if p == fit.Co {
			sc, unit = 1e6, "1e-6/psi"
		}
		out = append(out, "shift "+sig(r.Params.Shift*sc, 4)+" "+unit+" "+intervalScaled(r, "shift", sc))
	}
	if r.Params.Bend != 0 {
		out = append(out, "bend "+num(r.Params.Bend, 4)+" "+interval(r, "bend", 4)+" (exponent on Rs/Rsb below Pb)")
	}
	if r.Params.Coefficients != nil {
		pub := fit.DeclaredCoefficients(p, r.Family)
		for j, v := range r.Params.Coefficients {
			if j >= len(pub) || j >= len(r.CoefficientIDs) || v == pub[j].Value {
				continue
			}
			id := r.CoefficientIDs[j]
			if compact {
				out = append(out, id+" "+sig(v, 4)+" (publ. "+sig(pub[j].Value, 4)+")")
			} else {
				out = append(out, id+" "+sig(v, 5)+" (published "+sig(pub[j].Value, 5)+") "+intervalScaled(r, id, 1))
			}
		}
	}
	return out
}

func interval(r fit.Result, name string, dec int) string {
	ci, ok := r.CI95[name]
	if !ok {
		return "(95\u00a0% interval n/a)"
	}
	s := "(95\u00a0%: " + num(ci[0], dec) + "–" + num(ci[1], dec) + ")"
	if r.CIAssumed {
		s += " assumed lab uncertainty"
	}
	return s
}

func intervalScaled(r fit.Result, name string, sc float64) string {
	ci, ok := r.CI95[name]
	if !ok {
		return ""
	}
	return "(95\u00a0%: " + sig(ci[0]*sc, 3) + "\u00a0to\u00a0" + sig(ci[1]*sc, 3) + ")"
}

func minMax(vs []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range vs {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if math.IsInf(lo, 0) {
		return 0, 1
	}
	return lo, hi
}

// noTuningView says why a report cannot be tuned (it can still be read on the Report screen).
func noTuningView(c *common, w int) string {
	st := c.styles
	lines := []string{st.Err.Render("This report cannot be tuned"), ""}
	lines = append(lines, wrap(c.s.dsErr.Error(), w, "  ")...)
	lines = append(lines, "", st.Dim.Render("The lab tables and the QC findings are on the Report screen (1)."))
	return strings.Join(lines, "\n")
}
