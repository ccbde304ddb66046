package swarm

import (
	"fmt"
	"os"
	"sync"
)

// loaded caches tables read by Load, keyed by path, modification time and size.
var loaded sync.Map

// Load reads the swarm table CSV file at path (see ReadCSV). A table is read once per process
// while the file keeps its modification time and size, so a sweep of many runs reads a user
// table once; tables are immutable, so the cached one is safe to share.
func Load(path string) (*Table, error) {
	info, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	key := fmt.Sprintf("%s\x00%d\x00%d", path, info.ModTime().UnixNano(), info.Size())
	if t, ok := loaded.Load(key); ok {
		return t.(*Table), nil
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	t, err := ReadCSV(f, path)
	if err != nil {
		return nil, err
	}
	loaded.Store(key, t)
	return t, nil
}
