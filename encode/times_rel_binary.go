package encode

import (
	"fmt"
	"math/bits"

	"github.com/termwright/termwright/solver"
)

// Binary arithmetic over literals, for the counted soft rows whose sum is
// divided by the teaching weeks and too large for a unary counter: the sum
// of the terms is built in binary by ripple-carry adders, divided by the
// weeks by long division with a constant divisor, and the quotient's bits
// carry weak constraints of weight w·2^j. Sizes are O(terms · bits), exact
// for every sum. Gates are atoms defined by rules with negation
// (x :- a, not b; x :- not a, b for exclusive or), so the program stays
// tight. A literal 0 is the constant false and b.relTrue() the constant
// true; the gates fold both.

// relTrue is an atom that is a fact (made once).
func (b *builder) relTrue() solver.Lit {
	if b.rel.or == nil {
		b.rel.or = map[string]solver.Atom{}
	}
	if a, ok := b.rel.or["true"]; ok {
		return solver.Pos(a)
	}
	a := b.newAtom("true_", aux(-1, -1))
	b.rel.or["true"] = a
	b.gate(a)
	return solver.Pos(a)
}

// gate makes one rule for an auxiliary atom, outside any group.
func (b *builder) gate(head solver.Atom, body ...solver.Lit) {
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "pattern relation aux")
	b.rule(head, body...)
	b.group, b.boundKind = saveG, saveK
}

func (b *builder) gateAtom() solver.Atom {
	b.rel.n++
	return b.newAtom(fmt.Sprintf("bit_%d", b.rel.n), aux(-1, -1))
}

func (b *builder) notL(l solver.Lit) solver.Lit {
	switch t := b.relTrue(); l {
	case 0:
		return t
	case t:
		return 0
	}
	return l.Not()
}

func (b *builder) and2(x, y solver.Lit) solver.Lit {
	t := b.relTrue()
	switch {
	case x == 0 || y == 0 || x == y.Not():
		return 0
	case x == t || x == y:
		return y
	case y == t:
		return x
	}
	a := b.gateAtom()
	b.gate(a, x, y)
	return solver.Pos(a)
}

func (b *builder) or2(x, y solver.Lit) solver.Lit {
	t := b.relTrue()
	switch {
	case x == t || y == t || x == y.Not() && x != 0:
		return t
	case x == 0 || x == y:
		return y
	case y == 0:
		return x
	}
	a := b.gateAtom()
	b.gate(a, x)
	b.gate(a, y)
	return solver.Pos(a)
}

func (b *builder) xor2(x, y solver.Lit) solver.Lit {
	t := b.relTrue()
	switch {
	case x == 0:
		return y
	case y == 0:
		return x
	case x == y:
		return 0
	case x == t:
		return b.notL(y)
	case y == t:
		return b.notL(x)
	}
	a := b.gateAtom()
	b.gate(a, x, y.Not())
	b.gate(a, x.Not(), y)
	return solver.Pos(a)
}

// addBits returns x + y (little-endian bit literals).
func (b *builder) addBits(x, y []solver.Lit) []solver.Lit {
	n := max(len(x), len(y))
	at := func(v []solver.Lit, i int) solver.Lit {
		if i < len(v) {
			return v[i]
		}
		return 0
	}
	out := make([]solver.Lit, 0, n+1)
	var carry solver.Lit
	for i := 0; i < n; i++ {
		a, c := at(x, i), at(y, i)
		out = append(out, b.xor2(b.xor2(a, c), carry))
		carry = b.or2(b.and2(a, c), b.and2(carry, b.or2(a, c)))
	}
	out = append(out, carry)
	for len(out) > 0 && out[len(out)-1] == 0 {
		out = out[:len(out)-1]
	}
	return out
}

// divBits returns floor(s / d) for a constant d >= 1, by long division:
// from the top bit down, the partial remainder t = 2·rem + s_j is compared
// with d (the borrow out of t - d) and, when t >= d, replaced by t - d.
func (b *builder) divBits(s []solver.Lit, d int64) []solver.Lit {
	m := bits.Len64(uint64(d))
	rem := make([]solver.Lit, m)
	q := make([]solver.Lit, len(s))
	for j := len(s) - 1; j >= 0; j-- {
		t := append([]solver.Lit{s[j]}, rem...) // m+1 bits
		diff := make([]solver.Lit, m+1)
		var borrow solver.Lit
		for i := 0; i <= m; i++ {
			if d>>i&1 == 0 {
				diff[i] = b.xor2(t[i], borrow)
				borrow = b.and2(b.notL(t[i]), borrow)
			} else {
				diff[i] = b.notL(b.xor2(t[i], borrow))
				borrow = b.or2(b.notL(t[i]), borrow)
			}
		}
		q[j] = b.notL(borrow)
		nq := b.notL(q[j])
		for i := 0; i < m; i++ {
			rem[i] = b.or2(b.and2(q[j], diff[i]), b.and2(nq, t[i]))
		}
	}
	return q
}

// sumBits returns the binary sum of the terms' units over their literals.
func (b *builder) sumBits(terms []countTerm) []solver.Lit {
	var sum []solver.Lit
	for _, tm := range terms {
		var add []solver.Lit
		for i := 0; tm.units>>i != 0; i++ {
			if tm.units>>i&1 == 1 {
				add = append(add, tm.lit)
			} else {
				add = append(add, 0)
			}
		}
		sum = b.addBits(sum, add)
	}
	return sum
}

// mulBits returns x · c for a constant c >= 0 (shifted copies added).
func (b *builder) mulBits(x []solver.Lit, c int64) []solver.Lit {
	var out []solver.Lit
	for i := 0; c>>i != 0; i++ {
		if c>>i&1 == 1 {
			out = b.addBits(out, append(make([]solver.Lit, i), x...))
		}
	}
	return out
}
