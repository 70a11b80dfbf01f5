package tui

import (
	"errors"
	"fmt"
	"io/fs"
	"strings"
	"time"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"

	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// The smallest window the workbench draws in; below it, it says so.
const (
	minWidth  = 60
	minHeight = 16
)

// screen is one of the four screens.
type screen int

const (
	screenReport screen = iota
	screenFamilies
	screenMatch
	screenTables
	numScreens
)

func (s screen) String() string {
	return [...]string{"Report", "Families", "Match", "Tables"}[s]
}

// common is what every screen shares: the window size, the styles and the session.
type common struct {
	width, height int
	styles        Styles
	s             *session
	prop          int // index into s.props of the property Families and Match show
}

// property returns the focused property, or "" when there is none.
func (c *common) property() fit.PropertyID {
	if len(c.s.props) == 0 {
		return ""
	}
	return c.s.props[c.prop%len(c.s.props)]
}

// stepProperty moves the focus to the next (+1) or previous (−1) property.
func (c *common) stepProperty(d int) {
	if n := len(c.s.props); n > 0 {
		c.prop = ((c.prop+d)%n + n) % n
	}
}

// Option configures the workbench.
type Option func(*config)

type config struct {
	name      string
	load      func() (*lab.Report, error)
	tuning    string
	force     bool
	renderer  *lipgloss.Renderer
	noColor   bool
	tool      string
	exporters map[ExportKind]Exporter
	rankDelay *time.Duration
}

// WithReport opens the report that load returns; name is what the header shows when the
// report has no sample name (a folder or "demo:<id>"). The default is the built-in demo report.
func WithReport(name string, load func() (*lab.Report, error)) Option {
	return func(c *config) { c.name, c.load = name, load }
}

// WithTuningFile applies a tuning file's families and parameters on opening; force applies
// it even when it was made from other report files.
func WithTuningFile(path string, force bool) Option {
	return func(c *config) { c.tuning, c.force = path, force }
}

// WithRenderer draws with renderer r (its colour profile decides what escape codes appear);
// noColor keeps emphasis but drops every colour.
func WithRenderer(r *lipgloss.Renderer, noColor bool) Option {
	return func(c *config) { c.renderer, c.noColor = r, noColor }
}

// WithTool names the tool and version written into saved files.
func WithTool(tool string) Option { return func(c *config) { c.tool = tool } }

// WithExporter wires a writer for one kind of file into the Tables screen.
func WithExporter(k ExportKind, e Exporter) Option {
	return func(c *config) { c.exporters[k] = e }
}

// WithRankDelay sets how long the ranking waits for the user to pause before it is
// refreshed (tests use 0).
func WithRankDelay(d time.Duration) Option { return func(c *config) { c.rankDelay = &d } }

// Model is the workbench: a root model that handles the global keys and the session's
// messages and delegates the rest to the active screen.
type Model struct {
	c         *common
	keys      globalKeys
	helpKeys  helpKeys
	active    screen
	report    reportScreen
	families  familiesScreen
	match     matchScreen
	tables    tablesScreen
	prompt    promptModel
	help      help.Model
	showHelp  bool
	helpTop   int
	flash     string // a one-off message shown in the status line until the next key
	flashErr  bool
	load      func() (*lab.Report, error)
	exporters map[ExportKind]Exporter
	quitting  bool
}

// New makes the workbench. Init starts loading the report.
func New(opts ...Option) Model {
	cfg := config{
		name: "demo:" + samples.Default, load: func() (*lab.Report, error) { return samples.Load(samples.Default) },
		tool: "labmatch", exporters: map[ExportKind]Exporter{ExportTuning: TuningExporter},
	}
	for _, o := range opts {
		o(&cfg)
	}
	if cfg.renderer == nil {
		cfg.renderer = lipgloss.DefaultRenderer()
	}
	st := NewStyles(cfg.renderer, cfg.noColor)
	s := newSession(cfg.tool, cfg.name)
	s.tuningPath, s.tuningForce = cfg.tuning, cfg.force
	if cfg.rankDelay != nil {
		s.rankDelay = *cfg.rankDelay
	}
	s.loading = true
	h := help.New()
	h.Styles = help.Styles{
		Ellipsis: st.HelpSep, ShortKey: st.HelpKey, ShortDesc: st.HelpDesc, ShortSeparator: st.HelpSep,
		FullKey: st.HelpKey, FullDesc: st.HelpDesc, FullSeparator: st.HelpSep,
	}
	h.ShortSeparator = " · "
	m := Model{
		c:    &common{width: 80, height: 24, styles: st, s: s},
		keys: newGlobalKeys(), helpKeys: newHelpKeys(), active: screenMatch, help: h, load: cfg.load, exporters: cfg.exporters,
		report: newReportScreen(), families: newFamiliesScreen(), match: newMatchScreen(),
		tables: newTablesScreen(cfg.exporters), prompt: newPrompt(cfg.renderer),
	}
	return m
}

// Init starts loading the report.
func (m Model) Init() tea.Cmd { return loadCmd(m.load, m.c.s.tuningPath) }

// Update routes a message: window size to every screen, the session's messages to the
// session, keys to the prompt, the help, the global bindings or the active screen.
func (m Model) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	switch msg := msg.(type) {
	case tea.WindowSizeMsg:
		m.c.width, m.c.height = msg.Width, msg.Height
		m.help.Width = msg.Width
		return m, nil
	case tea.KeyMsg:
		return m.onKey(msg)
	case loadedMsg:
		return m.onLoaded(msg)
	case startedMsg:
		return m.onStarted(msg)
	case fitMsg:
		return m.onFit(msg)
	case rankDueMsg:
		return m, m.c.s.onRankDue(msg)
	case rankMsg:
		m.c.s.onRank(msg)
		return m, nil
	case compareMsg:
		m.c.s.onCompare(msg)
		return m, nil
	case tableMsg:
		m.c.s.onTable(msg)
		return m, nil
	case savedMsg:
		return m.onSaved(msg)
	}
	return m, nil
}

