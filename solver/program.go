package solver

// Atom is a propositional atom, numbered densely from 1. 0 means "no atom".
type Atom uint32

// Lit is a literal: the atom shifted left by one, with the low bit set for
// default negation ("not a"). 0 means "no literal".
type Lit uint32

// Pos is the positive literal of a.
func Pos(a Atom) Lit { return Lit(a << 1) }

// Neg is the default-negated literal "not a".
func Neg(a Atom) Lit { return Lit(a<<1 | 1) }

// Atom is the atom of the literal.
func (l Lit) Atom() Atom { return Atom(l >> 1) }

// IsNeg reports whether the literal is a default negation.
func (l Lit) IsNeg() bool { return l&1 == 1 }

// Not is the complementary literal.
func (l Lit) Not() Lit { return l ^ 1 }

// Rule is a normal rule "Head :- Body." or, with Head 0, an integrity
// constraint ":- Body.".
type Rule struct {
	Head Atom
	Body []Lit
}

// Choice is a choice rule "{Heads} :- Body.": when Body holds, any subset of
// Heads may be true (each head is supported by this rule). Cardinality bounds
// written on a choice rule are stored as a separate Bound with the same Body.
type Choice struct {
	Heads []Atom
	Body  []Lit
}

// NoBound marks a missing lower or upper limit in a Bound.
const NoBound = -1

// Bound is a cardinality constraint: whenever every literal of Cond holds,
// the number of true literals in Lits lies in [Lower, Upper]. Lower or Upper
// may be NoBound. In text it is written ":- U+1 {Lits}, Cond." for an upper
// limit and ":- {Lits} L-1, Cond." for a lower limit, or as the bounds of a
// choice rule.
type Bound struct {
	Lits  []Lit
	Lower int // NoBound or >= 0
	Upper int // NoBound or >= 0
	Cond  []Lit
}

// Weak is a weak constraint ":~ Body. [Weight@Level]": every model in which
// Body holds pays Weight at priority Level (higher levels matter more).
type Weak struct {
	Body   []Lit
	Weight int64
	Level  int
}

// Program is a ground logic program. Build it with NewAtom and the Add
// methods; the engine copies what it needs, so a Program may be reused.
// Slices passed to Add methods are copied.
type Program struct {
	names   []string // names[a] is the name of atom a ("" when anonymous); names[0] unused
	Rules   []Rule   // normal rules, facts and integrity constraints
	Choices []Choice // choice rules
	Bounds  []Bound  // cardinality constraints (standalone or from choice rules)
	Weaks   []Weak   // weak constraints
	Shows   []Atom   // atoms of interest for output and projection; empty = all named atoms
}

// NewProgram returns an empty program.
func NewProgram() *Program { return &Program{names: []string{""}} }

// NewAtom adds an atom with an optional name (names need not be unique, but
// the text form reads equal names as one atom).
func (p *Program) NewAtom(name string) Atom {
	if p.names == nil {
		p.names = []string{""}
	}
	p.names = append(p.names, name)
	return Atom(len(p.names) - 1)
}

// NumAtoms is the number of atoms; valid atoms are 1..NumAtoms().
func (p *Program) NumAtoms() int {
	if len(p.names) == 0 {
		return 0
	}
	return len(p.names) - 1
}

// Name returns the name of atom a, or "" when it has none.
func (p *Program) Name(a Atom) string {
	if int(a) >= len(p.names) {
		return ""
	}
	return p.names[a]
}

// SetName renames atom a.
func (p *Program) SetName(a Atom, name string) { p.names[a] = name }

// AddRule adds "head :- body."; head 0 makes it an integrity constraint.
func (p *Program) AddRule(head Atom, body ...Lit) {
	p.Rules = append(p.Rules, Rule{Head: head, Body: clone(body)})
}

// AddFact adds "a.".
func (p *Program) AddFact(a Atom) { p.AddRule(a) }

// AddConstraint adds ":- body.".
func (p *Program) AddConstraint(body ...Lit) { p.AddRule(0, body...) }

// AddChoice adds "lower {heads} upper :- body."; lower and upper may be
// NoBound.
func (p *Program) AddChoice(heads []Atom, lower, upper int, body ...Lit) {
	p.Choices = append(p.Choices, Choice{Heads: append([]Atom(nil), heads...), Body: clone(body)})
	if lower > 0 || upper != NoBound {
		lits := make([]Lit, len(heads))
		for i, h := range heads {
			lits[i] = Pos(h)
		}
		p.Bounds = append(p.Bounds, Bound{Lits: lits, Lower: lower, Upper: upper, Cond: clone(body)})
	}
}

// AddBound adds the cardinality constraint lower <= #true(lits) <= upper,
// active when every literal of cond holds.
func (p *Program) AddBound(lits []Lit, lower, upper int, cond ...Lit) {
	p.Bounds = append(p.Bounds, Bound{Lits: clone(lits), Lower: lower, Upper: upper, Cond: clone(cond)})
}

// AddWeak adds ":~ body. [weight@level]".
func (p *Program) AddWeak(weight int64, level int, body ...Lit) {
	p.Weaks = append(p.Weaks, Weak{Body: clone(body), Weight: weight, Level: level})
}

// Show marks atoms of interest (for printing and projection).
func (p *Program) Show(atoms ...Atom) { p.Shows = append(p.Shows, atoms...) }

func clone(l []Lit) []Lit {
	if len(l) == 0 {
		return nil
	}
	return append([]Lit(nil), l...)
}
