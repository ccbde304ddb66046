// Package report writes a self-contained HTML report: one file holding the text, the tables
// and the figures (inline SVG), with no external files, scripts, fonts or network requests,
// so that it can be sent by mail and opened anywhere. It knows no physics: the command fills a
// Page with what a run, a sweep or a comparison found.
package report

import (
	"bytes"
	"fmt"
	"html/template"
	"os"
	"strings"
	"sync"

	"n2pulse/internal/atomicfile"
)

// FileName is the name of the report in an output directory.
const FileName = "report.html"

// Page is one report.
type Page struct {
	Title    string
	Subtitle string    // one line under the title (what was run, when)
	Caution  string    // the safety caution, shown first in its own box
	Sections []Section // in order
}

// Section is one heading and what stands under it, each part optional, in this order:
// paragraphs, a list, a table, a preformatted block, figures.
type Section struct {
	Heading    string
	Paragraphs []string
	List       []string
	Table      *Table
	Pre        string
	Figures    []Figure
	// Warn marks the section as a warning (drawn with a coloured edge).
	Warn bool
}

// Table is a table of text cells; the first column is a row heading.
type Table struct {
	Head []string
	Rows [][]string
}

// Figure is one figure: SVG text as written by package plots, and its caption.
type Figure struct {
	Caption string
	SVG     []byte
	// ID names the figure in the page (id attribute of its <figure>); tests find figures
	// by it.
	ID string
}

// FigureFile reads an SVG file into a Figure.
func FigureFile(path, id, caption string) (Figure, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return Figure{}, fmt.Errorf("report: %w", err)
	}
	return Figure{ID: id, Caption: caption, SVG: b}, nil
}

// inline returns the <svg> element of an SVG document: from "<svg" to the end, without the
// XML declaration and comments before it, with width and height left to the page's style
// (the viewBox keeps its proportions).
func inline(svg []byte) (template.HTML, error) {
	i := bytes.Index(svg, []byte("<svg"))
	if i < 0 {
		return "", fmt.Errorf("report: a figure is not SVG (no <svg element)")
	}
	s := string(svg[i:])
	end := strings.Index(s, ">")
	if end < 0 {
		return "", fmt.Errorf("report: a figure's <svg element is not closed")
	}
	head := s[:end]
	for _, attr := range []string{"width", "height"} {
		if j := strings.Index(head, " "+attr+"=\""); j >= 0 {
			k := strings.Index(head[j+len(attr)+3:], "\"")
			if k >= 0 {
				head = head[:j] + head[j+len(attr)+3+k+1:]
			}
		}
	}
	low := strings.ToLower(s)
	for _, bad := range []string{"<script", "href=\"http", "href='http", "url(http"} {
		if strings.Contains(low, bad) {
			return "", fmt.Errorf("report: a figure holds %q: figures must be self-contained", bad)
		}
	}
	return template.HTML(head + s[end:]), nil // #nosec: SVG written by package plots
}

// HTML renders the page.
func HTML(p Page) ([]byte, error) {
	type fig struct {
		ID, Caption string
		SVG         template.HTML
	}
	type sec struct {
		Section
		Figs []fig
	}
	data := struct {
		Page
		Secs []sec
	}{Page: p}
	for _, s := range p.Sections {
		sc := sec{Section: s}
		for _, f := range s.Figures {
			h, err := inline(f.SVG)
			if err != nil {
				return nil, fmt.Errorf("%w (figure %q)", err, f.ID)
			}
			sc.Figs = append(sc.Figs, fig{ID: f.ID, Caption: f.Caption, SVG: h})
		}
		data.Secs = append(data.Secs, sc)
	}
	var b bytes.Buffer
	if err := page().Execute(&b, data); err != nil {
		return nil, fmt.Errorf("report: %w", err)
	}
	return b.Bytes(), nil
}

// Write renders the page into path, atomically.
func Write(path string, p Page) error {
	b, err := HTML(p)
	if err != nil {
		return err
	}
	if err := atomicfile.WriteFile(path, b); err != nil {
		return fmt.Errorf("report: %w", err)
	}
	return nil
}

// page is the page's template, parsed at its first use rather than at start-up: most runs of
// the program write no report.
var page = sync.OnceValue(func() *template.Template {
	return template.Must(template.New("report").Parse(pageText))
})

const pageText = `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<title>{{.Title}}</title>
<style>
body { font-family: serif; max-width: 60em; margin: 1em auto; padding: 0 1em; color: #111; line-height: 1.35; }
h1 { font-size: 1.5em; margin-bottom: 0.2em; }
h2 { font-size: 1.2em; border-bottom: 1px solid #bbb; margin-top: 1.6em; }
.sub { color: #555; margin-top: 0; }
.caution { border: 2px solid #b00; background: #fff3f0; padding: 0.6em 0.9em; }
.warn { border-left: 4px solid #d80; padding-left: 0.8em; }
table { border-collapse: collapse; margin: 0.5em 0; }
th, td { padding: 0.15em 0.8em 0.15em 0; text-align: left; vertical-align: top; }
th { border-bottom: 1px solid #999; }
td:first-child { color: #333; }
pre { background: #f6f6f6; padding: 0.6em; overflow-x: auto; font-size: 0.9em; }
figure { margin: 1em 0; }
figure svg { width: 100%; height: auto; max-width: 46em; display: block; }
figure svg text { font-family: "Liberation Serif", "Times New Roman", Times, serif !important; }
figcaption { color: #444; font-size: 0.95em; }
</style>
</head>
<body>
<h1>{{.Title}}</h1>
{{if .Subtitle}}<p class="sub">{{.Subtitle}}</p>{{end}}
{{if .Caution}}<p class="caution">{{.Caution}}</p>{{end}}
{{range .Secs}}<section{{if .Warn}} class="warn"{{end}}>
<h2>{{.Heading}}</h2>
{{range .Paragraphs}}<p>{{.}}</p>
{{end}}{{if .List}}<ul>
{{range .List}}<li>{{.}}</li>
{{end}}</ul>
{{end}}{{with .Table}}<table>
{{if .Head}}<tr>{{range .Head}}<th>{{.}}</th>{{end}}</tr>
{{end}}{{range .Rows}}<tr>{{range .}}<td>{{.}}</td>{{end}}</tr>
{{end}}</table>
{{end}}{{if .Pre}}<pre>{{.Pre}}</pre>
{{end}}{{range .Figs}}<figure id="{{.ID}}">
{{.SVG}}
<figcaption>{{.Caption}}</figcaption>
</figure>
{{end}}</section>
{{end}}
</body>
</html>
`
