package tui

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"labmatch/export"
	"labmatch/fit"
	"labmatch/lab"
)

// session is the loaded report and the state of its tuning. The root model owns it and changes
// it only in Update, from messages; the screens read it. Commands are given copies of what they
// need, never the session itself, so that nothing is shared with a running command.
type session struct {
	tool     string
	src      string // what was opened: a folder or "demo:<id>"
	loading  bool
	loadErr  error // the report could not be read
	report   *lab.Report
	findings []lab.Finding
	info     reportInfo
	ds       *fit.Dataset
	dsErr    error            // the report gives no tuning dataset (no separator test, …)
	props    []fit.PropertyID // properties with lab data, in order

	loss     fit.Loss
	excluded map[fit.PropertyID][]int     // sorted indexes into ds.Points[p]
	depth    map[fit.PropertyID]fit.Depth // forced rung; "" = chosen by leave-one-out
	fromFile map[fit.PropertyID]bool      // the rung is the tuning file's, not changed since
	choice   fit.Choice
	results  map[fit.PropertyID]fit.Result
	fitErr   map[fit.PropertyID]error
	curves   map[fit.PropertyID]curveSet
	ranking  fit.Ranking
	compare  map[fit.PropertyID][]string // families laid over the Match plot, in marking order
	compared map[fit.PropertyID]map[string]comparedFit

	started   bool // the first tuning has arrived
	seq       map[fit.PropertyID]int
	busy      map[fit.PropertyID]bool
	cmpSeq    map[fit.PropertyID]int
	rankSeq   int
	rankDirty map[fit.PropertyID]bool
	rankBusy  bool
	rankDelay time.Duration
	tableSeq  int
	table     tableData
	tableBusy bool

	tuningPath  string // --tuning file
	tuningForce bool
	tuningNote  string // what happened to it, for the Report screen
}

// reportInfo is what the Report screen shows beside the lab tables, worked out once on load.
type reportInfo struct {
	basis    lab.SeparatorBasis
	basisErr error
	yfit     lab.YFit
	yErr     error
	psat     lab.PsatEstimate
	psatErr  error
	co       lab.CoFit
	coErr    error
	fluid    lab.FluidType
	fluidWhy string
}

// curveSet is one property's published and tuned curves on the plot's pressure grid.
type curveSet struct {
	ps, published, tuned []float64
}

// comparedFit is another family tuned to the same property, for the plot.
type comparedFit struct {
	res   fit.Result
	curve []float64
	err   error
}

func newSession(tool, src string) *session {
	return &session{
		tool: tool, src: src, loss: fit.Relative,
		excluded: map[fit.PropertyID][]int{}, depth: map[fit.PropertyID]fit.Depth{}, fromFile: map[fit.PropertyID]bool{},
		choice: fit.Choice{}, results: map[fit.PropertyID]fit.Result{}, fitErr: map[fit.PropertyID]error{},
		curves: map[fit.PropertyID]curveSet{}, compare: map[fit.PropertyID][]string{},
		compared: map[fit.PropertyID]map[string]comparedFit{},
		seq:      map[fit.PropertyID]int{}, busy: map[fit.PropertyID]bool{}, cmpSeq: map[fit.PropertyID]int{},
		rankDirty: map[fit.PropertyID]bool{}, rankDelay: 250 * time.Millisecond,
	}
}

// options are the fit options as the session stands: every property's forced rung (the
// others chosen by leave-one-out), the loss and a copy of the excluded points. They hold for
// any property, so that a chained fit (TuneAll for the live-oil viscosities) tunes each
// property of the chain at its own rung.
func (s *session) options() fit.Options {
	ex := map[fit.PropertyID][]int{}
	for q, idx := range s.excluded {
		if len(idx) > 0 {
			ex[q] = append([]int(nil), idx...)
		}
	}
	var pd map[fit.PropertyID]fit.Depth
	for q, d := range s.depth {
		if d != "" {
			if pd == nil {
				pd = map[fit.PropertyID]fit.Depth{}
			}
			pd[q] = d
		}
	}
	return fit.Options{PropertyDepth: pd, Loss: s.loss, Excluded: ex}
}