func (m Model) onKey(msg tea.KeyMsg) (tea.Model, tea.Cmd) {
	m.flash, m.flashErr = "", false
	if m.prompt.active() {
		var act promptAction
		m.prompt, act = m.prompt.update(msg)
		switch act.kind {
		case promptSave, promptOverwrite:
			return m, saveCmd(m.exporters[act.export], act.export, act.path, m.c.s.snapshot(), act.kind == promptOverwrite)
		case promptCancelled:
			m.flash = "not saved"
		}
		return m, nil
	}
	if m.showHelp {
		switch {
		case key.Matches(msg, m.keys.Quit):
			m.quitting = true
			return m, tea.Quit
		case key.Matches(msg, m.helpKeys.Close):
			m.showHelp = false
		case key.Matches(msg, m.helpKeys.Down):
			m.helpTop = min(m.helpTop+1, max(0, len(m.helpLines(m.c.width))-(m.c.height-5)))
		case key.Matches(msg, m.helpKeys.Up):
			m.helpTop = max(0, m.helpTop-1)
		default:
			m.flash = "the help is open: " + m.helpKeys.Close.Help().Key + " closes it"
		}
		return m, nil
	}
	switch {
	case key.Matches(msg, m.keys.Quit):
		m.quitting = true
		return m, tea.Quit
	case key.Matches(msg, m.keys.Help):
		m.showHelp, m.helpTop = true, 0
		return m, nil
	case key.Matches(msg, m.keys.Report):
		m.active = screenReport
		return m, nil
	case key.Matches(msg, m.keys.Families):
		m.active = screenFamilies
		return m, nil
	case key.Matches(msg, m.keys.Match):
		m.active = screenMatch
		return m, nil
	case key.Matches(msg, m.keys.Tables):
		m.active = screenTables
		return m, nil
	case key.Matches(msg, m.keys.Next):
		m.active = (m.active + 1) % numScreens
		return m, nil
	case key.Matches(msg, m.keys.Prev):
		m.active = (m.active + numScreens - 1) % numScreens
		return m, nil
	}
	var cmd tea.Cmd
	var note string
	switch m.active {
	case screenReport:
		m.report, cmd = m.report.update(msg, m.c)
	case screenFamilies:
		m.families, cmd, note = m.families.update(msg, m.c)
	case screenMatch:
		m.match, cmd, note = m.match.update(msg, m.c)
	case screenTables:
		var ask *ExportKind
		m.tables, ask, note = m.tables.update(msg, m.c)
		if ask != nil {
			m.prompt = m.prompt.open(*ask, defaultPath(m.c.s.src, m.c.s.report, *ask))
			return m, nil
		}
	}
	if note != "" {
		m.flash, m.flashErr = note, true
	}
	return m, cmd
}

