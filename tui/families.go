package tui

import (
	"fmt"
	"slices"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"labmatch/correlations"
	"labmatch/fit"
)

// familiesScreen lists, for the focused property, every family with its published, tuned and
// leave-one-out errors, depth, multiplier and range, in rank order. Enter puts a family to use;
// c lays it over the Match plot for comparison.
type familiesScreen struct {
	keys   familiesKeys
	cursor map[fit.PropertyID]int
}

func newFamiliesScreen() familiesScreen {
	return familiesScreen{keys: newFamiliesKeys(), cursor: map[fit.PropertyID]int{}}
}

// maxCompared is how many families can be laid over one plot.
const maxCompared = 3

func (f familiesScreen) update(msg tea.KeyMsg, c *common) (familiesScreen, tea.Cmd, string) {
	s := c.s
	p := c.property()
	if p == "" {
		return f, nil, ""
	}
	es := s.ranking[p]
	cur := min(f.cursor[p], max(0, len(es)-1))
	switch {
	case key.Matches(msg, f.keys.Prev):
		c.stepProperty(-1)
	case key.Matches(msg, f.keys.Next):
		c.stepProperty(1)
	case key.Matches(msg, f.keys.Up):
		f.cursor[p] = max(0, cur-1)
	case key.Matches(msg, f.keys.Down):
		f.cursor[p] = min(len(es)-1, cur+1)
	case key.Matches(msg, f.keys.Pick):
		if !s.started {
			return f, nil, "wait for the first fit"
		}
		if len(es) == 0 {
			return f, nil, ""
		}
		e := es[cur]
		if e.Failed != "" {
			return f, nil, e.Family + " cannot be evaluated for this report"
		}
		if s.choice[p] == e.Family {
			return f, nil, e.Family + " is the family in use already"
		}
		s.choice[p] = e.Family
		// The family in use is not also compared with itself.
		s.compare[p] = slices.DeleteFunc(s.compare[p], func(x string) bool { return x == e.Family })
		return f, tea.Batch(s.refit(p), s.requestCompare(p)), ""
	case key.Matches(msg, f.keys.Compare):
		if !s.started {
			return f, nil, "wait for the first fit"
		}
		if len(es) == 0 {
			return f, nil, ""
		}
		e := es[cur]
		if i := slices.Index(s.compare[p], e.Family); i >= 0 {
			s.compare[p] = slices.Delete(s.compare[p], i, i+1)
			return f, s.requestCompare(p), ""
		}
		switch {
		case e.Failed != "":
			return f, nil, e.Family + " cannot be evaluated for this report"
		case e.Family == s.choice[p]:
			return f, nil, e.Family + " is the family in use; it is on the plot already"
		case len(s.compare[p]) >= maxCompared:
			return f, nil, fmt.Sprintf("at most %d families are compared at once; c on a marked one removes it", maxCompared)
		}
		s.compare[p] = append(s.compare[p], e.Family)
		return f, s.requestCompare(p), ""
	case key.Matches(msg, f.keys.ClearCompare):
		s.compare[p] = nil
		return f, s.requestCompare(p), ""
	}
	return f, nil, ""
}

