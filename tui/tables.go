package tui

import (
	"fmt"
	"path/filepath"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// tablesScreen shows the black-oil table of the tuned model as the table files hold it
// (saturated rows, the report's oil above Pb, and on demand the undersaturated branch of every
// saturated row) and saves the files that go on from here.
type tablesScreen struct {
	keys     tablesKeys
	top      int
	branches bool
	saved    map[ExportKind]string // last path written, per kind
}

func newTablesScreen(ex map[ExportKind]Exporter) tablesScreen {
	t := tablesScreen{keys: newTablesKeys(), saved: map[ExportKind]string{}}
	for k, b := range map[ExportKind]*key.Binding{ExportTuning: &t.keys.SaveTuning, ExportTablesCSV: &t.keys.SaveCSV, ExportDeck: &t.keys.SaveDeck, ExportHTML: &t.keys.SaveHTML} {
		b.SetEnabled(ex[k] != nil)
	}
	return t
}

func (t tablesScreen) update(msg tea.KeyMsg, c *common) (tablesScreen, *ExportKind, string) {
	ask := func(k ExportKind) (tablesScreen, *ExportKind, string) {
		switch {
		case c.s.report == nil || !c.s.started:
			return t, nil, "nothing to save yet"
		case len(c.s.results) == 0:
			return t, nil, "no property is tuned: nothing to save"
		}
		return t, &k, ""
	}
	n, page := t.visibleRows(c)
	switch {
	case key.Matches(msg, t.keys.Up):
		t.top--
	case key.Matches(msg, t.keys.Down):
		t.top++
	case key.Matches(msg, t.keys.PageUp):
		t.top -= page
	case key.Matches(msg, t.keys.PageDown):
		t.top += page
	case key.Matches(msg, t.keys.Top):
		t.top = 0
	case key.Matches(msg, t.keys.Bottom):
		t.top = n
	case key.Matches(msg, t.keys.Branches):
		t.branches = !t.branches
		n, page = t.visibleRows(c)
	case key.Matches(msg, t.keys.SaveTuning):
		return ask(ExportTuning)
	case key.Matches(msg, t.keys.SaveCSV):
		return ask(ExportTablesCSV)
	case key.Matches(msg, t.keys.SaveDeck):
		return ask(ExportDeck)
	case key.Matches(msg, t.keys.SaveHTML):
		return ask(ExportHTML)
	}
	t.top = max(0, min(t.top, n-page))
	return t, nil, ""
}

var tableCols = []struct {
	title string
	w     int
}{{"p psia", 7}, {"Rs", 6}, {"Bo", 7}, {"μo cP", 7}, {"ρo", 6}, {"co", 7}, {"Z", 6}, {"Bg", 8}, {"μg cP", 7}}

// lines are the table rows as text (without the header): every saturated row, the Pb row's
// branch (the report's oil above its bubble point) always, the other branches on demand.
func (t tablesScreen) lines(c *common, w int) []string {
	st := c.styles
	td := c.s.table
	var out []string
	row := func(mark string, vals []string) string {
		var b strings.Builder
		b.WriteString(cell(mark, 4))
		for i, v := range vals {
			b.WriteString(" " + cellRight(v, tableCols[i].w))
		}
		return cell(b.String(), w)
	}
	pb := 0.0
	if td.model != nil {
		pb = td.model.Pb
	}
	for i, r := range td.rows {
		mark := "sat"
		if r.kind == rowExtrap {
			mark = "ext"
		}
		isPb := r.st.Pressure == pb
		if isPb {
			mark = "Pb"
		}
		line := row(mark, stateCells(r))
		switch {
		case isPb:
			line = st.Bold.Render(line)
		case r.kind == rowExtrap:
			line = st.Dim.Render(line)
		}
		out = append(out, line)
		if !t.branches && !isPb {
			continue
		}
		if why := td.noBranch[i]; why != "" {
			out = append(out, st.Err.Render(cell("  ↳ no branch: "+why, w)))
			continue
		}
		for _, b := range td.branches[i] {
			out = append(out, st.Tuned.Render(row("  ↳", stateCells(b))))
		}
	}
	return out
}

func stateCells(r tableRow) []string {
	s := r.st
	co := "" // the tuned compressibility applies above the bubble point only
	if r.kind == rowBranch {
		co = num(s.Co*1e6, 2)
	}
	return []string{num(s.Pressure, 1), num(s.Rs, 1), num(s.Bo, 4), num(s.OilViscosity, 3), num(s.OilDensity, 2),
		co, num(s.Z, 4), sig(s.Bg, 4), num(s.GasViscosity, 4)}
}

func (t tablesScreen) view(c *common, w, h int) string {
	s, st := c.s, c.styles
	if s.dsErr != nil {
		return noTuningView(c, w)
	}
	td := s.table
	switch {
	case !s.started || (td.model == nil && td.err == nil):
		return st.Dim.Render("building the table of the tuned model…")
	case td.err != nil:
		return strings.Join(append([]string{st.Err.Render("The black-oil table of the tuned model cannot be built")}, wrap(td.err.Error(), w, "  ")...), "\n")
	}
	head, foot := t.head(c, w, h), t.footer(c, w)
	rows := t.lines(c, w)
	room := rowRoom(len(rows), h-len(head)-len(foot))
	top := max(0, min(t.top, len(rows)-room))
	body := append([]string(nil), rows[top:min(len(rows), top+room)]...)
	if len(rows) > room {
		body = append(body, st.Dim.Render(cell(fmt.Sprintf("  ── rows %d–%d of %d ──", top+1, top+len(body), len(rows)), w)))
	}
	for len(body) < h-len(head)-len(foot) {
		body = append(body, "")
	}
	out := append(head, body...)
	out = append(out, foot...)
	return strings.Join(out, "\n")
}

// rowRoom is how many table rows fit in free lines, one of them kept for the "rows a–b of n"
// line when not all rows fit.
func rowRoom(rows, free int) int {
	if rows > free {
		return max(1, free-1)
	}
	return max(1, free)
}

// visibleRows is how many rows the screen shows in the window (0 before the table exists).
func (t tablesScreen) visibleRows(c *common) (rows, room int) {
	if c.s.dsErr != nil || c.s.table.model == nil || c.s.table.err != nil {
		return 0, 1
	}
	w, h := c.width, c.height-4 // the body's height: View's header, tabs, status and help lines
	n := len(t.lines(c, w))
	return n, rowRoom(n, h-len(t.head(c, w, h))-len(t.footer(c, w)))
}

// head is the table's title, families and column titles.
func (t tablesScreen) head(c *common, w, h int) []string {
	s, st := c.s, c.styles
	td := s.table
	var head []string
	m := td.model
	title, tail := "Black-oil table of the tuned model", " · as the table files hold it"
	if w < 100 {
		title, tail = "Black-oil table", ""
	}
	head = append(head, wrap(st.Title.Render(title)+fmt.Sprintf("  at %s\u00a0°F · tuned Pb %s\u00a0psia · Rsb %s\u00a0scf/STB · %d saturated rows, %s to %s\u00a0psia%s",
		num(m.Oil.Temperature, 0), num(m.Pb, 1), num(m.Rsb, 0), len(td.rows), num(td.table.Rows[0].Pressure, 1), num(td.table.PMax, 0), tail), w, "  ")...)
	var fams []string
	for _, p := range s.props {
		fams = append(fams, string(p)+" "+m.Families[p])
	}
	if h >= 30 {
		head = append(head, wrap(st.Dim.Render("families: ")+strings.Join(fams, ", "), w, "  ")...)
	}
	if len(m.Untuned) > 0 {
		var u []string
		for _, p := range m.Untuned {
			u = append(u, string(p)+" "+m.Families[p])
		}
		head = append(head, wrap(st.Warn.Render("no lab data, published defaults: ")+strings.Join(u, ", "), w, "  ")...)
	}
	var hb strings.Builder
	hb.WriteString(cell("", 4))
	for _, col := range tableCols {
		hb.WriteString(" " + cellRight(col.title, col.w))
	}
	head = append(head, st.Header.Render(cell(hb.String(), w)))
	head = append(head, st.Dim.Render(cell("     Rs scf/STB · Bo rb/STB · ρo lbm/ft3 · co 1e-6/psi above Pb · Bg rcf/scf", w)))

	return head
}

// footer explains the row marks and the save keys, and names what was last saved.
func (t tablesScreen) footer(c *common, w int) []string {
	st := c.styles
	legend := "sat oil at its bubble point · Pb the tuned bubble point, ↳ the report's oil above it · ext above Pb: an oil with more gas, extrapolated"
	if w < 100 {
		legend = "sat saturated · Pb, ↳ the report's oil above it · ext extrapolated"
	}
	if t.branches {
		legend += " · ↳ branches"
	} else {
		legend += " · u branches"
	}
	var out []string
	for _, l := range wrap(legend, w, "  ") {
		out = append(out, st.Dim.Render(l))
	}
	var parts []string
	for _, k := range exportKinds {
		b := map[ExportKind]key.Binding{ExportTuning: t.keys.SaveTuning, ExportTablesCSV: t.keys.SaveCSV, ExportDeck: t.keys.SaveDeck, ExportHTML: t.keys.SaveHTML}[k]
		if b.Enabled() {
			txt := st.HelpKey.Render(b.Help().Key) + " " + k.String()
			if p, ok := t.saved[k]; ok {
				if w < 100 { // the status line named the whole path when it was written
					p = filepath.Base(p)
				}
				txt += st.Good.Render(" ✓ " + p)
			}
			parts = append(parts, txt)
		} else {
			parts = append(parts, st.Dim.Render(k.String()+": not in this build yet"))
		}
	}
	out = append(out, wrap(st.Bold.Render("save ")+strings.Join(parts, st.Dim.Render(" · ")), w, "     ")...)
	return out
}
