package app

import (
	"context"
	"errors"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
)

// direct is the post of model tests: it runs the function at once.
func direct(f func()) { f() }

// result collects what onDone was given, safely across goroutines.
type result struct {
	mu    sync.Mutex
	calls []string
}

func (r *result) add(s string) {
	r.mu.Lock()
	r.calls = append(r.calls, s)
	r.mu.Unlock()
}

func (r *result) list() []string {
	r.mu.Lock()
	defer r.mu.Unlock()
	return append([]string(nil), r.calls...)
}

func TestJobDeliversResult(t *testing.T) {
	j := NewJobs(direct)
	var r result
	Run(j, "a", "", func(context.Context, Progress) (int, error) { return 42, nil },
		func(v int, err error) {
			if err != nil {
				r.add("error " + err.Error())
				return
			}
			r.add(strings.Repeat("x", v))
		})
	j.Wait()
	if got := r.list(); len(got) != 1 || len(got[0]) != 42 {
		t.Errorf("onDone calls: got %q, want one call with 42", got)
	}
	if !j.Idle() || j.Busy("a") {
		t.Error("the runner is not idle after its job was delivered")
	}
}

func TestNewJobCancelsOldInSameSlot(t *testing.T) {
	j := NewJobs(direct)
	var r result
	started := make(chan struct{})
	oldSawCancel := make(chan bool, 1)
	Run(j, "plan", "old", func(ctx context.Context, _ Progress) (string, error) {
		close(started)
		<-ctx.Done()
		oldSawCancel <- true
		return "old", nil // a result despite the cancel: it must still be dropped
	}, func(v string, err error) { r.add("old:" + v) })
	<-started
	Run(j, "plan", "new", func(context.Context, Progress) (string, error) { return "new", nil },
		func(v string, err error) { r.add("new:" + v) })
	Run(j, "other", "", func(context.Context, Progress) (string, error) { return "other", nil },
		func(v string, err error) { r.add("other:" + v) })
	j.Wait()
	if !<-oldSawCancel {
		t.Error("the old job's context was not cancelled")
	}
	got := strings.Join(r.list(), ",")
	if strings.Contains(got, "old:") || !strings.Contains(got, "new:new") || !strings.Contains(got, "other:other") {
		t.Errorf("deliveries: got %q, want new:new and other:other, never old", got)
	}
}

func TestCancelGivesCanceled(t *testing.T) {
	j := NewJobs(direct)
	started := make(chan struct{})
	var gotErr error
	var mu sync.Mutex
	Run(j, "search", "Period search", func(ctx context.Context, p Progress) (float64, error) {
		p(3, 10)
		close(started)
		<-ctx.Done()
		return 0, ctx.Err()
	}, func(_ float64, err error) { mu.Lock(); gotErr = err; mu.Unlock() })
	<-started
	run := j.Running()
	if len(run) != 1 || run[0].Name != "Period search" || run[0].Done != 3 || run[0].Total != 10 {
		t.Errorf("Running: got %+v, want the period search at 3 of 10", run)
	}
	j.Cancel("search")
	j.Wait()
	mu.Lock()
	defer mu.Unlock()
	if !errors.Is(gotErr, context.Canceled) {
		t.Errorf("onDone after Cancel: got %v, want context.Canceled", gotErr)
	}
}

func TestPanicBecomesError(t *testing.T) {
	j := NewJobs(direct)
	var gotErr error
	Run(j, "fit", "Fitting the extremum", func(context.Context, Progress) (int, error) {
		var m map[string]int
		m["x"] = 1 // panics: assignment to a nil map
		return 0, nil
	}, func(_ int, err error) { gotErr = err })
	j.Wait()
	if gotErr == nil || !strings.Contains(gotErr.Error(), "Fitting the extremum") {
		t.Errorf("a panicking job: got %v, want an error naming the job", gotErr)
	}
}

func TestQuietJobsStayOutOfRunning(t *testing.T) {
	j := NewJobs(direct)
	release := make(chan struct{})
	var calls atomic.Int32
	j.OnChange(func() { calls.Add(1) })
	Run(j, "chart#1", "", func(context.Context, Progress) (int, error) { <-release; return 0, nil }, nil)
	if n := len(j.Running()); n != 0 {
		t.Errorf("Running lists %d jobs, want 0: a job without a name is not shown", n)
	}
	if !j.Busy("chart#1") {
		t.Error("Busy(chart#1) is false while its job runs")
	}
	close(release)
	j.Wait()
	if calls.Load() == 0 {
		t.Error("OnChange listeners were never called")
	}
}
