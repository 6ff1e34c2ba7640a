package timetable

// LeastCostPairs pairs the rows of cost with distinct columns, as many
// pairs as the smaller side has, so that the sum of the chosen entries is
// least: the Hungarian method (Kuhn, Naval Res. Logist. Q. 2, 1955) in the
// shortest-augmenting-path form with potentials, O(n²·m) for n ≤ m. It
// returns, per row, its column or -1. cost must be rectangular with
// non-negative entries. Both the comparison of two timetables and the
// solve report's moves (encode) pair meetings with it.
func LeastCostPairs(cost [][]int64) []int {
	n := len(cost)
	if n == 0 {
		return nil
	}
	m := len(cost[0])
	if n > m { // pair the columns with rows, then invert
		tr := make([][]int64, m)
		for j := range tr {
			tr[j] = make([]int64, n)
			for i := range cost {
				tr[j][i] = cost[i][j]
			}
		}
		out := make([]int, n)
		for i := range out {
			out[i] = -1
		}
		for j, i := range LeastCostPairs(tr) {
			out[i] = j
		}
		return out
	}
	const inf = int64(1) << 62
	// 1-based: rowOf[j] is the row on column j (0: none); column 0 is the
	// virtual start of each augmenting path.
	u, v := make([]int64, n+1), make([]int64, m+1)
	rowOf, way := make([]int, m+1), make([]int, m+1)
	minv, used := make([]int64, m+1), make([]bool, m+1)
	for i := 1; i <= n; i++ {
		rowOf[0] = i
		j0 := 0
		for j := range minv {
			minv[j], used[j] = inf, false
		}
		for rowOf[j0] != 0 {
			used[j0] = true
			i0, delta, j1 := rowOf[j0], inf, 0
			for j := 1; j <= m; j++ {
				if used[j] {
					continue
				}
				if c := cost[i0-1][j-1] - u[i0] - v[j]; c < minv[j] {
					minv[j], way[j] = c, j0
				}
				if minv[j] < delta {
					delta, j1 = minv[j], j
				}
			}
			for j := 0; j <= m; j++ {
				if used[j] {
					u[rowOf[j]] += delta
					v[j] -= delta
				} else {
					minv[j] -= delta
				}
			}
			j0 = j1
		}
		for j0 != 0 { // flip the path
			j1 := way[j0]
			rowOf[j0] = rowOf[j1]
			j0 = j1
		}
	}
	out := make([]int, n)
	for j := 1; j <= m; j++ {
		if rowOf[j] != 0 {
			out[rowOf[j]-1] = j - 1
		}
	}
	return out
}
