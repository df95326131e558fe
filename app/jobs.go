package app

import (
	"context"
	"fmt"
	"slices"
	"sync"
	"time"
)

// Progress reports how far a job has got: done of total steps (total 0 when
// the length is not known). A job may call it from any goroutine, as often
// as it likes: the window shows the latest value.
type Progress func(done, total int)

// JobFunc is the work of a job. It runs on its own goroutine, must not
// touch widgets or the Session, and should return soon after ctx is
// cancelled (with ctx.Err()).
type JobFunc func(ctx context.Context, progress Progress) (any, error)

// JobInfo describes a running job for the status bar.
type JobInfo struct {
	Slot, Name  string
	Done, Total int // the latest progress
	Started     time.Time
}

// Jobs runs work off the UI thread. Each job runs in a slot: starting a job
// in a slot cancels the job running there, whose result is then dropped.
// Results, and the notifications of OnChange, come back through post, which
// runs a function on the UI thread (fyne.Do in the window; a direct call in
// model tests, so that they need no window).
type Jobs struct {
	post func(func())

	mu        sync.Mutex
	idle      *sync.Cond
	cur       map[string]*job // the current job of each slot
	active    int             // jobs started whose delivery has not run yet
	pending   bool            // a change notification is queued
	listeners []func()
}

type job struct {
	info      JobInfo
	cancel    context.CancelFunc
	cancelled bool // by the user (Cancel), not by a newer job
}

// NewJobs returns a runner that delivers results through post.
func NewJobs(post func(func())) *Jobs {
	j := &Jobs{post: post, cur: map[string]*job{}}
	j.idle = sync.NewCond(&j.mu)
	return j
}

// Start runs fn in slot under a new context, cancelling the job running in
// that slot (whose onDone will not be called). name is shown in the status
// bar with the job's progress and a cancel button; an empty name keeps the
// job out of it (quick work such as drawing a chart). onDone, when not nil,
// gets fn's result on the UI thread, or context.Canceled when the user
// cancelled the job. A panic in fn becomes an error naming the job.
// Call Start on the UI thread.
func (j *Jobs) Start(slot, name string, fn JobFunc, onDone func(any, error)) {
	ctx, cancel := context.WithCancel(context.Background())
	jb := &job{info: JobInfo{Slot: slot, Name: name, Started: time.Now()}, cancel: cancel}
	j.mu.Lock()
	if old := j.cur[slot]; old != nil {
		old.cancel()
	}
	j.cur[slot] = jb
	j.active++
	j.mu.Unlock()
	j.changed()
	progress := func(done, total int) {
		j.mu.Lock()
		jb.info.Done, jb.info.Total = done, total
		j.mu.Unlock()
		j.changed()
	}
	go func() {
		res, err := run(ctx, fn, progress, name, slot)
		j.post(func() { j.deliver(jb, res, err, onDone) })
	}()
}

// run calls fn, turning a panic into an error.
func run(ctx context.Context, fn JobFunc, p Progress, name, slot string) (res any, err error) {
	defer func() {
		if r := recover(); r != nil {
			if name == "" {
				name = slot
			}
			res, err = nil, fmt.Errorf("internal error in %q: %v", name, r)
		}
	}()
	return fn(ctx, p)
}

// deliver runs on the UI thread when a job has returned.
func (j *Jobs) deliver(jb *job, res any, err error, onDone func(any, error)) {
	j.mu.Lock()
	current := j.cur[jb.info.Slot] == jb
	if current {
		delete(j.cur, jb.info.Slot)
	}
	cancelled := jb.cancelled
	j.mu.Unlock()
	jb.cancel()
	if current && onDone != nil {
		if cancelled {
			res, err = nil, context.Canceled
		}
		onDone(res, err)
	}
	j.mu.Lock()
	j.active--
	j.idle.Broadcast()
	j.mu.Unlock()
	j.changed()
}

// Run is Start with a typed result.
func Run[T any](j *Jobs, slot, name string, fn func(ctx context.Context, p Progress) (T, error), onDone func(T, error)) {
	var done func(any, error)
	if onDone != nil {
		done = func(v any, err error) {
			t, _ := v.(T)
			onDone(t, err)
		}
	}
	j.Start(slot, name, func(ctx context.Context, p Progress) (any, error) { return fn(ctx, p) }, done)
}

// Cancel cancels the job running in slot, if any; its onDone gets
// context.Canceled.
func (j *Jobs) Cancel(slot string) {
	j.mu.Lock()
	defer j.mu.Unlock()
	if jb := j.cur[slot]; jb != nil {
		jb.cancelled = true
		jb.cancel()
	}
}

// CancelAll cancels every running job (when the window closes).
func (j *Jobs) CancelAll() {
	j.mu.Lock()
	defer j.mu.Unlock()
	for _, jb := range j.cur {
		jb.cancelled = true
		jb.cancel()
	}
}

// Running returns the named jobs now running, oldest first.
func (j *Jobs) Running() []JobInfo {
	j.mu.Lock()
	defer j.mu.Unlock()
	var out []JobInfo
	for _, jb := range j.cur {
		if jb.info.Name != "" {
			out = append(out, jb.info)
		}
	}
	slices.SortFunc(out, func(a, b JobInfo) int { return a.Started.Compare(b.Started) })
	return out
}

// Busy reports whether a job is running in slot.
func (j *Jobs) Busy(slot string) bool {
	j.mu.Lock()
	defer j.mu.Unlock()
	return j.cur[slot] != nil
}

// Idle reports whether every job started has returned and been delivered.
func (j *Jobs) Idle() bool {
	j.mu.Lock()
	defer j.mu.Unlock()
	return j.active == 0
}

// Wait blocks until Idle. It suits a post that runs functions at once (model
// tests); with a queueing post, run the queue instead.
func (j *Jobs) Wait() {
	j.mu.Lock()
	defer j.mu.Unlock()
	for j.active > 0 {
		j.idle.Wait()
	}
}

// OnChange registers f, called on the UI thread after jobs start, report
// progress or finish (several changes may be reported as one).
func (j *Jobs) OnChange(f func()) {
	j.mu.Lock()
	j.listeners = append(j.listeners, f)
	j.mu.Unlock()
}

// changed queues one notification of the listeners, unless one is queued.
func (j *Jobs) changed() {
	j.mu.Lock()
	if j.pending || len(j.listeners) == 0 {
		j.mu.Unlock()
		return
	}
	j.pending = true
	j.mu.Unlock()
	j.post(func() {
		j.mu.Lock()
		j.pending = false
		ls := slices.Clone(j.listeners)
		j.mu.Unlock()
		for _, f := range ls {
			f()
		}
	})
}