func (m Model) onLoaded(msg loadedMsg) (tea.Model, tea.Cmd) {
	s := m.c.s
	s.loading = false
	if msg.err != nil {
		s.loadErr = msg.err
		return m, nil
	}
	s.report, s.findings, s.info, s.ds, s.dsErr = msg.report, msg.findings, msg.info, msg.ds, msg.dsErr
	if msg.tuningErr != nil {
		s.tuningNote = "tuning file not read: " + msg.tuningErr.Error()
	}
	if s.ds == nil {
		m.active = screenReport
		return m, nil
	}
	for _, f := range s.findings {
		if f.Severity == lab.Error { // a report with errors opens where they are listed
			m.active = screenReport
			m.flash, m.flashErr = "the QC found errors in this report: fix them before trusting any tuning", true
		}
	}
	for _, p := range fit.Properties {
		if len(s.ds.Points[p]) > 0 {
			s.props = append(s.props, p)
			s.busy[p] = true
		}
	}
	return m, startCmd(s.ds, s.report, msg.tuning, s.tuningForce)
}

func (m Model) onStarted(msg startedMsg) (tea.Model, tea.Cmd) {
	s := m.c.s
	s.started = true
	s.ranking, s.loss = msg.ranking, msg.loss
	if msg.note != "" && s.tuningPath != "" {
		s.tuningNote = msg.note
	}
	// Say what became of the --tuning file on whatever screen opens.
	if s.tuningPath != "" && m.flash == "" {
		if msg.applied {
			m.flash = s.tuningNote
		} else if s.tuningNote != "" {
			m.flash, m.flashErr = s.tuningNote+" (the Report screen, 1, says why)", true
		}
	}
	for p, idx := range msg.exclude {
		s.excluded[p] = append([]int(nil), idx...)
	}
	for _, p := range s.props {
		s.busy[p] = false
		if r, ok := msg.results[p]; ok {
			s.results[p], s.choice[p], s.curves[p] = r, r.Family, msg.curves[p]
			if msg.applied && r.Depth != "" {
				s.depth[p], s.fromFile[p] = r.Depth, true // a tuning file fixes the rung it was saved at
			}
		}
		if err, ok := msg.errs[p]; ok {
			s.fitErr[p] = err
		}
	}
	return m, s.requestTable()
}

func (m Model) onFit(msg fitMsg) (tea.Model, tea.Cmd) {
	s := m.c.s
	if msg.seq != s.seq[msg.prop] {
		return m, nil // a newer fit of this property is on its way
	}
	s.busy[msg.prop] = false
	if msg.err != nil {
		s.fitErr[msg.prop] = msg.err
		if r, ok := s.results[msg.prop]; ok { // back to what is shown
			s.excluded[msg.prop] = append([]int(nil), r.Excluded...)
			s.choice[msg.prop] = r.Family
		}
		m.flash, m.flashErr = msg.err.Error(), true
		return m, nil
	}
	delete(s.fitErr, msg.prop)
	s.results[msg.prop], s.curves[msg.prop] = msg.res, msg.curve
	cmds := []tea.Cmd{s.requestTable(), s.requestRank(msg.prop), s.requestCompare(msg.prop)}
	for _, d := range dependents(s.ds, msg.prop) {
		if _, ok := s.choice[d]; ok {
			cmds = append(cmds, s.refit(d))
		}
	}
	return m, tea.Batch(cmds...)
}

