package usermsg

import "testing"

func TestStrip(t *testing.T) {
	t.Parallel()
	for in, want := range map[string]string{
		"study: point 3: design: gas.pressure = 40: no unit": "point 3: gas.pressure = 40: no unit",
		"units: \"1 m^256\": power 256":                      "\"1 m^256\": power 256",
		"design: example.toml:12: study: units: x":           "example.toml:12: x",
		"merge: --out d is not empty":                        "merge: --out d is not empty",
		"the [build]: dielectric design: rule":               "the [build]: dielectric design: rule",
	} {
		if got := Strip(in); got != want {
			t.Errorf("Strip(%q) = %q, want %q", in, got, want)
		}
	}
}
