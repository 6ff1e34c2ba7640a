package solver

// cyclicComponents finds the strongly connected components of the graph on
// vertices 1..n whose edges from v are adj[adjStart[v]:adjStart[v+1]]
// (Tarjan 1972, iterative so deep graphs do not exhaust the stack). It
// returns comp with comp[v] = 1..k for vertices on a cycle (a component of
// two or more vertices, or one with a self-loop) and 0 for the others, and
// the number k of such components. Time and memory O(n + edges).
func cyclicComponents(n int, adjStart, adj []uint32) ([]uint32, int) {
	const unvisited = -1
	index := make([]int32, n+1)
	low := make([]int32, n+1)
	onStack := make([]bool, n+1)
	for i := range index {
		index[i] = unvisited
	}
	comp := make([]uint32, n+1)
	var stack []uint32 // Tarjan's stack of vertices
	type frame struct {
		v    uint32
		next uint32 // next edge of v to explore
	}
	var calls []frame
	next := int32(0)
	k := 0
	for root := 1; root <= n; root++ {
		if index[root] != unvisited {
			continue
		}
		calls = append(calls, frame{uint32(root), adjStart[root]})
		index[root], low[root] = next, next
		next++
		stack = append(stack, uint32(root))
		onStack[root] = true
		for len(calls) > 0 {
			f := &calls[len(calls)-1]
			v := f.v
			if f.next < adjStart[v+1] {
				w := adj[f.next]
				f.next++
				switch {
				case index[w] == unvisited:
					index[w], low[w] = next, next
					next++
					stack = append(stack, w)
					onStack[w] = true
					calls = append(calls, frame{w, adjStart[w]})
				case onStack[w]:
					low[v] = min(low[v], index[w])
				}
				continue
			}
			calls = calls[:len(calls)-1]
			if len(calls) > 0 {
				u := calls[len(calls)-1].v
				low[u] = min(low[u], low[v])
			}
			if low[v] != index[v] {
				continue
			}
			// v is the root of a component: pop it.
			i := len(stack) - 1
			for stack[i] != v {
				i--
			}
			members := stack[i:]
			cyclic := len(members) > 1
			if !cyclic {
				for e := adjStart[v]; e < adjStart[v+1]; e++ {
					if adj[e] == v {
						cyclic = true
						break
					}
				}
			}
			if cyclic {
				k++
			}
			for _, w := range members {
				onStack[w] = false
				if cyclic {
					comp[w] = uint32(k)
				}
			}
			stack = stack[:i]
		}
	}
	return comp, k
}
