package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"example.org/vigil/observe/logbook"
)

// readDir returns the files of a directory by name, with their contents.
func readDir(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][]byte{}
	for _, e := range entries {
		b, err := os.ReadFile(filepath.Join(dir, e.Name()))
		if err != nil {
			t.Fatal(err)
		}
		out[e.Name()] = b
	}
	return out
}

// backupOf returns the JSON backup of the logbook at path, written by
// vigil logbook backup.
func backupOf(t *testing.T, path string) []byte {
	t.Helper()
	out := filepath.Join(t.TempDir(), "backup.json")
	mustRun(t, "logbook", "backup", "--logbook", path, "--out", out)
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// TestLogbookCSVRoundTrip checks that every table exported as CSV and
// imported into a fresh logbook exports again to identical files, and that
// one table exported alone is the same file as in the directory.
func TestLogbookCSVRoundTrip(t *testing.T) {
	path := sharedDemo(t)
	dir := t.TempDir()
	first, second := filepath.Join(dir, "first"), filepath.Join(dir, "second")
	m := mustJSON(t, "logbook", "export", "--logbook", path, "--dir", first, "--json")
	files := list(t, m, "files")
	if len(files) != len(logbook.Tables) {
		t.Fatalf("exported %d files, want one per table (%d)", len(files), len(logbook.Tables))
	}
	lb := openBook(t, path)
	sites, _ := lb.Sites()
	targets, _ := lb.Targets()
	nights, _ := lb.Nights("")
	for _, f := range files {
		want := map[string]int{"sites": len(sites), "targets": len(targets), "nights": len(nights)}
		if n, ok := want[f["table"].(string)]; ok && number(t, f, "rows") != float64(n) {
			t.Errorf("%s: %v rows exported, the logbook holds %d", f["table"], f["rows"], n)
		}
	}

	fresh := filepath.Join(dir, "fresh.db")
	imp := mustJSON(t, "logbook", "import", "--logbook", fresh, "--dir", first, "--json")
	if imp["created"] != true || imp["demo_removed"] != false {
		t.Errorf("import into a new path: created %v, demo_removed %v; want true, false", imp["created"], imp["demo_removed"])
	}
	mustRun(t, "logbook", "export", "--logbook", fresh, "--dir", second)
	a, b := readDir(t, first), readDir(t, second)
	if len(a) != len(logbook.Tables) || len(b) != len(a) {
		t.Fatalf("exports hold %d and %d files, want %d", len(a), len(b), len(logbook.Tables))
	}
	for name, data := range a {
		if !bytes.Equal(data, b[name]) {
			t.Errorf("%s differs after export → import → export (%d and %d bytes)", name, len(data), len(b[name]))
		}
	}
	for _, tb := range []logbook.Table{logbook.SitesTable, logbook.TimingsTable} {
		out := filepath.Join(dir, "one-"+tb.FileName())
		mustRun(t, "logbook", "export", "--logbook", path, "--table", strings.ToUpper(string(tb)), "--out", out)
		got, _ := os.ReadFile(out)
		if !bytes.Equal(got, a[tb.FileName()]) {
			t.Errorf("--table %s --out differs from %s of --dir", tb, tb.FileName())
		}
	}
}

// TestLogbookBackupRestore checks that a backup restored into a new logbook
// backs up to the identical document; that restore leaves an existing file
// alone without --force, and with it replaces only a logbook; and that a
// broken backup makes no file.
func TestLogbookBackupRestore(t *testing.T) {
	path := sharedDemo(t)
	dir := t.TempDir()
	b1 := backupOf(t, path)
	in := filepath.Join(dir, "b1.json")
	if err := os.WriteFile(in, b1, 0o644); err != nil {
		t.Fatal(err)
	}
	restored := filepath.Join(dir, "restored.db")
	m := mustJSON(t, "logbook", "restore", "--input", in, "--logbook", restored, "--json")
	if m["replaced"] != false || object(t, m, "info")["demo"] != true || object(t, m, "info")["integrity"] != "ok" {
		t.Errorf("restore: replaced %v, info %v", m["replaced"], m["info"])
	}
	if b2 := backupOf(t, restored); !bytes.Equal(b1, b2) {
		t.Errorf("backup → restore → backup: %d and %d bytes, want identical documents", len(b1), len(b2))
	}

	// An existing logbook stays as it is without --force.
	other := freshDemo(t)
	mustRun(t, "logbook", "import", "--logbook", other, "--table", "sites", "--input",
		writeTemp(t, "sites.csv", "name,lat_deg,lon_deg,time_zone,min_alt_deg\nOak Yard,50,10,Europe/Berlin,20\n")) // invented
	before := backupOf(t, other)
	args := []string{"logbook", "restore", "--input", in, "--logbook", other}
	wantFailure(t, args, vigil(args...), "--logbook", strconv.Quote(other), "already exists", "--force")
	if !bytes.Equal(before, backupOf(t, other)) {
		t.Error("restore without --force changed the existing logbook")
	}
	// With --force it is replaced by the backup.
	m = mustJSON(t, append(args, "--force", "--json")...)
	if m["replaced"] != true {
		t.Errorf("replaced = %v, want true", m["replaced"])
	}
	if got := backupOf(t, other); !bytes.Equal(got, b1) {
		t.Error("restore --force: the logbook does not back up to the backup restored")
	}
	if leftovers, _ := filepath.Glob(filepath.Join(filepath.Dir(other), ".vigil-restore-*")); len(leftovers) > 0 {
		t.Errorf("restore --force left %v", leftovers)
	}

	// --force replaces a logbook only.
	notes := writeTemp(t, "notes.txt", "not a logbook\n")
	args = []string{"logbook", "restore", "--input", in, "--logbook", notes, "--force"}
	wantFailure(t, args, vigil(args...), "--logbook", strconv.Quote(notes), "not a vigil logbook")
	if b, _ := os.ReadFile(notes); string(b) != "not a logbook\n" {
		t.Errorf("restore --force changed a text file: %q", b)
	}

	// A broken backup: nothing made.
	for _, tc := range []struct {
		name, text string
		want       []string
	}{
		{"not JSON", "{", []string{"--input"}},
		{"newer schema", strings.Replace(string(b1), `"schema_version": 2`, `"schema_version": 99`, 1), []string{"--input", "99"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			bad := writeTemp(t, "bad.json", tc.text)
			target := filepath.Join(t.TempDir(), "never.db")
			args := []string{"logbook", "restore", "--input", bad, "--logbook", target}
			wantFailure(t, args, vigil(args...), tc.want...)
			if entries, _ := os.ReadDir(filepath.Dir(target)); len(entries) > 0 {
				t.Errorf("a failed restore left %s", entries[0].Name())
			}
		})
	}
}

// TestLogbookImportBadRow checks that an import with a bad row exits 2 with
// the file, line and column of the fault and changes nothing: not the
// demo, not the other tables of a directory import; and that an import into
// a new path leaves no file when it fails.
func TestLogbookImportBadRow(t *testing.T) {
	path := freshDemo(t)
	before := backupOf(t, path)
	good := "Oak Yard,50,10,100,Europe/Berlin,20\n"
	badRow := "Elm Yard,95,10,100,Europe/Berlin,20\n"
	sites := "name,lat_deg,lon_deg,elev_m,time_zone,min_alt_deg\n" + good + badRow
	// The fault: line 3, the column where "95" starts (counted from 1).
	col := strconv.Itoa(strings.Index(badRow, "95") + 1)
	one := writeTemp(t, "sites.csv", sites)

	dir := t.TempDir()
	goodSites := "name,lat_deg,lon_deg,elev_m,time_zone,min_alt_deg\n" + good
	badTargets := "name,ra,dec,epoch,period\nOak Var,1.5,20,2459000.1,0.5\nAsh Var,25:00:00,20,2459000.1,0.5\n" // invented
	for name, text := range map[string]string{"sites.csv": goodSites, "targets.csv": badTargets} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"one table", []string{"--table", "sites", "--input", one}, []string{one + ": line 3, column " + col + " (lat_deg)", `"95"`}},
		{"a directory", []string{"--dir", dir}, []string{filepath.Join(dir, "targets.csv") + ": line 3, column ", "(ra)", `"25:00:00"`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			args := append([]string{"logbook", "import", "--logbook", path}, tc.args...)
			wantFailure(t, args, vigil(args...), tc.want...)
			if !bytes.Equal(before, backupOf(t, path)) {
				t.Error("the failed import changed the logbook")
			}
			fresh := filepath.Join(t.TempDir(), "new.db")
			args = append([]string{"logbook", "import", "--logbook", fresh}, tc.args...)
			wantFailure(t, args, vigil(args...), tc.want...)
			if entries, _ := os.ReadDir(filepath.Dir(fresh)); len(entries) > 0 {
				t.Errorf("a failed import into a new path left %s", entries[0].Name())
			}
		})
	}
	// The same rows without the fault go in, and the demo goes first.
	m := mustJSON(t, "logbook", "import", "--logbook", path, "--table", "sites", "--input", writeTemp(t, "good.csv", goodSites), "--json")
	if m["demo_removed"] != true || number(t, m, "rows") != 1 {
		t.Errorf("import into the demo: demo_removed %v, rows %v; want true, 1", m["demo_removed"], m["rows"])
	}
	lb := openBook(t, path)
	if isDemo, _ := lb.IsDemo(); isDemo {
		t.Error("the logbook still holds the demo after an import")
	}
	if s, err := lb.Sites(); err != nil || len(s) != 1 || s[0].Name != "Oak Yard" {
		t.Errorf("sites after the import: %v, %v; want Oak Yard alone", s, err)
	}
}