func (m Model) onSaved(msg savedMsg) (tea.Model, tea.Cmd) {
	switch {
	case msg.err == nil:
		m.flash = fmt.Sprintf("%s written: %s", msg.kind, msg.path)
		m.tables.saved[msg.kind] = msg.path
	case errors.Is(msg.err, fs.ErrExist):
		m.prompt = m.prompt.askOverwrite(msg.kind, msg.path)
	default:
		m.flash, m.flashErr = fmt.Sprintf("%s not written: %v", msg.kind, msg.err), true
	}
	return m, nil
}

// View draws the window.
func (m Model) View() string {
	if m.quitting {
		return ""
	}
	c := m.c
	w, h := c.width, c.height
	st := c.styles
	if w < minWidth || h < minHeight {
		msg := fmt.Sprintf("window too small: %d×%d; labmatch needs at least %d×%d", w, h, minWidth, minHeight)
		return frame(strings.Join(wrap(msg, w, ""), "\n"), w, h)
	}
	header := m.headerLine()
	tabs := m.tabsLine()
	bodyH := h - 4
	var body string
	switch {
	case m.showHelp:
		body = m.helpView(w, bodyH)
	case c.s.loading:
		body = st.Dim.Render("reading " + c.s.src + " …")
	case c.s.loadErr != nil:
		body = loadErrorView(c, w, bodyH)
	default:
		switch m.active {
		case screenReport:
			body = m.report.view(c, w, bodyH)
		case screenFamilies:
			body = m.families.view(c, w, bodyH)
		case screenMatch:
			body = m.match.view(c, w, bodyH)
		case screenTables:
			body = m.tables.view(c, w, bodyH)
		}
	}
	status, helpLine := m.statusLine(), m.shortHelp()
	if m.prompt.active() {
		status, helpLine = m.prompt.view(w, st), m.help.ShortHelpView(m.prompt.keysHelp().ShortHelp())
	}
	return frame(strings.Join([]string{header, tabs, frame(body, w, bodyH), status, helpLine}, "\n"), w, h)
}

func (m Model) headerLine() string {
	c, st := m.c, m.c.styles
	tool := st.Title.Render("labmatch")
	r := c.s.report
	if r == nil {
		return cell(tool+st.Dim.Render(" · ")+c.s.src, c.width)
	}
	name := r.Fluid.Sample
	if name == "" {
		name = c.s.src
	}
	ft := ""
	if c.s.info.fluid != lab.UnknownFluid {
		ft = c.s.info.fluid.String()
		if c.s.info.fluid != lab.BlackOil {
			ft = st.Warn.Render(ft)
		}
	}
	facts := []string{fmt.Sprintf("%s °F", num(r.Fluid.Temperature, 0)), fmt.Sprintf("Pb %s psia", num(r.Fluid.Pb, 0))}
	join := func(ps ...string) string {
		var keep []string
		for _, p := range ps {
			if p != "" {
				keep = append(keep, p)
			}
		}
		return strings.Join(keep, st.Dim.Render(" · "))
	}
	// Drop the tool's name, then the fluid type, when the window is narrow.
	line := join(append([]string{tool, st.Bold.Render(name), ft}, facts...)...)
	if lipgloss.Width(line) > c.width {
		line = join(append([]string{st.Bold.Render(name), ft}, facts...)...)
	}
	if lipgloss.Width(line) > c.width && c.s.info.fluid == lab.BlackOil {
		line = join(append([]string{st.Bold.Render(name)}, facts...)...)
	}
	return cell(line, c.width)
}

func (m Model) tabsLine() string {
	st := m.c.styles
	var b strings.Builder
	for s := screen(0); s < numScreens; s++ {
		label := fmt.Sprintf("%d %s", int(s)+1, s)
		if s == m.active && !m.showHelp {
			b.WriteString(st.TabActive.Render(label))
		} else {
			b.WriteString(st.Tab.Render(label))
		}
		b.WriteString("   ")
	}
	if m.showHelp {
		b.WriteString(st.TabActive.Render("? Help"))
	}
	return cell(b.String(), m.c.width)
}

