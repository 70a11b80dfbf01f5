package tui

import (
	"fmt"
	"path/filepath"
	"testing"

	"github.com/charmbracelet/x/exp/golden"

	"labmatch/lab"
)

// Golden views of every screen on the default demo report at the smallest supported window
// and a roomy one, drawn with the ASCII profile. Regenerate with go test ./tui -update and
// review the diff before committing it.
func TestGoldenScreens(t *testing.T) {
	for _, size := range [][2]int{{80, 24}, {120, 40}} {
		w, h := size[0], size[1]
		m := newTest(t, w, h)
		for _, k := range []string{"1", "2", "3", "4"} {
			m := press(t, m, k)
			t.Run(fmt.Sprintf("%s_%dx%d", m.active, w, h), func(t *testing.T) {
				v := m.View()
				assertFits(t, v, w, h)
				golden.RequireEqual(t, []byte(v))
			})
		}
		t.Run(fmt.Sprintf("Help_%dx%d", w, h), func(t *testing.T) {
			golden.RequireEqual(t, []byte(press(t, m, "?").View()))
		})
	}
}

// The Match screen with a point left out, a forced depth and two families compared.
func TestGoldenMatchWorked(t *testing.T) {
	m := newTest(t, 120, 40)
	m = press(t, m, "2", "down", "c", "down", "down", "c", "3", "down", "down", "down", "space", "d", "d")
	golden.RequireEqual(t, []byte(m.View()))
}

func TestGoldenBrokenReport(t *testing.T) {
	path := filepath.Join("..", "testdata", "bad", "psig-slip")
	m := newTest(t, 80, 24, WithReport("testdata/bad/psig-slip", func() (*lab.Report, error) { return lab.ReadFolder(path) }))
	golden.RequireEqual(t, []byte(m.View()))
}