// anyBusy reports whether a fit of any property is running.
func (s *session) anyBusy() bool {
	for _, b := range s.busy {
		if b {
			return true
		}
	}
	return false
}

// isExcluded reports whether point i of property p is left out.
func (s *session) isExcluded(p fit.PropertyID, i int) bool {
	for _, j := range s.excluded[p] {
		if j == i {
			return true
		}
	}
	return false
}

// toggleExcluded leaves point i of p out, or puts it back. It refuses to leave the last point
// out and returns why.
func (s *session) toggleExcluded(p fit.PropertyID, i int) error {
	if s.isExcluded(p, i) {
		var keep []int
		for _, j := range s.excluded[p] {
			if j != i {
				keep = append(keep, j)
			}
		}
		s.excluded[p] = keep
		return nil
	}
	if len(s.excluded[p])+1 >= len(s.ds.Points[p]) {
		return errors.New("the last point stays in the fit")
	}
	s.excluded[p] = append(s.excluded[p], i)
	sort.Ints(s.excluded[p])
	return nil
}

// snapshot copies what an exporter needs.
func (s *session) snapshot() Snapshot {
	res := map[fit.PropertyID]fit.Result{}
	for p, r := range s.results {
		res[p] = r
	}
	opts := s.options()
	return Snapshot{Tool: s.tool, Report: s.report, Dataset: s.ds, Results: res, Options: opts, Model: s.table.model, Table: s.table.table}
}

// dependents are the properties whose fit uses p's tuned result (the live-oil viscosities use
// the tuned dead-oil viscosity and viscosity at Pb when the report lacks measurements).
func dependents(ds *fit.Dataset, p fit.PropertyID) []fit.PropertyID {
	switch {
	case p == fit.MuDead && ds.MuDeadLab == 0:
		return []fit.PropertyID{fit.MuSat, fit.MuUnder}
	case p == fit.MuSat && ds.MuBLab == 0:
		return []fit.PropertyID{fit.MuUnder}
	}
	return nil
}

// chained reports whether p's fit needs the tuned results of other properties.
func chained(ds *fit.Dataset, p fit.PropertyID) bool {
	return (p == fit.MuSat && ds.MuDeadLab == 0) || (p == fit.MuUnder && (ds.MuDeadLab == 0 || ds.MuBLab == 0))
}

// tuneProperty tunes family fam to p. Where p depends on other properties' tuned results, it
// runs TuneAll over the given choice so that the chain is the one the command line uses.
func tuneProperty(ds *fit.Dataset, p fit.PropertyID, fam string, opts fit.Options, choice fit.Choice) (fit.Result, error) {
	if !chained(ds, p) {
		return fit.Tune(ds, p, fam, opts)
	}
	ch := fit.Choice{}
	for q, f := range choice {
		ch[q] = f
	}
	ch[p] = fam
	rs, err := fit.TuneAll(ds, ch, opts)
	if err != nil {
		return fit.Result{}, err
	}
	r, ok := rs[p]
	if !ok {
		return fit.Result{}, fmt.Errorf("fit: %s: no result", p)
	}
	return r, nil
}

// ---- messages

// loadedMsg carries a report read from disk (or the demo store) and what was worked out of it.
type loadedMsg struct {
	report    *lab.Report
	err       error
	findings  []lab.Finding
	info      reportInfo
	ds        *fit.Dataset
	dsErr     error
	tuning    *export.TuningFile
	tuningErr error
}

// startedMsg carries the first tuning of every property and the ranking.
type startedMsg struct {
	ranking fit.Ranking
	results map[fit.PropertyID]fit.Result
	errs    map[fit.PropertyID]error
	curves  map[fit.PropertyID]curveSet
	loss    fit.Loss
	exclude map[fit.PropertyID][]int
	note    string
	applied bool // the results are a tuning file's
}

