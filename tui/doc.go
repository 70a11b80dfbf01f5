// Package tui is labmatch's terminal workbench (DESIGN.md §7), built on bubbletea, bubbles and
// lipgloss. A root model (app.go) routes messages: the window size and the session's messages
// to the session, keys to the path prompt, the help, the global bindings or the active screen.
// The four screens each have a file: Report (report.go: the lab tables with QC findings beside
// their rows), Families (families.go: every family of a property, ranked), Match (match.go: the
// residual table, the plot, the parameters and the ladder of depths) and Tables (tables.go:
// the black-oil table of the tuned model and the save keys). Key maps (keys.go) are structs of
// key.Binding, so that help is drawn from the bindings that drive behaviour; styles
// (styles.go) are made for one lipgloss renderer; plot.go is a small braille plotter.
//
// Fits, rankings, tables and file I/O run as tea.Cmds (session.go) that return messages; each
// request carries a sequence number and an answer older than the latest request is dropped, so
// Update never blocks and never draws a stale fit.
package tui
