package solver

import (
	"bufio"
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"
)

// DIMACSOptions tunes WriteDIMACSWith.
type DIMACSOptions struct {
	// Names adds a comment line "c atom N NAME" for every named atom.
	Names bool
}

// WriteDIMACS writes the Clark completion of the tight program p as a CNF
// formula in the DIMACS format ("p cnf V C" and one clause per line ending
// in 0). Variables 1..p.NumAtoms() are the program's atoms; further
// variables stand for rule bodies and for the registers of the sequential
// counters (Sinz 2005) that encode each cardinality Bound compactly. The
// models of the CNF projected onto the atoms are exactly the stable models
// of p (Fages 1994). Weak constraints are ignored (a comment line says how
// many). A program whose positive dependency graph has a cycle is refused
// with an error naming the atoms of one cycle.
//
// This translation is written independently of the engine's own completion,
// so comparing the two doubles as a cross-check.
func WriteDIMACS(w io.Writer, p *Program) error {
	return WriteDIMACSWith(w, p, DIMACSOptions{})
}

// WriteDIMACSWith is WriteDIMACS with options.
func WriteDIMACSWith(w io.Writer, p *Program, o DIMACSOptions) error {
	if err := checkProgram(p); err != nil {
		return err
	}
	if cyc := positiveCycle(p); cyc != nil {
		names := make([]string, len(cyc))
		for i, a := range cyc {
			names[i] = atomLabel(p, a)
		}
		return fmt.Errorf("%w: the program is not tight, so its completion is not exact: positive cycle %s -> %s; "+
			"the CNF form needs a program without recursion through positive body literals",
			ErrProgram, strings.Join(names, " -> "), names[0])
	}
	c := newCNFBuilder(p.NumAtoms())
	c.complete(p)
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "c Clark completion of a tight ground program, written by termwright\n")
	fmt.Fprintf(bw, "c variables 1..%d are the program's atoms; the rest are rule bodies and counter registers\n", p.NumAtoms())
	fmt.Fprintf(bw, "c %d cardinality bounds encoded by sequential counters (Sinz 2005)\n", len(p.Bounds))
	if len(p.Weaks) > 0 {
		fmt.Fprintf(bw, "c %d weak constraints ignored: the CNF has every stable model, not only optimal ones\n", len(p.Weaks))
	}
	if o.Names {
		for a := Atom(1); int(a) <= p.NumAtoms(); a++ {
			if n := p.Name(a); n != "" {
				fmt.Fprintf(bw, "c atom %d %s\n", a, n)
			}
		}
	}
	fmt.Fprintf(bw, "p cnf %d %d\n", c.vars, c.count)
	buf := make([]byte, 0, 16)
	for _, l := range c.flat {
		buf = strconv.AppendInt(buf[:0], int64(l), 10)
		if l == 0 {
			buf = append(buf, '\n')
		} else {
			buf = append(buf, ' ')
		}
		if _, err := bw.Write(buf); err != nil {
			return err
		}
	}
	return bw.Flush()
}

func atomLabel(p *Program, a Atom) string {
	if n := p.Name(a); n != "" {
		return n
	}
	return "atom " + strconv.Itoa(int(a))
}

// positiveCycle returns the atoms of one cycle of the positive dependency
// graph (edge from a head to each atom of its positive body), or nil.
func positiveCycle(p *Program) []Atom {
	n := p.NumAtoms()
	deg := make([]uint32, n+2)
	edges := func(fn func(h Atom, b Atom)) {
		for _, r := range p.Rules {
			if r.Head == 0 {
				continue
			}
			for _, l := range r.Body {
				if !l.IsNeg() {
					fn(r.Head, l.Atom())
				}
			}
		}
		for _, ch := range p.Choices {
			for _, h := range ch.Heads {
				for _, l := range ch.Body {
					if !l.IsNeg() {
						fn(h, l.Atom())
					}
				}
			}
		}
	}
	edges(func(h, _ Atom) { deg[h+1]++ })
	for i := 1; i < len(deg); i++ {
		deg[i] += deg[i-1]
	}
	adj := make([]uint32, deg[n+1])
	fill := slices.Clone(deg)
	edges(func(h, b Atom) { adj[fill[h]] = uint32(b); fill[h]++ })
	comp, k := cyclicComponents(n, deg, adj)
	if k == 0 {
		return nil
	}
	// Walk inside the first cyclic component until an atom repeats.
	start := 0
	for v := 1; v <= n; v++ {
		if comp[v] != 0 {
			start = v
			break
		}
	}
	pos := map[uint32]int{}
	var path []Atom
	v := uint32(start)
	for {
		if i, ok := pos[v]; ok {
			return path[i:]
		}
		pos[v] = len(path)
		path = append(path, Atom(v))
		for _, w := range adj[deg[v]:deg[v+1]] {
			if comp[w] == comp[v] {
				v = w
				break
			}
		}
	}
}