func (f familiesScreen) view(c *common, w, h int) string {
	s, st := c.s, c.styles
	if s.dsErr != nil {
		return noTuningView(c, w)
	}
	p := c.property()
	if p == "" {
		return st.Dim.Render("no property of this report has lab data to tune")
	}
	lines := []string{propertyBar(c, w), ""}
	es, ok := s.ranking[p]
	if !ok {
		return strings.Join(append(lines, st.Dim.Render("ranking…")), "\n")
	}
	at := "each at its rung by LOO"
	if d := s.depth[p]; d != "" {
		at = "all at depth " + string(d)
	}
	title := st.Title.Render(propertyTitle(p))
	if w < 100 {
		title = st.Title.Render(string(p))
	}
	lines = append(lines, cell(title+st.Dim.Render(fmt.Sprintf("   %s · best first · %s · %s errors", plural(len(s.ds.Points[p]), "point"), at, s.loss)), w))
	famW, nw := 22, 9
	if w < 90 {
		famW, nw = 20, 8
	}
	mult := "mult."
	if p == fit.Pb {
		mult = "scale" // the pressure scale of the pair
	}
	hdr := fmt.Sprintf("    %-*s %*s %*s %*s  %-10s %6s  %s", famW, "family", nw, "published", nw, "tuned", nw, "LOO", "depth", mult, "range")
	lines = append(lines, st.Header.Render(cell(hdr, w)))
	cur := min(f.cursor[p], max(0, len(es)-1))
	room := max(1, h-len(lines)-7)
	top := 0
	if cur >= room {
		top = cur - room + 1
	}
	for i := top; i < len(es) && i < top+room; i++ {
		e := es[i]
		mark := [3]string{" ", " ", " "}
		if i == cur {
			mark[0] = "▸"
		}
		if e.Family == s.choice[p] {
			mark[1] = "✓"
		}
		ci := slices.Index(s.compare[p], e.Family)
		if ci >= 0 {
			mark[2] = "◆"
		}
		var row string
		if e.Failed != "" {
			row = fmt.Sprintf("%s %-*s %*s %*s %*s  %-10s %6s  %s", strings.Join(mark[:], ""), famW, e.Family, nw, "—", nw, "—", nw, "—", "", "", "cannot be evaluated")
		} else {
			rng := "in"
			if !e.InRange {
				rng = "OUT"
			}
			if len(e.Flags) > 0 {
				rng += " !"
			}
			depth := string(e.Depth)
			if depth == "" {
				depth = "n/a"
			}
			row = fmt.Sprintf("%s %-*s %*s %*s %*s  %-10s %6s  %s", strings.Join(mark[:], ""), famW, e.Family,
				nw, pctp(e.AAREPublished), nw, pctp(e.AARETuned), nw, pctp(e.AARELOO), depth, ptrNum(e.Multiplier, 3), rng)
		}
		row = cell(row, w)
		switch {
		case i == cur:
			row = st.Cursor.Render(row)
		case ci >= 0:
			row = st.overlayStyle(ci).Render(row)
		case e.Failed != "":
			row = st.Dim.Render(row)
		}
		lines = append(lines, row)
	}
	lines = append(lines, st.Dim.Render(cell("  ✓ in use   ◆ compared on the Match plot   ! warning below   errors: AARE %", w)), "")
	if len(es) > 0 {
		lines = append(lines, familyDetail(c, p, es[cur], w)...)
	}
	return strings.Join(lines, "\n")
}

// familyDetail describes the family under the cursor: its paper, and what is wrong with it.
func familyDetail(c *common, p fit.PropertyID, e fit.RankEntry, w int) []string {
	st := c.styles
	var out []string
	if ce, err := correlations.Lookup(catalogProperty(p), e.Family); err == nil {
		out = append(out, wrap(st.Bold.Render(e.Family)+fmt.Sprintf(": %s (%d). %s", ce.Authors, ce.Year, ce.Reference), w, "  ")...)
		if ce.Convention != "" {
			out = append(out, wrap("  convention: "+ce.Convention, w, "    ")...)
		}
	} else {
		out = append(out, st.Bold.Render(e.Family))
	}
	if e.Failed != "" {
		out = append(out, wrap(st.Err.Render("  cannot be evaluated: ")+e.Failed, w, "    ")...)
	}
	for _, o := range e.OutOfRange {
		out = append(out, wrap(st.Warn.Render("  outside its data: ")+o, w, "    ")...)
	}
	for _, fl := range e.Flags {
		out = append(out, wrap(st.Warn.Render("  ! ")+fl, w, "    ")...)
	}
	return out
}

// propertyBar lists the properties with the focused one marked.
func propertyBar(c *common, w int) string {
	st := c.styles
	var parts []string
	for i, p := range c.s.props {
		label := st.Dim.Render(" " + string(p) + " ")
		if i == c.prop%len(c.s.props) {
			label = st.TabActive.Render("[" + string(p) + "]")
		}
		parts = append(parts, label)
	}
	return cell(strings.Join(parts, "  "), w)
}

// catalogProperty maps a tuned property to the catalog property of its families.
func catalogProperty(p fit.PropertyID) correlations.Property {
	switch p {
	case fit.Pb:
		return correlations.SolutionGas
	case fit.Bo:
		return correlations.OilFVF
	case fit.Co:
		return correlations.Compressibility
	case fit.MuDead:
		return correlations.DeadViscosity
	case fit.MuSat:
		return correlations.SatViscosity
	case fit.MuUnder:
		return correlations.UnderViscosity
	case fit.Z:
		return correlations.GasZ
	}
	return ""
}

func ptrNum(v *float64, dec int) string {
	if v == nil {
		return "n/a"
	}
	return num(*v, dec)
}

// plural writes "1 point", "5 points".
func plural(n int, word string) string {
	if n == 1 {
		return fmt.Sprintf("1 %s", word)
	}
	return fmt.Sprintf("%d %ss", n, word)
}