// TestLogbookInfo checks vigil logbook info and check against the
// logbook's own API: the counts of sites, targets, nights, measurements and
// timings, the schema version and the demo flag.
func TestLogbookInfo(t *testing.T) {
	path := sharedDemo(t)
	lb := openBook(t, path)
	sites, _ := lb.Sites()
	targets, _ := lb.Targets()
	nights, _ := lb.Nights("")
	measurements, timings := 0, 0
	for _, tg := range targets {
		ms, err := lb.MeasurementsOf(tg.Name, 0)
		if err != nil {
			t.Fatal(err)
		}
		ts, err := lb.TimingsOf(tg.Name)
		if err != nil {
			t.Fatal(err)
		}
		measurements += len(ms)
		timings += len(ts)
	}
	m := mustJSON(t, "logbook", "info", "--logbook", path, "--json")
	for key, want := range map[string]any{"path": path, "created": false, "schema_version": float64(logbook.SchemaVersion),
		"program_schema_version": float64(logbook.SchemaVersion), "demo": true, "integrity": "ok"} {
		if m[key] != want {
			t.Errorf("%s = %v, want %v", key, m[key], want)
		}
	}
	rows := map[string]float64{}
	for _, tb := range list(t, m, "tables") {
		rows[tb["name"].(string)] = number(t, tb, "rows")
	}
	for name, want := range map[string]int{"sites": len(sites), "targets": len(targets), "nights": len(nights),
		"measurements": measurements, "timings": timings} {
		if rows[name] != float64(want) {
			t.Errorf("rows of %s = %v, the API gives %d", name, rows[name], want)
		}
	}
	text := mustRun(t, "logbook", "info", "--logbook", path)
	for _, want := range []string{path, "Schema version", "Demo scenario", "yes", "measurements", strconv.Itoa(measurements)} {
		if !strings.Contains(text, want) {
			t.Errorf("info lacks %q:\n%s", want, text)
		}
	}
	fresh := filepath.Join(t.TempDir(), "first-run.db")
	if m := mustJSON(t, "logbook", "info", "--logbook", fresh, "--json"); m["created"] != true || m["demo"] != true {
		t.Errorf("info on a new path: created %v, demo %v; want both true", m["created"], m["demo"])
	}
	if c := mustJSON(t, "logbook", "check", "--logbook", path, "--json"); c["integrity"] != "ok" {
		t.Errorf("check: %v", c)
	}
}

