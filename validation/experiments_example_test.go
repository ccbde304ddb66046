package validation_test

import (
	"fmt"

	"n2pulse/validation"
)

// The measured variations of the experiment cases, each with the model's curve over the same
// design key; WriteReport has one overlay figure drawn per variation.
func ExampleVariations() {
	vars, err := validation.Variations()
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, v := range vars {
		fmt.Printf("%s: %s, %d model points, %d measured\n", v.ID, v.Key, len(v.ModelX), len(v.MeasuredX))
	}
	// Output:
	// tea-blumlein-11mm-n2/oxygen: gas.oxygen, 5 model points, 2 measured
	// tea-transfer-88mm-v1/gap: channel.gap, 7 model points, 1 measured
	// tea-transfer-88mm-v1/oxygen: gas.oxygen, 5 model points, 2 measured
	// tea-transfer-88mm-v2/gap: channel.gap, 7 model points, 1 measured
}
