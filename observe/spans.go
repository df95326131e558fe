package observe

// span is a time interval [a, b) in Julian days (UTC).
type span struct{ a, b float64 }

// spans is a sorted list of disjoint intervals.
type spans []span

// mergeTol is the gap (days, about 9 ms) below which touching intervals are
// joined.
const mergeTol = 1e-7

// add appends [a, b) to a list built in increasing order, joining it to the
// last interval when they touch.
func (s spans) add(a, b float64) spans {
	if !(b > a) {
		return s
	}
	if n := len(s); n > 0 && a <= s[n-1].b+mergeTol {
		if b > s[n-1].b {
			s[n-1].b = b
		}
		return s
	}
	return append(s, span{a, b})
}

// intersect returns s ∩ o, appended to dst[:0].
func (s spans) intersect(o spans, dst spans) spans {
	dst = dst[:0]
	i, j := 0, 0
	for i < len(s) && j < len(o) {
		a := max(s[i].a, o[j].a)
		b := min(s[i].b, o[j].b)
		if b > a {
			dst = dst.add(a, b)
		}
		if s[i].b < o[j].b {
			i++
		} else {
			j++
		}
	}
	return dst
}

// first returns the index of the first interval that ends after t (a
// binary search).
func (s spans) first(t float64) int {
	lo, hi := 0, len(s)
	for lo < hi {
		m := int(uint(lo+hi) >> 1)
		if s[m].b > t {
			hi = m
		} else {
			lo = m + 1
		}
	}
	return lo
}

// firstFrom returns s.first(t), trying the index guess (such as the
// answer for a nearby earlier t) and the one after it before searching.
func (s spans) firstFrom(t float64, guess int) int {
	for i := max(guess, 0); i <= min(guess+1, len(s)); i++ {
		if (i == len(s) || s[i].b > t) && (i == 0 || s[i-1].b <= t) {
			return i
		}
	}
	return s.first(t)
}

// meets reports whether s has a part of positive length in [lo, hi).
func (s spans) meets(lo, hi float64) bool {
	i := s.first(lo)
	return i < len(s) && s[i].a < hi && lo < hi
}

// measure returns the length (days) of s ∩ [lo, hi).
func (s spans) measure(lo, hi float64) float64 {
	m := 0.0
	for i := s.first(lo); i < len(s) && s[i].a < hi; i++ {
		m += min(s[i].b, hi) - max(s[i].a, lo)
	}
	return m
}

// each calls fn for every piece of s ∩ [lo, hi).
func (s spans) each(lo, hi float64, fn func(a, b float64)) {
	for i := s.first(lo); i < len(s) && s[i].a < hi; i++ {
		fn(max(s[i].a, lo), min(s[i].b, hi))
	}
}
