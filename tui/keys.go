package tui

import "github.com/charmbracelet/bubbles/key"

// The key maps. Each is a struct of key.Binding with ShortHelp and FullHelp, so that the help
// overlay and the one-line help are drawn from the same bindings that drive behaviour.

// globalKeys work on every screen.
type globalKeys struct {
	Report, Families, Match, Tables key.Binding
	Next, Prev                      key.Binding
	Help, Quit                      key.Binding
}

func newGlobalKeys() globalKeys {
	return globalKeys{
		Report:   key.NewBinding(key.WithKeys("1"), key.WithHelp("1", "report")),
		Families: key.NewBinding(key.WithKeys("2"), key.WithHelp("2", "families")),
		Match:    key.NewBinding(key.WithKeys("3"), key.WithHelp("3", "match")),
		Tables:   key.NewBinding(key.WithKeys("4"), key.WithHelp("4", "tables")),
		Next:     key.NewBinding(key.WithKeys("tab"), key.WithHelp("tab", "next screen")),
		Prev:     key.NewBinding(key.WithKeys("shift+tab"), key.WithHelp("shift+tab", "previous screen")),
		Help:     key.NewBinding(key.WithKeys("?"), key.WithHelp("?", "help and cautions")),
		Quit:     key.NewBinding(key.WithKeys("q", "ctrl+c"), key.WithHelp("q", "quit")),
	}
}

func (k globalKeys) ShortHelp() []key.Binding { return []key.Binding{k.Help, k.Quit} }

func (k globalKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Report, k.Families, k.Match, k.Tables}, {k.Next, k.Prev, k.Help, k.Quit}}
}

// helpKeys work while the help is open (every other key is ignored then).
type helpKeys struct {
	Up, Down, Close key.Binding
}

func newHelpKeys() helpKeys {
	return helpKeys{
		Up:    key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "scroll up")),
		Down:  key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "scroll down")),
		Close: key.NewBinding(key.WithKeys("?", "esc"), key.WithHelp("?/esc", "close the help")),
	}
}

func (k helpKeys) ShortHelp() []key.Binding { return []key.Binding{k.Up, k.Down, k.Close} }

func (k helpKeys) FullHelp() [][]key.Binding { return [][]key.Binding{{k.Up, k.Down, k.Close}} }

// scrollKeys move through a long list or text.
type scrollKeys struct {
	Up, Down, PageUp, PageDown, Top, Bottom key.Binding
}

func newScrollKeys(what string) scrollKeys {
	return scrollKeys{
		Up:       key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "up")),
		Down:     key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "down")),
		PageUp:   key.NewBinding(key.WithKeys("pgup", "ctrl+u"), key.WithHelp("pgup", "page up")),
		PageDown: key.NewBinding(key.WithKeys("pgdown", "ctrl+d"), key.WithHelp("pgdn", "page down")),
		Top:      key.NewBinding(key.WithKeys("home", "g"), key.WithHelp("home/g", "first "+what)),
		Bottom:   key.NewBinding(key.WithKeys("end", "G"), key.WithHelp("end/G", "last "+what)),
	}
}

// propertyKeys step through the tuned properties (Families and Match).
type propertyKeys struct {
	Prev, Next key.Binding
}

func newPropertyKeys() propertyKeys {
	return propertyKeys{
		Prev: key.NewBinding(key.WithKeys("left", "["), key.WithHelp("←/[", "previous property")),
		Next: key.NewBinding(key.WithKeys("right", "]"), key.WithHelp("→/]", "next property")),
	}
}

// reportKeys drive the Report screen.
type reportKeys struct {
	scrollKeys
	NextFinding, PrevFinding key.Binding
}

func newReportKeys() reportKeys {
	return reportKeys{
		scrollKeys:  newScrollKeys("line"),
		NextFinding: key.NewBinding(key.WithKeys("n"), key.WithHelp("n", "next marked row or finding")),
		PrevFinding: key.NewBinding(key.WithKeys("N"), key.WithHelp("N", "previous marked row or finding")),
	}
}

func (k reportKeys) ShortHelp() []key.Binding {
	return []key.Binding{k.Down, k.PageDown, k.NextFinding}
}

func (k reportKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Up, k.Down, k.PageUp, k.PageDown, k.Top, k.Bottom}, {k.NextFinding, k.PrevFinding}}
}

// familiesKeys drive the Families screen.
type familiesKeys struct {
	Up, Down key.Binding
	propertyKeys
	Pick, Compare, ClearCompare key.Binding
}

