package samples

import (
	"fmt"
	"math"
	"strings"
)

// assignStaff gives every section a lead teacher from its department, and
// some a second (laboratory demonstrators, co-taught plenaries). Each person
// teaches one to four sections and at most capLoad periods a week; people
// are added where a department runs short.
func (g *gen) assignStaff() {
	need := make([]int, len(g.secs))
	perDept := make([]int, len(g.depts))
	total := 0
	for i, s := range g.secs {
		need[i] = 1
		if s.kind == kindLab && g.chance(0.25) || s.kind != kindLab && g.chance(0.06) {
			need[i] = 2
		}
		perDept[s.dept] += need[i]
		total += need[i]
	}
	perPerson := math.Max(1, float64(total)/float64(staffTarget(g.cfg.Sections)))
	pool := make([][]int, len(g.depts))
	for d := range g.depts {
		for range max(1, int(math.Round(float64(perDept[d])/perPerson))) {
			pool[d] = append(pool[d], g.newStaff(d))
		}
	}
	for _, i := range g.shuffled(len(g.secs)) {
		for range need[i] {
			p := g.pickTeacher(i, pool[g.secs[i].dept])
			if p < 0 {
				p = g.newStaff(g.secs[i].dept)
				pool[g.secs[i].dept] = append(pool[g.secs[i].dept], p)
			}
			g.secs[i].staff = append(g.secs[i].staff, p)
			g.staff[p].secs = append(g.staff[p].secs, i)
			g.staff[p].load += g.secs[i].load()
		}
	}
	g.dropIdleStaff()
	g.nameStaff()
}

// pickTeacher chooses someone from pool for section i: preferably a person
// below the number of sections they are meant to teach, otherwise anyone
// below four; -1 when nobody can take it.
func (g *gen) pickTeacher(i int, pool []int) int {
	s := &g.secs[i]
	var under, any []int
	for _, p := range pool {
		st := &g.staff[p]
		if len(st.secs) >= 4 || st.load+s.load() > g.capLoad || containsInt(s.staff, p) {
			continue
		}
		any = append(any, p)
		if len(st.secs) < st.want {
			under = append(under, p)
		}
	}
	switch {
	case len(under) > 0:
		return under[g.rng.IntN(len(under))]
	case len(any) > 0:
		return any[g.rng.IntN(len(any))]
	}
	return -1
}

func (g *gen) newStaff(d int) int {
	g.staff = append(g.staff, staffer{dept: d, want: 1 + g.pickWeighted([]int{15, 30, 35, 20})})
	return len(g.staff) - 1
}

// dropIdleStaff removes people who were given no section and renumbers the
// sections' staff lists.
func (g *gen) dropIdleStaff() {
	renum := make([]int, len(g.staff))
	kept := g.staff[:0]
	for i, st := range g.staff {
		renum[i] = -1
		if len(st.secs) > 0 {
			renum[i] = len(kept)
			kept = append(kept, st)
		}
	}
	g.staff = kept
	for i := range g.secs {
		for k, p := range g.secs[i].staff {
			g.secs[i].staff[k] = renum[p]
		}
	}
}

// nameStaff gives everyone an ID, a name (distinct while the lists allow)
// and a unique e-mail address.
func (g *gen) nameStaff() {
	weights := make([]int, len(cultures))
	for i, c := range cultures {
		weights[i] = c.weight
	}
	emails, names := map[string]bool{}, map[string]bool{}
	for i := range g.staff {
		var given givenName
		var family, famASCII string
		for try := 0; try == 0 || names[given.name+" "+family] && try < 20; try++ {
			c := cultures[g.pickWeighted(weights)]
			given = c.given[g.rng.IntN(len(c.given))]
			fam := c.family[g.rng.IntN(len(c.family))]
			family, famASCII = fam.male, fam.ascii
			if given.female && fam.female != "" {
				family, famASCII = fam.female, fam.asciiFemale
			}
		}
		names[given.name+" "+family] = true
		givenASCII := given.ascii
		if givenASCII == "" {
			givenASCII = asciiFold(given.name)
		}
		if famASCII == "" {
			famASCII = asciiFold(family)
		}
		local := strings.ToLower(givenASCII[:1] + "." + strings.NewReplacer(" ", "", "'", "").Replace(famASCII))
		email := local + "@" + emailDomain
		for n := 2; emails[email]; n++ {
			email = fmt.Sprintf("%s%d@%s", local, n, emailDomain)
		}
		emails[email] = true
		st := &g.staff[i]
		st.id = fmt.Sprintf("S-%04d", 1001+i)
		st.name = given.name + " " + family
		st.email = email
	}
}

// asciiFold writes a Latin-script name in ASCII letters: marked letters
// lose their marks (foldTable), combining marks are dropped.
func asciiFold(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r < 128:
			b.WriteRune(r)
		case r >= 0x300 && r <= 0x36f:
			// combining mark: dropped
		default:
			b.WriteString(foldTable[r])
		}
	}
	return b.String()
}

func containsInt(xs []int, x int) bool {
	for _, v := range xs {
		if v == x {
			return true
		}
	}
	return false
}
