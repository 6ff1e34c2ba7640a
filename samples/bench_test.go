package samples

import "testing"

// BenchmarkGenerate measures generating a 2,000-section term with its
// witness (the size the design plans for a whole faculty group).
func BenchmarkGenerate(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		GenerateWithWitness(Config{Sections: 2000, Seed: 7})
	}
}
