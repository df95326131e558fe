package app

import (
	"bytes"
	"fmt"
	"path/filepath"
	"strings"

	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// StarImport is a catalogue file read and checked, not yet stored.
type StarImport struct {
	Path    string
	VOTable bool
	Targets []observe.Target
}

// starVOTableExts are the file name endings read as VOTable; any other
// file is read as CSV.
var starVOTableExts = []string{".vot", ".votable", ".xml"}

// IsVOTablePath reports whether the file at path is read as a VOTable (by
// its name's ending: .vot, .votable, .xml).
func IsVOTablePath(path string) bool {
	ext := strings.ToLower(filepath.Ext(path))
	for _, e := range starVOTableExts {
		if ext == e {
			return true
		}
	}
	return false
}

// ReadStarFile reads a catalogue of stars: a VOTable by
// observe.ReadVOTableFile (epochs on a scale the file states; a file silent
// about it is refused rather than guessed), anything else as CSV by
// observe.ReadTargetsCSVFile (the documented column set). Any bad row
// refuses the whole file; the error names the file, line and column (or
// FIELD). Nothing is stored.
func ReadStarFile(path string) (StarImport, error) {
	im := StarImport{Path: path, VOTable: IsVOTablePath(path)}
	var err error
	if im.VOTable {
		im.Targets, err = observe.ReadVOTableFile(path, observe.VOTableOptions{})
	} else {
		im.Targets, err = observe.ReadTargetsCSVFile(path)
	}
	if err != nil {
		return im, err
	}
	if len(im.Targets) == 0 {
		return im, fmt.Errorf("%s: no stars in the file: want one row per star under a header row", path)
	}
	return im, nil
}

// Names returns the names of the stars read.
func (im StarImport) Names() []string {
	var out []string
	for _, t := range im.Targets {
		out = append(out, t.Name)
	}
	return out
}

// Store adds the stars to the logbook in one transaction, all of them or
// none, and returns how many were added. The logbook has no call that adds
// a list of targets at once, but its CSV import of the targets table is
// one transaction and reads the catalogue format: a CSV file goes there as
// it is (with its extra columns mean_mag_v, ephemeris_adopted and
// ephemeris_source), a VOTable's stars are written in that format first
// (observe.WriteTargetsCSV keeps every field). A name already in the
// logbook refuses the whole import. As every import, it removes the demo
// first when the logbook holds it (logbook.ImportCSV).
func (im StarImport) Store(lb *logbook.Logbook) (int, error) {
	if !im.VOTable {
		return lb.ImportCSVFile(logbook.TargetsTable, im.Path)
	}
	// The logbook would name a line of the CSV made here, which the user
	// never sees: repeated names are refused here first, naming the star.
	if demo, err := lb.IsDemo(); err != nil {
		return 0, err
	} else if !demo {
		have, err := lb.Targets()
		if err != nil {
			return 0, err
		}
		for _, t := range im.Targets {
			for _, h := range have {
				if strings.EqualFold(t.Name, h.Name) {
					return 0, fmt.Errorf("%s: star %q is already in the logbook: rename it in the file, or delete the logbook's one first; nothing was imported", im.Path, t.Name)
				}
			}
		}
	}
	var buf bytes.Buffer
	if err := observe.WriteTargetsCSV(&buf, im.Targets); err != nil {
		return 0, err
	}
	return lb.ImportCSV(logbook.TargetsTable, &buf, im.Path)
}

// ImportStars reads the catalogue at path (ReadStarFile) and stores it
// (StarImport.Store): every star or none.
func ImportStars(lb *logbook.Logbook, path string) (int, error) {
	im, err := ReadStarFile(path)
	if err != nil {
		return 0, err
	}
	return im.Store(lb)
}

// ExportStars writes every star of the logbook to a CSV catalogue at path,
// whole or not at all: the documented columns of observe.ReadTargetsCSV
// with the current ephemeris and the latest timing, and the logbook's three
// more (mean V, when and from where the ephemeris was adopted), so that the
// file imports back without loss.
func ExportStars(lb *logbook.Logbook, path string) (int, error) {
	ts, err := lb.Targets()
	if err != nil {
		return 0, err
	}
	if err := lb.ExportCSVFile(logbook.TargetsTable, path); err != nil {
		return 0, fmt.Errorf("writing %s: %w", path, err)
	}
	return len(ts), nil
}

// StarDeletion is what goes when a star is deleted.
type StarDeletion struct {
	Name                                      string
	Ephemerides, Comps, Measurements, Timings int
}

// CountStarRecords counts what the logbook holds of the star named name:
// everything logbook.DeleteTarget removes with it (its places in night
// plans aside).
func CountStarRecords(lb *logbook.Logbook, name string) (StarDeletion, error) {
	d := StarDeletion{Name: name}
	h, err := lb.EphemerisHistory(name)
	if err != nil {
		return d, err
	}
	comps, checks, err := lb.Comps(name)
	if err != nil {
		return d, err
	}
	ms, err := lb.MeasurementsOf(name, 0)
	if err != nil {
		return d, err
	}
	ts, err := lb.TimingsOf(name)
	if err != nil {
		return d, err
	}
	d.Ephemerides, d.Comps, d.Measurements, d.Timings = len(h), len(comps)+len(checks), len(ms), len(ts)
	return d, nil
}

// Question asks whether to delete the star, naming what goes with it.
func (d StarDeletion) Question() string {
	return fmt.Sprintf("Delete %s for good, with %s, %s, %s and %s, and its places in night plans? This cannot be undone.",
		d.Name, plural(d.Ephemerides, "ephemeris", "ephemerides"), plural(d.Comps, "comparison or check star", "comparison and check stars"),
		plural(d.Measurements, "measurement", "measurements"), plural(d.Timings, "timing", "timings"))
}
