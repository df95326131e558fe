package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"strings"
)

// flags is the flag set of one subcommand. The standard flag package does
// the parsing, so --lat and -lat, --lat=52 and --lat 52 all work; flags adds
// the declared order, units and defaults that --help prints, and turns every
// failure into one message naming the flag.
//
// Every value flag is read as a string and converted afterwards with the
// engine's parsers (ephem.ParseRA, ...), so that the message quotes the text
// exactly as typed.
type flags struct {
	cmd      string // "vigil sky"
	synopsis string // the usage line, without "vigil sky"
	about    string // what the command does, a few lines
	fs       *flag.FlagSet
	specs    []*flagSpec
	set      map[string]bool // flags given on the command line
}

// flagSpec describes one flag for --help and for the messages.
type flagSpec struct {
	name  string
	arg   string // placeholder naming the unit: DEG, HOURS, INSTANT; "" for a switch
	usage string // what it is, with its unit
	def   string // the default as shown; "" when there is none
	note  string // "required", "required unless --site", ...
}

// newFlags starts the flag set of the command cmd ("vigil sky").
func newFlags(cmd, synopsis, about string) *flags {
	fs := flag.NewFlagSet(cmd, flag.ContinueOnError)
	// The flag package would print its own messages and usage; run prints
	// one line instead, and --help prints the help below.
	fs.SetOutput(io.Discard)
	fs.Usage = func() {}
	return &flags{cmd: cmd, synopsis: synopsis, about: about, fs: fs, set: map[string]bool{}}
}

// value declares a flag that takes a value; def is its default ("" for none).
func (f *flags) value(name, arg, def, usage, note string) *string {
	f.specs = append(f.specs, &flagSpec{name: name, arg: arg, usage: usage, def: def, note: note})
	return f.fs.String(name, def, usage)
}

// required declares a flag that must be given.
func (f *flags) required(name, arg, usage string) *string {
	return f.value(name, arg, "", usage, "required")
}

// repeated declares a flag that may be given several times, as --comp is;
// the values are kept in the order given. note says whether it is required
// (checked by the command: get only reads single values).
func (f *flags) repeated(name, arg, usage, note string) *[]string {
	f.specs = append(f.specs, &flagSpec{name: name, arg: arg, usage: usage, note: note})
	var vs stringList
	f.fs.Var(&vs, name, usage)
	return (*[]string)(&vs)
}

// stringList is the flag.Value of a repeated flag: each use appends.
type stringList []string

func (l *stringList) String() string {
	if l == nil {
		return ""
	}
	return strings.Join(*l, " ")
}

func (l *stringList) Set(s string) error { *l = append(*l, s); return nil }

// toggle declares a switch, false unless given.
func (f *flags) toggle(name, usage string) *bool {
	f.specs = append(f.specs, &flagSpec{name: name, usage: usage})
	return f.fs.Bool(name, false, usage)
}

// parse reads args. It returns errHelp after printing the help to w when
// --help (or -h) is among them, and a one-line error naming the flag when the
// command line is malformed. Required flags are checked by get.
func (f *flags) parse(args []string, w io.Writer) error {
	if err := f.fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			f.writeHelp(w)
			return errHelp
		}
		return f.translate(err)
	}
	if rest := f.fs.Args(); len(rest) > 0 {
		return fmt.Errorf("unexpected argument %q: every value goes after its flag, as in --lat 52.1 (see %s --help)", rest[0], f.cmd)
	}
	f.fs.Visit(func(fl *flag.Flag) { f.set[fl.Name] = true })
	return nil
}

// given reports whether the flag was on the command line.
func (f *flags) given(name string) bool { return f.set[name] }

// spec returns the declaration of a flag; it panics on a name never declared,
// which is a programming error in this package.
func (f *flags) spec(name string) *flagSpec {
	for _, s := range f.specs {
		if s.name == name {
			return s
		}
	}
	panic("vigil: flag --" + name + " was never declared")
}

