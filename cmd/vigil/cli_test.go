package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"time"
)

// update rewrites the golden files from the current output:
//
//	go test ./cmd/vigil -run Golden -update
var update = flag.Bool("update", false, "rewrite cmd/vigil/testdata/*.golden from the current output")

// goldenTol is the absolute tolerance on numbers when comparing with a
// golden file, in each field's own unit (degrees, hours, days): float64
// rounding differences between platforms (fused multiply-add), far below any
// accuracy the engine claims (a JD of 1e-9 d is 86 µs).
const goldenTol = 1e-9

// goldenInstantTol is the tolerance on ISO 8601 instants in golden files:
// they are printed to the millisecond, so rounding noise can flip the last
// digit.
const goldenInstantTol = 2 * time.Millisecond

// result is what one in-process run of vigil produced.
type result struct {
	code           int
	stdout, stderr string
}

// vigil runs the command line in-process, as main would.
func vigil(args ...string) result {
	var out, errOut bytes.Buffer
	code := run(args, strings.NewReader(""), &out, &errOut)
	return result{code: code, stdout: out.String(), stderr: errOut.String()}
}

// mustJSON runs vigil, requires success, and decodes its one JSON object.
func mustJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	r := vigil(args...)
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("vigil %s: exit %d, stderr %q", strings.Join(args, " "), r.code, r.stderr)
	}
	var m map[string]any
	dec := json.NewDecoder(strings.NewReader(r.stdout))
	if err := dec.Decode(&m); err != nil {
		t.Fatalf("vigil %s: stdout is not one JSON object: %v\n%s", strings.Join(args, " "), err, r.stdout)
	}
	if dec.More() {
		t.Fatalf("vigil %s: more than one JSON value on stdout:\n%s", strings.Join(args, " "), r.stdout)
	}
	return m
}

// withClock pins the clock that "now" and "tonight" read, for one test.
func withClock(t *testing.T, now time.Time) {
	t.Helper()
	old := clock
	clock = func() time.Time { return now }
	t.Cleanup(func() { clock = old })
}

// compareGolden checks got (JSON text) against testdata/name.golden, or
// rewrites the file with -update. Keys, nulls, strings and booleans must
// match exactly; numbers within goldenTol; instants within goldenInstantTol.
func compareGolden(t *testing.T, name, got string) {
	t.Helper()
	path := filepath.Join("testdata", name+".golden")
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatalf("writing %s: %v", path, err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("reading %s: %v (run go test ./cmd/vigil -update to create it)", path, err)
	}
	var g, w any
	if err := json.Unmarshal([]byte(got), &g); err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, got)
	}
	if err := json.Unmarshal(want, &w); err != nil {
		t.Fatalf("%s is not JSON: %v", path, err)
	}
	for _, d := range diffJSON("", g, w) {
		t.Errorf("%s: %s", path, d)
	}
}

// diffJSON lists the differences between two decoded JSON values.
func diffJSON(at string, got, want any) []string {
	switch w := want.(type) {
	case map[string]any:
		g, ok := got.(map[string]any)
		if !ok {
			return []string{fmt.Sprintf("%s: got %v, want an object", at, got)}
		}
		var out []string
		keys := map[string]bool{}
		for k := range w {
			keys[k] = true
		}
		for k := range g {
			keys[k] = true
		}
		sorted := make([]string, 0, len(keys))
		for k := range keys {
			sorted = append(sorted, k)
		}
		sort.Strings(sorted)
		for _, k := range sorted {
			gv, gok := g[k]
			wv, wok := w[k]
			switch {
			case !gok:
				out = append(out, fmt.Sprintf("%s.%s: missing, want %v", at, k, wv))
			case !wok:
				out = append(out, fmt.Sprintf("%s.%s: unexpected field (%v)", at, k, gv))
			default:
				out = append(out, diffJSON(at+"."+k, gv, wv)...)
			}
		}
		return out
	case []any:
		g, ok := got.([]any)
		if !ok || len(g) != len(w) {
			return []string{fmt.Sprintf("%s: got %v, want %v", at, got, want)}
		}
		var out []string
		for i := range w {
			out = append(out, diffJSON(fmt.Sprintf("%s[%d]", at, i), g[i], w[i])...)
		}
		return out
	case float64:
		g, ok := got.(float64)
		if !ok || math.Abs(g-w) > goldenTol {
			return []string{fmt.Sprintf("%s: got %v, want %v (diff %.3g, tol %g)", at, got, w, g-w, goldenTol)}
		}
	case string:
		g, ok := got.(string)
		if !ok {
			return []string{fmt.Sprintf("%s: got %v, want %q", at, got, w)}
		}
		gt, gerr := time.Parse(time.RFC3339Nano, g)
		wt, werr := time.Parse(time.RFC3339Nano, w)
		if gerr == nil && werr == nil {
			if d := gt.Sub(wt); d.Abs() > goldenInstantTol {
				return []string{fmt.Sprintf("%s: got %s, want %s (diff %v, tol %v)", at, g, w, d, goldenInstantTol)}
			}
			return nil
		}
		if g != w {
			return []string{fmt.Sprintf("%s: got %q, want %q", at, g, w)}
		}
	default: // bool, nil
		if got != want {
			return []string{fmt.Sprintf("%s: got %v, want %v", at, got, want)}
		}
	}
	return nil
}

// refRows reads a reference table at path into rows keyed by column name:
// '#' starts a comment line, the first other line is the header, and at
// least one row must follow.
func refRows(t *testing.T, path string) []map[string]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatalf("reference table: %v", err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	recs, err := r.ReadAll()
	if err != nil || len(recs) < 2 {
		t.Fatalf("reference table %s: %v (%d records)", path, err, len(recs))
	}
	var rows []map[string]string
	for _, rec := range recs[1:] {
		row := map[string]string{}
		for i, h := range recs[0] {
			row[h] = rec[i]
		}
		rows = append(rows, row)
	}
	return rows
}

// readReference reads a table written by testdata/astropy_cli.py (refRows).
func readReference(t *testing.T, name string) []map[string]string {
	t.Helper()
	return refRows(t, filepath.Join("testdata", name))
}

// number returns a JSON field as a float64, failing the test when it is not
// a number.
func number(t *testing.T, m map[string]any, key string) float64 {
	t.Helper()
	v, ok := m[key].(float64)
	if !ok {
		t.Errorf("field %q = %v: want a number", key, m[key])
		return math.NaN()
	}
	return v
}

// instant returns a JSON field as an instant, and false when it is null.
func instant(t *testing.T, m map[string]any, key string) (time.Time, bool) {
	t.Helper()
	v, present := m[key]
	if !present {
		t.Errorf("field %q missing", key)
		return time.Time{}, false
	}
	if v == nil {
		return time.Time{}, false
	}
	s, ok := v.(string)
	if !ok {
		t.Errorf("field %q = %v: want an ISO 8601 string or null", key, v)
		return time.Time{}, false
	}
	tm, err := time.Parse(time.RFC3339Nano, s)
	if err != nil {
		t.Errorf("field %q = %q: %v", key, s, err)
		return time.Time{}, false
	}
	if !strings.HasSuffix(s, "Z") {
		t.Errorf("field %q = %q: want UTC (Z suffix)", key, s)
	}
	return tm, true
}

// jsonUnmarshal decodes a JSON text.
func jsonUnmarshal(s string, v any) error { return json.Unmarshal([]byte(s), v) }
