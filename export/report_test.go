package export

import (
	"bytes"
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"golang.org/x/net/html"

	"labmatch/fit"
)

var reportDate = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

func reportInput(tu tuned) ReportInput {
	return ReportInput{Tool: "labmatch test", Report: tu.r, Dataset: tu.ds, Results: tu.results, Model: tu.m,
		Origin: "tuned in the test", Generated: reportDate}
}

// htmlFacts walks a parsed page and collects what the checks need.
type htmlFacts struct {
	svgs, scripts, external []string
	text                    strings.Builder
	ids                     map[string]bool
}

func walkHTML(n *html.Node, f *htmlFacts, section string) {
	if n.Type == html.ElementNode {
		for _, a := range n.Attr {
			if a.Key == "id" {
				f.ids[a.Val] = true
				if n.Data == "section" {
					section = a.Val
				}
			}
			key := strings.ToLower(a.Key)
			if strings.HasPrefix(key, "on") {
				f.scripts = append(f.scripts, n.Data+" "+a.Key)
			}
			if (key == "href" || key == "src" || key == "xlink:href" || key == "action" || key == "data" || key == "poster") && !strings.HasPrefix(a.Val, "#") {
				f.external = append(f.external, n.Data+" "+a.Key+"="+a.Val)
			}
			if key == "style" && strings.Contains(a.Val, "url(") {
				f.external = append(f.external, n.Data+" style url()")
			}
		}
		switch n.Data {
		case "script", "iframe", "object", "embed", "link", "img", "base", "frame", "audio", "source", "track":
			f.scripts = append(f.scripts, n.Data)
		case "svg":
			f.svgs = append(f.svgs, section)
		case "style":
			if n.FirstChild != nil && (strings.Contains(n.FirstChild.Data, "url(") || strings.Contains(n.FirstChild.Data, "@import")) {
				f.external = append(f.external, "style sheet url() or @import")
			}
		}
	}
	if n.Type == html.TextNode {
		f.text.WriteString(n.Data)
		f.text.WriteByte(' ')
	}
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		walkHTML(c, f, section)
	}
}

func TestReportHTML(t *testing.T) {
	for _, id := range testReports {
		t.Run(id, func(t *testing.T) {
			tu := loadTuned(t, id)
			var b bytes.Buffer
			if err := WriteReport(&b, reportInput(tu)); err != nil {
				t.Fatal(err)
			}
			doc, err := html.Parse(bytes.NewReader(b.Bytes()))
			if err != nil {
				t.Fatal(err)
			}
			f := &htmlFacts{ids: map[string]bool{}}
			walkHTML(doc, f, "")
			// One SVG per tuned property, in its own section.
			if len(f.svgs) != len(tu.results) {
				t.Errorf("%d SVG plots, want one per tuned property (%d)", len(f.svgs), len(tu.results))
			}
			for _, p := range fit.Properties {
				if _, ok := tu.results[p]; ok && !contains(f.svgs, "prop-"+string(p)) {
					t.Errorf("no plot in the section of %s (plots in %v)", p, f.svgs)
				}
			}
			if len(f.scripts) > 0 {
				t.Errorf("script or embedded resources: %v", f.scripts)
			}
			if len(f.external) > 0 {
				t.Errorf("external references: %v", f.external)
			}
			text := strings.Join(strings.Fields(f.text.String()), " ")
			for _, want := range []string{
				"Correlation results are estimates, valid only near the data they were fitted to",
				"qualified engineers and local regulations",
				tu.r.Fingerprint, "labmatch test", "1 December 2026",
				"leave-one-out", "QC findings", "Depth ladder", "Residuals",
			} {
				if !strings.Contains(text, want) {
					t.Errorf("the page does not say %q", want)
				}
			}
			// Every in-page link has its target.
			for _, l := range regexpHrefs(b.String()) {
				if !f.ids[l] {
					t.Errorf("link to #%s has no target", l)
				}
			}
			// Printable: a print style sheet with page breaks; readable on a phone: a viewport.
			for _, want := range []string{"@media print", "break-inside: avoid", `name="viewport"`, "@media (max-width"} {
				if !strings.Contains(b.String(), want) {
					t.Errorf("no %q in the page", want)
				}
			}
		})
	}
}

func regexpHrefs(page string) []string {
	var out []string
	for _, part := range strings.Split(page, `href="#`)[1:] {
		if i := strings.IndexByte(part, '"'); i > 0 {
			out = append(out, part[:i])
		}
	}
	return out
}

func contains(xs []string, s string) bool {
	for _, x := range xs {
		if x == s {
			return true
		}
	}
	return false
}

func TestReportMarksExcludedAndEscapes(t *testing.T) {
	tu := loadTuned(t, "tr3-black")
	opts := fit.Options{Excluded: map[fit.PropertyID][]int{fit.Bo: {2}}}
	res, err := fit.TuneAll(tu.ds, nil, opts)
	if err != nil {
		t.Fatal(err)
	}
	z := res[fit.Z]
	z.NoFit = "even the best family leaves 12 % error (invented remark for the test)"
	res[fit.Z] = z
	tu.results = res
	tu.m = nil
	tu.ds.Name = `TR-3 <script>alert(1)</script> & co`
	in := reportInput(tu)
	in.Model, in.Options = nil, opts
	var b bytes.Buffer
	if err := WriteReport(&b, in); err != nil {
		t.Fatal(err)
	}
	page := b.String()
	if strings.Contains(page, "<script>") || !strings.Contains(page, "&lt;script&gt;") {
		t.Error("the sample name is not escaped")
	}
	// The excluded Bo point: its residual row is marked and the plot draws it in the
	// excluded colour (brick red, #A4243B).
	if !strings.Contains(page, "No good fit.</strong> even the best family leaves 12 % error") {
		t.Error("the no-fit remark is not shown in its property's section")
	}
	if n := strings.Count(page, `<tr class="excluded">`); n != 1 {
		t.Errorf("%d excluded residual rows, want 1", n)
	}
	bo := page[strings.Index(page, `id="prop-bo"`):]
	bo = bo[:strings.Index(bo, "</section>")]
	if !strings.Contains(bo, "#A4243B") || !strings.Contains(bo, "lab, excluded") {
		t.Error("the bo plot does not mark the excluded point")
	}
}

func TestSaveReportAtomic(t *testing.T) {
	tu := loadTuned(t, "tr12-heavy")
	path := filepath.Join(t.TempDir(), "r.html")
	if err := os.WriteFile(path, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := SaveReport(path, reportInput(tu), false); !errors.Is(err, fs.ErrExist) {
		t.Errorf("without force: %v, want fs.ErrExist", err)
	}
	// A report that cannot be made leaves the old file as it was.
	bad := reportInput(tu)
	bad.Results = nil
	if err := SaveReport(path, bad, true); err == nil {
		t.Error("a report without results: no error")
	}
	if b, _ := os.ReadFile(path); string(b) != "old" {
		t.Errorf("old file changed: %.20q", b)
	}
	if err := SaveReport(path, reportInput(tu), true); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(path); !bytes.HasPrefix(b, []byte("<!DOCTYPE html>")) {
		t.Errorf("forced save: %.20q", b)
	}
}
