package app

import (
	"fmt"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// header is the top row: the site, the night with its buttons, the
// twilight strip, the Moon, and the theme.
type header struct {
	w          *Window
	site       *keySelect
	prev, next *widget.Button
	date       *widget.Label
	strip      *twilightStrip
	moon       *widget.Label
	theme      *keySelect
	root       *fyne.Container
}

func newHeader(w *Window) *header {
	h := &header{w: w}
	h.site = newKeySelect(w, nil, func(name string) {
		if name != "" {
			_ = w.Session.SetSite(name) // the options are the session's sites
		}
	})
	h.site.PlaceHolder = "(no site)"
	h.prev = widget.NewButtonWithIcon("", theme.NavigateBackIcon(), w.Session.PrevNight)
	h.next = widget.NewButtonWithIcon("", theme.NavigateNextIcon(), w.Session.NextNight)
	h.date = widget.NewLabelWithStyle("", fyne.TextAlignCenter, fyne.TextStyle{Bold: true})
	h.strip = newTwilightStrip(w.Shades)
	h.moon = widget.NewLabel("")
	var names []string
	for _, t := range Themes {
		names = append(names, t.String())
	}
	h.theme = newKeySelect(w, names, func(s string) {
		for _, t := range Themes {
			if t.String() == s {
				w.Session.SetTheme(t)
			}
		}
	})
	h.theme.SetSelected(w.Session.Theme().String())
	// Site and night on the left, the strip in the middle, the Moon and
	// the theme on the right.
	site := container.NewGridWrap(fyne.NewSize(260, h.site.MinSize().Height), h.site)
	left := container.NewHBox(site, h.prev, h.date, h.next)
	right := container.NewHBox(h.moon, widget.NewIcon(theme.ColorPaletteIcon()), h.theme)
	h.root = container.NewVBox(container.NewBorder(nil, nil, left, right, container.NewPadded(h.strip)), widget.NewSeparator())
	w.Session.OnChange(h.changed)
	return h
}

func (h *header) content() fyne.CanvasObject { return h.root }

// changed follows the session.
func (h *header) changed(c Change) {
	s := h.w.Session
	if c&ChangedSites != 0 {
		var names []string
		for _, st := range s.Sites() {
			names = append(names, st.Name)
		}
		h.site.SetOptions(names)
	}
	if c&(ChangedSites|ChangedSite) != 0 {
		if st, ok := s.Site(); ok {
			h.site.SetSelected(st.Name)
		} else {
			h.site.ClearSelected()
		}
	}
	if c&(ChangedNight|ChangedSite|ChangedSites) != 0 {
		_, ok := s.Site()
		if ok {
			h.date.SetText(nightTitle(s.Date()))
			h.prev.Enable()
			h.next.Enable()
		} else {
			h.date.SetText("No site")
			h.prev.Disable()
			h.next.Disable()
		}
	}
	if c&ChangedPlan != 0 {
		nd := s.Night()
		h.strip.set(nd)
		h.moon.SetText(moonSummary(nd))
	}
	if c&ChangedTheme != 0 {
		h.theme.SetSelected(s.Theme().String())
		h.strip.Refresh()
	}
	h.root.Refresh() // the texts changed width: lay the row out again
}

// moonSummary says how much of the Moon is lit and when it is up in the
// shown part of the night: "Moon 42% · rises 00:29", "sets 21:10",
// "up 18:20–02:10", "up all night" or "down all night".
func moonSummary(nd *NightData) string {
	if nd == nil || nd.Err != nil {
		return "Moon —"
	}
	loc := nd.Request.Site.Location()
	txt := "Moon " + percentText(nd.Sky.MoonIllum) + " · "
	up := nd.MoonUp()
	if len(up) == 0 {
		return txt + "down all night"
	}
	var spans []string
	for _, u := range up {
		rises, sets := u.From.After(nd.From), u.To.Before(nd.To)
		switch {
		case rises && sets:
			spans = append(spans, fmt.Sprintf("up %s–%s", clockText(u.From, loc), clockText(u.To, loc)))
		case rises:
			spans = append(spans, "rises "+clockText(u.From, loc))
		case sets:
			spans = append(spans, "sets "+clockText(u.To, loc))
		default:
			spans = append(spans, "up all night")
		}
	}
	return txt + strings.Join(spans, ", ")
}
