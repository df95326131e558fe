package observe

import (
	"slices"
	"sync"
)

// forecaster is one forecast worker: the planner, the sky table, the
// nights' starts and its output, with the buffers it reuses from target to
// target.
type forecaster struct {
	p      *Planner
	tb     *skyTable
	starts []float64    // JD (UTC) of the nights' starts, and the end of the last
	o      *forecastOut // this worker's events
	w      int32        // this worker's index (in forecastKey)
	tr     track
	ws     winSpans
	cand   spans // the target's candidate spans (skyTable.candidates)
	high   spans // candidates' scratch space
}

// target adds to the worker's output the events of tg (index i of the
// caller's list) that the forecast's plans hold (NightPlan.Events), each in
// the store of its night with its key. It returns the first error of
// solving the light time.
func (fc *forecaster) target(tg *Target, i int) error {
	tb, c, tr := fc.tb, &fc.p.c, &fc.tr
	lo, hi := fc.starts[0], fc.starts[len(fc.starts)-1]
	eph := &tg.Ephemeris
	tb.reset(tr, tg, i)
	keep := c.KeepAll
	fn := func(cyc float64, sec bool) error {
		// An event none of whose window is usable has the verdict "not
		// observable, coverage 0" at once: a plan leaves it out unless
		// KeepAll is set. The window lies within seenMarginDays of the
		// ephemeris time, so a window that cannot meet the candidate spans
		// (darkness with the star high enough) is found before the light
		// time is solved. With Q = 0 cyclesNear has made this test
		// already; with Q ≠ 0 it widened the spans by the widest window
		// any period gets.
		T := eph.At(cyc)
		hw := c.HalfWidthDays(eph.PeriodAt(cyc))
		if !keep && eph.Q != 0 && !fc.cand.meets(T-hw-seenMarginDays, T+hw+seenMarginDays) {
			return nil
		}
		jd, err := tb.seen(tr, T)
		if err != nil || jd < lo || jd >= hi {
			return err
		}
		if !keep {
			// Leave out a window that no dark span meets (as
			// tb.dark.meets(jd-hw, jd+hw), from the last answer on).
			d := tb.dark.firstFrom(jd-hw, fc.ws.dark0)
			if fc.ws.dark0 = d; d == len(tb.dark) || tb.dark[d].a >= jd+hw {
				return nil
			}
		}
		tb.windowSpans(tr, jd, hw, &fc.ws)
		if !keep && !(fc.ws.usable.total() > 0) {
			return nil
		}
		st := fc.o.night(jd)
		e := st.slot()
		tb.event(e, tr, c, cyc, sec, jd, &fc.ws)
		if !keep && !e.Observable && !(e.Window.UsableFraction > 0) {
			*e = Event{}
			return nil
		}
		st.keys = append(st.keys, forecastKey{k: nightKey(jd, st.start, i), w: fc.w, i: int32(len(st.keys))})
		return nil
	}
	if keep {
		return cycles(tg, tg.Secondary, lo, hi, fn)
	}
	from, to := tb.span.From().JDUTC(), tb.span.To().JDUTC()
	fc.cand, fc.high = tb.candidates(tr, from, to, fc.cand, fc.high)
	hwMax := c.maxHalfWidth() // the period changes with Q
	if eph.Q == 0 {
		hwMax = c.HalfWidthDays(eph.PeriodDays)
	}
	return cyclesNear(tg, tg.Secondary, lo, hi, fc.cand, hwMax+seenMarginDays, fn)
}

// forecastKey places one event of a forecast: its instant and target (the
// sort order, in k), and where the worker w keeps it (index i of its
// night's store).
//
// k holds the event's instant, counted in units of 2⁻³¹ d from the start of
// its night, above the target's index: every Julian date ephem accepts
// (1620 to 2200) lies in [2²¹, 2²²), where float64 values are whole
// multiples of 2⁻³¹ d, so the count is exact and fits 32 bits in a night
// shorter than two days. Keys order as (instant, target) do.
type forecastKey struct {
	k uint64
	w int32
	i int32
}

