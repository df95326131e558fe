package observe

import "math"

// Unit conversions of the file formats (a VOTable may give angles in
// radians and times in seconds) and of the tests.
const (
	deg2rad   = math.Pi / 180
	rad2deg   = 180 / math.Pi
	secPerDay = 86400.0
)
