package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// This file holds --logbook, which every command that reads or writes
// stored data takes, and the lookup of --site among the logbook's sites.

// defaultLogbookPath says where the logbook is when --logbook is not given:
// vigil/vigil.db in the user's configuration directory. Tests point it at a
// temporary directory.
var defaultLogbookPath = logbook.DefaultPath

// bookFlag is --logbook on one command: which file, and the logbook once a
// step needs it. Nothing is opened, and no file made, before then: a run
// with --lat and --lon never touches the logbook.
type bookFlag struct {
	e        *env
	f        *flags  // nil when the path is explicit
	path     *string // the flag's text
	explicit string  // the path, when not from a flag (vigil --logbook PATH)

	lb       *logbook.Logbook
	created  bool     // this run made the file
	madeDirs []string // and these directories for it, deepest first
}

// logbookNote is what --help says of the default of --logbook.
const logbookNote = "default vigil/vigil.db in the user's configuration directory"

// addLogbookFlag declares --logbook on f.
func addLogbookFlag(e *env, f *flags) *bookFlag {
	return addLogbookFlagAs(e, f, "the logbook file; one that does not exist yet is created with the demo scenario in it")
}

// addLogbookFlagAs declares --logbook on f with its own help, for a command
// that makes a missing logbook otherwise (import, restore).
func addLogbookFlagAs(e *env, f *flags, usage string) *bookFlag {
	return &bookFlag{e: e, f: f, path: f.value("logbook", "PATH", "", usage, logbookNote)}
}

// where returns the path of the logbook: --logbook, or the default.
func (b *bookFlag) where() (string, error) {
	if b.f == nil {
		return b.explicit, nil
	}
	if b.f.given("logbook") {
		if strings.TrimSpace(*b.path) == "" {
			return "", &flagError{flag: "logbook", err: errors.New("empty value: want the path of a logbook file")}
		}
		return *b.path, nil
	}
	p, err := defaultLogbookPath()
	if err != nil {
		return "", &flagError{flag: "logbook", err: fmt.Errorf("no default logbook (%v): name one with --logbook PATH", err)}
	}
	return p, nil
}

// open opens the logbook, creating it with the demo scenario when there is
// no file (demo.OpenOrCreate). It is closed when the command is done, and
// removed again if this run made it and then failed: a failed run leaves
// nothing behind.
func (b *bookFlag) open() (*logbook.Logbook, error) {
	if b.lb != nil {
		return b.lb, nil
	}
	path, err := b.where()
	if err != nil {
		return nil, err
	}
	dirs := missingDirs(path)
	lb, created, err := demo.OpenOrCreate(path)
	if err != nil {
		removeDirs(dirs)
		return nil, openError(path, err)
	}
	b.adopt(lb, created, dirs)
	return lb, nil
}

// adopt keeps the open logbook and arranges for it to be closed (and
// removed after a failed run that made it).
func (b *bookFlag) adopt(lb *logbook.Logbook, created bool, dirs []string) {
	b.lb, b.created = lb, created
	if created {
		b.madeDirs = dirs
	}
	b.e.atExit(func(failed bool) error {
		if failed {
			b.removeMade()
		}
		if b.lb == nil {
			return nil
		}
		return b.lb.Close()
	})
}

// missingDirs lists the directories above path that do not exist yet,
// deepest first: those that making a logbook at path will make.
func missingDirs(path string) []string {
	var dirs []string
	for d := filepath.Dir(path); ; d = filepath.Dir(d) {
		if _, err := os.Stat(d); !errors.Is(err, fs.ErrNotExist) {
			return dirs
		}
		dirs = append(dirs, d)
		if filepath.Dir(d) == d {
			return dirs
		}
	}
}

// openExisting opens the logbook at the path, or, when there is no file,
// makes an empty one (not the demo): for an import, which would remove the
// demo first anyway. made says whether it did; as with open, a made file is
// removed again when the run fails.
func (b *bookFlag) openExisting() (lb *logbook.Logbook, made bool, err error) {
	path, err := b.where()
	if err != nil {
		return nil, false, err
	}
	dirs := missingDirs(path)
	if _, serr := os.Stat(path); errors.Is(serr, fs.ErrNotExist) {
		lb, err = logbook.Create(path)
		made = err == nil
	} else {
		lb, err = logbook.Open(path)
	}
	if err != nil {
		removeDirs(dirs)
		return nil, false, openError(path, err)
	}
	b.adopt(lb, made, dirs)
	return lb, made, nil
}

// openError turns a failure to open or create the logbook at path into a
// message naming --logbook.
func openError(path string, err error) error {
	var why error
	switch {
	case errors.Is(err, logbook.ErrNotLogbook):
		why = fmt.Errorf("%q is not a vigil logbook (%s): want a logbook file made by vigil, or the path of a new one (the file is left as it is)", path, reason(err, logbook.ErrNotLogbook))
	case errors.Is(err, logbook.ErrNewerSchema):
		why = fmt.Errorf("%q was written by a newer version of vigil (%s; the file is left as it is)", path, reason(err, logbook.ErrNewerSchema))
	default:
		why = fmt.Errorf("cannot open or create the logbook %q: %v", path, err)
	}
	return &flagError{flag: "logbook", err: why}
}

