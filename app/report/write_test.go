package report

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// TestWrite checks that the extension picks the format and that a bad one
// is refused with the path named, before any file is made.
func TestWrite(t *testing.T) {
	l := fjord.build(t)
	var text bytes.Buffer
	if err := l.WriteText(&text); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name, file string
		prefix     string // of the file written; "" when refused
		err        []string
	}{
		{"pdf", "log.pdf", "%PDF-", nil},
		{"pdf, upper case", "LOG.PDF", "%PDF-", nil},
		{"text", "log.txt", text.String(), nil},
		{"csv refused", "log.csv", "", []string{"log.csv", `".csv"`, "want .pdf or .txt"}},
		{"no extension", "log", "", []string{"log", `""`, "want .pdf or .txt"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, tc.file)
			err := l.Write(path)
			if tc.prefix == "" {
				if err == nil {
					t.Fatalf("Write(%q): no error, want one naming the path", path)
				}
				for _, w := range tc.err {
					if !strings.Contains(err.Error(), w) {
						t.Errorf("error %q lacks %q", err, w)
					}
				}
				assertEmpty(t, dir)
				return
			}
			if err != nil {
				t.Fatalf("Write(%q): %v", path, err)
			}
			b, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			if !strings.HasPrefix(string(b), tc.prefix) {
				t.Errorf("%s starts with %q, want %q", tc.file, b[:min(len(b), 16)], tc.prefix[:min(len(tc.prefix), 16)])
			}
		})
	}
}

