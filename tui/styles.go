package tui

import "github.com/charmbracelet/lipgloss"

// The workbench's own colour scheme, "core box": the warm ochre of a core tray for what the
// lab measured, a sea-green for what labmatch tuned, slate for the published correlations,
// and three muted hues for families laid over the plot for comparison. Every colour has a
// light and a dark variant so that it reads on both backgrounds; nothing relies on colour
// alone (points, curves and the cursor also differ in glyph or pattern).
var (
	colAccent    = lipgloss.AdaptiveColor{Light: "#8A5200", Dark: "#E3A857"} // ochre: lab data, titles
	colTuned     = lipgloss.AdaptiveColor{Light: "#00695C", Dark: "#5CCFB9"} // sea-green
	colPublished = lipgloss.AdaptiveColor{Light: "#52606D", Dark: "#A3B1BF"} // slate
	colDim       = lipgloss.AdaptiveColor{Light: "#7B8794", Dark: "#7B8794"}
	colError     = lipgloss.AdaptiveColor{Light: "#B3261E", Dark: "#FF8A80"}
	colWarning   = lipgloss.AdaptiveColor{Light: "#9C4A00", Dark: "#FFB866"}
	colCursorBg  = lipgloss.AdaptiveColor{Light: "#E4E9EE", Dark: "#2E3A46"}
	colOverlay   = []lipgloss.AdaptiveColor{
		{Light: "#6A3FA0", Dark: "#C3A6F0"}, // heather
		{Light: "#5A6B00", Dark: "#C6D67A"}, // lichen
		{Light: "#A0335E", Dark: "#F2A2C0"}, // rhodochrosite
	}
)

// Styles are the lipgloss styles of every part of the workbench, made for one renderer.
type Styles struct {
	Title, Tab, TabActive, Header, Status, Busy lipgloss.Style
	Dim, Bold, Err, Warn, Note, Good            lipgloss.Style
	Cursor                                      lipgloss.Style // the row under the cursor
	Lab, Excluded, Tuned, Published, Pb, Axis   lipgloss.Style
	Overlay                                     []lipgloss.Style
	HelpKey, HelpDesc, HelpSep                  lipgloss.Style
	Prompt                                      lipgloss.Style
}

// NewStyles builds the styles on renderer r. With noColor the styles keep bold, underline
// and reverse but set no colour (https://no-color.org).
func NewStyles(r *lipgloss.Renderer, noColor bool) Styles {
	n := r.NewStyle
	fg := func(c lipgloss.AdaptiveColor) lipgloss.Style {
		if noColor {
			return n()
		}
		return n().Foreground(c)
	}
	s := Styles{
		Title:     fg(colAccent).Bold(true),
		Tab:       fg(colDim),
		TabActive: fg(colAccent).Bold(true).Underline(true),
		Header:    n().Bold(true),
		Status:    n(),
		Busy:      fg(colWarning),
		Dim:       fg(colDim),
		Bold:      n().Bold(true),
		Err:       fg(colError).Bold(true),
		Warn:      fg(colWarning),
		Note:      fg(colDim),
		Good:      fg(colTuned),
		Lab:       fg(colAccent).Bold(true),
		Excluded:  fg(colDim),
		Tuned:     fg(colTuned),
		Published: fg(colPublished),
		Pb:        fg(colDim),
		Axis:      fg(colDim),
		HelpKey:   fg(colAccent).Bold(true),
		HelpDesc:  n(),
		HelpSep:   fg(colDim),
		Prompt:    fg(colAccent).Bold(true),
	}
	if noColor {
		s.Cursor = n().Reverse(true)
	} else {
		s.Cursor = n().Background(colCursorBg).Bold(true)
	}
	for _, c := range colOverlay {
		s.Overlay = append(s.Overlay, fg(c))
	}
	return s
}

// overlayStyle returns the style of the i-th overlaid family.
func (s Styles) overlayStyle(i int) lipgloss.Style { return s.Overlay[i%len(s.Overlay)] }
