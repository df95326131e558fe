package logbook

import (
	"bufio"
	"errors"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// killEnv tells the test binary, re-executed as a child, to run the import
// loop of TestKillChild: its value is "logbook path|csv path".
const killEnv = "VIGIL_LOGBOOK_KILL_CHILD"

// Sizes of the kill test.
const (
	killRows  = 20000 // measurements per import
	killTimes = 20    // kills
)

// TestKillChild is the child of TestKillDuringImport: it opens the logbook
// and imports the measurements table again and again, saying "import" on
// standard output as each begins, until it is killed.
func TestKillChild(t *testing.T) {
	spec := os.Getenv(killEnv)
	if spec == "" {
		t.Skip("the child of TestKillDuringImport; runs only under it")
	}
	db, csvPath, _ := strings.Cut(spec, "|")
	lb, err := Open(db)
	if err != nil {
		fmt.Fprintln(os.Stderr, "child: open:", err)
		os.Exit(3)
	}
	for {
		fmt.Println("import")
		if _, err := lb.ImportCSVFile(MeasurementsTable, csvPath); err != nil {
			fmt.Fprintln(os.Stderr, "child: import:", err)
			os.Exit(4)
		}
	}
}

// TestKillDuringImport kills (SIGKILL) a child process in the middle of
// importing a large table, many times over at random moments, and checks
// after each kill that the file is whole (PRAGMA integrity_check and the
// foreign keys) and holds every import whole or not at all: each import
// recorded in the imports table has exactly the rows it says, and no row
// belongs to an import that is not recorded.
func TestKillDuringImport(t *testing.T) {
	if testing.Short() {
		t.Skip("kills a child process many times: skipped with -short")
	}
	if os.Getenv(killEnv) != "" {
		t.Skip("in the child")
	}
	dir := t.TempDir()
	lb, _ := fixture(t)
	base := filepath.Join(dir, "base.db")
	// The fixture lives in its own temporary file: back it up into ours.
	var backup strings.Builder
	if err := lb.Backup(&backup); err != nil {
		t.Fatal(err)
	}
	lb.Close()
	r, err := Restore(base, strings.NewReader(backup.String()), "fixture")
	if err != nil {
		t.Fatal(err)
	}
	csvPath := filepath.Join(dir, "m.csv")
	if err := os.WriteFile(csvPath, measurementsCSV(killRows), 0o644); err != nil {
		t.Fatal(err)
	}
	// One whole import in the base file; its time sets the scale of the
	// delays.
	start := time.Now()
	if _, err := r.ImportCSVFile(MeasurementsTable, csvPath); err != nil {
		t.Fatal(err)
	}
	dur := time.Since(start)
	r.Close()
	baseBytes, err := os.ReadFile(base)
	if err != nil {
		t.Fatal(err)
	}

	rng := rand.New(rand.NewPCG(20260101, 7))
	for i := 0; i < killTimes; i++ {
		// Every third kill starts again from the base file, so that the
		// file stays small and the checks quick; the others build on the
		// file the last kill left.
		db := filepath.Join(dir, fmt.Sprintf("kill-%d.db", i/3))
		if i%3 == 0 {
			if err := os.WriteFile(db, baseBytes, 0o644); err != nil {
				t.Fatal(err)
			}
		}
		cmd := exec.Command(os.Args[0], "-test.run=^TestKillChild$", "-test.count=1", "-test.v=false")
		cmd.Env = append(os.Environ(), killEnv+"="+db+"|"+csvPath)
		out, err := cmd.StdoutPipe()
		if err != nil {
			t.Fatal(err)
		}
		var stderr strings.Builder
		cmd.Stderr = &stderr
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		// Wait until the first import begins, then a random part of up to 1.1
		// imports (so that a few kills land in a second one).
		sc := bufio.NewScanner(out)
		if !sc.Scan() {
			cmd.Wait()
			t.Fatalf("kill %d: the child never started importing: %s", i+1, stderr.String())
		}
		go func() {
			for sc.Scan() {
			}
		}()
		time.Sleep(time.Duration(rng.Float64() * 1.1 * float64(dur)))
		if err := cmd.Process.Kill(); err != nil {
			t.Fatal(err)
		}
		err = cmd.Wait()
		var exit *exec.ExitError
		if !errors.As(err, &exit) || exit.Exited() {
			t.Fatalf("kill %d: the child ended by itself (%v): %s", i+1, err, stderr.String())
		}
		checkImportsWhole(t, db, i+1)
	}
}

// checkImportsWhole opens the logbook at path and checks it after a kill.
func checkImportsWhole(t *testing.T, path string, kill int) {
	t.Helper()
	lb, err := Open(path)
	if err != nil {
		t.Fatalf("kill %d: the logbook does not open: %v", kill, err)
	}
	defer lb.Close()
	if err := lb.IntegrityCheck(); err != nil {
		t.Fatalf("kill %d: %v", kill, err)
	}
	var broken, orphans, imports, rows, raw int
	q := []struct {
		sql string
		dst *int
	}{
		{`SELECT count(*) FROM imports i WHERE i.rows <> (SELECT count(*) FROM measurements m WHERE m.import_id = i.id)`, &broken},
		{`SELECT count(*) FROM measurements WHERE import_id IS NULL OR import_id NOT IN (SELECT id FROM imports)`, &orphans},
		{`SELECT count(*) FROM imports`, &imports},
		{`SELECT count(*) FROM measurements`, &rows},
		{`SELECT count(*) FROM raw_comps`, &raw},
	}
	for _, x := range q {
		if err := lb.db.QueryRow(x.sql).Scan(x.dst); err != nil {
			t.Fatalf("kill %d: %v", kill, err)
		}
	}
	if broken != 0 || orphans != 0 || rows != imports*killRows || raw != 3*rows {
		t.Fatalf("kill %d: %d imports, %d measurements, %d comparison rows; %d imports not whole, %d rows of no import",
			kill, imports, rows, raw, broken, orphans)
	}
	t.Logf("kill %d: %d whole imports", kill, imports)
}
