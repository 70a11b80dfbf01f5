package tui

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"

	"labmatch/lab"
)

// reportScreen shows the lab report as read: the fluid description, the DL with its
// separator-basis columns, the separator tests, the CCE with its Y-function and the
// viscosities. A QC finding is marked in the gutter beside the row it concerns (E error,
// W warning, n note, with its number) and listed in full below the tables.
type reportScreen struct {
	keys reportKeys
	top  int // first line shown
}

func newReportScreen() reportScreen { return reportScreen{keys: newReportKeys()} }

func (r reportScreen) update(msg tea.KeyMsg, c *common) (reportScreen, tea.Cmd) {
	if c.s.report == nil {
		return r, nil
	}
	lines, anchors := reportContent(c, c.width)
	page := max(1, c.height-5) // the body less the line that says where we are
	last := max(0, len(lines)-page)
	switch {
	case key.Matches(msg, r.keys.Up):
		r.top--
	case key.Matches(msg, r.keys.Down):
		r.top++
	case key.Matches(msg, r.keys.PageUp):
		r.top -= page
	case key.Matches(msg, r.keys.PageDown):
		r.top += page
	case key.Matches(msg, r.keys.Top):
		r.top = 0
	case key.Matches(msg, r.keys.Bottom):
		r.top = last
	case key.Matches(msg, r.keys.NextFinding):
		for _, a := range anchors {
			if a > r.top {
				r.top = a
				break
			}
		}
	case key.Matches(msg, r.keys.PrevFinding):
		for i := len(anchors) - 1; i >= 0; i-- {
			if anchors[i] < r.top {
				r.top = anchors[i]
				break
			}
		}
	}
	r.top = max(0, min(r.top, last))
	return r, nil
}

func (r reportScreen) view(c *common, w, h int) string {
	if c.s.report == nil {
		return ""
	}
	lines, _ := reportContent(c, w)
	if len(lines) <= h {
		return strings.Join(lines, "\n")
	}
	room := max(1, h-1) // the last line says where we are
	top := max(0, min(r.top, len(lines)-room))
	out := append([]string(nil), lines[top:min(len(lines), top+room)]...)
	out = append(out, c.styles.Dim.Render(cell(fmt.Sprintf("── lines %d–%d of %d · ↓/pgdn more · n next finding", top+1, top+len(out), len(lines)), w)))
	return strings.Join(out, "\n")
}

// findingIndex numbers the findings and files them by (file, line).
type findingIndex struct {
	byRow  map[string]map[int][]int // file → line → finding numbers (1-based)
	byFile map[string][]int         // findings about a whole file (line 0)
}

func indexFindings(fs []lab.Finding) findingIndex {
	ix := findingIndex{byRow: map[string]map[int][]int{}, byFile: map[string][]int{}}
	for i, f := range fs {
		if f.Row > 0 {
			if ix.byRow[f.File] == nil {
				ix.byRow[f.File] = map[int][]int{}
			}
			ix.byRow[f.File][f.Row] = append(ix.byRow[f.File][f.Row], i+1)
		} else {
			ix.byFile[f.File] = append(ix.byFile[f.File], i+1)
		}
	}
	return ix
}

// gutter is the finding mark of one row: "W2", "E1,3", or blanks.
func gutter(c *common, ns []int, w int) string {
	if len(ns) == 0 {
		return strings.Repeat(" ", w)
	}
	st := c.styles
	worst := lab.Note
	var ids []string
	for _, n := range ns {
		f := c.s.findings[n-1]
		if f.Severity > worst {
			worst = f.Severity
		}
		ids = append(ids, strconv.Itoa(n))
	}
	txt := map[lab.Severity]string{lab.Error: "E", lab.Warning: "W", lab.Note: "n"}[worst] + strings.Join(ids, ",")
	style := map[lab.Severity]func(...string) string{lab.Error: st.Err.Render, lab.Warning: st.Warn.Render, lab.Note: st.Note.Render}[worst]
	return style(cell(txt, w))
}

// column of a report table.
type column struct {
	title string
	width int
	wide  bool // shown only in wide windows
	left  bool // left-aligned (text)
}

const gutterW = 5