// nightKey returns the key of an event at jd of target index target in the
// night that starts at start.
func nightKey(jd, start float64, target int) uint64 {
	return uint64(jd*0x1p31-start*0x1p31)<<32 | uint64(uint32(target))
}

// sortKeys sorts keys by k, with tmp as scratch space, and returns the
// sorted keys and the scratch space (each is one of the two): a radix sort,
// least significant byte first, over the bytes in which the keys differ.
func sortKeys(keys, tmp []forecastKey) (sorted, scratch []forecastKey) {
	if len(keys) < 2 {
		return keys, tmp
	}
	var diff uint64
	for _, x := range keys {
		diff |= x.k ^ keys[0].k
	}
	tmp = slices.Grow(tmp[:0], len(keys))[:len(keys)]
	src, dst := keys, tmp
	for shift := 0; shift < 64; shift += 8 {
		if (diff>>shift)&0xff == 0 {
			continue
		}
		var at [256]int
		for _, x := range src {
			at[(x.k>>shift)&0xff]++
		}
		sum := 0
		for b, c := range at {
			at[b] = sum
			sum += c
		}
		for _, x := range src {
			b := (x.k >> shift) & 0xff
			dst[at[b]] = x
			at[b]++
		}
		src, dst = dst, src
	}
	return src, dst
}

// eventBlockLen is the number of events in one block of a forecast
// worker's store (about 120 kB).
const eventBlockLen = 512

type eventBlock [eventBlockLen]Event

// Pools of event blocks and of worker outputs, reused between forecasts: a
// forecast of 10,000 targets would otherwise allocate twice the memory of
// its result.
var (
	blockPool = sync.Pool{New: func() any { return new(eventBlock) }}
	outPool   = sync.Pool{New: func() any { return new(forecastOut) }}
)

// forecastOut is what one forecast worker found: its events night by night.
type forecastOut struct {
	nights []nightStore
	err    error
	errAt  int // the index of the target of err
}

// nightStore holds the events one worker found in one night, and their
// keys: event i in block i/eventBlockLen.
type nightStore struct {
	start  float64 // the night's start, JD (UTC)
	keys   []forecastKey
	blocks []*eventBlock
}

// getOut returns an empty output for the nights that start at starts (and
// end at the last of them).
func getOut(starts []float64) *forecastOut {
	nights := len(starts) - 1
	o := outPool.Get().(*forecastOut)
	if cap(o.nights) < nights {
		o.nights = append(o.nights[:cap(o.nights)], make([]nightStore, nights-cap(o.nights))...)
	}
	o.nights = o.nights[:nights]
	for n := range o.nights {
		o.nights[n].start = starts[n]
	}
	return o
}

// night returns the store of the night in which jd lies (the last whose
// start is at or before it). The nights are a day long: the guess from
// the first start is off by at most one.
func (o *forecastOut) night(jd float64) *nightStore {
	last := len(o.nights) - 1
	n := max(0, min(int(jd-o.nights[0].start), last))
	for n > 0 && o.nights[n].start > jd {
		n--
	}
	for n < last && o.nights[n+1].start <= jd {
		n++
	}
	return &o.nights[n]
}

// slot returns the place of the store's next event.
func (s *nightStore) slot() *Event {
	i := len(s.keys)
	if i/eventBlockLen == len(s.blocks) {
		s.blocks = append(s.blocks, blockPool.Get().(*eventBlock))
	}
	return &s.blocks[i/eventBlockLen][i%eventBlockLen]
}

// at returns event i of the store.
func (s *nightStore) at(i int32) *Event { return &s.blocks[i/eventBlockLen][i%eventBlockLen] }

// release clears the blocks (they hold names and time zones) and returns
// them and the output to their pools.
func (o *forecastOut) release() {
	for n := range o.nights {
		s := &o.nights[n]
		for b, blk := range s.blocks {
			clear(blk[:max(0, min(eventBlockLen, len(s.keys)-b*eventBlockLen))])
			blockPool.Put(blk)
		}
		s.keys, s.blocks = s.keys[:0], s.blocks[:0]
	}
	o.err, o.errAt = nil, 0
	outPool.Put(o)
}
