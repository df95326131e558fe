package ephem

import "math"

// vec3 is a Cartesian 3-vector; mat3 a 3×3 rotation matrix, row major.
type (
	vec3 [3]float64
	mat3 [3][3]float64
)

const (
	deg2rad = math.Pi / 180
	rad2deg = 180 / math.Pi
	// arcsec2rad converts seconds of arc to radians.
	arcsec2rad = deg2rad / 3600
)

func (a vec3) dot(b vec3) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
func (a vec3) add(b vec3) vec3    { return vec3{a[0] + b[0], a[1] + b[1], a[2] + b[2]} }
func (a vec3) sub(b vec3) vec3    { return vec3{a[0] - b[0], a[1] - b[1], a[2] - b[2]} }
func (a vec3) scale(s float64) vec3 {
	return vec3{a[0] * s, a[1] * s, a[2] * s}
}
func (a vec3) norm() float64 { return math.Sqrt(a.dot(a)) }
func (a vec3) unit() vec3    { return a.scale(1 / a.norm()) }

// mul returns m·v.
func (m *mat3) mul(v vec3) vec3 {
	return vec3{
		m[0][0]*v[0] + m[0][1]*v[1] + m[0][2]*v[2],
		m[1][0]*v[0] + m[1][1]*v[1] + m[1][2]*v[2],
		m[2][0]*v[0] + m[2][1]*v[1] + m[2][2]*v[2],
	}
}

// tmul returns mᵀ·v (the inverse rotation).
func (m *mat3) tmul(v vec3) vec3 {
	return vec3{
		m[0][0]*v[0] + m[1][0]*v[1] + m[2][0]*v[2],
		m[0][1]*v[0] + m[1][1]*v[1] + m[2][1]*v[2],
		m[0][2]*v[0] + m[1][2]*v[1] + m[2][2]*v[2],
	}
}

// mulm returns a·b.
func (a *mat3) mulm(b *mat3) mat3 {
	var r mat3
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			r[i][j] = a[i][0]*b[0][j] + a[i][1]*b[1][j] + a[i][2]*b[2][j]
		}
	}
	return r
}

// rotX, rotY, rotZ are the passive rotations of the IAU conventions (a frame
// rotated by +θ about the axis): R1, R2, R3 of the Explanatory Supplement to
// the Astronomical Almanac (1992), sect. 11.4.
func rotX(t float64) mat3 {
	s, c := math.Sincos(t)
	return mat3{{1, 0, 0}, {0, c, s}, {0, -s, c}}
}

func rotY(t float64) mat3 {
	s, c := math.Sincos(t)
	return mat3{{c, 0, -s}, {0, 1, 0}, {s, 0, c}}
}

func rotZ(t float64) mat3 {
	s, c := math.Sincos(t)
	return mat3{{c, s, 0}, {-s, c, 0}, {0, 0, 1}}
}

// sphToVec returns the unit vector at longitude lon and latitude lat (radians).
func sphToVec(lon, lat float64) vec3 {
	sl, cl := math.Sincos(lon)
	sb, cb := math.Sincos(lat)
	return vec3{cb * cl, cb * sl, sb}
}

// vecToSph returns longitude in [0, 2π) and latitude of v (radians).
func vecToSph(v vec3) (lon, lat float64) {
	lon = math.Atan2(v[1], v[0])
	if lon < 0 {
		lon += 2 * math.Pi
	}
	lat = math.Atan2(v[2], math.Hypot(v[0], v[1]))
	return lon, lat
}

// angleBetween returns the angle between two vectors (radians), by the
// atan2 form that stays accurate for small and near-180° separations.
func angleBetween(a, b vec3) float64 {
	c := vec3{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
	return math.Atan2(c.norm(), a.dot(b))
}
