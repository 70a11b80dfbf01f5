package tui

import (
	"strings"

	"github.com/charmbracelet/bubbles/cursor"
	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/textinput"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

// promptModel asks for the path of a file to save, then, if the file exists, whether to
// overwrite it. It takes every key while it is open.
type promptModel struct {
	state  promptState
	kind   ExportKind
	path   string
	input  textinput.Model
	keys   promptKeys
	render *lipgloss.Renderer
}

type promptState int

const (
	promptClosed promptState = iota
	promptPath
	promptConfirm
)

// promptAction is what the prompt asks the root to do after a key.
type promptAction struct {
	kind   int // promptNone, promptSave, promptOverwrite, promptCancelled
	export ExportKind
	path   string
}

const (
	promptNone = iota
	promptSave
	promptOverwrite
	promptCancelled
)

func newPrompt(r *lipgloss.Renderer) promptModel {
	in := textinput.New()
	in.Prompt = ""
	in.CharLimit = 4096
	in.Cursor.SetMode(cursor.CursorStatic)
	in.Cursor.Style = r.NewStyle().Reverse(true)
	in.TextStyle = r.NewStyle()
	in.PlaceholderStyle = r.NewStyle()
	return promptModel{input: in, keys: newPromptKeys(), render: r}
}

func (p promptModel) active() bool { return p.state != promptClosed }

// open asks for the path of a file of kind k, proposing def.
func (p promptModel) open(k ExportKind, def string) promptModel {
	p.state, p.kind = promptPath, k
	p.input.SetValue(def)
	p.input.CursorEnd()
	p.input.Focus()
	return p
}

// askOverwrite asks whether to overwrite path.
func (p promptModel) askOverwrite(k ExportKind, path string) promptModel {
	p.state, p.kind, p.path = promptConfirm, k, path
	p.input.Blur()
	return p
}

func (p promptModel) update(msg tea.KeyMsg) (promptModel, promptAction) {
	switch p.state {
	case promptPath:
		switch {
		case key.Matches(msg, p.keys.Cancel):
			p.state = promptClosed
			p.input.Blur()
			return p, promptAction{kind: promptCancelled}
		case key.Matches(msg, p.keys.Accept):
			path := strings.TrimSpace(p.input.Value())
			if path == "" {
				return p, promptAction{}
			}
			p.state = promptClosed
			p.input.Blur()
			return p, promptAction{kind: promptSave, export: p.kind, path: path}
		}
		var cmd tea.Cmd
		p.input, cmd = p.input.Update(msg)
		_ = cmd // the cursor does not blink: no command to run
		return p, promptAction{}
	case promptConfirm:
		switch {
		case key.Matches(msg, p.keys.Yes):
			p.state = promptClosed
			return p, promptAction{kind: promptOverwrite, export: p.kind, path: p.path}
		case key.Matches(msg, p.keys.No):
			p.state = promptClosed
			return p, promptAction{kind: promptCancelled}
		}
	}
	return p, promptAction{}
}

// view is the prompt's line, in place of the status line.
func (p promptModel) view(w int, st Styles) string {
	switch p.state {
	case promptPath:
		label := st.Prompt.Render("save " + p.kind.String() + " to: ")
		p.input.Width = max(10, w-lipgloss.Width(label)-1)
		return cell(label+p.input.View(), w)
	case promptConfirm:
		return cell(st.Warn.Render(p.path+" exists. Overwrite it? (y/n)"), w)
	}
	return ""
}

// keysHelp is the help of the prompt's current question.
func (p promptModel) keysHelp() help.KeyMap {
	if p.state == promptConfirm {
		return confirmHelp{p.keys}
	}
	return p.keys
}