// TestLogbookCommands checks the group's help and its messages for a
// missing or unknown command and for flags that go together.
func TestLogbookCommands(t *testing.T) {
	for _, args := range [][]string{{"logbook", "--help"}, {"logbook", "help"}, {"help", "logbook"}} {
		out := mustRun(t, args...)
		for _, c := range logbookCommands {
			if !strings.Contains(out, "  "+c.name+" ") {
				t.Errorf("vigil %s lacks %q:\n%s", strings.Join(args, " "), c.name, out)
			}
		}
	}
	for _, c := range logbookCommands {
		for _, args := range [][]string{{"logbook", c.name, "--help"}, {"logbook", "help", c.name}} {
			out := mustRun(t, args...)
			for _, want := range []string{"Usage:\n  vigil logbook " + c.name, "Flags:", "--logbook PATH", "--json"} {
				if !strings.Contains(out, want) {
					t.Errorf("vigil %s lacks %q:\n%s", strings.Join(args, " "), want, out)
				}
			}
		}
	}
	path := sharedDemo(t)
	dir := t.TempDir()
	file := writeTemp(t, "file.csv", "name\n")
	jsonBook := filepath.Join(t.TempDir(), "book.json") // a logbook with a backup's name
	lb, err := logbook.Create(jsonBook)
	if err != nil {
		t.Fatal(err)
	}
	lb.Close()
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"no command", []string{"logbook"}, []string{"vigil logbook: ", "missing command", "export, import"}},
		{"unknown command", []string{"logbook", "vacuum"}, []string{`"vacuum"`, "export, import"}},
		{"help for an unknown command", []string{"logbook", "help", "vacuum"}, []string{`"vacuum"`}},
		{"export: neither", []string{"logbook", "export", "--logbook", path}, []string{"vigil logbook export: ", "--dir", "missing"}},
		{"export: both", []string{"logbook", "export", "--logbook", path, "--dir", dir, "--table", "sites"}, []string{"--dir", "not both"}},
		{"export: unknown table", []string{"logbook", "export", "--logbook", path, "--table", "stars", "--out", filepath.Join(dir, "s.csv")}, []string{"--table", `"stars"`, "sites, targets"}},
		{"export: not .csv", []string{"logbook", "export", "--logbook", path, "--table", "sites", "--out", filepath.Join(dir, "s.txt")}, []string{"--out", ".csv"}},
		{"export: --dir is a file", []string{"logbook", "export", "--logbook", path, "--dir", file}, []string{"--dir", "is a file"}},
		{"import: --input alone", []string{"logbook", "import", "--logbook", path, "--input", file}, []string{"--table", "missing"}},
		{"import: missing file", []string{"logbook", "import", "--logbook", path, "--table", "sites", "--input", filepath.Join(dir, "none.csv")}, []string{"--input", "no such file"}},
		{"import: no tables in --dir", []string{"logbook", "import", "--logbook", path, "--dir", dir}, []string{"--dir", "none of the tables"}},
		{"backup: not .json", []string{"logbook", "backup", "--logbook", path, "--out", filepath.Join(dir, "b.db")}, []string{"--out", ".json"}},
		{"backup: onto the logbook", []string{"logbook", "backup", "--logbook", jsonBook, "--out", jsonBook}, []string{"--out", "the logbook itself"}},
		{"restore: missing --input", []string{"logbook", "restore", "--logbook", filepath.Join(dir, "r.db")}, []string{"--input", "missing"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
			if entries, _ := os.ReadDir(dir); len(entries) > 0 {
				t.Errorf("a failed run wrote %s", entries[0].Name())
			}
		})
	}
}
