package solver

import (
	"context"
	"errors"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

// TestPigeonhole: n+1 pigeons do not fit into n holes (the pigeonhole
// principle; exponentially hard for resolution, Haken 1985), while n fit.
func TestPigeonhole(t *testing.T) {
	for n := 1; n <= 7; n++ {
		if n == 7 && testing.Short() {
			continue
		}
		s, err := New(engPigeonhole(n+1, n), DefaultOptions())
		require.NoError(t, err)
		require.Equal(t, Unsatisfiable, s.Solve(context.Background()), "%d into %d", n+1, n)
		p := engPigeonhole(n, n)
		s, err = New(p, DefaultOptions())
		require.NoError(t, err)
		require.Equal(t, Satisfiable, s.Solve(context.Background()))
		require.NoError(t, Verify(p, s.Model(nil)))
	}
}

func TestSmallPrograms(t *testing.T) {
	type tc struct {
		name  string
		build func(p *Program)
		want  Status
	}
	cases := []tc{
		{"empty", func(p *Program) {}, Satisfiable},
		{"fact", func(p *Program) { p.AddFact(p.NewAtom("a")) }, Satisfiable},
		{"empty constraint", func(p *Program) { p.AddConstraint() }, Unsatisfiable},
		{"no rule means false", func(p *Program) { a := p.NewAtom("a"); p.AddConstraint(Neg(a)) }, Unsatisfiable},
		{"odd loop", func(p *Program) { a := p.NewAtom("a"); p.AddRule(a, Neg(a)) }, Unsatisfiable},
		{"self support", func(p *Program) {
			a := p.NewAtom("a")
			p.AddRule(a, Pos(a))
			p.AddConstraint(Neg(a))
		}, Unsatisfiable},
		{"choice loop unfounded", func(p *Program) {
			a, b := p.NewAtom("a"), p.NewAtom("b")
			p.AddChoice([]Atom{a}, NoBound, NoBound, Pos(b))
			p.AddChoice([]Atom{b}, NoBound, NoBound, Pos(a))
			p.AddConstraint(Neg(a))
		}, Unsatisfiable},
		{"bound impossible", func(p *Program) {
			a := p.NewAtom("a")
			p.AddChoice([]Atom{a}, NoBound, NoBound)
			p.AddBound([]Lit{Pos(a)}, 2, NoBound)
		}, Unsatisfiable},
		{"bound with false condition", func(p *Program) {
			a, c := p.NewAtom("a"), p.NewAtom("c")
			p.AddChoice([]Atom{a}, NoBound, NoBound)
			p.AddBound([]Lit{Pos(a)}, 2, NoBound, Pos(c))
		}, Satisfiable},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := NewProgram()
			c.build(p)
			s, err := New(p, DefaultOptions())
			require.NoError(t, err)
			st := s.Solve(context.Background())
			require.Equal(t, c.want, st)
			require.Equal(t, len(engAllStable(p)) > 0, st == Satisfiable)
			if st == Satisfiable {
				require.NoError(t, Verify(p, s.Model(nil)))
			} else {
				require.Empty(t, s.Model(nil))
			}
			// Repeated calls give the same answer.
			require.Equal(t, c.want, s.Solve(context.Background()))
		})
	}
}

