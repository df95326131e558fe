package ephem

import (
	"math"
	"sync"
)

// Frames hands out one Frame per UTC day, computed on first use and kept:
// the way to convert or plan many instants cheaply. The frame for an instant
// is the one of the nearest 0h UTC, so it is never more than half a day away
// (see Frame.Sky for what that costs in accuracy: well under an arcsecond and
// a millisecond). Safe for concurrent use.
type Frames struct {
	mu sync.RWMutex
	m  map[int64]*Frame
}

// NewFrames returns an empty cache.
func NewFrames() *Frames { return &Frames{m: map[int64]*Frame{}} }

// For returns the frame to use for instant t, which must be valid.
func (fs *Frames) For(t Time) *Frame {
	k := int64(math.Floor(t.jd)) // 0h UTC of the nearest day is k + 0.5
	fs.mu.RLock()
	f := fs.m[k]
	fs.mu.RUnlock()
	if f != nil {
		return f
	}
	c := float64(k) + 0.5
	if c < minJD {
		c = minJD
	}
	if c >= maxJD {
		c = maxJD - 0.5
	}
	f = NewFrame(mustJD(c))
	fs.mu.Lock()
	if g := fs.m[k]; g != nil {
		f = g
	} else {
		fs.m[k] = f
	}
	fs.mu.Unlock()
	return f
}

// Len returns the number of frames held.
func (fs *Frames) Len() int {
	fs.mu.RLock()
	defer fs.mu.RUnlock()
	return len(fs.m)
}