// cnfBuilder collects clauses as a flat list of DIMACS literals, each
// clause ended by 0.
type cnfBuilder struct {
	vars   int
	count  int
	flat   []int32
	bodies map[string]int32 // normalised body -> DIMACS literal
}

const (
	litTrue  int32 = 1 << 30 // a body that always holds
	litFalse int32 = -litTrue
)

func newCNFBuilder(atoms int) *cnfBuilder {
	return &cnfBuilder{vars: atoms, bodies: map[string]int32{}}
}

func dlit(l Lit) int32 {
	if l.IsNeg() {
		return -int32(l.Atom())
	}
	return int32(l.Atom())
}

func (c *cnfBuilder) newVar() int32 { c.vars++; return int32(c.vars) }

// clause adds a clause, dropping false constants and skipping it when it
// contains a true constant or a complementary pair.
func (c *cnfBuilder) clause(lits ...int32) {
	for _, l := range lits {
		if l == litTrue {
			return
		}
	}
	mark := len(c.flat)
	for _, l := range lits {
		if l == litFalse {
			continue
		}
		dup := false
		for _, m := range c.flat[mark:] {
			if m == -l {
				c.flat = c.flat[:mark]
				return
			}
			if m == l {
				dup = true
			}
		}
		if !dup {
			c.flat = append(c.flat, l)
		}
	}
	if len(c.flat) == mark {
		// The empty clause: write it as x and -x over a fresh variable, which
		// every reader accepts.
		x := c.newVar()
		c.flat = append(c.flat, x, 0, -x, 0)
		c.count += 2
		return
	}
	c.flat = append(c.flat, 0)
	c.count++
}

// body returns a DIMACS literal equivalent to the conjunction of ls
// (litTrue for the empty body, litFalse for a contradictory one), defining
// a fresh body variable once per distinct body of two or more literals.
func (c *cnfBuilder) body(ls []Lit) int32 {
	norm := make([]int32, 0, len(ls))
	for _, l := range ls {
		norm = append(norm, dlit(l))
	}
	slices.SortFunc(norm, func(a, b int32) int {
		ka, kb := a, b
		if ka < 0 {
			ka = -ka
		}
		if kb < 0 {
			kb = -kb
		}
		if ka != kb {
			return int(ka - kb)
		}
		return int(a - b)
	})
	norm = slices.Compact(norm)
	for i := 1; i < len(norm); i++ {
		if norm[i] == -norm[i-1] {
			return litFalse
		}
	}
	switch len(norm) {
	case 0:
		return litTrue
	case 1:
		return norm[0]
	}
	var sb strings.Builder
	for _, l := range norm {
		sb.WriteString(strconv.Itoa(int(l)))
		sb.WriteByte(',')
	}
	key := sb.String()
	if b, ok := c.bodies[key]; ok {
		return b
	}
	b := c.newVar()
	c.bodies[key] = b
	long := make([]int32, 0, len(norm)+1)
	long = append(long, b)
	for _, l := range norm {
		c.clause(-b, l)
		long = append(long, -l)
	}
	c.clause(long...)
	return b
}

