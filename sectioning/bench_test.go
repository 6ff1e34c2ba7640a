package sectioning

import (
	"context"
	"math/rand/v2"
	"testing"
)

// large is a generated term of the size of the largest public ITC-2019
// instance with students (13,497 students, about a thousand sections):
// courses with 1-3 arrangements of 1-4 parts, parents, limits about the
// requests times 1.1, random placements.
var large = genSpec{students: 13497, courses: 230, maxArrs: 3, maxParts: 4, maxSections: 3, perStudent: [2]int{3, 7},
	slack: 1.1, parents: true, alternatives: true, priorities: true, fixed: 500}

// BenchmarkSectionLarge sections the large generated term.
func BenchmarkSectionLarge(b *testing.B) {
	term, sched := genTerm(rand.New(rand.NewPCG(1, 1)), large)
	b.Logf("%d students, %d requests, %d sections", large.students, len(term.Requests), len(term.Sections))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		res, err := Section(context.Background(), term, sched, Options{Seed: int64(i)})
		if err != nil {
			b.Fatal(err)
		}
		if i == 0 {
			b.ReportMetric(float64(len(res.Unplaced)), "unplaced")
			p := newProblem(term, sched)
			p.restoreFrom(res)
			b.ReportMetric(float64(p.totals().clashes), "clashes")
		}
	}
}

// BenchmarkStudentMove times one student move (student.go) on the large
// generated term after the first seating: the hot path of improvement.
func BenchmarkStudentMove(b *testing.B) {
	term, sched := genTerm(rand.New(rand.NewPCG(1, 1)), large)
	p := newProblem(term, sched)
	rng := rand.New(rand.NewPCG(2, 2))
	sr := newSearcher(p)
	p.greedy(sr, rng, newRepairer(p, sr))
	ss := &studentSearch{}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		k := int32(i % len(p.students))
		snap := p.snapshotStudent(k)
		p.improveStudent(ss, k)
		p.restoreStudent(k, snap)
	}
}

// snapshotStudent and restoreStudent keep a benchmark's state unchanged.
func (p *problem) snapshotStudent(k int32) [][]int32 {
	var out [][]int32
	for _, r := range p.students[k].reqs {
		out = append(out, append([]int32(nil), p.st.secs[r]...))
	}
	return out
}

func (p *problem) restoreStudent(k int32, snap [][]int32) {
	for i, r := range p.students[k].reqs {
		if p.st.opt[r] >= 0 {
			p.seat(r, p.st.opt[r], snap[i])
		}
	}
}