func newFamiliesKeys() familiesKeys {
	return familiesKeys{
		Up:           key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "up")),
		Down:         key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "down")),
		propertyKeys: newPropertyKeys(),
		Pick:         key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "use this family")),
		Compare:      key.NewBinding(key.WithKeys("c"), key.WithHelp("c", "compare on the plot")),
		ClearCompare: key.NewBinding(key.WithKeys("C"), key.WithHelp("C", "clear comparisons")),
	}
}

func (k familiesKeys) ShortHelp() []key.Binding {
	return []key.Binding{k.Next, k.Pick, k.Compare}
}

func (k familiesKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Up, k.Down, k.Prev, k.Next}, {k.Pick, k.Compare, k.ClearCompare}}
}

// matchKeys drive the Match screen.
type matchKeys struct {
	Up, Down key.Binding
	propertyKeys
	Exclude, RestoreAll       key.Binding
	DeeperRung, ShallowerRung key.Binding
	Objective                 key.Binding
}

func newMatchKeys() matchKeys {
	return matchKeys{
		Up:            key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "previous point")),
		Down:          key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "next point")),
		propertyKeys:  newPropertyKeys(),
		Exclude:       key.NewBinding(key.WithKeys(" "), key.WithHelp("space", "leave point out / put back")),
		RestoreAll:    key.NewBinding(key.WithKeys("a"), key.WithHelp("a", "put all points back")),
		DeeperRung:    key.NewBinding(key.WithKeys("d"), key.WithHelp("d", "next depth")),
		ShallowerRung: key.NewBinding(key.WithKeys("D"), key.WithHelp("D", "previous depth")),
		Objective:     key.NewBinding(key.WithKeys("e"), key.WithHelp("e", "relative/absolute errors")),
	}
}

func (k matchKeys) ShortHelp() []key.Binding {
	return []key.Binding{k.Exclude, k.Next, k.DeeperRung, k.Objective}
}

func (k matchKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Up, k.Down, k.Prev, k.Next}, {k.Exclude, k.RestoreAll, k.DeeperRung, k.ShallowerRung, k.Objective}}
}

// tablesKeys drive the Tables screen.
type tablesKeys struct {
	scrollKeys
	Branches                                key.Binding
	SaveTuning, SaveCSV, SaveDeck, SaveHTML key.Binding
}

func newTablesKeys() tablesKeys {
	return tablesKeys{
		scrollKeys: newScrollKeys("row"),
		Branches:   key.NewBinding(key.WithKeys("u"), key.WithHelp("u", "undersaturated branches")),
		SaveTuning: key.NewBinding(key.WithKeys("s"), key.WithHelp("s", "save tuning file")),
		SaveCSV:    key.NewBinding(key.WithKeys("c"), key.WithHelp("c", "save tables (CSV)")),
		SaveDeck:   key.NewBinding(key.WithKeys("i"), key.WithHelp("i", "save simulator deck")),
		SaveHTML:   key.NewBinding(key.WithKeys("h"), key.WithHelp("h", "save HTML report")),
	}
}

func (k tablesKeys) ShortHelp() []key.Binding {
	return []key.Binding{k.Branches, k.SaveTuning, k.SaveCSV, k.SaveDeck, k.SaveHTML}
}

func (k tablesKeys) FullHelp() [][]key.Binding {
	return [][]key.Binding{{k.Up, k.Down, k.PageUp, k.PageDown, k.Top, k.Bottom}, {k.Branches, k.SaveTuning, k.SaveCSV, k.SaveDeck, k.SaveHTML}}
}

// promptKeys drive the path prompt and the overwrite question.
type promptKeys struct {
	Accept, Cancel, Yes, No key.Binding
}

func newPromptKeys() promptKeys {
	return promptKeys{
		Accept: key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "save")),
		Cancel: key.NewBinding(key.WithKeys("esc", "ctrl+c"), key.WithHelp("esc", "cancel")),
		Yes:    key.NewBinding(key.WithKeys("y", "Y"), key.WithHelp("y", "overwrite")),
		No:     key.NewBinding(key.WithKeys("n", "N", "esc"), key.WithHelp("n", "keep the file")),
	}
}

func (k promptKeys) ShortHelp() []key.Binding { return []key.Binding{k.Accept, k.Cancel} }

func (k promptKeys) FullHelp() [][]key.Binding { return [][]key.Binding{{k.Accept, k.Cancel}} }

// confirmHelp is the help of the overwrite question.
type confirmHelp struct{ promptKeys }

func (k confirmHelp) ShortHelp() []key.Binding  { return []key.Binding{k.Yes, k.No} }
func (k confirmHelp) FullHelp() [][]key.Binding { return [][]key.Binding{{k.Yes, k.No}} }
