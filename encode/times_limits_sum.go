package encode

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/termwright/termwright/solver"
)

// litVal is a literal worth v units when it holds.
type litVal struct {
	lit solver.Lit
	v   int
}

// unitChain returns unit literals u[0 .. top-1] for mutually exclusive
// literals with values (at most one holds: one section's patterns): u[j]
// holds exactly when the true literal's value is at least j+1, by the chain
// u[j] :- u[j+1] and u[v-1] :- lit. The number of true units is the value,
// so a weighted sum over exclusive groups becomes a cardinality bound over
// their units: linear in the values, unlike a bound over pairs. Chains are
// interned by their literals and values.
func (b *builder) unitChain(vals []litVal) []solver.Lit {
	var kb strings.Builder
	top := 0
	for _, x := range vals {
		kb.WriteString(strconv.FormatUint(uint64(x.lit), 10))
		kb.WriteByte('*')
		kb.WriteString(strconv.Itoa(x.v))
		kb.WriteByte(',')
		top = max(top, x.v)
	}
	key := kb.String()
	if u, ok := b.rel.units[key]; ok {
		return u
	}
	out := make([]solver.Lit, top)
	if b.rel.units == nil {
		b.rel.units = map[string][]solver.Lit{}
	}
	b.rel.units[key] = out
	if top == 1 && len(vals) == 1 {
		out[0] = vals[0].lit
		return out
	}
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "pattern relation aux")
	defer func() { b.group, b.boundKind = saveG, saveK }()
	b.rel.n++
	for j := range out {
		out[j] = solver.Pos(b.newAtom(fmt.Sprintf("units_%d(%d)", b.rel.n, j+1), aux(-1, -1)))
	}
	for j := 0; j+1 < len(out); j++ {
		b.rule(out[j].Atom(), out[j+1])
	}
	for _, x := range vals {
		if x.v > 0 {
			b.rule(out[x.v-1].Atom(), x.lit)
		}
	}
	return out
}

// distinct returns lits with every repeat of a literal replaced by a new
// atom equal to it (copy :- l), because a bound counts a literal listed
// twice once: a pattern meeting on two days gives the same literal for
// both days, and each day must count.
func (b *builder) distinct(lits []solver.Lit) []solver.Lit {
	seen := map[solver.Lit]bool{}
	out := make([]solver.Lit, len(lits))
	for i, l := range lits {
		if !seen[l] {
			seen[l] = true
			out[i] = l
			continue
		}
		saveG, saveK := b.group, b.boundKind
		b.in(-1, "pattern relation aux")
		b.rel.n++
		a := b.newAtom(fmt.Sprintf("again_%d", b.rel.n), aux(-1, -1))
		b.rule(a, l)
		b.group, b.boundKind = saveG, saveK
		out[i] = solver.Pos(a)
	}
	return out
}
