package nufft

import "sync"

// cacheSize is how many plans CachedPlan keeps: enough for a periodogram's
// block sizes and a re-run on the same grid, small enough that the largest
// plans (tens of MiB of twiddles and corrections at most) stay cheap.
const cacheSize = 4

type planKey struct {
	modes int
	tol   float64
}

var planCache struct {
	sync.Mutex
	keys  []planKey // oldest first
	plans map[planKey]*Plan
}

// CachedPlan returns a plan for modes and tol, reusing one made by an
// earlier call when it is still among the last few used. Making a plan
// costs about as much as one transform (the kernel's Fourier transform at
// K/2 modes), so searches repeated on the same grid, as an interactive
// window does, need not pay it again. Plans are read-only, so one plan may
// serve several goroutines.
func CachedPlan(modes int, tol float64) (*Plan, error) {
	key := planKey{modes, tol}
	planCache.Lock()
	if p, ok := planCache.plans[key]; ok {
		for i, k := range planCache.keys {
			if k == key {
				planCache.keys = append(append(planCache.keys[:i:i], planCache.keys[i+1:]...), key)
				break
			}
		}
		planCache.Unlock()
		return p, nil
	}
	planCache.Unlock()
	p, err := NewPlan(modes, tol)
	if err != nil {
		return nil, err
	}
	planCache.Lock()
	defer planCache.Unlock()
	if planCache.plans == nil {
		planCache.plans = make(map[planKey]*Plan)
	}
	if _, ok := planCache.plans[key]; !ok {
		if len(planCache.keys) == cacheSize {
			delete(planCache.plans, planCache.keys[0])
			planCache.keys = planCache.keys[1:]
		}
		planCache.keys = append(planCache.keys, key)
		planCache.plans[key] = p
	}
	return planCache.plans[key], nil
}
