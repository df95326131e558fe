package reduce

import (
	"fmt"
	"runtime"
	"sync"

	"example.org/vigil/ephem"
)

// ConvertTimes returns, for each instant of jdUTC (Julian dates on the UTC
// scale), the heliocentric Julian date on the UTC scale (HJD_UTC) and the
// barycentric Julian date on the TDB scale (BJD_TDB) of light from the star:
// the instant plus the light time from the observer to the Sun's centre or
// to the solar-system barycentre along the star's direction (Eastman, Siverd
// & Gaudi 2010, PASP 122, 935, eq. 1). With a site the observer is there
// (topocentric, as ephem.Sky.HJD and ephem.Sky.BJDTDB); with a nil site it
// is the Earth's centre (ephem.Frame.HJD and ephem.Frame.BJDTDB): the two
// differ by at most 21 ms.
//
// The work uses one ephem.Frame per UTC day and is spread over GOMAXPROCS
// goroutines. Accuracy is the engine's: a few hundredths of a second against
// astropy (see the tests). The error names the first instant outside ephem's
// supported range, by its index.
func ConvertTimes(jdUTC []float64, star ephem.Star, site *ephem.Site) (hjd, bjdTDB []float64, err error) {
	lt, err := newLightTimer(star, site, nil)
	if err != nil {
		return nil, nil, err
	}
	n := len(jdUTC)
	hjd = make([]float64, n)
	bjdTDB = make([]float64, n)
	var firstErr photoFirstError
	photoParallel(n, func(lo, hi int) {
		for i := lo; i < hi; i++ {
			t, err := ephem.FromJDUTC(jdUTC[i])
			if err != nil {
				firstErr.set(i, fmt.Errorf("reduce: time %d: %w", i+1, err))
				return
			}
			hjd[i], bjdTDB[i], _ = lt.at(t)
		}
	})
	if err := firstErr.get(); err != nil {
		return nil, nil, err
	}
	return hjd, bjdTDB, nil
}

// lightTimer converts instants to HJD and BJD_TDB for one star, from one
// site or from the Earth's centre, with a shared cache of frames.
type lightTimer struct {
	frames *ephem.Frames
	vec    ephem.StarVec
	site   ephem.Site
	topo   bool
}

func newLightTimer(star ephem.Star, site *ephem.Site, frames *ephem.Frames) (*lightTimer, error) {
	if err := star.Validate(); err != nil {
		return nil, fmt.Errorf("reduce: target position: %w", err)
	}
	lt := &lightTimer{frames: frames, vec: star.Vec()}
	if lt.frames == nil {
		lt.frames = ephem.NewFrames()
	}
	if site != nil {
		if err := site.Validate(); err != nil {
			return nil, fmt.Errorf("reduce: site: %w", err)
		}
		lt.site, lt.topo = *site, true
	}
	return lt, nil
}

// at returns HJD_UTC and BJD_TDB of instant t, and the view from the site
// (nil without a site) for further use at the same instant.
func (lt *lightTimer) at(t ephem.Time) (hjd, bjd float64, sky *ephem.Sky) {
	f := lt.frames.For(t)
	if lt.topo {
		sky = f.Sky(lt.site, t)
		return sky.HJD(&lt.vec), sky.BJDTDB(&lt.vec), sky
	}
	return f.HJD(&lt.vec, t), f.BJDTDB(&lt.vec, t), nil
}

// photoMinChunk is the smallest number of items worth a goroutine of its own.
const photoMinChunk = 2048

// photoParallel calls fn on consecutive chunks [lo, hi) covering [0, n),
// concurrently on up to GOMAXPROCS goroutines, and returns when all are done.
func photoParallel(n int, fn func(lo, hi int)) {
	workers := runtime.GOMAXPROCS(0)
	if w := (n + photoMinChunk - 1) / photoMinChunk; w < workers {
		workers = w
	}
	if workers <= 1 {
		fn(0, n)
		return
	}
	var wg sync.WaitGroup
	size := (n + workers - 1) / workers
	for lo := 0; lo < n; lo += size {
		hi := min(lo+size, n)
		wg.Add(1)
		go func() {
			defer wg.Done()
			fn(lo, hi)
		}()
	}
	wg.Wait()
}

// photoFirstError keeps the error of the lowest index reported by
// concurrent chunks, so that the error returned does not depend on timing.
type photoFirstError struct {
	mu  sync.Mutex
	idx int
	err error
}

func (fe *photoFirstError) set(i int, err error) {
	fe.mu.Lock()
	defer fe.mu.Unlock()
	if fe.err == nil || i < fe.idx {
		fe.idx, fe.err = i, err
	}
}

func (fe *photoFirstError) get() error {
	fe.mu.Lock()
	defer fe.mu.Unlock()
	return fe.err
}