// reason returns what err says after the sentinel it wraps ("logbook:
// x.db: not a vigil logbook: the file is empty" gives "the file is empty"),
// or all of it when it says nothing more.
func reason(err, sentinel error) string {
	msg := err.Error()
	if i := strings.LastIndex(msg, sentinel.Error()+": "); i >= 0 {
		return msg[i+len(sentinel.Error())+2:]
	}
	return msg
}

// removeMade deletes the logbook file made by this run, SQLite's side
// files if any are left, and the directories made for it, for a run that
// failed: nothing stays behind.
func (b *bookFlag) removeMade() {
	if b.lb == nil || !b.created {
		return
	}
	path := b.lb.Path()
	b.lb.Close()
	b.lb = nil
	for _, p := range []string{path, path + "-wal", path + "-shm", path + "-journal"} {
		os.Remove(p)
	}
	removeDirs(b.madeDirs)
}

// removeDirs removes the directories, deepest first, that are empty.
func removeDirs(dirs []string) {
	for _, d := range dirs {
		os.Remove(d) // fails, harmlessly, unless empty
	}
}

// findSite returns the logbook's site called name: the site of exactly that
// name; else the one equal to it ignoring case; else, for the alias "demo",
// the demo's observatory (the logbook's copy when it holds one, else
// demo.Site); else the only site whose name contains name ignoring case.
// Anything else is an error naming --site and listing the sites.
func findSite(lb *logbook.Logbook, name string) (observe.Site, error) {
	sites, err := lb.Sites()
	if err != nil {
		return observe.Site{}, fmt.Errorf("reading the sites of the logbook %q: %w", lb.Path(), err)
	}
	pick := func(s observe.Site) (observe.Site, error) {
		// Site loads the time zone.
		full, err := lb.Site(s.Name)
		if err != nil {
			return observe.Site{}, fmt.Errorf("reading the site %q of the logbook %q: %w", s.Name, lb.Path(), err)
		}
		return full, nil
	}
	for _, s := range sites {
		if s.Name == name {
			return pick(s)
		}
	}
	for _, s := range sites {
		if strings.EqualFold(s.Name, name) {
			return pick(s)
		}
	}
	if strings.EqualFold(name, demoSiteAlias) {
		for _, s := range sites {
			if s.Name == demo.SiteName {
				return pick(s)
			}
		}
		return demo.Site(), nil
	}
	var parts []observe.Site
	for _, s := range sites {
		if strings.Contains(strings.ToLower(s.Name), strings.ToLower(name)) {
			parts = append(parts, s)
		}
	}
	switch {
	case len(parts) == 1:
		return pick(parts[0])
	case len(parts) > 1:
		return observe.Site{}, &flagError{flag: "site", err: fmt.Errorf("%q is part of the names of %d sites in the logbook %q: %s: give the whole name",
			name, len(parts), lb.Path(), siteNames(parts))}
	case len(sites) == 0:
		return observe.Site{}, &flagError{flag: "site", err: fmt.Errorf("no site named %q: the logbook %q holds no sites; import some (vigil logbook import), or give --lat and --lon, or %q for the demo site",
			name, lb.Path(), demoSiteAlias)}
	}
	return observe.Site{}, &flagError{flag: "site", err: fmt.Errorf("no site named %q in the logbook %q: want one of %s (or %q for the demo site)",
		name, lb.Path(), siteNames(sites), demoSiteAlias)}
}

// defaultSite returns the site a command uses when --site is not given: the
// logbook's only site, or the first in order of name; n is the number of
// sites (see whichSite).
func defaultSite(lb *logbook.Logbook) (site observe.Site, n int, err error) {
	sites, err := lb.Sites()
	if err != nil {
		return observe.Site{}, 0, fmt.Errorf("reading the sites of the logbook %q: %w", lb.Path(), err)
	}
	if len(sites) == 0 {
		return observe.Site{}, 0, &flagError{flag: "logbook", err: fmt.Errorf("the logbook %q holds no sites: import some (vigil logbook import --table sites --input FILE)", lb.Path())}
	}
	site, err = lb.Site(sites[0].Name)
	if err != nil {
		return observe.Site{}, 0, fmt.Errorf("reading the site %q of the logbook %q: %w", sites[0].Name, lb.Path(), err)
	}
	return site, len(sites), nil
}

// whichSite says, for the output, which of the logbook's n sites
// defaultSite chose.
func whichSite(n int) string {
	if n == 1 {
		return "the logbook's only site"
	}
	return fmt.Sprintf("the first of the logbook's %d sites in order of name (choose another with --site NAME)", n)
}

// siteNames lists the sites' names, quoted, for a message: at most
// siteNamesMax of them.
func siteNames(sites []observe.Site) string {
	var names []string
	for i, s := range sites {
		if i == siteNamesMax {
			names = append(names, fmt.Sprintf("... (%d in all)", len(sites)))
			break
		}
		names = append(names, strconv.Quote(s.Name))
	}
	return strings.Join(names, ", ")
}

// siteNamesMax is the most site names a message lists.
const siteNamesMax = 10

// placeObserver is the observer at a site of the logbook (or the demo's).
func placeObserver(s observe.Site) observer {
	return observer{site: s.Site, zone: s.Location(), place: &s}
}
