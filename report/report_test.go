package report

import (
	"strings"
	"testing"
)

// TestHTML checks the page text, the inlined SVG (declaration dropped, fixed size removed,
// viewBox kept), escaping of text, and the refusal of figures that would load something.
func TestHTML(t *testing.T) {
	t.Parallel()
	svg := []byte(`<?xml version="1.0"?>
<!-- made by a test -->
<svg width="453.54pt" height="680.31pt" viewBox="0 0 453.54 680.31" xmlns="http://www.w3.org/2000/svg"><text>E/N</text></svg>`)
	p := Page{Title: "shot <1>", Caution: "high voltage", Sections: []Section{
		{Heading: "Summary", Paragraphs: []string{"lases & more"}, Table: &Table{Head: []string{"a", "b"}, Rows: [][]string{{"energy", "264 µJ"}}}},
		{Heading: "Figures", Figures: []Figure{{ID: "f1", Caption: "the pulse", SVG: svg}}},
	}}
	b, err := HTML(p)
	if err != nil {
		t.Fatal(err)
	}
	h := string(b)
	for _, want := range []string{"<title>shot &lt;1&gt;</title>", `<p class="caution">high voltage</p>`, "lases &amp; more",
		"<td>264 µJ</td>", `<figure id="f1">`, `<svg viewBox="0 0 453.54 680.31"`, "<text>E/N</text>", "<figcaption>the pulse</figcaption>"} {
		if !strings.Contains(h, want) {
			t.Errorf("no %q in\n%s", want, h)
		}
	}
	for _, bad := range []string{"<?xml", "made by a test", `width="453.54pt"`} {
		if strings.Contains(h, bad) {
			t.Errorf("%q left in the page", bad)
		}
	}
	for _, evil := range []string{`<svg><script>alert(1)</script></svg>`, `<svg><image href="http://example.invalid/x.png"/></svg>`, "no svg here"} {
		p.Sections[1].Figures[0].SVG = []byte(evil)
		if _, err := HTML(p); err == nil {
			t.Errorf("accepted figure %q", evil)
		}
	}
}
