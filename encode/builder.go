package encode

import (
	"strconv"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// builder holds one compilation: the term, the program being written and
// the catalog being filled. Every statement goes through the add methods so
// that the catalog knows which group stated it.
type builder struct {
	t   *timetable.Term
	opt Options
	p   *solver.Program
	c   *Catalog

	staffIdx, cohortIdx, roomIdx, secIdx map[string]int
	fits                                 map[int][]bool         // fits[length][start]: the meeting fits in one run
	unavail                              unavailTable           // hard unavailability per staff, cohort, section, room
	group                                int32                  // group of the statements being added, -1 for none
	boundKind                            string                 // kind recorded for bounds being added
	errs                                 []InputError           // problems found so far
	days                                 [][]int                // periods of each grid day, in grid order
	dayOf                                []int                  // dayOf[p]: index into days
	meets                                map[int][]solver.Atom  // meets[s][day order]: meets(S,D) atoms, made on demand
	startedBy                            map[int][]solver.Atom  // startedBy[s][p]: started_by(S,P) atoms, made on demand
	busy                                 map[int][]solver.Atom  // busy[staff][p]: busy(T,P) atoms, made on demand
	itemsBySet                           map[int][]roomItem     // candidate meetings by room set id (roomItemsBySet)
	travel                               *timetable.TravelIndex // travel times (travelMinutes), built on first use
	staffSecs, cohortSecs                [][]int                // peopleSections, built on first use
	stamp                                []int32                // stamp[s] == stampGen: section s seen in the current count
	stampGen                             int32                  // current stamp
	pat                                  patState               // pattern sections (pattern_unavail.go)
	rel                                  relState               // pattern relations and limits (times_rel_rooms.go)
	gridRoomsDone                        bool                   // explicit grid rooms decided (rooms_grid.go)
}

// newAtom makes an atom with a name and a meaning.
func (b *builder) newAtom(name string, info AtomInfo) solver.Atom {
	a := b.p.NewAtom(name)
	b.c.atoms = append(b.c.atoms, info)
	return a
}

func (b *builder) rule(head solver.Atom, body ...solver.Lit) {
	b.p.AddRule(head, body...)
	b.c.ruleGroup = append(b.c.ruleGroup, b.group)
}

func (b *builder) choice(heads []solver.Atom, lower, upper int, body ...solver.Lit) {
	nb := len(b.p.Bounds)
	b.p.AddChoice(heads, lower, upper, body...)
	b.c.choiceGroup = append(b.c.choiceGroup, b.group)
	for range b.p.Bounds[nb:] {
		b.c.boundGroup = append(b.c.boundGroup, b.group)
		b.c.boundKind = append(b.c.boundKind, b.boundKind)
	}
}

func (b *builder) bound(lits []solver.Lit, lower, upper int, cond ...solver.Lit) {
	b.p.AddBound(lits, lower, upper, cond...)
	b.c.boundGroup = append(b.c.boundGroup, b.group)
	b.c.boundKind = append(b.c.boundKind, b.boundKind)
}

// in sets the group (by index, -1 for none) and bound kind of the
// statements that follow.
func (b *builder) in(group int, boundKind string) {
	b.group = int32(group)
	b.boundKind = boundKind
}

// newGroup makes a requirement group with its selector atom: a fact
// normally, a free choice in Explain mode. key makes the selector's name
// unique ("staff","S-017"); the same kind and key give the same group.
func (b *builder) newGroup(kind string, key []string, sentence string, src []timetable.Source, relax int) int {
	k := kind + "\x00" + strings.Join(key, "\x00")
	if id, ok := b.c.groupKey[k]; ok {
		return id
	}
	id := len(b.c.Groups)
	sel := b.newAtom(selectorName(kind, key), AtomInfo{Kind: AtomSelector, Section: -1, Period: -1, Staff: -1, Group: id})
	b.c.Groups = append(b.c.Groups, Group{ID: id, Kind: kind, Selector: sel, Sentence: sentence, Src: src, Hard: true, RelaxCost: relax})
	b.c.groupKey[k] = id
	saveG, saveK := b.group, b.boundKind
	b.in(id, "selector")
	if b.opt.Explain {
		b.choice([]solver.Atom{sel}, solver.NoBound, solver.NoBound)
	} else {
		b.rule(sel)
	}
	b.group, b.boundKind = saveG, saveK
	return id
}

// sel is the positive selector literal of group g.
func (b *builder) sel(g int) solver.Lit { return solver.Pos(b.c.Groups[g].Selector) }

// Naming: atoms print as ground terms of the standard rule syntax, e.g.
// start("BIO-101",tue_10_00) and req(staff_availability,"S-017").

// quote writes s as a quoted string constant.
func quote(s string) string {
	var sb strings.Builder
	sb.WriteByte('"')
	for _, r := range s {
		switch r {
		case '"', '\\':
			sb.WriteByte('\\')
			sb.WriteRune(r)
		case '\n':
			sb.WriteString(`\n`)
		case '\r', '\t':
			sb.WriteByte(' ')
		default:
			sb.WriteRune(r)
		}
	}
	sb.WriteByte('"')
	return sb.String()
}

// periodName is "tue_10_00".
func periodName(p timetable.Period) string {
	d := strings.ToLower(timetable.DayName(p.Day))
	s := p.Start.String()
	return d + "_" + s[:2] + "_" + s[3:]
}

func selectorName(kind string, key []string) string {
	var sb strings.Builder
	sb.WriteString("req(")
	sb.WriteString(strings.NewReplacer(" ", "_", "-", "_").Replace(kind))
	for _, k := range key {
		sb.WriteByte(',')
		if n, err := strconv.Atoi(k); err == nil && strconv.Itoa(n) == k && n >= 0 {
			sb.WriteString(k)
		} else {
			sb.WriteString(quote(k))
		}
	}
	sb.WriteByte(')')
	return sb.String()
}

// extender is a builder that adds statements to an already compiled program.
func (c *Catalog) extender(p *solver.Program) *builder {
	return &builder{t: c.term, opt: Options{Explain: c.explain}, p: p, c: c, group: -1}
}