// fitMsg carries one property's refit. seq tells a stale result from the current one.
type fitMsg struct {
	prop  fit.PropertyID
	seq   int
	res   fit.Result
	curve curveSet
	err   error
}

// rankDueMsg fires when the ranking may be refreshed (the user paused).
type rankDueMsg struct{ seq int }

// rankMsg carries refreshed ranking entries of some properties.
type rankMsg struct {
	seq     int
	entries map[fit.PropertyID][]fit.RankEntry
}

// compareMsg carries the families compared on one property's plot.
type compareMsg struct {
	prop fit.PropertyID
	seq  int
	fits map[string]comparedFit
}

// tableMsg carries the black-oil table of the tuned model.
type tableMsg struct {
	seq   int
	table tableData
}

// savedMsg reports a save.
type savedMsg struct {
	kind ExportKind
	path string
	err  error
}

// ---- commands

// loadCmd reads the report, checks it, builds its dataset and reads the tuning file.
func loadCmd(load func() (*lab.Report, error), tuningPath string) tea.Cmd {
	return func() tea.Msg {
		r, err := load()
		if err != nil {
			return loadedMsg{err: err}
		}
		msg := loadedMsg{report: r, findings: lab.Check(r), info: analyse(r)}
		msg.ds, msg.dsErr = fit.NewDataset(r)
		if tuningPath != "" {
			tf, err := export.LoadTuning(tuningPath)
			if err != nil {
				msg.tuningErr = err
			} else {
				msg.tuning = &tf
			}
		}
		return msg
	}
}

func analyse(r *lab.Report) reportInfo {
	var in reportInfo
	in.basis, in.basisErr = r.SeparatorBasis()
	if len(r.CCE) > 0 {
		in.yfit, in.yErr = lab.FitY(r.Fluid.Pb, r.CCE)
		in.psat, in.psatErr = lab.ImpliedPsat(r.Fluid.Pb, r.CCE)
		_, in.co, in.coErr = lab.UndersaturatedCo(r.Fluid.Pb, r.CCE)
	}
	bob, rsb := 0.0, 0.0
	if in.basisErr == nil {
		bob, rsb = in.basis.Bofb, in.basis.Rsfb
	} else if i := r.BubblePointStage(); i >= 0 {
		bob, rsb = r.DL[i].Bod, r.DL[i].Rsd
	}
	in.fluid, in.fluidWhy = lab.Classify(rsb, r.Fluid.API, bob)
	return in
}

// startCmd ranks every family and tunes the best of each property, or applies a tuning file.
func startCmd(ds *fit.Dataset, r *lab.Report, tf *export.TuningFile, force bool) tea.Cmd {
	return func() tea.Msg {
		msg := startedMsg{errs: map[fit.PropertyID]error{}, curves: map[fit.PropertyID]curveSet{}, loss: fit.Relative}
		opts := fit.Options{Loss: fit.Relative}
		if tf != nil {
			if err := tf.Matches(r, force); err != nil {
				msg.note = "tuning file not applied: " + err.Error()
				tf = nil
			}
		}
		if tf != nil {
			fo := tf.FitOptions()
			res, err := fit.Apply(ds, tf.Results(), fo)
			if err != nil {
				msg.note = "tuning file not applied: " + err.Error()
			} else {
				msg.results, msg.loss, msg.exclude, msg.applied = res, fo.Loss, fo.Excluded, true
				msg.note = "tuning file applied: its families, rungs and parameters"
				// The file fixes each property's rung: rank the families at it too.
				pd := map[fit.PropertyID]fit.Depth{}
				for p, r := range res {
					if r.Depth != "" {
						pd[p] = r.Depth
					}
				}
				opts = fit.Options{Loss: fo.Loss, Excluded: fo.Excluded, PropertyDepth: pd}
			}
		}
		msg.ranking = fit.Rank(ds, opts)
		if msg.results == nil {
			choice := fit.Choice{}
			for _, p := range fit.Properties {
				if f, ok := msg.ranking.Best(p); ok {
					choice[p] = f
				}
			}
			res, err := fit.TuneAll(ds, choice, opts)
			if err != nil { // tune what can be tuned, one property at a time
				res = map[fit.PropertyID]fit.Result{}
				for _, p := range fit.Properties {
					if len(ds.Points[p]) == 0 {
						continue
					}
					f, ok := choice[p]
					if !ok {
						msg.errs[p] = fmt.Errorf("fit: %s: no family can be evaluated for this report", p)
						continue
					}
					r, err := tuneProperty(ds, p, f, opts, choice)
					if err != nil {
						msg.errs[p] = err
						continue
					}
					res[p] = r
				}
			}
			msg.results = res
		}
		for p, r := range msg.results {
			msg.curves[p] = curvesFor(ds, p, r, opts)
		}
		return msg
	}
}