// statusLine shows the focused property's family, depth, multiplier and errors, or a message.
func (m Model) statusLine() string {
	c, st, s := m.c, m.c.styles, m.c.s
	if m.flash != "" {
		if m.flashErr {
			return cell(st.Err.Render(m.flash), c.width)
		}
		return cell(st.Good.Render(m.flash), c.width)
	}
	p := c.property()
	if p == "" {
		return ""
	}
	line := st.Bold.Render(string(p))
	if r, ok := s.results[p]; ok {
		mult := "multiplier "
		if r.Anchored {
			mult = "pressure scale "
		}
		full := []string{line + " " + r.Family, "depth " + depthText(s, p, r), mult + num(r.Params.Multiplier, 3),
			fmt.Sprintf("AARE tuned %s %%", num(r.Tuned.AARE, 2)), fmt.Sprintf("leave-one-out %s", pctWithUnit(r.LOO))}
		line = strings.Join(full, st.Dim.Render(" · "))
		if lipgloss.Width(line) > c.width-12 { // short forms, leaving room for "fitting…"
			d := string(r.Depth)
			if d == "" {
				d = "n/a"
			}
			short := []string{full[0], d, "×" + num(r.Params.Multiplier, 3),
				fmt.Sprintf("AARE %s %%", num(r.Tuned.AARE, 2)), fmt.Sprintf("LOO %s", pctWithUnit(r.LOO))}
			line = strings.Join(short, st.Dim.Render(" · "))
		}
	} else if err := s.fitErr[p]; err != nil {
		line += " " + st.Err.Render("not tuned")
	}
	if s.anyBusy() || !s.started {
		line += "  " + st.Busy.Render("fitting…")
	} else if s.rankBusy || len(s.rankDirty) > 0 {
		line += "  " + st.Dim.Render("ranking…")
	}
	return cell(line, c.width)
}

func (m Model) shortHelp() string {
	var ks []key.Binding
	if m.c.s.report == nil || m.c.s.loadErr != nil {
		return m.help.ShortHelpView([]key.Binding{m.keys.Help, m.keys.Quit})
	}
	switch m.active {
	case screenReport:
		ks = m.report.keys.ShortHelp()
	case screenFamilies:
		ks = m.families.keys.ShortHelp()
	case screenMatch:
		ks = m.match.keys.ShortHelp()
	case screenTables:
		ks = m.tables.keys.ShortHelp()
	}
	if m.showHelp {
		return m.help.ShortHelpView(append(m.helpKeys.ShortHelp(), m.keys.Quit))
	}
	ks = append(ks, m.keys.Next, m.keys.Help, m.keys.Quit)
	return m.help.ShortHelpView(ks)
}

// helpView is the help overlay: every key of the active screen and the global keys, from the
// same bindings that drive them, then the cautions.
func (m Model) helpView(w, h int) string {
	st := m.c.styles
	lines := m.helpLines(w)
	if len(lines) <= h {
		return strings.Join(lines, "\n")
	}
	room := max(1, h-1)
	top := min(m.helpTop, len(lines)-room)
	out := append([]string(nil), lines[top:top+room]...)
	return strings.Join(append(out, st.Dim.Render(fmt.Sprintf("── %s scroll (%d–%d of %d) · %s closes", "↑/↓", top+1, top+room, len(lines), m.helpKeys.Close.Help().Key))), "\n")
}

// helpLines are the lines of the help overlay at width w.
func (m Model) helpLines(w int) []string {
	st := m.c.styles
	var groups [][]key.Binding
	var title string
	switch m.active {
	case screenReport:
		groups, title = m.report.keys.FullHelp(), "Report"
	case screenFamilies:
		groups, title = m.families.keys.FullHelp(), "Families"
	case screenMatch:
		groups, title = m.match.keys.FullHelp(), "Match"
	case screenTables:
		groups, title = m.tables.keys.FullHelp(), "Tables"
	}
	var lines []string
	lines = append(lines, st.Header.Render("Keys on the "+title+" screen"))
	lines = append(lines, strings.Split(m.help.FullHelpView(groups), "\n")...)
	lines = append(lines, "", st.Header.Render("Everywhere"))
	lines = append(lines, strings.Split(m.help.FullHelpView(m.keys.FullHelp()), "\n")...)
	lines = append(lines, "", st.Header.Render("Cautions"))
	lines = append(lines, wrap(cautions, w, "")...)
	lines = append(lines, "", st.Header.Render("Terms"))
	for _, t := range terms {
		lines = append(lines, wrap(st.Bold.Render(t[0])+" · "+t[1], w, "    ")...)
	}
	lines = append(lines, "", st.Header.Render("In this help"))
	lines = append(lines, strings.Split(m.help.FullHelpView(m.helpKeys.FullHelp()), "\n")...)
	return lines
}

