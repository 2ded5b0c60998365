package plant

// nearest returns the allowed key closest to key by edit distance, or ""
// when none is close enough to be a likely misspelling (more than a third
// of the key's length, and at least two edits, away).
func nearest(key string, allowed []string) string {
	best, bestD := "", 1<<30
	for _, a := range allowed {
		if d := editDistance(key, a); d < bestD {
			best, bestD = a, d
		}
	}
	limit := max(2, len([]rune(key))/3)
	if bestD > limit {
		return ""
	}
	return best
}

// editDistance is the Levenshtein distance between a and b (insertions,
// deletions and substitutions of runes), with an adjacent transposition
// counted as one edit (optimal string alignment).
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	if len(ra) > 64 || len(rb) > 64 {
		return 1 << 20
	}
	prev2 := make([]int, len(rb)+1)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(rb)]
}
