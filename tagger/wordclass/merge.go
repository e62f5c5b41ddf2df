package wordclass

import "math"

// mergeTree merges the learned classes greedily, as Brown et al. (1992)
// merge words: each step joins the two classes whose merge lowers the
// likelihood F the least. It returns the path of each class in the tree
// of merges ("" for the fixed classes and for classes left empty).
//
// The loss of every pair is kept in a table. Merging a and b changes the
// loss of a pair (i, j) elsewhere only through the cells of i and j in
// the rows and columns of a and b, so those terms are taken out and the
// merged class's put in (Brown et al. 1992, §3, and Liang 2005, "Semi-
// supervised learning for natural language", §3.2, do the same for
// words): a step costs O(C²) instead of O(C³).
func (x *exchange) mergeTree() []string {
	nc := x.nc
	g := newMerger(x)
	// node[c] is the tree node class c stands for: the class itself, or
	// nc+i for the node of the i-th merge, whose children are kids[i].
	node := make([]int, nc)
	for c := range node {
		node[c] = c
	}
	var kids [][2]int
	for len(g.active) > 1 {
		a, b := g.best()
		g.merge(a, b)
		kids = append(kids, [2]int{node[a], node[b]})
		node[a] = nc + len(kids) - 1
	}
	paths := make([]string, x.k)
	if len(g.active) == 0 {
		return paths
	}
	var walk func(n int, path []byte)
	walk = func(n int, path []byte) {
		if n < nc {
			paths[n] = string(path)
			return
		}
		kid := kids[n-nc]
		walk(kid[0], append(path, '0'))
		walk(kid[1], append(path, '1'))
	}
	walk(node[g.active[0]], nil)
	return paths
}

// merger holds the classes not yet merged away and the gain of merging
// each pair of them.
type merger struct {
	x      *exchange
	active []int     // in increasing order
	gain   []float64 // gain[i*nc+j], i < j: mergeGain(i, j)
}

func newMerger(x *exchange) *merger {
	nc := x.nc
	size := make([]int, nc)
	for w := range x.c.words {
		size[x.cls[w]]++
	}
	g := &merger{x: x, gain: make([]float64, nc*nc)}
	for c := range nc {
		if size[c] > 0 {
			g.active = append(g.active, c)
		}
	}
	for a, i := range g.active {
		for _, j := range g.active[a+1:] {
			g.gain[i*nc+j] = x.mergeGain(i, j)
		}
	}
	return g
}

// best returns the pair whose merge gains the most (of equals, the first
// in order), a < b.
func (g *merger) best() (a, b int) {
	nc := g.x.nc
	a, b = -1, -1
	best := math.Inf(-1)
	for k, i := range g.active {
		for _, j := range g.active[k+1:] {
			if v := g.gain[i*nc+j]; v > best {
				a, b, best = i, j, v
			}
		}
	}
	return a, b
}

// merge merges class b into class a (a < b) and updates the gains.
func (g *merger) merge(a, b int) {
	x, nc := g.x, g.x.nc
	for k, i := range g.active {
		if i == a || i == b {
			continue
		}
		for _, j := range g.active[k+1:] {
			if j != a && j != b {
				g.gain[i*nc+j] += x.mergedTerms(i, j, a, b)
			}
		}
	}
	x.mergeCounts(a, b)
	out := g.active[:0]
	for _, c := range g.active {
		if c != b {
			out = append(out, c)
		}
	}
	g.active = out
	for _, c := range g.active {
		if c < a {
			g.gain[c*nc+a] = x.mergeGain(c, a)
		} else if c > a {
			g.gain[a*nc+c] = x.mergeGain(a, c)
		}
	}
}

// pairTerms returns, for classes i and j and a third class z, the change
// that merging i and j makes to the terms of z's column and z's row:
// f(N(i,z)+N(j,z)) − f(N(i,z)) − f(N(j,z)), and the same for N(z,·).
func (x *exchange) pairTerms(i, j, z int) float64 {
	k := x.k
	a, b := x.n[i*k+z], x.n[j*k+z]
	c, d := x.n[z*k+i], x.n[z*k+j]
	return xlogx(a+b) - xlogx(a) - xlogx(b) + xlogx(c+d) - xlogx(c) - xlogx(d)
}

// mergeGain returns the change of F when classes i and j merge (at most 0).
func (x *exchange) mergeGain(i, j int) float64 {
	k := x.k
	d := 0.0
	for z := range k {
		if z != i && z != j {
			d += x.pairTerms(i, j, z)
		}
	}
	ii, ij, ji, jj := x.n[i*k+i], x.n[i*k+j], x.n[j*k+i], x.n[j*k+j]
	d += xlogx(ii+ij+ji+jj) - xlogx(ii) - xlogx(ij) - xlogx(ji) - xlogx(jj)
	d -= xlogx(x.nl[i]+x.nl[j]) - xlogx(x.nl[i]) - xlogx(x.nl[j])
	d -= xlogx(x.nr[i]+x.nr[j]) - xlogx(x.nr[i]) - xlogx(x.nr[j])
	return d
}

// mergedTerms returns how the gain of merging i and j changes when a and b
// merge: the terms of z = a and z = b give way to those of the merged
// class. It reads the counts before the merge.
func (x *exchange) mergedTerms(i, j, a, b int) float64 {
	k := x.k
	ia, ib, ja, jb := x.n[i*k+a], x.n[i*k+b], x.n[j*k+a], x.n[j*k+b]
	ai, bi, aj, bj := x.n[a*k+i], x.n[b*k+i], x.n[a*k+j], x.n[b*k+j]
	merged := xlogx(ia+ib+ja+jb) - xlogx(ia+ib) - xlogx(ja+jb) +
		xlogx(ai+bi+aj+bj) - xlogx(ai+bi) - xlogx(aj+bj)
	return merged - x.pairTerms(i, j, a) - x.pairTerms(i, j, b)
}

// mergeCounts merges class b into class a, leaving b empty.
func (x *exchange) mergeCounts(a, b int) {
	k := x.k
	for z := range k {
		x.n[a*k+z] += x.n[b*k+z]
		x.n[b*k+z] = 0
	}
	for z := range k {
		x.n[z*k+a] += x.n[z*k+b]
		x.n[z*k+b] = 0
	}
	x.nl[a] += x.nl[b]
	x.nr[a] += x.nr[b]
	x.nl[b], x.nr[b] = 0, 0
}
