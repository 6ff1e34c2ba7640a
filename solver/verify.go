package solver

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
)

// This file is the independent checker of stable models. It shares nothing
// with the search but the Program type: a bug in the engine cannot hide a
// bug here.

// ProblemKind classifies why a candidate is not a stable model.
type ProblemKind int

// Kinds of problems found by Verify.
const (
	BadAtom     ProblemKind = iota + 1 // the candidate names an atom outside the program
	Unsupported                        // true, but the reduct does not derive it
	Unwanted                           // false, but the reduct derives it
	Violated                           // an integrity constraint's body holds
	OutOfBounds                        // a Bound's condition holds and its count is outside the limits
)

// String names the kind in lower case: "bad-atom", "unsupported",
// "unwanted", "violated" or "out-of-bounds".
func (k ProblemKind) String() string {
	switch k {
	case BadAtom:
		return "bad-atom"
	case Unsupported:
		return "unsupported"
	case Unwanted:
		return "unwanted"
	case Violated:
		return "violated"
	case OutOfBounds:
		return "out-of-bounds"
	}
	return "unknown"
}

// Problem is one reason why a candidate is not a stable model.
type Problem struct {
	Kind  ProblemKind
	Atom  Atom   // the atom concerned (BadAtom, Unsupported, Unwanted), else 0
	Index int    // index in Program.Rules (Unwanted, Violated) or Program.Bounds (OutOfBounds), else -1
	Msg   string // a sentence saying what is wrong
}

// VerifyError lists every problem Verify found, in the order: atoms
// outside the program, unsupported atoms, unwanted atoms (each by atom
// number), violated constraints, violated bounds (each by index).
type VerifyError struct {
	Problems []Problem
}