// fitCmd refits one property.
func fitCmd(ds *fit.Dataset, p fit.PropertyID, fam string, opts fit.Options, choice fit.Choice, seq int) tea.Cmd {
	return func() tea.Msg {
		r, err := tuneProperty(ds, p, fam, opts, choice)
		if err != nil {
			return fitMsg{prop: p, seq: seq, err: err}
		}
		return fitMsg{prop: p, seq: seq, res: r, curve: curvesFor(ds, p, r, opts)}
	}
}

// rankDueCmd waits for the user to pause before the ranking is refreshed.
func rankDueCmd(delay time.Duration, seq int) tea.Cmd {
	if delay <= 0 {
		return func() tea.Msg { return rankDueMsg{seq: seq} }
	}
	return tea.Tick(delay, func(time.Time) tea.Msg { return rankDueMsg{seq: seq} })
}

// rankCmd ranks the families of the given properties (each at its own forced rung, through
// opts.PropertyDepth).
func rankCmd(ds *fit.Dataset, props []fit.PropertyID, opts fit.Options, seq int) tea.Cmd {
	return func() tea.Msg {
		out := map[fit.PropertyID][]fit.RankEntry{}
		rk := fit.Rank(ds, opts)
		for _, p := range props {
			out[p] = rk[p]
		}
		return rankMsg{seq: seq, entries: out}
	}
}

// compareCmd tunes the compared families of one property.
func compareCmd(ds *fit.Dataset, p fit.PropertyID, fams []string, opts fit.Options, choice fit.Choice, seq int) tea.Cmd {
	return func() tea.Msg {
		out := map[string]comparedFit{}
		ps := plotGrid(ds, p)
		for _, f := range fams {
			r, err := tuneProperty(ds, p, f, opts, choice)
			if err != nil {
				out[f] = comparedFit{err: err}
				continue
			}
			c, err := fit.Curve(ds, p, f, r.Params, opts, ps)
			out[f] = comparedFit{res: r, curve: clipCurve(ds, p, ps, c), err: err}
		}
		return compareMsg{prop: p, seq: seq, fits: out}
	}
}

// tableCmd builds the tuned model and its black-oil table.
func tableCmd(ds *fit.Dataset, r *lab.Report, tool string, results map[fit.PropertyID]fit.Result, opts fit.Options, seq int) tea.Cmd {
	return func() tea.Msg { return tableMsg{seq: seq, table: buildTable(ds, r, tool, results, opts)} }
}

// saveCmd writes one file through its exporter.
func saveCmd(e Exporter, kind ExportKind, path string, snap Snapshot, force bool) tea.Cmd {
	return func() tea.Msg { return savedMsg{kind: kind, path: path, err: e.Export(path, snap, force)} }
}

// ---- curves

// plotPoints is the number of pressures a curve is evaluated at.
const plotPoints = 161

