package tui

import (
	"bytes"
	"path/filepath"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/exp/teatest"

	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// waitFor waits until the program has drawn every text in the output that follows the last
// wait (teatest polls the output; nothing sleeps here).
func waitFor(t *testing.T, tm *teatest.TestModel, texts ...string) {
	t.Helper()
	teatest.WaitFor(t, tm.Output(), func(b []byte) bool {
		for _, s := range texts {
			if !bytes.Contains(b, []byte(s)) {
				return false
			}
		}
		return true
	}, teatest.WithDuration(20*time.Second), teatest.WithCheckInterval(20*time.Millisecond))
}

func startFlow(t *testing.T, w, h int, opts ...Option) *teatest.TestModel {
	t.Helper()
	opts = append([]Option{WithRenderer(asciiRenderer(), false), WithRankDelay(0), WithTool("labmatch test")}, opts...)
	return teatest.NewTestModel(t, New(opts...), teatest.WithInitialTermSize(w, h))
}

// A user's session in a real program loop: open the demo, leave a point out and see the
// multiplier move, look at the families, save the tuning file, quit; then reopen with it.
func TestFlowTuneSaveReopen(t *testing.T) {
	r, err := samples.Load(samples.Default)
	if err != nil {
		t.Fatal(err)
	}
	ds, err := fit.NewDataset(r)
	if err != nil {
		t.Fatal(err)
	}
	rk := fit.Rank(ds, fit.Options{})
	fam, _ := rk.Best(fit.Bo)
	ref, err := fit.Tune(ds, fit.Bo, fam, fit.Options{Excluded: map[fit.PropertyID][]int{fit.Bo: {1}}})
	if err != nil {
		t.Fatal(err)
	}
	want := "multiplier " + num(ref.Params.Multiplier, 4)
	path := filepath.Join(t.TempDir(), "flow.json")

	tm := startFlow(t, 120, 40)
	waitFor(t, tm, "AARE published")
	tm.Send(keyMsg("right"))
	waitFor(t, tm, "bo · saturated oil FVF")
	tm.Send(keyMsg("down"))
	tm.Send(keyMsg("space"))
	waitFor(t, tm, want)
	tm.Send(keyMsg("2"))
	waitFor(t, tm, "best first")
	tm.Send(keyMsg("4"))
	waitFor(t, tm, "Black-oil table of the tuned model")
	tm.Send(keyMsg("s"))
	waitFor(t, tm, "save tuning file to:")
	tm.Send(tea.KeyMsg{Type: tea.KeyCtrlU}) // clear the proposed name
	tm.Type(path)
	tm.Send(keyMsg("enter"))
	waitFor(t, tm, "tuning file written")
	tm.Send(keyMsg("q"))
	tm.WaitFinished(t, teatest.WithFinalTimeout(10*time.Second))
	final := tm.FinalModel(t).(Model)
	if got := final.c.s.results[fit.Bo].Params.Multiplier; got != ref.Params.Multiplier {
		t.Errorf("final bo multiplier %v, want %v", got, ref.Params.Multiplier)
	}

	tm = startFlow(t, 80, 24, WithTuningFile(path, false))
	waitFor(t, tm, "AARE published")
	tm.Send(keyMsg("right"))
	waitFor(t, tm, want)
	tm.Send(keyMsg("1"))
	waitFor(t, tm, "left of a row")
	tm.Send(keyMsg("q"))
	tm.WaitFinished(t, teatest.WithFinalTimeout(10*time.Second))
}

func TestFlowBrokenReport(t *testing.T) {
	path := filepath.Join("..", "testdata", "bad", "unknown-unit")
	tm := startFlow(t, 80, 24, WithReport(path, func() (*lab.Report, error) { return lab.ReadFolder(path) }))
	waitFor(t, tm, "The report could not be read", "dl.csv, line 2, column 2")
	tm.Send(keyMsg("ctrl+c"))
	tm.WaitFinished(t, teatest.WithFinalTimeout(10*time.Second))
}