// Error gives the first problem and how many more there are.
func (e *VerifyError) Error() string {
	if len(e.Problems) == 0 {
		return "not a stable model"
	}
	msg := "not a stable model: " + e.Problems[0].Msg
	if n := len(e.Problems) - 1; n > 0 {
		msg += fmt.Sprintf(" (and %d more problem%s)", n, plural(n))
	}
	return msg
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// Verify checks that model (the set of true atoms; order and repeats do not
// matter) is a stable model of p: it equals the least model of the
// Gelfond–Lifschitz reduct of p by the model (Gelfond & Lifschitz 1988),
// and every integrity constraint and Bound holds (a Bound counts distinct
// true literals: a literal listed twice counts once). The reduct keeps each
// normal rule whose negative body is false in the model, without its
// negative literals; a choice rule whose negative body is false contributes
// "h :- B+" for each of its heads h in the model. The least model is
// computed by forward chaining with a counter of underived positive body
// atoms per rule (Dowling & Gallier 1984), so Verify runs in time linear in
// the size of p. It returns nil or a *VerifyError saying why the candidate
// fails.
func Verify(p *Program, model []Atom) error {
	if err := checkAtoms(p); err != nil {
		return err
	}
	v := newVerifier(p)
	if probs := v.setModel(model); len(probs) > 0 {
		return &VerifyError{Problems: probs}
	}
	v.leastModel()
	probs := v.compare()
	probs = append(probs, v.constraints()...)
	if len(probs) > 0 {
		return &VerifyError{Problems: probs}
	}
	return nil
}

// checkAtoms reports a program that refers to atoms it does not have (a
// bug in whatever built it), so that Verify never indexes out of range.
func checkAtoms(p *Program) error {
	n := Atom(p.NumAtoms())
	check := func(what string, i int, lits []Lit, atoms []Atom) error {
		for _, l := range lits {
			if l.Atom() == 0 || l.Atom() > n {
				return fmt.Errorf("malformed program: %s %d refers to atom %d outside 1..%d", what, i, l.Atom(), n)
			}
		}
		for _, a := range atoms {
			if a == 0 || a > n {
				return fmt.Errorf("malformed program: %s %d refers to atom %d outside 1..%d", what, i, a, n)
			}
		}
		return nil
	}
	for i, r := range p.Rules {
		var head []Atom
		if r.Head != 0 {
			head = []Atom{r.Head}
		}
		if err := check("rule", i, r.Body, head); err != nil {
			return err
		}
	}
	for i, c := range p.Choices {
		if err := check("choice", i, c.Body, c.Heads); err != nil {
			return err
		}
	}
	for i, b := range p.Bounds {
		if err := check("bound", i, b.Lits, nil); err != nil {
			return err
		}
		if err := check("bound", i, b.Cond, nil); err != nil {
			return err
		}
	}
	for i, w := range p.Weaks {
		if err := check("weak constraint", i, w.Body, nil); err != nil {
			return err
		}
	}
	return nil
}

// verifier holds the state of one Verify call.
type verifier struct {
	p       *Program
	n       int
	inModel []bool  // inModel[a]: a is in the candidate
	derived []bool  // derived[a]: a is in the least model of the reduct
	by      []int32 // by[a]: 1+index of the normal rule that derived a, -1-index of the choice, 0 if not derived
}

func newVerifier(p *Program) *verifier {
	n := p.NumAtoms()
	return &verifier{p: p, n: n, inModel: make([]bool, n+1)}
}

func (v *verifier) setModel(model []Atom) []Problem {
	var probs []Problem
	for _, a := range model {
		if a == 0 || int(a) > v.n {
			probs = append(probs, Problem{Kind: BadAtom, Atom: a, Index: -1,
				Msg: fmt.Sprintf("atom %d is not an atom of the program (atoms are 1..%d)", a, v.n)})
			continue
		}
		v.inModel[a] = true
	}
	return probs
}

// holds reports whether every literal of body is true in the candidate.
func (v *verifier) holds(body []Lit) bool {
	for _, l := range body {
		if v.inModel[l.Atom()] == l.IsNeg() {
			return false
		}
	}
	return true
}

// negFalse reports whether every negative literal of body is true in the
// candidate, i.e. the rule survives the reduct.
func (v *verifier) negFalse(body []Lit) bool {
	for _, l := range body {
		if l.IsNeg() && v.inModel[l.Atom()] {
			return false
		}
	}
	return true
}

// leastModel computes the least model of the reduct into v.derived and v.by.
// Reduct rules are numbered: normal rules 0..R-1, then choice rules R..;
// a choice rule derives all of its heads that are in the candidate.
func (v *verifier) leastModel() {
	p := v.p
	nr := len(p.Rules)
	total := nr + len(p.Choices)
	body := func(r int) []Lit {
		if r < nr {
			return p.Rules[r].Body
		}
		return p.Choices[r-nr].Body
	}
	// Counters and occurrence lists (compressed rows: occ[start[a]:start[a+1]]
	// are the reduct rules with a in their positive body).
	count := make([]int32, total)
	start := make([]int32, v.n+2)
	live := make([]bool, total)
	for r := 0; r < total; r++ {
		if r < nr && p.Rules[r].Head == 0 {
			continue
		}
		if !v.negFalse(body(r)) {
			continue
		}
		live[r] = true
		for _, l := range body(r) {
			if !l.IsNeg() {
				count[r]++
				start[l.Atom()+1]++
			}
		}
	}
	for a := 1; a <= v.n+1; a++ {
		start[a] += start[a-1]
	}
	occ := make([]int32, start[v.n+1])
	fill := append([]int32(nil), start[:v.n+1]...)
	for r := 0; r < total; r++ {
		if !live[r] {
			continue
		}
		for _, l := range body(r) {
			if !l.IsNeg() {
				occ[fill[l.Atom()]] = int32(r)
				fill[l.Atom()]++
			}
		}
	}
	v.derived = make([]bool, v.n+1)
	v.by = make([]int32, v.n+1)
	queue := make([]Atom, 0, 64)
	fire := func(r int) {
		if r < nr {
			h := p.Rules[r].Head
			if !v.derived[h] {
				v.derived[h], v.by[h] = true, int32(r+1)
				queue = append(queue, h)
			}
			return
		}
		for _, h := range p.Choices[r-nr].Heads {
			if v.inModel[h] && !v.derived[h] {
				v.derived[h], v.by[h] = true, int32(-(r-nr)-1)
				queue = append(queue, h)
			}
		}
	}
	for r := 0; r < total; r++ {
		if live[r] && count[r] == 0 {
			fire(r)
		}
	}
	for len(queue) > 0 {
		a := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		for _, r := range occ[start[a]:start[a+1]] {
			count[r]--
			if count[r] == 0 {
				fire(int(r))
			}
		}
	}
}

// compare reports atoms where the candidate and the least model differ.
func (v *verifier) compare() []Problem {
	var unsupported, unwanted []Problem
	var why *supportIndex
	for a := Atom(1); int(a) <= v.n; a++ {
		switch {
		case v.inModel[a] && !v.derived[a]:
			if why == nil {
				why = newSupportIndex(v.p)
			}
			unsupported = append(unsupported, Problem{Kind: Unsupported, Atom: a, Index: -1,
				Msg: fmt.Sprintf("atom %s is true but has no support in the reduct (%s)", atomText(v.p, a), why.explain(v, a))})
		case !v.inModel[a] && v.derived[a]:
			r := int(v.by[a] - 1) // only normal rules derive atoms outside the candidate
			unwanted = append(unwanted, Problem{Kind: Unwanted, Atom: a, Index: r,
				Msg: fmt.Sprintf("atom %s is derived by rule %d (`%s`) but false in the candidate", atomText(v.p, a), r, ruleText(v.p, v.p.Rules[r]))})
		}
	}
	return append(unsupported, unwanted...)
}

// constraints reports violated integrity constraints and bounds.
func (v *verifier) constraints() []Problem {
	var probs []Problem
	for i, r := range v.p.Rules {
		if r.Head == 0 && v.holds(r.Body) {
			probs = append(probs, Problem{Kind: Violated, Index: i,
				Msg: fmt.Sprintf("constraint at rule %d (`%s`) is violated: all of its body is true", i, ruleText(v.p, r))})
		}
	}
	// stamp[l] == i+1 marks literal l as counted for bound i: a literal
	// listed twice counts once (the elements of a count form a set).
	stamp := make([]int32, 2*v.n+2)
	for i, b := range v.p.Bounds {
		if !v.holds(b.Cond) {
			continue
		}
		k := 0
		for _, l := range b.Lits {
			if v.inModel[l.Atom()] != l.IsNeg() && stamp[l] != int32(i+1) {
				stamp[l] = int32(i + 1)
				k++
			}
		}
		switch {
		case b.Upper >= 0 && k > b.Upper:
			probs = append(probs, Problem{Kind: OutOfBounds, Index: i,
				Msg: fmt.Sprintf("bound %d has %d true literal%s, more than %d", i, k, plural(k), b.Upper)})
		case b.Lower >= 0 && k < b.Lower:
			probs = append(probs, Problem{Kind: OutOfBounds, Index: i,
				Msg: fmt.Sprintf("bound %d has %d true literal%s, fewer than %d", i, k, plural(k), b.Lower)})
		}
	}
	return probs
}

// supportIndex lists, per atom, the rules and choices with it in the head;
// built only when a message needs it.
type supportIndex struct {
	rules   map[Atom][]int
	choices map[Atom][]int
}

func newSupportIndex(p *Program) *supportIndex {
	s := &supportIndex{rules: map[Atom][]int{}, choices: map[Atom][]int{}}
	for i, r := range p.Rules {
		if r.Head != 0 {
			s.rules[r.Head] = append(s.rules[r.Head], i)
		}
	}
	for i, c := range p.Choices {
		for _, h := range c.Heads {
			s.choices[h] = append(s.choices[h], i)
		}
	}
	return s
}

// explain says why no rule for a applies in the reduct.
func (s *supportIndex) explain(v *verifier, a Atom) string {
	rules, choices := s.rules[a], s.choices[a]
	if len(rules) == 0 && len(choices) == 0 {
		return "no rule has it as head"
	}
	var blocked, missing []string
	note := func(what string, body []Lit) {
		if !v.negFalse(body) {
			blocked = append(blocked, what)
			return
		}
		var need []string
		for _, l := range body {
			if !l.IsNeg() && !v.derived[l.Atom()] {
				need = append(need, atomText(v.p, l.Atom()))
			}
		}
		sort.Strings(need)
		missing = append(missing, what+" needs "+strings.Join(need, ", "))
	}
	for _, i := range rules {
		note(fmt.Sprintf("rule %d `%s`", i, ruleText(v.p, v.p.Rules[i])), v.p.Rules[i].Body)
	}
	for _, i := range choices {
		note(fmt.Sprintf("choice %d", i), v.p.Choices[i].Body)
	}
	const most = 3
	var parts []string
	if len(missing) > 0 {
		parts = append(parts, "no rule derives it: "+listSome(missing, most)+" (not derived)")
	}
	if len(blocked) > 0 {
		parts = append(parts, "blocked by a true negated atom: "+listSome(blocked, most))
	}
	return strings.Join(parts, "; ")
}

// listSome joins up to most items and says how many more there are.
func listSome(items []string, most int) string {
	if len(items) <= most {
		return strings.Join(items, "; ")
	}
	return strings.Join(items[:most], "; ") + fmt.Sprintf("; and %d more", len(items)-most)
}

// Levels returns the distinct priority levels of p's weak constraints,
// highest first.
func Levels(p *Program) []int {
	seen := map[int]bool{}
	var levels []int
	for _, w := range p.Weaks {
		if !seen[w.Level] {
			seen[w.Level] = true
			levels = append(levels, w.Level)
		}
	}
	sort.Sort(sort.Reverse(sort.IntSlice(levels)))
	return levels
}

// Cost returns the total weight of the weak constraints whose body holds in
// model, one entry per level of Levels(p) (highest level first). Each weak
// constraint counts on its own, even when two are equal. Atoms outside the
// program are ignored, and a weak constraint that mentions an atom outside
// the program never holds. A total that does not fit an int64 is clamped to
// math.MaxInt64 or math.MinInt64; CheckedCost reports it instead.
func Cost(p *Program, model []Atom) []int64 {
	cost, _ := CheckedCost(p, model)
	return cost
}

// ErrCostOverflow is wrapped by the error of CheckedCost when a level's
// total weight does not fit an int64.
var ErrCostOverflow = errors.New("cost does not fit a 64-bit integer")

// CheckedCost is Cost with overflow checked: when a level's total does not
// fit an int64 it is clamped as in Cost and the error, wrapping
// ErrCostOverflow, names the level.
func CheckedCost(p *Program, model []Atom) ([]int64, error) {
	levels := Levels(p)
	at := make(map[int]int, len(levels))
	for i, l := range levels {
		at[l] = i
	}
	n := p.NumAtoms()
	in := make([]bool, n+1)
	for _, a := range model {
		if a != 0 && int(a) <= n {
			in[a] = true
		}
	}
	cost := make([]int64, len(levels))
	over := make([]bool, len(levels))
	for _, w := range p.Weaks {
		holds := true
		for _, l := range w.Body {
			if a := l.Atom(); int(a) > n || in[a] == l.IsNeg() {
				holds = false
				break
			}
		}
		if !holds {
			continue
		}
		i := at[w.Level]
		if over[i] {
			continue // clamped for good
		}
		sum := cost[i] + w.Weight
		if (w.Weight > 0 && sum < cost[i]) || (w.Weight < 0 && sum > cost[i]) {
			over[i] = true
			sum = math.MaxInt64
			if w.Weight < 0 {
				sum = math.MinInt64
			}
		}
		cost[i] = sum
	}
	for i, o := range over {
		if o {
			return cost, fmt.Errorf("the weak constraints of level %d that hold weigh more than an int64 holds: %w", levels[i], ErrCostOverflow)
		}
	}
	return cost, nil
}
