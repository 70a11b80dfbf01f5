package tui

import (
	"math/rand/v2"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

// The monkey: 5,000 random keys and random window sizes down to 20×5 over every screen. No
// panic, and no line of any view wider than the window or more lines than it has. Commands
// run for about half the keys; the others never answer, as if the user kept typing while a
// fit was running.
func TestMonkey(t *testing.T) {
	keys := []string{"1", "2", "3", "4", "tab", "shift+tab", "?", "esc", "up", "down", "left", "right",
		"[", "]", "space", "a", "d", "D", "e", "enter", "c", "C", "u", "s", "i", "h", "n", "N", "g", "G",
		"pgup", "pgdown", "home", "end", "y", "x", "/", "backspace", "j", "k"}
	saves := 0
	fake := ExporterFunc(func(string, Snapshot, bool) error { saves++; return nil })
	m := newTest(t, 100, 30, WithExporter(ExportTuning, fake), WithExporter(ExportTablesCSV, fake),
		WithExporter(ExportDeck, fake), WithExporter(ExportHTML, fake))
	rng := rand.New(rand.NewPCG(9, 2))
	w, h := 100, 30
	for i := 0; i < 5000; i++ {
		if rng.IntN(25) == 0 {
			w, h = 20+rng.IntN(141), 5+rng.IntN(46)
			m = send(t, m, tea.WindowSizeMsg{Width: w, Height: h})
		}
		k := keys[rng.IntN(len(keys))]
		next, cmd := m.Update(keyMsg(k))
		m = next.(Model)
		if rng.IntN(2) == 0 {
			m = run(t, m, cmd)
		}
		v := m.View()
		lines := strings.Split(v, "\n")
		if len(lines) > h {
			t.Fatalf("key %d (%q) at %d×%d: %d lines", i, k, w, h, len(lines))
		}
		for _, l := range lines {
			if lipgloss.Width(l) > w {
				t.Fatalf("key %d (%q) at %d×%d on %v: line %d wide: %q", i, k, w, h, m.active, lipgloss.Width(l), l)
			}
		}
	}
	t.Logf("%d saves through the fake exporter", saves)
}
