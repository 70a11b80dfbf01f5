package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestTablesAndReportUsageErrors(t *testing.T) {
	for _, args := range [][]string{
		{"tables"},
		{"tables", "demo:tr3-black", "--format", "xls"},
		{"tables", "demo:tr3-black", "--units", "imperial"},
		{"tables", "demo:tr3-black", "--pmax", "12parsecs"},
		{"tables", "demo:tr3-black", "--step", "100psi", "--points", "20"},
		{"tables", "demo:tr3-black", "--points", "1"},
		{"tables", "demo:tr3-black", "--salinity", "40wt%"},
		{"tables", "demo:tr3-black", "--salinity", "3furlongs"},
		{"tables", "demo:tr3-black", "--step", "-5bar"},
		{"report"},
		{"report", "demo:tr3-black", "demo:tr7-light"},
		{"report", "demo:tr3-black", "--units", "imperial"},
	} {
		code, _, stderr := runCLI(t, args...)
		if code != exitUsage || !strings.Contains(stderr, "Usage") {
			t.Errorf("%v: exit %d, want %d with the usage (stderr %q)", args, code, exitUsage, stderr)
		}
	}
}

func TestTablesCommand(t *testing.T) {
	dir := t.TempDir()
	deck := filepath.Join(dir, "pvt.inc")
	code, out, stderr := runCLI(t, "tables", "demo:tr3-black", "--format", "deck", "--units", "metric", "--step", "20bar", "--salinity", "5wt%", "--out", deck)
	if code != exitOK {
		t.Fatalf("tables --out: exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "deck, metric units") || !strings.Contains(out, "estimates") || !strings.Contains(out, " bara\n") || strings.Contains(out, "psia") {
		t.Errorf("summary: %q", out)
	}
	b, err := os.ReadFile(deck)
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	for _, want := range []string{"PVTO", "PVDG", "PVTW", "DENSITY", "must declare METRIC", "salinity 5 wt %", "P [bara]"} {
		if !strings.Contains(text, want) {
			t.Errorf("deck lacks %q", want)
		}
	}
	// An existing file needs --force, and stays as it was without it.
	if code, _, stderr := runCLI(t, "tables", "demo:tr3-black", "--out", deck); code != exitData || !strings.Contains(stderr, "--force") {
		t.Errorf("overwrite without --force: exit %d, %q", code, stderr)
	}
	if c, _ := os.ReadFile(deck); string(c) != text {
		t.Error("the deck changed without --force")
	}
	if code, _, stderr := runCLI(t, "tables", "demo:tr3-black", "--out", deck, "--force"); code != exitOK {
		t.Errorf("--force: exit %d, %s", code, stderr)
	}
	// CSV to standard output, from a tuning file alone.
	tuning := filepath.Join(dir, "t.json")
	if code, _, stderr := runCLI(t, "tune", "demo:tr7-light", "--save", tuning); code != exitOK {
		t.Fatalf("tune --save: %d %s", code, stderr)
	}
	code, out, stderr = runCLI(t, "tables", tuning, "--points", "5")
	if code != exitOK {
		t.Fatalf("tables TUNING_FILE: exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "row,saturation pressure [psia],pressure [psia],Rs [scf/STB]") || !strings.Contains(out, "from the tuning file") {
		t.Errorf("CSV from a tuning file: %.300q", out)
	}
	// The same tuning applied to its report gives the same rows.
	_, out2, _ := runCLI(t, "tables", "demo:tr7-light", "--tuning", tuning, "--points", "5")
	if body(out) != body(out2) {
		t.Error("tables from the tuning file alone and from the report with --tuning differ")
	}
}

// body drops the comment header of a table file.
func body(s string) string {
	var keep []string
	for _, l := range strings.Split(s, "\n") {
		if !strings.HasPrefix(l, "#") {
			keep = append(keep, l)
		}
	}
	return strings.Join(keep, "\n")
}

func TestTablesRefusedDeckHint(t *testing.T) {
	// A tuning file edited by hand so that the tuned co turns negative at high pressure: the
	// deck is refused with the row, a hint, and no file.
	dir := t.TempDir()
	tuning := filepath.Join(dir, "t.json")
	if code, _, stderr := runCLI(t, "tune", "demo:tr3-black", "--save", tuning); code != exitOK {
		t.Fatalf("tune --save: %d %s", code, stderr)
	}
	raw, err := os.ReadFile(tuning)
	if err != nil {
		t.Fatal(err)
	}
	var tf map[string]any
	if err := json.Unmarshal(raw, &tf); err != nil {
		t.Fatal(err)
	}
	co := tf["properties"].(map[string]any)["co"].(map[string]any)
	co["depth"] = "shape"
	co["parameters"].(map[string]any)["shift"] = -5e-5
	raw, _ = json.Marshal(tf)
	if err := os.WriteFile(tuning, raw, 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "pvt.inc")
	code, _, stderr := runCLI(t, "tables", "demo:tr3-black", "--tuning", tuning, "--format", "deck", "--out", out)
	if code != exitData || !strings.Contains(stderr, "PVTO record") || !strings.Contains(stderr, "Bo must fall") || !strings.Contains(stderr, "hint:") {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
	if _, err := os.Stat(out); err == nil {
		t.Error("a refused deck was written")
	}
}

func TestReportCommand(t *testing.T) {
	out := filepath.Join(t.TempDir(), "r.html")
	code, stdout, stderr := runCLI(t, "report", "demo:tr12-heavy", "--out", out)
	if code != exitOK || !strings.Contains(stdout, "report written") {
		t.Fatalf("report: exit %d: %s", code, stderr)
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(string(b), "<!DOCTYPE html>") || strings.Count(string(b), "<svg") != 7 || !strings.Contains(string(b), "labmatch "+version) {
		t.Errorf("report file: %d bytes, %d plots", len(b), strings.Count(string(b), "<svg"))
	}
	if code, _, _ := runCLI(t, "report", "demo:tr12-heavy", "--out", out); code != exitData {
		t.Errorf("overwrite without --force: exit %d", code)
	}
}

func TestReportCommandMetric(t *testing.T) {
	out := filepath.Join(t.TempDir(), "r.html")
	code, _, stderr := runCLI(t, "report", "demo:tr7-light", "--units", "metric", "--out", out)
	if code != exitOK {
		t.Fatalf("report --units metric: exit %d: %s", code, stderr)
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	page := string(b)
	if strings.Count(page, "pressure [bara]</text>") != 7 || strings.Contains(page, "pressure [psia]") || !strings.Contains(page, " °C</td>") {
		t.Errorf("metric report: %d bara axes, psia axis %v, °C %v", strings.Count(page, "pressure [bara]</text>"),
			strings.Contains(page, "pressure [psia]"), strings.Contains(page, " °C</td>"))
	}
}