func TestNewRejectsInvalid(t *testing.T) {
	p := NewProgram()
	a := p.NewAtom("a")
	cases := []struct {
		name  string
		build func() *Program
		opts  Options
		want  error
	}{
		{"head out of range", func() *Program { q := NewProgram(); q.NewAtom("a"); q.AddRule(5); return q }, Options{}, ErrProgram},
		{"body out of range", func() *Program { q := NewProgram(); q.AddConstraint(Pos(3)); return q }, Options{}, ErrProgram},
		{"atom zero in body", func() *Program { q := NewProgram(); q.AddConstraint(Lit(1)); return q }, Options{}, ErrProgram},
		{"lower above upper", func() *Program { q := NewProgram(); x := q.NewAtom("x"); q.AddBound([]Lit{Pos(x)}, 2, 1); return q }, Options{}, ErrProgram},
		{"limit below NoBound", func() *Program { q := NewProgram(); x := q.NewAtom("x"); q.AddBound([]Lit{Pos(x)}, -2, 1); return q }, Options{}, ErrProgram},
		{"choice head zero", func() *Program { q := NewProgram(); q.AddChoice([]Atom{0}, NoBound, NoBound); return q }, Options{}, ErrProgram},
		{"weak out of range", func() *Program { q := NewProgram(); q.AddWeak(1, 0, Pos(9)); return q }, Options{}, ErrProgram},
		{"decay", func() *Program { return p }, Options{VarDecay: 1.5}, ErrOptions},
		{"random freq", func() *Program { return p }, Options{RandomFreq: -0.1}, ErrOptions},
		{"conflict limit", func() *Program { return p }, Options{ConflictLimit: -1}, ErrOptions},
		{"restart policy", func() *Program { return p }, Options{Restarts: 9}, ErrOptions},
	}
	_ = a
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s, err := New(c.build(), c.opts)
			require.Nil(t, s)
			require.True(t, errors.Is(err, c.want), "got %v", err)
			require.NotEmpty(t, err.Error())
		})
	}
}

func TestLimitsGiveUnknown(t *testing.T) {
	p := engPigeonhole(10, 9)
	s, err := New(p, Options{ConflictLimit: 100})
	require.NoError(t, err)
	require.Equal(t, Unknown, s.Solve(context.Background()))
	require.Equal(t, Unknown, s.Solve(context.Background()), "the limit is per call")
	require.GreaterOrEqual(t, s.Stats().Conflicts, int64(200))

	s, err = New(p, DefaultOptions())
	require.NoError(t, err)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	require.Equal(t, Unknown, s.Solve(ctx))
	ctx, cancel = context.WithTimeout(context.Background(), 20*time.Millisecond)
	defer cancel()
	require.Equal(t, Unknown, s.Solve(ctx))
}

func TestAddClauseSetPhaseProgress(t *testing.T) {
	p := NewProgram()
	var xs []Atom
	for i := 0; i < 4; i++ {
		xs = append(xs, p.NewAtom(""))
	}
	p.AddChoice(xs, 1, NoBound)
	s, err := New(p, DefaultOptions())
	require.NoError(t, err)
	for _, x := range xs {
		s.SetPhase(x, true)
	}
	require.Equal(t, Satisfiable, s.Solve(context.Background()))
	require.Equal(t, xs, s.Model(nil), "phases make every atom true first")
	require.Error(t, s.AddClause(Pos(99)))
	// Forbid each model in turn: exactly 15 non-empty subsets.
	n := 0
	for s.Solve(context.Background()) == Satisfiable {
		n++
		var block []Lit
		for _, x := range xs {
			if s.Value(x) {
				block = append(block, Neg(x))
			} else {
				block = append(block, Pos(x))
			}
		}
		require.NoError(t, s.AddClause(block...))
	}
	require.Equal(t, 15, n)
	require.False(t, s.Value(xs[0]))

	calls := 0
	q := engPigeonhole(8, 7)
	s, err = New(q, Options{Restarts: RestartLuby, LubyUnit: 10})
	require.NoError(t, err)
	s.SetProgress(func(st Stats) { calls++; require.Positive(t, st.Conflicts) })
	require.Equal(t, Unsatisfiable, s.Solve(context.Background()))
	require.Positive(t, calls)
	st := s.Stats()
	require.Equal(t, int64(calls), st.Restarts)
	require.Positive(t, st.Decisions)
	require.Positive(t, st.Propagations)
	require.Positive(t, st.Learned)
}

func TestAssumeUnknownAtom(t *testing.T) {
	p := NewProgram()
	p.NewAtom("a")
	s, err := New(p, DefaultOptions())
	require.NoError(t, err)
	s.Assume(Pos(7))
	require.Equal(t, Unknown, s.Solve(context.Background()))
	require.Equal(t, Satisfiable, s.Solve(context.Background()))
}

func TestLuby(t *testing.T) {
	// The Luby sequence as defined by Luby, Sinclair & Zuckerman (1993).
	want := []int64{1, 1, 2, 1, 1, 2, 4, 1, 1, 2, 1, 1, 2, 4, 8, 1, 1, 2}
	for i, w := range want {
		require.Equal(t, w, luby(i), "luby(%d)", i)
	}
}
