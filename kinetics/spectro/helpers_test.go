package spectro

import (
	"testing"

	"n2pulse/data"
)

func testDataText(t testing.TB) []byte {
	t.Helper()
	return data.Spectroscopy()
}