// tableBlock renders a titled table with a finding gutter and the file's line numbers.
func tableBlock(c *common, w int, file, title string, cols []column, lines []int, rows [][]string) []string {
	st := c.styles
	ix := indexFindings(c.s.findings)
	wide := w >= 110
	var use []int
	for i, col := range cols {
		if !col.wide || wide {
			use = append(use, i)
		}
	}
	head := st.Title.Render(title) + st.Dim.Render("  "+file)
	if ns := ix.byFile[file]; len(ns) > 0 {
		head += "  " + gutter(c, ns, len(fmt.Sprint(ns))+1)
	}
	out := []string{cell(head, w)}
	var b strings.Builder
	b.WriteString(strings.Repeat(" ", gutterW) + cellRight("line", 4))
	for _, i := range use {
		b.WriteString(" " + align(cols[i], cols[i].title))
	}
	out = append(out, st.Header.Render(cell(b.String(), w)))
	for r, row := range rows {
		b.Reset()
		b.WriteString(gutter(c, ix.byRow[file][lines[r]], gutterW))
		b.WriteString(st.Dim.Render(cellRight(strconv.Itoa(lines[r]), 4)))
		for _, i := range use {
			b.WriteString(" " + align(cols[i], row[i]))
		}
		out = append(out, cell(b.String(), w))
	}
	return append(out, "")
}

func align(c column, s string) string {
	if c.left {
		return cell(s, c.width)
	}
	return cellRight(s, c.width)
}