// plotRange is the pressure span (psia) of a property's plot: from atmospheric pressure to
// above Pb for the saturated properties, from just below Pb to the highest lab pressure for
// the undersaturated ones.
func plotRange(ds *fit.Dataset, p fit.PropertyID) (lo, hi float64) {
	pmax := ds.Pb
	for _, pt := range ds.Points[p] {
		pmax = math.Max(pmax, pt.Pressure)
	}
	switch p {
	case fit.Co, fit.MuUnder:
		lo = math.Min(ds.Pb, ds.CCEPsat)
		if lo <= 0 {
			lo = ds.Pb
		}
		return lo - 0.04*(pmax-lo), pmax + 0.04*(pmax-lo)
	case fit.MuDead:
		return 0, 100
	}
	return 0, pmax * 1.1 // room beyond Pb for its mark and the flat Rs above it
}

// plotGrid is the pressure grid of a property's plot, with Pb itself on it.
func plotGrid(ds *fit.Dataset, p fit.PropertyID) []float64 {
	lo, hi := plotRange(ds, p)
	ps := make([]float64, 0, plotPoints+1)
	for i := 0; i < plotPoints; i++ {
		ps = append(ps, lo+(hi-lo)*float64(i)/float64(plotPoints-1))
	}
	if ds.Pb > lo && ds.Pb < hi {
		ps = append(ps, ds.Pb)
		sort.Float64s(ps)
	}
	if ps[0] <= 0 {
		ps[0] = math.Min(ds.StdPressure, ps[1]/2)
	}
	return ps
}

// clipCurve blanks a saturated property's curve above Pb, where its correlation says nothing
// about the report's oil.
func clipCurve(ds *fit.Dataset, p fit.PropertyID, ps, c []float64) []float64 {
	if p != fit.Bo && p != fit.MuSat {
		return c
	}
	for i, x := range ps {
		if x > ds.Pb*(1+1e-9) {
			c[i] = math.NaN()
		}
	}
	return c
}

func curvesFor(ds *fit.Dataset, p fit.PropertyID, r fit.Result, opts fit.Options) curveSet {
	ps := plotGrid(ds, p)
	cs := curveSet{ps: ps}
	if c, err := fit.Curve(ds, p, r.Family, fit.Published, opts, ps); err == nil {
		cs.published = clipCurve(ds, p, ps, c)
	}
	if c, err := fit.Curve(ds, p, r.Family, r.Params, opts, ps); err == nil {
		cs.tuned = clipCurve(ds, p, ps, c)
	}
	return cs
}

// ---- the black-oil table

// rowKind says what a table row is.
type rowKind int

const (
	rowSaturated rowKind = iota // the oil at its bubble point, at or below the tuned Pb
	rowExtrap                   // a saturated row above Pb: an oil with more gas than the report's
	rowBranch                   // an undersaturated point of a saturated row's branch
)

type tableRow struct {
	kind rowKind
	st   fit.State
	err  error
}

// tableData is the black-oil table of the tuned model as the table files hold it
// (export.BuildTable with tableOptions): the saturated rows and, for each, its undersaturated
// branch; the Pb row's branch is the report's oil above its bubble point.
type tableData struct {
	model    *fit.Model
	table    *export.Table
	err      error
	rows     []tableRow   // saturated rows, rising pressure
	branches [][]tableRow // branches[i] follows rows[i]
	noBranch []string     // why rows[i] has no branch, "" when it has one
}

// tableOptions are the options of the black-oil table of a report: the export package's
// default grid up to the report's highest pressure, and its default water salinity. The
// table files written from the Tables screen use the same (see Snapshot.Table).
func tableOptions(r *lab.Report) export.TableOptions {
	o := export.TableOptions{Salinity: export.DefaultSalinity}
	if r != nil {
		o.MaxLabPressure = export.MaxLabPressure(r)
	}
	return o
}