// complete adds the completion of p.
func (c *cnfBuilder) complete(p *Program) {
	n := p.NumAtoms()
	support := make([][]int32, n+1)
	for _, r := range p.Rules {
		if r.Head == 0 {
			neg := make([]int32, len(r.Body))
			for i, l := range r.Body {
				neg[i] = -dlit(l)
			}
			c.clause(neg...)
			continue
		}
		b := c.body(r.Body)
		if b == litFalse {
			continue
		}
		c.clause(-b, int32(r.Head))
		support[r.Head] = append(support[r.Head], b)
	}
	for _, ch := range p.Choices {
		b := c.body(ch.Body)
		if b == litFalse {
			continue
		}
		for _, h := range ch.Heads {
			support[h] = append(support[h], b)
		}
	}
	for a := 1; a <= n; a++ {
		c.clause(append([]int32{-int32(a)}, support[a]...)...)
	}
	for _, bd := range p.Bounds {
		c.bound(bd)
	}
}

// A bound is encoded with a sequential counter (n·k registers and about
// 4·n·k clauses for n literals and counter width k, propagating as well as
// the engine's counting) when k <= dimacsCounterWidth or n·k <=
// dimacsCounterLimit; otherwise (such as the room supply of a period,
// thousands of literals under a limit of hundreds) with adders (about 2·n
// variables and 7·n clauses whatever the limit, but weaker propagation).
// Variables so that tests can exercise both.
var (
	dimacsCounterWidth = 4
	dimacsCounterLimit = 200
)

// bound encodes lower <= #true(Lits) <= upper under Cond with a sequential
// counter: register s[i][j] (j = 1..K) is implied by "at least j of the
// first i literals hold" (upward clauses, needed for the upper limit) and,
// when a lower limit is present, implies it (downward clauses).
func (c *cnfBuilder) bound(bd Bound) {
	xs := make([]int32, len(bd.Lits))
	for i, l := range bd.Lits {
		xs[i] = dlit(l)
	}
	nc := make([]int32, len(bd.Cond))
	for i, l := range bd.Cond {
		nc[i] = -dlit(l)
	}
	with := func(lits ...int32) { c.clause(append(lits, nc...)...) }
	n := len(xs)
	lower, upper := bd.Lower, bd.Upper
	if lower != NoBound && lower > n {
		with()
		return
	}
	if upper != NoBound && upper >= n {
		upper = NoBound
	}
	if lower != NoBound && lower <= 0 {
		lower = NoBound
	}
	// Cases that need no counter.
	if upper == 0 {
		for _, x := range xs {
			with(-x)
		}
		upper = NoBound
	}
	if lower == n {
		for _, x := range xs {
			with(x)
		}
		lower = NoBound
	}
	if lower == 1 {
		with(xs...)
		lower = NoBound
	}
	if upper == NoBound && lower == NoBound {
		return
	}
	k := 0
	if upper != NoBound {
		k = upper + 1
	}
	if lower != NoBound && lower > k {
		k = lower
	}
	if k > dimacsCounterWidth && n*k > dimacsCounterLimit {
		c.adderBound(xs, nc, lower, upper)
		return
	}
	k = 0
	if upper != NoBound {
		k = upper + 1
	}
	if lower != NoBound && lower > k {
		k = lower
	}
	down := lower != NoBound
	// prev[j-1] is s[i-1][j]; 0 means constant false (j > i-1).
	prev := make([]int32, k)
	cur := make([]int32, k)
	for i, x := range xs {
		top := min(i+1, k)
		for j := 1; j <= top; j++ {
			s := c.newVar()
			cur[j-1] = s
			p := prev[j-1] // s[i-1][j], 0 when j > i
			// Upward: s[i-1][j] -> s; x and s[i-1][j-1] -> s.
			if p != 0 {
				c.clause(-p, s)
			}
			if j == 1 {
				c.clause(-x, s)
			} else {
				c.clause(-x, -prev[j-2], s)
			}
			if down {
				// s -> s[i-1][j] or x; s -> s[i-1][j] or s[i-1][j-1].
				if p != 0 {
					c.clause(-s, p, x)
					if j > 1 {
						c.clause(-s, p, prev[j-2])
					}
				} else {
					c.clause(-s, x)
					if j > 1 {
						c.clause(-s, prev[j-2])
					}
				}
			}
		}
		prev, cur = cur, prev
		for j := top; j < k; j++ {
			prev[j] = 0
		}
	}
	if upper != NoBound {
		with(-prev[upper])
	}
	if lower != NoBound {
		with(prev[lower-1])
	}
}

