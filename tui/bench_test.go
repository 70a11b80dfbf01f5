package tui

import (
	"testing"

	"labmatch/fit"
)

var sinkView string

// BenchmarkExcludeRefitView is one keystroke on the Match screen at 120×40: space leaves a
// point out, the focused property is refitted at its depth (the command runs here, in line),
// its curves are evaluated, and the new frame is drawn. Target: one frame, under 16 ms on one
// core (go test ./tui -run XXX -bench ExcludeRefit -cpu 1). The ranking and table refreshes
// that follow run in the background in the program and are not part of the frame.
func BenchmarkExcludeRefitView(b *testing.B) {
	for _, p := range []fit.PropertyID{fit.Pb, fit.Bo, fit.MuSat} {
		b.Run(string(p), func(b *testing.B) {
			m := newTest(b, 120, 40)
			m = focus(b, m, p)
			m = press(b, m, "down")
			b.ReportAllocs()
			for b.Loop() {
				next, cmd := m.Update(keyMsg("space"))
				m = next.(Model)
				msg := cmd()
				next, _ = m.Update(msg)
				m = next.(Model)
				sinkView = m.View()
			}
		})
	}
}

// BenchmarkView draws the Match screen at 120×40 without a refit.
func BenchmarkView(b *testing.B) {
	m := newTest(b, 120, 40)
	b.ReportAllocs()
	for b.Loop() {
		sinkView = m.View()
	}
}
