package tui

import tea "github.com/charmbracelet/bubbletea"

// Run opens the workbench in the terminal (alternate screen) and returns when the user quits.
func Run(opts ...Option) error {
	_, err := tea.NewProgram(New(opts...), tea.WithAltScreen()).Run()
	return err
}