// missing is the error for a required flag that was not given.
func (f *flags) missing(name string) error {
	s := f.spec(name)
	return fmt.Errorf("flag --%s: missing (%s): %s (see %s --help)", name, s.note, s.usage, f.cmd)
}

// flagError is an error about one flag's value.
type flagError struct {
	flag string
	err  error
}

func (e *flagError) Error() string { return "flag --" + e.flag + ": " + e.err.Error() }
func (e *flagError) Unwrap() error { return e.err }

// get converts the text of flag name with parse, after checking that a
// required flag was given. The error names the flag and keeps parse's
// message, which quotes the value and says what was expected.
func get[T any](f *flags, name, raw string, parse func(string) (T, error)) (T, error) {
	if f.spec(name).note == "required" && !f.given(name) {
		var zero T
		return zero, f.missing(name)
	}
	v, err := parse(raw)
	if err != nil {
		return v, &flagError{flag: name, err: err}
	}
	return v, nil
}

// translate rewrites the flag package's messages so that every one names
// the flag as --name and points to the help.
func (f *flags) translate(err error) error {
	msg := err.Error()
	dashes := func(s string) string { return "--" + strings.TrimLeft(s, "-") }
	if name, ok := strings.CutPrefix(msg, "flag provided but not defined: "); ok {
		return fmt.Errorf("flag %s: unknown flag (see %s --help for the flags)", dashes(name), f.cmd)
	}
	if name, ok := strings.CutPrefix(msg, "flag needs an argument: "); ok {
		arg := "a value"
		if s := f.lookupSpec(strings.TrimLeft(name, "-")); s != nil && s.arg != "" {
			arg = s.arg
		}
		return fmt.Errorf("flag %s: needs %s after it", dashes(name), arg)
	}
	if rest, ok := strings.CutPrefix(msg, "invalid boolean value "); ok {
		// invalid boolean value "x" for -json: parse error
		if i := strings.Index(rest, " for -"); i >= 0 {
			name, _, _ := strings.Cut(rest[i+len(" for "):], ":")
			return fmt.Errorf("flag %s: %s is not true or false (a switch: give it alone, or as %s=false)", dashes(name), rest[:i], dashes(name))
		}
	}
	if rest, ok := strings.CutPrefix(msg, "bad flag syntax: "); ok {
		return fmt.Errorf("flag %s: bad flag syntax: want --name or --name=value", rest)
	}
	return fmt.Errorf("%s (see %s --help)", msg, f.cmd)
}

// lookupSpec is spec without the panic, for names typed by the user.
func (f *flags) lookupSpec(name string) *flagSpec {
	for _, s := range f.specs {
		if s.name == name {
			return s
		}
	}
	return nil
}

// writeHelp prints the command's help: usage, what it does and every flag
// with its unit and default.
func (f *flags) writeHelp(w io.Writer) {
	var b bytes.Buffer
	fmt.Fprintf(&b, "Usage:\n  %s %s\n\n%s\n\nFlags:\n", f.cmd, f.synopsis, strings.TrimSpace(f.about))
	width := 0
	heads := make([]string, len(f.specs))
	for i, s := range f.specs {
		heads[i] = "--" + s.name
		if s.arg != "" {
			heads[i] += " " + s.arg
		}
		width = max(width, len(heads[i]))
	}
	for i, s := range f.specs {
		var extra []string
		if s.note != "" {
			extra = append(extra, s.note)
		}
		if s.def != "" {
			extra = append(extra, "default "+s.def)
		}
		line := s.usage
		if len(extra) > 0 {
			line += " (" + strings.Join(extra, "; ") + ")"
		}
		fmt.Fprintf(&b, "  %-*s  %s\n", width, heads[i], line)
	}
	fmt.Fprintf(&b, "  %-*s  %s\n", width, "--help", "print this help and exit")
	fmt.Fprintf(&b, "\nBoth --name and -name work, as do --name VALUE and --name=VALUE.\n")
	w.Write(b.Bytes())
}
