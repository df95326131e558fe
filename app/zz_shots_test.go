package app

import (
	"os"
	"path/filepath"
	"testing"
	"time"

	"fyne.io/fyne/v2/test"
)

func TestZZShots(t *testing.T) {
	dir := "/tmp/vshots"
	os.MkdirAll(dir, 0o755)
	w, q := openWindow(t, demoLogbook(t))
	w.Session.SetDate(time.Date(2026, 11, 5, 0, 0, 0, 0, time.UTC))
	w.Session.Select("Ashgrove V4")
	settle(t, w, q)
	tv := timingPage(t, w)
	sv := starPage(t, w)
	shot := func(name string) {
		settle(t, w, q)
		if err := writePNG(filepath.Join(dir, name+".png"), w.Win.Canvas().Capture()); err != nil {
			t.Fatal(err)
		}
	}
	for _, th := range Themes {
		w.Session.SetTheme(th)
		settle(t, w, q)
		w.ShowPage("timing")
		tv.tabs.SelectIndex(0)
		settle(t, w, q)
		test.Tap(tv.fit.fitBtn)
		shot("timing-fit-" + th.Slug())
		tv.tabs.SelectIndex(1)
		shot("timing-oc-" + th.Slug())
		tv.tabs.SelectIndex(2)
		settle(t, w, q)
		test.Tap(tv.per.search)
		shot("timing-period-" + th.Slug())
		w.ShowPage("star")
		sv.form.open(starFormEdit)
		shot("star-edit-" + th.Slug())
		sv.form.close()
		sv.form.open(starFormAdopt)
		shot("star-adopt-" + th.Slug())
		sv.form.close()
		w.ShowPage("measure")
		shot("measure-" + th.Slug())
	}
}
