package observe

import (
	"bytes"
	"errors"
	"os"
	"strings"
	"testing"

	"example.org/vigil/internal/table"
)

// FuzzReadTargetsCSV feeds arbitrary text to the target importer: it must
// never panic; it either refuses the whole file with an error that names the
// file (and, for a fault in a row, the line), or returns targets that pass
// their own validation and survive an export and re-import unchanged.
func FuzzReadTargetsCSV(f *testing.F) {
	if b, err := os.ReadFile("testdata/targets_example.csv"); err == nil {
		f.Add(string(b))
	}
	f.Add("name,ra,dec,class,epoch,timescale,period\nA,05:30:00,+30:00:00,pulsating,2459000.1234,bjd,0.3712345\n")
	f.Add("name,ra,dec,class,epoch,timescale,period\nA,25:00:00,+30,pulsating,2459000,bjd,0.37\n")
	f.Add("name,ra,dec,class,epoch,timescale,period,comps\nA,1,2,eclipsing,2459000,hjd,1.2,C1=11.2/0.6;K=11.65\n")
	f.Add("name,ra,dec\n\"unterminated,1,2\n")
	f.Add("# only a comment\n")
	f.Fuzz(func(t *testing.T, in string) {
		ts, err := ReadTargetsCSV(strings.NewReader(in), "fuzz.csv")
		if err != nil {
			if !strings.Contains(err.Error(), "fuzz.csv") {
				t.Fatalf("error does not name the file: %v", err)
			}
			var te *table.Error
			if errors.As(err, &te) && te.Line < 0 {
				t.Fatalf("error with a negative line: %v", err)
			}
			if ts != nil {
				t.Fatalf("targets returned with an error: the import must be all or nothing")
			}
			return
		}
		for i := range ts {
			if err := ts[i].Validate(); err != nil {
				t.Fatalf("imported target %q fails validation: %v", ts[i].Name, err)
			}
		}
		var buf bytes.Buffer
		if err := WriteTargetsCSV(&buf, ts); err != nil {
			t.Fatalf("exporting imported targets: %v", err)
		}
		again, err := ReadTargetsCSV(bytes.NewReader(buf.Bytes()), "again.csv")
		if err != nil {
			t.Fatalf("re-importing the export: %v\n%s", err, buf.String())
		}
		var buf2 bytes.Buffer
		if err := WriteTargetsCSV(&buf2, again); err != nil {
			t.Fatal(err)
		}
		if buf.String() != buf2.String() {
			t.Fatalf("export → import → export changed the text:\n%s\n---\n%s", buf.String(), buf2.String())
		}
	})
}

// FuzzReadVOTable feeds arbitrary XML to the VOTable importer: no panic; an
// error names the file; accepted targets pass their own validation.
func FuzzReadVOTable(f *testing.F) {
	if b, err := os.ReadFile("testdata/targets_example.vot"); err == nil {
		f.Add(string(b))
	}
	f.Add(`<?xml version="1.0"?><VOTABLE><RESOURCE><TABLE><FIELD name="x" datatype="double"/><DATA><TABLEDATA><TR><TD>1</TD></TR></TABLEDATA></DATA></TABLE></RESOURCE></VOTABLE>`)
	f.Add(`<VOTABLE><RESOURCE><TABLE>`)
	f.Add(`not xml at all`)
	f.Fuzz(func(t *testing.T, in string) {
		ts, err := ReadVOTable(strings.NewReader(in), "fuzz.vot", VOTableOptions{})
		if err != nil {
			if !strings.Contains(err.Error(), "fuzz.vot") {
				t.Fatalf("error does not name the file: %v", err)
			}
			if ts != nil {
				t.Fatalf("targets returned with an error")
			}
			return
		}
		for i := range ts {
			if err := ts[i].Validate(); err != nil {
				t.Fatalf("imported target %q fails validation: %v", ts[i].Name, err)
			}
		}
	})
}
