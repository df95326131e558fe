module vigil

go 1.26.0

require (
	github.com/soniakeys/meeus/v3 v3.0.1
	github.com/soniakeys/unit v1.0.0
)

require gonum.org/v1/gonum v0.17.0
