package tui

import (
	"io"
	"os"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"labmatch/lab"
	"labmatch/samples"
)

func TestMain(m *testing.M) {
	// Golden files hold no escape codes: the default renderer (used by bubbles' own styles)
	// and the test renderers draw with the ASCII profile.
	lipgloss.SetColorProfile(termenv.Ascii)
	os.Exit(m.Run())
}

// asciiRenderer draws without any escape code.
func asciiRenderer() *lipgloss.Renderer {
	r := lipgloss.NewRenderer(io.Discard)
	r.SetColorProfile(termenv.Ascii)
	return r
}

// demo opens a built-in demo report.
func demo(id string) Option {
	return WithReport("demo:"+id, func() (*lab.Report, error) { return samples.Load(id) })
}

// newTest makes a workbench for tests: ASCII drawing, no pause before re-ranking, the given
// window size.
func newTest(t testing.TB, w, h int, opts ...Option) Model {
	t.Helper()
	opts = append([]Option{WithRenderer(asciiRenderer(), false), WithRankDelay(0), WithTool("labmatch test")}, opts...)
	m := New(opts...)
	m = send(t, m, tea.WindowSizeMsg{Width: w, Height: h})
	return run(t, m, m.Init())
}

// send delivers one message and runs every command it returns, and theirs, to the end.
func send(t testing.TB, m Model, msg tea.Msg) Model {
	t.Helper()
	next, cmd := m.Update(msg)
	return run(t, next.(Model), cmd)
}

// run runs a command (and the commands its messages lead to) synchronously.
func run(t testing.TB, m Model, cmd tea.Cmd) Model {
	t.Helper()
	queue := []tea.Cmd{cmd}
	for n := 0; len(queue) > 0; n++ {
		if n > 10000 {
			t.Fatal("commands do not settle")
		}
		c := queue[0]
		queue = queue[1:]
		if c == nil {
			continue
		}
		switch msg := c().(type) {
		case nil:
		case tea.BatchMsg:
			queue = append(queue, msg...)
		case tea.QuitMsg:
			return m
		default:
			next, more := m.Update(msg)
			m = next.(Model)
			queue = append(queue, more)
		}
	}
	return m
}

// key builds the message of one key press as bubbletea reports it.
func keyMsg(k string) tea.KeyMsg {
	switch k {
	case "up":
		return tea.KeyMsg{Type: tea.KeyUp}
	case "down":
		return tea.KeyMsg{Type: tea.KeyDown}
	case "left":
		return tea.KeyMsg{Type: tea.KeyLeft}
	case "right":
		return tea.KeyMsg{Type: tea.KeyRight}
	case "enter":
		return tea.KeyMsg{Type: tea.KeyEnter}
	case "tab":
		return tea.KeyMsg{Type: tea.KeyTab}
	case "shift+tab":
		return tea.KeyMsg{Type: tea.KeyShiftTab}
	case "esc":
		return tea.KeyMsg{Type: tea.KeyEsc}
	case "space":
		return tea.KeyMsg{Type: tea.KeySpace, Runes: []rune{' '}}
	case "pgdown":
		return tea.KeyMsg{Type: tea.KeyPgDown}
	case "pgup":
		return tea.KeyMsg{Type: tea.KeyPgUp}
	case "home":
		return tea.KeyMsg{Type: tea.KeyHome}
	case "end":
		return tea.KeyMsg{Type: tea.KeyEnd}
	case "backspace":
		return tea.KeyMsg{Type: tea.KeyBackspace}
	case "ctrl+c":
		return tea.KeyMsg{Type: tea.KeyCtrlC}
	}
	return tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(k)}
}

// press sends keys one after the other, each followed by its commands.
func press(t testing.TB, m Model, keys ...string) Model {
	t.Helper()
	for _, k := range keys {
		m = send(t, m, keyMsg(k))
	}
	return m
}

func sizeMsg(w, h int) tea.WindowSizeMsg { return tea.WindowSizeMsg{Width: w, Height: h} }