// reportContent is the whole Report screen as lines, with the line index of each finding in
// the list at the end (for n / N).
func reportContent(c *common, w int) ([]string, []int) {
	s, st := c.s, c.styles
	r := s.report
	in := s.info
	var out []string

	// Fluid description and what the tuning takes from the report.
	name := r.Fluid.Sample
	if name == "" {
		name = "(no sample name)"
	}
	where := s.src
	if r.Dir != "" {
		where = r.Dir
	}
	out = append(out, cell(st.Title.Render("Fluid")+"  "+st.Bold.Render(name)+st.Dim.Render("  "+where), w))
	for _, l := range wrap("  left of a row: E error, W warning, n note and the finding's number in the list at the end (n jumps there)", w, "  ") {
		out = append(out, st.Dim.Render(l))
	}
	fl := r.Fluid
	type kv struct{ key, value string }
	items := []kv{
		{lab.KeyTemperature, num(fl.Temperature, 1) + " °F"},
		{lab.KeyPb, num(fl.Pb, 1) + " psia"},
		{lab.KeyAPI, num(fl.API, 1) + " °API"},
		{lab.KeyResidualSG, ""},
		{lab.KeySepGasGravity, optional(fl.SepGasGravity, 3)},
		{lab.KeyH2S, optional(fl.H2S, 2) + " mol %"},
		{lab.KeyCO2, optional(fl.CO2, 2) + " mol %"},
		{lab.KeyN2, optional(fl.N2, 2) + " mol %"},
		{lab.KeyStdPressure, num(fl.StdPressure, 3) + " psia"},
		{lab.KeyStdTemperature, num(fl.StdTemperature, 1) + " °F"},
		{lab.KeySelectedTest, fl.SelectedTest},
	}
	ix := indexFindings(s.findings)
	for _, it := range items {
		line, ok := fl.Line[it.key]
		if !ok {
			continue
		}
		v := it.value
		if it.key == lab.KeyResidualSG {
			v = "given (API " + num(fl.API, 1) + ")"
		}
		out = append(out, cell(gutter(c, ix.byRow["fluid.csv"][line], gutterW)+st.Dim.Render(cellRight(strconv.Itoa(line), 4))+" "+cell(it.key, 24)+" "+v, w))
	}
	if ns := ix.byFile["fluid.csv"]; len(ns) > 0 {
		out = append(out, cell(gutter(c, ns, gutterW)+"     fluid type: "+in.fluid.String(), w))
	} else {
		out = append(out, cell(strings.Repeat(" ", gutterW)+"     fluid type: "+in.fluid.String(), w))
	}
	out = append(out, wrap(strings.Repeat(" ", gutterW+5)+in.fluidWhy, w, strings.Repeat(" ", gutterW+7))...)
	if in.fluid == lab.VolatileOil || in.fluid == lab.GasCondensate {
		out = append(out, wrap(st.Warn.Render("     ! this fluid looks like a "+in.fluid.String()+": black-oil correlations are a poor choice; treat tuned results with caution"), w, "       ")...)
	}
	if in.basisErr == nil {
		b := in.basis
		out = append(out, wrap(fmt.Sprintf("     separator basis (test %s): Rsb %s scf/STB, Bob %s rb/STB; DL at Pb: Rsdb %s scf/bbl, Bodb %s",
			b.Test, num(b.Rsfb, 0), num(b.Bofb, 4), num(b.Rsdb, 0), num(b.Bodb, 4)), w, "       ")...)
	} else {
		out = append(out, wrap(st.Warn.Render("     separator basis: ")+in.basisErr.Error(), w, "       ")...)
	}
	if len(r.CCE) > 0 {
		if in.yErr == nil {
			out = append(out, wrap(fmt.Sprintf("     CCE Y-function: Y = %s + %s·p (p psia), r² %s over %d points", sig(in.yfit.A, 4), sig(in.yfit.B, 4), num(in.yfit.R2, 4), len(in.yfit.Points)), w, "       ")...)
		}
		if in.psatErr == nil {
			out = append(out, wrap(fmt.Sprintf("     saturation pressure implied by the CCE: %s psia (reported %s, %s %%)", num(in.psat.Psat, 0), num(in.psat.Reported, 0), signed(100*(in.psat.Psat/in.psat.Reported-1))), w, "       ")...)
		}
		if in.coErr == nil {
			out = append(out, wrap(fmt.Sprintf("     undersaturated co from the CCE: %s at Pb, %s at %s\u00a0psia (1e-6/psi)", num(in.co.Co(fl.Pb)*1e6, 2), num(in.co.Co(in.co.Pmax)*1e6, 2), num(in.co.Pmax, 0)), w, "       ")...)
		}
	}
	if s.tuningNote != "" {
		out = append(out, wrap("     "+s.tuningNote+" ("+s.tuningPath+")", w, "       ")...)
	}
	out = append(out, "")

	// Differential liberation, with the separator-basis columns beside the reported ones.
	if len(r.DL) > 0 {
		basis := map[int]lab.BasisPoint{}
		if in.basisErr == nil {
			for _, b := range in.basis.Below {
				basis[b.Line] = b
			}
		}
		cols := []column{{"p psia", 7, false, false}, {"Rsd", 5, false, false}, {"Bod", 6, false, false}, {"Bt", 7, false, false}, {"ρo lb/ft3", 9, true, false},
			{"Z", 6, false, false}, {"Bg", 7, true, false}, {"γg", 5, false, false}, {"│", 1, false, true}, {"Rs", 5, false, false}, {"Bo", 6, false, false}, {"Bt", 7, true, false}}
		var rows [][]string
		var lines []int
		clamped := false
		for _, d := range r.DL {
			b, ok := basis[d.Line]
			rs, bo, bt := "", "", ""
			if ok {
				rs, bo, bt = num(b.Rs, 0), num(b.Bo, 4), optional(b.Bt, 4)
				if b.Clamped {
					rs += "*"
					clamped = true
				}
			}
			p := num(d.Pressure, 1)
			if d.Residual60 {
				p = "60 °F"
			}
			rows = append(rows, []string{p, num(d.Rsd, 0), num(d.Bod, 4), optional(d.Bt, 4), optional(d.OilDensity, 2),
				optional(d.Z, 4), optional(d.Bg, 5), optional(d.GasGravity, 3), "│", rs, bo, bt})
			lines = append(lines, d.Line)
		}
		out = append(out, tableBlock(c, w, "dl.csv", "Differential liberation", cols, lines, rows)...)
		out = out[:len(out)-1]
		note := "Rsd scf/bbl, Bod and Bt rb/bbl residual oil as reported · Bg rcf/scf │ separator basis: Rs scf/STB, Bo and Bt rb/STB"
		if clamped {
			note += " · * came out below zero, set to 0"
		}
		for _, l := range wrap(strings.Repeat(" ", gutterW+5)+note, w, strings.Repeat(" ", gutterW+5)) {
			out = append(out, st.Dim.Render(l))
		}
		out = append(out, "")
	}

	// Separator tests.
	if len(r.Separator) > 0 {
		sel, _ := r.SelectedSeparator()
		cols := []column{{"test", 10, false, true}, {"stage", 10, false, true}, {"p psia", 7, false, false}, {"T °F", 5, false, false}, {"GOR", 5, false, false},
			{"γg", 5, false, false}, {"Bofb", 6, false, false}, {"API", 5, false, false}}
		var rows [][]string
		var lines []int
		for _, t := range r.Separator {
			for k, stg := range t.Stages {
				id := t.ID
				if t.ID == sel.ID {
					id += " ✓"
				}
				bofb, api := "", ""
				if k == len(t.Stages)-1 {
					bofb, api = optional(t.Bofb, 4), optional(t.API, 1)
				}
				rows = append(rows, []string{id, stg.Stage, num(stg.Pressure, 1), num(stg.Temperature, 0), num(stg.GOR, 0), optional(stg.GasGravity, 3), bofb, api})
				lines = append(lines, stg.Line)
			}
		}
		out = append(out, tableBlock(c, w, "separator.csv", "Separator tests", cols, lines, rows)...)
		out = out[:len(out)-1]
		out = append(out, st.Dim.Render(cell(strings.Repeat(" ", gutterW+5)+"✓ the test used for the field · GOR scf/STB · Bofb rb/STB", w)), "")
	}

	// CCE with the Y-function.
	if len(r.CCE) > 0 {
		yAt := map[int]lab.YPoint{}
		if in.yErr == nil {
			for _, y := range in.yfit.Points {
				yAt[y.Line] = y
			}
		}
		cols := []column{{"p psia", 7, false, false}, {"V/Vsat", 7, false, false}, {"ρ lb/ft3", 8, true, false}, {"Y rep.", 7, false, false}, {"Y", 7, false, false}, {"Y line", 7, false, false}, {"", 9, false, true}}
		var rows [][]string
		var lines []int
		for _, p := range r.CCE {
			y, ok := yAt[p.Line]
			yv, yl, flag := "", "", ""
			if ok {
				yv, yl = num(y.Y, 4), num(y.Fit, 4)
				if y.Outlier {
					flag = "off line"
				}
			}
			rows = append(rows, []string{num(p.Pressure, 1), num(p.RelVolume, 4), optional(p.Density, 2), optional(p.Y, 4), yv, yl, flag})
			lines = append(lines, p.Line)
		}
		out = append(out, tableBlock(c, w, "cce.csv", "Constant-composition expansion", cols, lines, rows)...)
		out = out[:len(out)-1]
		out = append(out, st.Dim.Render(cell(strings.Repeat(" ", gutterW+5)+"Y = (Psat − p)/(p·(V/Vsat − 1)) below Psat; Y line: the straight-line fit", w)), "")
	}

	// Viscosity.
	if len(r.Viscosity) > 0 {
		cols := []column{{"p psia", 7, false, false}, {"oil cP", 7, false, false}, {"gas cP", 7, false, false}}
		var rows [][]string
		var lines []int
		for _, v := range r.Viscosity {
			rows = append(rows, []string{num(v.Pressure, 1), num(v.Oil, 3), optional(v.Gas, 4)})
			lines = append(lines, v.Line)
		}
		out = append(out, tableBlock(c, w, "viscosity.csv", "Viscosity", cols, lines, rows)...)
	}

	// The findings in full.
	out = append(out, cell(st.Title.Render("QC findings")+"  "+lab.Verdict(s.findings), w))
	var anchors []int
	for i, f := range s.findings {
		anchors = append(anchors, len(out))
		where := f.File
		if where == "" {
			where = "whole report"
		}
		if f.Row > 0 {
			where += fmt.Sprintf(" line %d", f.Row)
		}
		sev := map[lab.Severity]func(...string) string{lab.Error: st.Err.Render, lab.Warning: st.Warn.Render, lab.Note: st.Note.Render}[f.Severity]
		head := fmt.Sprintf("%3d %s %s %s: ", i+1, sev(cell(f.Severity.String(), 7)), where, st.Dim.Render(f.Code))
		out = append(out, wrap(head+f.Message, w, "      ")...)
		if f.Action != "" {
			out = append(out, wrap("      → "+f.Action, w, "        ")...)
		}
	}
	if len(s.findings) == 0 {
		out = append(out, "    none")
	}
	for _, n := range s.ds0Notes() {
		out = append(out, wrap("    note: "+n, w, "      ")...)
	}
	// n and N step through the marked rows of the tables, then the list.
	var marked []int
	for i, l := range out {
		if markedRow.MatchString(ansi.Strip(l)) {
			marked = append(marked, i)
		}
	}
	return out, append(marked, anchors...)
}

// markedRow is a line with a finding mark in its gutter ("W2", "E1,3", "n4").
var markedRow = regexp.MustCompile(`^[EWn][0-9]`)

// ds0Notes are the tuning dataset's notes (what was left out or assumed).
func (s *session) ds0Notes() []string {
	if s.ds == nil {
		return nil
	}
	return s.ds.Notes
}
