package report

import (
	"bytes"
	"fmt"
	"regexp"
	"strings"
	"testing"
	"unicode/utf16"

	"example.org/vigil/observe"
)

// pdfPage matches a page object of the PDF (not the /Pages tree).
var pdfPage = regexp.MustCompile(`/Type /Page[^s]`)

// pdfText encodes s as the PDF library writes text in a Unicode font:
// UTF-16BE, with \ ( ) and CR escaped (PDF 1.7, ISO 32000-1, §7.3.4.2).
func pdfText(s string) []byte {
	var b []byte
	for _, u := range utf16.Encode([]rune(s)) {
		for _, c := range []byte{byte(u >> 8), byte(u)} {
			switch c {
			case '\\', '(', ')':
				b = append(b, '\\', c)
			case '\r':
				b = append(b, '\\', 'r')
			default:
				b = append(b, c)
			}
		}
	}
	return b
}

// TestPDFStructure makes the PDF of fixed nights, uncompressed so that its
// text can be searched, and checks its frame: the header, the page count
// (page objects and the foot's "page N of N" agree with the layout), the
// page size, the site, every planned target and the Sun caution.
func TestPDFStructure(t *testing.T) {
	letter := hilltop
	letter.paper = Letter
	cases := []struct {
		name      string
		fx        fixture
		pages     int
		mediaBox  string // ISO 216 A4 210 × 297 mm; US Letter 8.5 × 11 in; in points of 1/72 in
		want      []string
		solarWarn bool
	}{
		{"A4, every event, measured", hilltop, 5, "/MediaBox [0 0 595.28 841.89]",
			[]string{"Hilltop Yard", "Europe/Berlin (CET, UTC+01:00)", "+10.0000° (EAST +)", "2460666.59541", "BJD_TDB"}, true},
		{"US Letter", letter, 5, "/MediaBox [0 0 612.00 792.00]", []string{"Hilltop Yard"}, true},
		{"midnight sun", fjord, 3, "/MediaBox [0 0 595.28 841.89]",
			[]string{"Fjord Shed", "no astronomical darkness tonight", "No planned extrema tonight."}, false},
		{"no darkness, no targets", moor, 3, "/MediaBox [0 0 595.28 841.89]",
			[]string{"Moor Cabin", "−3.2000° (EAST +)", "No planned extrema tonight."}, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			l := tc.fx.build(t)
			var buf bytes.Buffer
			if err := l.writePDF(&buf, false); err != nil {
				t.Fatalf("writePDF: %v", err)
			}
			b := buf.Bytes()
			if !bytes.HasPrefix(b, []byte("%PDF-1.")) {
				t.Errorf("starts with %q, want %%PDF-1.", b[:min(8, len(b))])
			}
			if !bytes.HasSuffix(bytes.TrimSpace(b), []byte("%%EOF")) {
				t.Errorf("does not end with %%%%EOF")
			}
			if got := len(pdfPage.FindAll(b, -1)); got != tc.pages {
				t.Errorf("page objects: got %d, want %d", got, tc.pages)
			}
			for p := 1; p <= tc.pages; p++ {
				foot := fmt.Sprintf("page %d of %d", p, tc.pages)
				if !bytes.Contains(b, pdfText(foot)) {
					t.Errorf("no page foot %q", foot)
				}
			}
			// One page size, in the page tree, inherited by every page.
			if n, all := bytes.Count(b, []byte(tc.mediaBox)), bytes.Count(b, []byte("/MediaBox")); n != 1 || all != 1 {
				t.Errorf("%s given %d times among %d page sizes, want once and alone", tc.mediaBox, n, all)
			}
			want := append([]string(nil), tc.want...)
			for _, e := range l.Plan.Events {
				want = append(want, e.Target)
			}
			for _, w := range want {
				if !bytes.Contains(b, pdfText(w)) {
					t.Errorf("the PDF lacks the text %q", w)
				}
			}
			// The caution's first words sit on one line of the box.
			caution := strings.Join(strings.Fields(observe.SolarWarningText)[:6], " ")
			if got := bytes.Contains(b, pdfText(caution)); got != tc.solarWarn {
				t.Errorf("Sun caution %q printed: %v, want %v", caution, got, tc.solarWarn)
			}
		})
	}
}

// TestWritePDFCompressed checks that the PDF as shipped (compressed) keeps
// the same frame.
func TestWritePDFCompressed(t *testing.T) {
	var buf bytes.Buffer
	if err := fjord.build(t).WritePDF(&buf); err != nil {
		t.Fatalf("WritePDF: %v", err)
	}
	b := buf.Bytes()
	if !bytes.HasPrefix(b, []byte("%PDF-1.")) {
		t.Errorf("starts with %q, want %%PDF-1.", b[:min(8, len(b))])
	}
	if got := len(pdfPage.FindAll(b, -1)); got != 3 {
		t.Errorf("page objects: got %d, want 3", got)
	}
	if !bytes.Contains(b, []byte("/Filter /FlateDecode")) {
		t.Errorf("no compressed stream")
	}
}

func BenchmarkWritePDF(b *testing.B) {
	l := hilltop.build(b)
	b.ReportAllocs()
	for b.Loop() {
		var buf bytes.Buffer
		if err := l.WritePDF(&buf); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkWriteText(b *testing.B) {
	l := hilltop.build(b)
	b.ReportAllocs()
	for b.Loop() {
		var buf bytes.Buffer
		if err := l.WriteText(&buf); err != nil {
			b.Fatal(err)
		}
	}
}
