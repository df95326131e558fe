package demo

import (
	"path/filepath"
	"testing"
)

// BenchmarkCreate measures the first run: generating the demo scenario and
// writing it as a new logbook (the goal is well under a second).
func BenchmarkCreate(b *testing.B) {
	for i := 0; i < b.N; i++ {
		lb, err := Create(filepath.Join(b.TempDir(), "demo.db"))
		if err != nil {
			b.Fatal(err)
		}
		lb.Close()
	}
}

// BenchmarkGenerate measures the generation alone, without the logbook.
func BenchmarkGenerate(b *testing.B) {
	for i := 0; i < b.N; i++ {
		if _, err := generate(seed); err != nil {
			b.Fatal(err)
		}
	}
}
