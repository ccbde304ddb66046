package study

import (
	"fmt"
	"strconv"
	"strings"
)

// Shard is one share of a sweep's points: shard K of N owns the points i with i mod N = K−1.
// The zero Shard means the whole sweep (1 of 1).
type Shard struct {
	K int `json:"k"` // 1…N
	N int `json:"n"` // number of shards
}

// Whole reports whether the shard is the entire sweep.
func (s Shard) Whole() bool { return s.N <= 1 }

// Owns reports whether point i belongs to the shard.
func (s Shard) Owns(i int) bool { return s.Whole() || i%s.N == s.K-1 }

// String writes the shard as K/N.
func (s Shard) String() string {
	if s.Whole() {
		return "1/1"
	}
	return fmt.Sprintf("%d/%d", s.K, s.N)
}

func (s Shard) norm() Shard {
	if s.Whole() {
		return Shard{K: 1, N: 1}
	}
	return s
}

// ParseShard reads K/N with 1 ≤ K ≤ N.
func ParseShard(text string) (Shard, error) {
	ks, ns, ok := strings.Cut(strings.TrimSpace(text), "/")
	k, err1 := strconv.Atoi(ks)
	n, err2 := strconv.Atoi(ns)
	if !ok || err1 != nil || err2 != nil {
		return Shard{}, fmt.Errorf("study: shard %q: want K/N, for example 2/4", text)
	}
	if n < 1 || k < 1 || k > n {
		return Shard{}, fmt.Errorf("study: shard %q: want 1 ≤ K ≤ N", text)
	}
	return Shard{K: k, N: n}, nil
}

// ShardFromSlurm reads the shard of a Slurm job-array task from its environment (getenv is
// os.Getenv in use): SLURM_ARRAY_TASK_ID with SLURM_ARRAY_TASK_COUNT, or with
// SLURM_ARRAY_TASK_MIN and SLURM_ARRAY_TASK_MAX for the count. Task IDs are counted from
// SLURM_ARRAY_TASK_MIN (default 1 when only the count is known), so --array=0-3 and
// --array=1-4 both give shards 1/4 … 4/4. ok is false outside a job array.
func ShardFromSlurm(getenv func(string) string) (s Shard, ok bool, err error) {
	idText := getenv("SLURM_ARRAY_TASK_ID")
	if idText == "" {
		return Shard{}, false, nil
	}
	num := func(name string) (int, bool, error) {
		t := getenv(name)
		if t == "" {
			return 0, false, nil
		}
		v, err := strconv.Atoi(t)
		if err != nil {
			return 0, false, fmt.Errorf("study: %s = %q: want a whole number", name, t)
		}
		return v, true, nil
	}
	id, _, err := num("SLURM_ARRAY_TASK_ID")
	if err != nil {
		return Shard{}, false, err
	}
	lo, haveLo, err := num("SLURM_ARRAY_TASK_MIN")
	if err != nil {
		return Shard{}, false, err
	}
	hi, haveHi, err := num("SLURM_ARRAY_TASK_MAX")
	if err != nil {
		return Shard{}, false, err
	}
	count, haveCount, err := num("SLURM_ARRAY_TASK_COUNT")
	if err != nil {
		return Shard{}, false, err
	}
	if !haveLo {
		lo = 1
	}
	switch {
	case haveCount:
	case haveLo && haveHi:
		count = hi - lo + 1
	default:
		return Shard{}, false, fmt.Errorf("study: SLURM_ARRAY_TASK_ID = %d but neither SLURM_ARRAY_TASK_COUNT nor SLURM_ARRAY_TASK_MIN/MAX is set; pass --shard K/N", id)
	}
	k := id - lo + 1
	if count < 1 || k < 1 || k > count {
		return Shard{}, false, fmt.Errorf("study: Slurm array task %d (min %d, count %d) is not a shard 1…N; use a contiguous --array range or pass --shard", id, lo, count)
	}
	return Shard{K: k, N: count}, true, nil
}