// adderBound encodes lower <= sum(xs) <= upper under the negated condition
// literals nc with a network of full and half adders that reduces the bits
// of each weight to one (Eén & Sörensson 2006, after Warners 1998), then
// compares the binary sum with the limits. Size O(len(xs)), whatever the
// limits.
func (c *cnfBuilder) adderBound(xs, nc []int32, lower, upper int) {
	var buckets [][]int32
	buckets = append(buckets, slices.Clone(xs))
	for w := 0; w < len(buckets); w++ {
		for len(buckets[w]) >= 2 {
			b := buckets[w]
			var sum, carry int32
			if len(b) >= 3 {
				x, y, z := b[len(b)-1], b[len(b)-2], b[len(b)-3]
				buckets[w] = b[:len(b)-3]
				sum, carry = c.fullAdder(x, y, z)
			} else {
				x, y := b[1], b[0]
				buckets[w] = b[:0]
				sum, carry = c.halfAdder(x, y)
			}
			buckets[w] = append(buckets[w], sum)
			if w+1 == len(buckets) {
				buckets = append(buckets, nil)
			}
			buckets[w+1] = append(buckets[w+1], carry)
		}
	}
	bits := make([]int32, len(buckets)) // 0 for a weight with no bit
	for w, b := range buckets {
		if len(b) == 1 {
			bits[w] = b[0]
		}
	}
	// forbid adds, for each position i where the bit of the sum must not
	// take value bad given equal higher bits, the clause saying so.
	forbid := func(limit int, bad bool) {
		for i := len(bits) - 1; i >= 0; i-- {
			li := limit>>i&1 == 1
			// sum > limit is decided at i when limit's bit is 0 and sum's is 1;
			// sum < limit when limit's bit is 1 and sum's is 0.
			if li == bad {
				continue
			}
			var cl []int32
			if bits[i] == 0 {
				if bad {
					continue // a missing bit is 0: never 1
				}
			} else if bad {
				cl = append(cl, -bits[i])
			} else {
				cl = append(cl, bits[i])
			}
			skip := false
			for j := i + 1; j < len(bits); j++ {
				lj := limit>>j&1 == 1
				switch {
				case bits[j] == 0 && lj:
					skip = true // sum's bit 0 differs from limit's 1 above: not decided at i
				case bits[j] == 0:
				case lj:
					cl = append(cl, -bits[j])
				default:
					cl = append(cl, bits[j])
				}
			}
			if !skip {
				c.clause(append(cl, nc...)...)
			}
		}
		if limit>>len(bits) != 0 && !bad {
			c.clause(nc...) // lower limit above any sum
		}
	}
	if upper != NoBound {
		forbid(upper, true)
	}
	if lower != NoBound {
		forbid(lower, false)
	}
}

// fullAdder defines sum = x xor y xor z and carry = at least two of them.
func (c *cnfBuilder) fullAdder(x, y, z int32) (sum, carry int32) {
	sum, carry = c.newVar(), c.newVar()
	for _, sx := range []int32{1, -1} {
		for _, sy := range []int32{1, -1} {
			for _, sz := range []int32{1, -1} {
				// odd number of true among x,y,z <-> sum
				odd := (sx > 0) != (sy > 0) != (sz > 0)
				s := sum
				if !odd {
					s = -sum
				}
				c.clause(-sx*x, -sy*y, -sz*z, s)
			}
		}
	}
	c.clause(-x, -y, carry)
	c.clause(-x, -z, carry)
	c.clause(-y, -z, carry)
	c.clause(x, y, -carry)
	c.clause(x, z, -carry)
	c.clause(y, z, -carry)
	return sum, carry
}

// halfAdder defines sum = x xor y and carry = x and y.
func (c *cnfBuilder) halfAdder(x, y int32) (sum, carry int32) {
	sum, carry = c.newVar(), c.newVar()
	c.clause(-x, -y, -sum)
	c.clause(x, y, -sum)
	c.clause(-x, y, sum)
	c.clause(x, -y, sum)
	c.clause(-x, -y, carry)
	c.clause(x, -carry)
	c.clause(y, -carry)
	return sum, carry
}