// terms explains the words the screens use.
var terms = [][2]string{
	{"AARE", "average absolute relative error of the points in the fit, %"},
	{"LOO", "leave-one-out AARE: each point refitted without itself and then predicted; the honest error of a rung"},
	{"depth", "the rung of the tuning ladder: published (no parameter), multiplier, shape (pb: a bend of Rs below Pb; others: a shift), refit (the family's own coefficients, held near their published values); by LOO = the rung with the smallest LOO, a deeper one only when it wins clearly; d sets one"},
	{"pressure scale", "pb: fixed by the report's bubble point, so the tuned Pb equals it exactly"},
	{"ext", "Tables: a saturated row above the tuned Pb, an oil holding more gas than the report's, from the tuned solution-gas pair continued (simulators need it where gas dissolves again); no lab data stands behind it"},
	{"separator basis", "DL volumes and GORs converted to the selected separator test (Bo = Bod·Bofb/Bodb); the tuning uses these"},
}

// cautions are the cautions of DESIGN.md §8.
const cautions = "Correlation results are estimates, valid only near the data they were fitted to. " +
	"Check them against the lab report and local practice. Facility, well-control and reserves " +
	"decisions rest with qualified engineers and with local codes and regulations."

// loadErrorView shows why a report could not be read.
func loadErrorView(c *common, w, h int) string {
	st := c.styles
	lines := []string{st.Err.Render("The report could not be read"), "", "  " + c.s.src, ""}
	var pe *lab.ParseError
	if errors.As(c.s.loadErr, &pe) {
		loc := pe.File
		if pe.Line > 0 {
			loc += fmt.Sprintf(", line %d", pe.Line)
		}
		if pe.Column > 0 {
			loc += fmt.Sprintf(", column %d", pe.Column)
		}
		if pe.Header != "" {
			loc += " (" + pe.Header + ")"
		}
		labelled := func(label, text string) {
			for i, l := range wrap(text, w-9, "") {
				if i == 0 {
					lines = append(lines, "  "+st.Bold.Render(label)+l)
				} else {
					lines = append(lines, "         "+l)
				}
			}
		}
		labelled("where  ", loc)
		msg := pe.Msg
		if msg == "" && pe.Err != nil {
			msg = strings.TrimPrefix(pe.Err.Error(), "lab: ")
		}
		labelled("what   ", msg)
		if pe.Hint != "" {
			labelled("hint   ", pe.Hint)
		}
		lines = append(lines, "")
	}
	if pe == nil {
		lines = append(lines, wrap("  "+c.s.loadErr.Error(), w, "    ")...)
	}
	lines = append(lines, "", st.Dim.Render("Fix the file and open the folder again (labmatch open DIR); q quits."))
	return strings.Join(lines, "\n")
}

// depthText says which rung a property's result is at and how it was chosen.
func depthText(s *session, p fit.PropertyID, r fit.Result) string {
	d := string(r.Depth)
	forced := s.depth[p] != ""
	switch {
	case d == "" && forced:
		d = string(s.depth[p])
	case d == "":
		d = "n/a"
	}
	if s.fromFile[p] {
		return d + " (tuning file)"
	}
	if forced {
		return d + " (set)"
	}
	return d + " (by LOO)"
}

// pctWithUnit formats a percentage pointer as "1.23 %" or "n/a".
func pctWithUnit(v *float64) string {
	if v == nil {
		return "n/a"
	}
	return num(*v, 2) + "\u00a0%"
}