// TestWriteLeavesNothing checks that a failed write leaves no file, no
// temporary file, and an older file as it was.
func TestWriteLeavesNothing(t *testing.T) {
	dir := t.TempDir()
	missing := filepath.Join(dir, "no such dir", "log.pdf")
	if err := fjord.build(t).Write(missing); err == nil || !strings.Contains(err.Error(), missing) {
		t.Errorf("Write(%q): error %v, want one naming the path", missing, err)
	}
	assertEmpty(t, dir)

	old := filepath.Join(dir, "log.txt")
	if err := os.WriteFile(old, []byte("older log\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	bad := fjord.build(t)
	bad.Measurements = []Measurement{{Target: "Alder Var", Mag: 10}} // no time
	if err := bad.Write(old); err == nil {
		t.Errorf("Write of a measurement without time: no error")
	}
	if b, _ := os.ReadFile(old); string(b) != "older log\n" {
		t.Errorf("older file changed to %q", b)
	}
	if es, _ := os.ReadDir(dir); len(es) != 1 {
		t.Errorf("directory holds %d entries after the failed write, want 1 (the older file)", len(es))
	}
}

func assertEmpty(t *testing.T, dir string) {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range es {
		t.Errorf("left behind: %s", e.Name())
	}
}

// TestValidate checks that every unprintable input is refused with a
// message naming the field, quoting the value and saying what was expected.
func TestValidate(t *testing.T) {
	at, _ := ephem.ParseInstant("2025-06-21T22:00:00Z")
	good := Measurement{Time: at, Target: "Alder Var", Mag: 10.2, MagErr: 0.01, Comp: "C1"}
	goodT := Timing{Target: "Alder Var", Kind: observe.Max, JD: 2460848.4, Scale: ephem.BJDTDB, SigmaDays: 0.001, OCDays: math.NaN()}
	cases := []struct {
		name string
		edit func(l *NightLog)
		want []string // fragments of the error; none for a good log
	}{
		{"good", func(l *NightLog) { l.Measurements, l.Timings = []Measurement{good}, []Timing{goodT} }, nil},
		{"unknown error and O−C are fine", func(l *NightLog) {
			m, tm := good, goodT
			m.MagErr, tm.SigmaDays = math.NaN(), math.NaN()
			l.Measurements, l.Timings = []Measurement{m}, []Timing{tm}
		}, nil},
		{"night not set", func(l *NightLog) { l.Night = ephem.Night{} }, []string{"night is not set"}},
		{"plan of another date", func(l *NightLog) { l.Plan.Date = l.Plan.Date.Add(24 * time.Hour) },
			[]string{"plan of 2025-06-22", "night of 2025-06-21"}},
		{"bad time zone", func(l *NightLog) { l.Site.TimeZone = "Mars/Olympus" }, []string{"site", "Mars/Olympus"}},
		{"bad paper", func(l *NightLog) { l.Paper = 7 }, []string{"paper 7", "A4 or Letter"}},
		{"measurement without time", func(l *NightLog) {
			m := good
			m.Time = ephem.Time{}
			l.Measurements = []Measurement{good, m}
		}, []string{"measurement 2", `"Alder Var"`, "time not set"}},
		{"measurement NaN magnitude", func(l *NightLog) {
			m := good
			m.Mag = math.NaN()
			l.Measurements = []Measurement{m}
		}, []string{"measurement 1", "magnitude NaN", "finite"}},
		{"measurement negative error", func(l *NightLog) {
			m := good
			m.MagErr = -0.1
			l.Measurements = []Measurement{m}
		}, []string{"measurement 1", "error -0.1", "≥ 0"}},
		{"measurement without target", func(l *NightLog) {
			m := good
			m.Target = " "
			l.Measurements = []Measurement{m}
		}, []string{"measurement 1", "target name empty"}},
		{"timing without kind", func(l *NightLog) {
			tm := goodT
			tm.Kind = 0
			l.Timings = []Timing{tm}
		}, []string{"timing 1", "kind 0", "max or min"}},
		{"timing without scale", func(l *NightLog) {
			tm := goodT
			tm.Scale = 0
			l.Timings = []Timing{tm}
		}, []string{"timing 1", "time scale 0", "HJD or BJD"}},
		{"timing NaN date", func(l *NightLog) {
			tm := goodT
			tm.JD = math.NaN()
			l.Timings = []Timing{tm}
		}, []string{"timing 1", "Julian date NaN"}},
		{"timing negative sigma", func(l *NightLog) {
			tm := goodT
			tm.SigmaDays = -1
			l.Timings = []Timing{tm}
		}, []string{"timing 1", "sigma -1 d"}},
		{"timing infinite O−C", func(l *NightLog) {
			tm := goodT
			tm.OCDays = math.Inf(1)
			l.Timings = []Timing{tm}
		}, []string{"timing 1", "O−C +Inf d"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			l := fjord.build(t)
			tc.edit(l)
			err := l.Validate()
			if tc.want == nil {
				if err != nil {
					t.Errorf("Validate: %v, want no error", err)
				}
				return
			}
			if err == nil {
				t.Fatalf("Validate: no error, want one with %q", tc.want)
			}
			if !strings.HasPrefix(err.Error(), "report: ") {
				t.Errorf("error %q: want the prefix %q", err, "report: ")
			}
			for _, w := range tc.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q lacks %q", err, w)
				}
			}
			var buf bytes.Buffer
			if err := l.WriteText(&buf); err == nil || buf.Len() != 0 {
				t.Errorf("WriteText of a bad log: error %v, wrote %d bytes; want an error and nothing", err, buf.Len())
			}
			buf.Reset()
			if err := l.WritePDF(&buf); err == nil || buf.Len() != 0 {
				t.Errorf("WritePDF of a bad log: error %v, wrote %d bytes; want an error and nothing", err, buf.Len())
			}
		})
	}
}

// TestParsePaper checks the paper names the command line accepts.
func TestParsePaper(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Paper
		ok   bool
	}{{"a4", A4, true}, {" A4 ", A4, true}, {"Letter", Letter, true}, {"legal", 0, false}, {"", 0, false}} {
		got, err := ParsePaper(tc.in)
		if (err == nil) != tc.ok || (tc.ok && got != tc.want) {
			t.Errorf("ParsePaper(%q) = %v, %v; want %v, ok %v", tc.in, got, err, tc.want, tc.ok)
		}
		if err != nil && !strings.Contains(err.Error(), `"`+tc.in+`"`) {
			t.Errorf("ParsePaper(%q): error %q does not quote the input", tc.in, err)
		}
	}
}
