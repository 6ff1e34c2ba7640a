package encode

// bipartite is a bipartite graph between left nodes 0..len(adj)-1 (meetings)
// and right nodes 0..nRight-1 (rooms), with a maximum matching computed by
// Hopcroft and Karp's algorithm (SIAM J. Comput. 2(4), 1973): O(E·√V).
type bipartite struct {
	adj    [][]int // adj[l]: right neighbours of left node l
	nRight int
	matchL []int // matchL[l]: right partner or -1
	matchR []int // matchR[r]: left partner or -1
	dist   []int // BFS layer of left nodes
	queue  []int
}

func newBipartite(adj [][]int, nRight int) *bipartite {
	g := &bipartite{adj: adj, nRight: nRight}
	g.matchL = make([]int, len(adj))
	g.matchR = make([]int, nRight)
	g.dist = make([]int, len(adj))
	for i := range g.matchL {
		g.matchL[i] = -1
	}
	for i := range g.matchR {
		g.matchR[i] = -1
	}
	return g
}

const infDist = int(^uint(0) >> 1)

// maxMatching computes a maximum matching and returns its size.
func (g *bipartite) maxMatching() int {
	size := 0
	// Greedy start.
	for l, ns := range g.adj {
		for _, r := range ns {
			if g.matchR[r] < 0 {
				g.matchL[l], g.matchR[r] = r, l
				size++
				break
			}
		}
	}
	for g.bfs() {
		for l := range g.adj {
			if g.matchL[l] < 0 && g.dfs(l) {
				size++
			}
		}
	}
	return size
}

// bfs layers the left nodes from the free ones; true when an augmenting path
// exists.
func (g *bipartite) bfs() bool {
	g.queue = g.queue[:0]
	for l := range g.adj {
		if g.matchL[l] < 0 {
			g.dist[l] = 0
			g.queue = append(g.queue, l)
		} else {
			g.dist[l] = infDist
		}
	}
	found := false
	for i := 0; i < len(g.queue); i++ {
		l := g.queue[i]
		for _, r := range g.adj[l] {
			m := g.matchR[r]
			if m < 0 {
				found = true
			} else if g.dist[m] == infDist {
				g.dist[m] = g.dist[l] + 1
				g.queue = append(g.queue, m)
			}
		}
	}
	return found
}

func (g *bipartite) dfs(l int) bool {
	for _, r := range g.adj[l] {
		m := g.matchR[r]
		if m < 0 || (g.dist[m] == g.dist[l]+1 && g.dfs(m)) {
			g.matchL[l], g.matchR[r] = r, l
			return true
		}
	}
	g.dist[l] = infDist
	return false
}

// deficient returns, after maxMatching, a Hall violator when the matching
// does not cover every left node: the left nodes Z reachable from an
// unmatched left node by alternating paths, and their neighbourhood N(Z),
// with |N(Z)| < |Z| (König 1931; Hall 1935). Both are nil when every left
// node is matched.
func (g *bipartite) deficient() (z, nz []int) {
	start := -1
	for l, r := range g.matchL {
		if r < 0 {
			start = l
			break
		}
	}
	if start < 0 {
		return nil, nil
	}
	seenL := make([]bool, len(g.adj))
	seenR := make([]bool, g.nRight)
	stack := []int{start}
	seenL[start] = true
	for len(stack) > 0 {
		l := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		z = append(z, l)
		for _, r := range g.adj[l] {
			if seenR[r] {
				continue
			}
			seenR[r] = true
			nz = append(nz, r)
			if m := g.matchR[r]; m >= 0 && !seenL[m] {
				seenL[m] = true
				stack = append(stack, m)
			}
		}
	}
	return z, nz
}