func buildTable(ds *fit.Dataset, r *lab.Report, tool string, results map[fit.PropertyID]fit.Result, opts fit.Options) tableData {
	m, err := fit.NewModel(ds, results, opts)
	if err != nil {
		return tableData{err: err}
	}
	fp := ""
	if r != nil {
		fp = r.Fingerprint
	}
	t, err := export.BuildTable(m, export.NewSource(tool, ds.Name, fp, "tuned in the workbench", m, results), tableOptions(r))
	if err != nil {
		return tableData{model: m, err: err}
	}
	td := tableData{model: m, table: t}
	for _, row := range t.Rows {
		kind := rowSaturated
		if row.Extrapolated {
			kind = rowExtrap
		}
		td.rows = append(td.rows, tableRow{kind: kind, st: row.State})
		var br []tableRow
		for _, b := range row.Branch {
			br = append(br, tableRow{kind: rowBranch, st: b})
		}
		td.branches = append(td.branches, br)
		td.noBranch = append(td.noBranch, row.NoBranch)
	}
	return td
}

// ---- requests: each bumps a sequence number so that an older answer is recognised and dropped

// refit starts a new fit of property p with its chosen family and the session's options.
func (s *session) refit(p fit.PropertyID) tea.Cmd {
	fam, ok := s.choice[p]
	if !ok || s.ds == nil {
		return nil
	}
	s.seq[p]++
	s.busy[p] = true
	return fitCmd(s.ds, p, fam, s.options(), s.choiceCopy(), s.seq[p])
}

// refitAll refits every property (after a change of the objective).
func (s *session) refitAll() tea.Cmd {
	var cmds []tea.Cmd
	for _, p := range s.props {
		cmds = append(cmds, s.refit(p))
	}
	return tea.Batch(cmds...)
}

func (s *session) choiceCopy() fit.Choice {
	ch := fit.Choice{}
	for p, f := range s.choice {
		ch[p] = f
	}
	return ch
}

// requestRank marks p's ranking as out of date and asks for a refresh once the user pauses.
func (s *session) requestRank(p fit.PropertyID) tea.Cmd {
	s.rankDirty[p] = true
	s.rankSeq++
	return rankDueCmd(s.rankDelay, s.rankSeq)
}

func (s *session) onRankDue(msg rankDueMsg) tea.Cmd {
	if msg.seq != s.rankSeq || len(s.rankDirty) == 0 {
		return nil
	}
	var props []fit.PropertyID
	for p := range s.rankDirty {
		props = append(props, p)
	}
	s.rankBusy = true
	return rankCmd(s.ds, props, s.options(), msg.seq)
}

func (s *session) onRank(msg rankMsg) {
	if msg.seq != s.rankSeq {
		return // the options changed meanwhile; a newer ranking is due
	}
	s.rankBusy = false
	if s.ranking == nil {
		s.ranking = fit.Ranking{}
	}
	for p, es := range msg.entries {
		s.ranking[p] = es
		delete(s.rankDirty, p)
	}
}

// requestCompare refreshes the families compared on p's plot.
func (s *session) requestCompare(p fit.PropertyID) tea.Cmd {
	s.cmpSeq[p]++
	if len(s.compare[p]) == 0 {
		delete(s.compared, p)
		return nil
	}
	return compareCmd(s.ds, p, append([]string(nil), s.compare[p]...), s.options(), s.choiceCopy(), s.cmpSeq[p])
}

func (s *session) onCompare(msg compareMsg) {
	if msg.seq != s.cmpSeq[msg.prop] {
		return
	}
	s.compared[msg.prop] = msg.fits
}

// requestTable rebuilds the tuned model and its table.
func (s *session) requestTable() tea.Cmd {
	if s.ds == nil || len(s.results) == 0 {
		return nil
	}
	s.tableSeq++
	s.tableBusy = true
	res := map[fit.PropertyID]fit.Result{}
	for p, r := range s.results {
		res[p] = r
	}
	return tableCmd(s.ds, s.report, s.tool, res, s.options(), s.tableSeq)
}

func (s *session) onTable(msg tableMsg) {
	if msg.seq != s.tableSeq {
		return
	}
	s.tableBusy = false
	s.table = msg.table
}
