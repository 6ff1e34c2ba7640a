package encode

import (
	"math/rand"
	"strings"
	"testing"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// programSize counts what a compiled program holds: atoms, rules, bounds,
// weak constraints and the literals of all of them.
type programSize struct{ atoms, rules, bounds, weaks, lits int }

func sizeOf(p *solver.Program) programSize {
	s := programSize{atoms: p.NumAtoms(), rules: len(p.Rules), bounds: len(p.Bounds), weaks: len(p.Weaks)}
	for _, r := range p.Rules {
		s.lits += len(r.Body) + 1
	}
	for _, b := range p.Bounds {
		s.lits += len(b.Lits) + len(b.Cond)
	}
	for _, w := range p.Weaks {
		s.lits += len(w.Body)
	}
	return s
}

// relationsBenchTerm is a seeded pattern term of 200 sections (up to 8
// meeting patterns each, 20 rooms, 4 teaching weeks with odd and even
// weeks) with rows relation rows of kind k (or of random kinds when k is
// 0) over 2 to 4 sections each.
func relationsBenchTerm(k timetable.RelationKind, rows int, hard bool) *timetable.Term {
	term := patternTerm(7, 200, 8, 20)
	term.Unavailable = nil // keep every section placeable
	for r := range term.Rooms {
		term.Rooms[r].Capacity = 60
	}
	rng := rand.New(rand.NewSource(9))
	for r := 0; r < rows; r++ {
		kind := k
		if kind == 0 {
			kind = timetable.RelationKinds[rng.Intn(len(timetable.RelationKinds))].Kind
		}
		rel := timetable.Relation{Kind: kind, Hard: hard, Weight: 1 + rng.Intn(3), Src: timetable.Source{Sheet: "Relations", Row: r + 2}}
		if hard {
			rel.Weight = 0
		}
		for _, s := range rng.Perm(len(term.Sections))[:2+rng.Intn(3)] {
			rel.Sections = append(rel.Sections, term.Sections[s].ID)
		}
		switch kind.Params() {
		case 1:
			rel.N = []int{2, 150, 240}[rng.Intn(3)]
		case 2:
			rel.N, rel.M = []int{1, 150}[rng.Intn(2)], 15
		}
		term.Relations = append(term.Relations, rel)
	}
	return term
}

// BenchmarkPatternRelationsCompile compiles the 200-section term with 100
// rows of each kind (hard, then soft) and reports what the rows add per
// row: rules, atoms, literals. Run with -benchtime=1x.
func BenchmarkPatternRelationsCompile(b *testing.B) {
	base, _, err := Compile(relationsBenchTerm(0, 0, true), Options{})
	if err != nil {
		b.Fatal(err)
	}
	b0 := sizeOf(base)
	const rows = 100
	for _, rk := range append([]struct {
		Kind timetable.RelationKind
		Name string
	}{{0, "mixed"}}, timetable.RelationKinds...) {
		for _, hard := range []bool{true, false} {
			name := strings.ReplaceAll(rk.Name, " ", "_")
			if !hard {
				name += "/soft"
			}
			b.Run(name, func(b *testing.B) {
				term := relationsBenchTerm(rk.Kind, rows, hard)
				b.ReportAllocs()
				var p *solver.Program
				for i := 0; i < b.N; i++ {
					p, _, err = Compile(term, Options{})
					if err != nil {
						b.Fatal(err)
					}
				}
				s := sizeOf(p)
				b.ReportMetric(float64(s.rules+s.bounds+s.weaks-b0.rules-b0.bounds-b0.weaks)/rows, "statements/row")
				b.ReportMetric(float64(s.atoms-b0.atoms)/rows, "atoms/row")
				b.ReportMetric(float64(s.lits-b0.lits)/rows, "lits/row")
			})
		}
	}
}
