package solver

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"regexp"
	"testing"
)

// fuzzSeeds are inputs for FuzzReadProgram beyond the files in testdata.
var fuzzSeeds = []string{
	"",
	"a.",
	"a :- b, not c.",
	":- a, b.",
	"{a; b; c} :- d.",
	"1 {a; b} 2 :- c.",
	"{a; b} = 1.",
	"{a; b} <= 1. 1 <= {a; b}.",
	":- 2 {a; b; c}, d.",
	":- {a; b} 0, d.",
	":- not 1 {a; not b} 2, d.",
	":~ a, not b. [3@1]",
	"#show a. #atoms b; a.",
	`start(s12,3) :- busy("R 204",mon), not p(-1,(x,y)).`,
	"% comment\n%* block *% _a3 :- _a1.",
	"a :- b c.",
	"p(X).",
	"\"open",
	"%* open",
	"{a} < 0.",
	":- 0 {a}.",
	"p(((((((((a))))))))).",
}

var positionPrefix = regexp.MustCompile(`^fuzz\.lp:[1-9][0-9]*:[1-9][0-9]*: `)

// FuzzReadProgram checks that the reader (and ReadModel) never panics, that
// every error carries a line:col position, and that a program that reads prints, reads
// back as the same program and prints again byte for byte.
func FuzzReadProgram(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add([]byte(s))
	}
	f.Add([]byte(":~ a. [4611686018427387904@1]\n:~ b. [4611686018427387904@1]\n{a; b}."))
	f.Add([]byte(":~ a. [-9223372036854775808]\n{a}."))
	files, _ := filepath.Glob(filepath.Join("testdata", "*.lp"))
	for _, name := range files {
		if data, err := os.ReadFile(name); err == nil {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		if fastName(string(data)) && slowCheckName(string(data)) != "" {
			t.Fatalf("fast name check accepts %q: %s", data, slowCheckName(string(data)))
		}
		p, err := ReadProgram(bytes.NewReader(data), "fuzz.lp")
		base := p
		if base == nil {
			base = NewProgram()
		}
		if _, merr := ReadModel(bytes.NewReader(data), base, "fuzz.txt"); merr != nil {
			var list SyntaxErrors
			if !errors.As(merr, &list) || len(list) == 0 {
				t.Fatalf("ReadModel error is not a syntax error list: %v", merr)
			}
		}
		if err != nil {
			if p != nil {
				t.Fatal("a program and an error")
			}
			var list SyntaxErrors
			if !errors.As(err, &list) || len(list) == 0 || !errors.Is(err, ErrSyntax) {
				t.Fatalf("error is not a syntax error list: %v", err)
			}
			for _, e := range list {
				if !positionPrefix.MatchString(e.Error()) {
					t.Fatalf("error without position: %q", e.Error())
				}
			}
			return
		}
		// Weights were bounded per level, so no model's cost overflows.
		all := make([]Atom, p.NumAtoms())
		for i := range all {
			all[i] = Atom(i + 1)
		}
		if _, err := CheckedCost(p, all); err != nil {
			t.Fatalf("a program that was read has a cost that overflows: %v", err)
		}
		var first bytes.Buffer
		if err := WriteProgram(&first, p); err != nil {
			t.Fatalf("a program that was read cannot be printed: %v", err)
		}
		q, err := ReadProgram(bytes.NewReader(first.Bytes()), "printed.lp")
		if err != nil {
			t.Fatalf("printed program does not read back: %v\n%s", err, first.String())
		}
		if q.NumAtoms() != p.NumAtoms() {
			t.Fatalf("atoms %d, read back %d\n%s", p.NumAtoms(), q.NumAtoms(), first.String())
		}
		var second bytes.Buffer
		if err := WriteProgram(&second, q); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(first.Bytes(), second.Bytes()) {
			t.Fatalf("print, read, print differs:\n%s\n---\n%s", first.String(), second.String())
		}
	})
}
