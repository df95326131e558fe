package reduce

// Point is one measurement of a light curve or one timing: a time (Julian
// date, on a scale the caller states), a value (a magnitude, or an O−C in
// days) and its one-sigma error (NaN or 0 when unknown).
type Point struct {
	T   float64
	Mag float64
	Err float64
}
