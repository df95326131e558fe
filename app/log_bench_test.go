package app

import (
	"context"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	"example.org/vigil/internal/demo"
)

// BenchmarkLogNextNight200 measures one step to the next night with 200
// stars while the Log page is in front: the log planned and written as
// text and PDF (in a job), then put on show. "show-ms" is the time spent
// on the UI thread putting a new text on show (the window is busy only
// then), measured apart.
func BenchmarkLogNextNight200(b *testing.B) {
	lb := many200Logbook(b)
	fa := test.NewApp()
	defer fa.Quit()
	q := newUIQueue()
	w := New(fa, lb, Options{Now: func() time.Time { return testNow }, Post: q.post, Size: fyne.NewSize(1280, 800)})
	w.ShowPage("log")
	settle(b, w, q)
	v := w.Page("log").(*logView)
	var show time.Duration
	lines := 0
	for b.Loop() {
		w.Session.NextNight()
		settle(b, w, q)
		if v.preview == nil {
			b.Fatal("no log after stepping")
		}
		b.StopTimer()
		v.text.SetText("")
		start := time.Now()
		v.show()
		show += time.Since(start)
		lines += len(v.text.Rows)
		b.StartTimer()
	}
	b.ReportMetric(float64(show.Milliseconds())/float64(b.N), "show-ms")
	b.ReportMetric(float64(lines)/float64(b.N), "lines")
}

// BenchmarkBuildLogPreviewDemo measures the log of one demo night with a
// record (116 measurements): plan, text and PDF.
func BenchmarkBuildLogPreviewDemo(b *testing.B) {
	lb := openBench(b, benchLogbook(b, "demo.db", func(p string) error {
		lb, err := demo.Create(p)
		if err == nil {
			err = lb.Close()
		}
		return err
	}))
	r := LogRequest{Site: demo.Site(), Date: time.Date(2026, 11, 5, 0, 0, 0, 0, time.UTC)}
	for b.Loop() {
		if _, err := BuildLogPreview(context.Background(), lb, r, nil); err != nil {
			b.Fatal(err)
		}
	}
}
