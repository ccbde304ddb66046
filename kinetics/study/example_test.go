package study_test

import (
	"context"
	"fmt"
	"math"
	"os"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
)

// An axis is written as on the command line; the ends take any unit of the key.
func ExampleParseAxis() {
	a, err := study.ParseAxis("gas.pressure=20Torr:760Torr:3:log", design.ExampleDesign())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(a.Header())
	for _, v := range a.Values() {
		fmt.Printf("%.1f Pa\n", v)
	}
	// Output:
	// gas.pressure [Pa]
	// 2666.4 Pa
	// 16437.1 Pa
	// 101325.0 Pa
}

// A sweep with a runner of one's own (here a toy formula standing in for the model): rows come
// back in point order, a failing point keeps its row with the reason in the status column.
func ExampleSweep() {
	d := design.ExampleDesign()
	v, _ := study.ParseAxis("circuit.charge_voltage=10kV:20kV:3", d)
	dir, _ := os.MkdirTemp("", "sweep-example-")
	defer os.RemoveAll(dir)
	s := &study.Sweep{Design: d, Axes: []study.Axis{v}, Dir: dir,
		Runner: func(d *design.Design) (kinetics.Summary, error) {
			if d.Circuit.ChargeVoltage > 18e3 {
				return kinetics.Summary{}, fmt.Errorf("toy: above 18 kV")
			}
			return kinetics.Summary{EnergyTotal: d.Circuit.ChargeVoltage / 1e8}, nil
		}}
	t, err := s.Run(context.Background())
	if err != nil {
		fmt.Println(err)
		return
	}
	v0, e, st := t.Column("circuit.charge_voltage [V]"), t.Column("energy_total_J"), t.Column("status")
	for _, r := range t.Rows {
		fmt.Println(r[v0], r[e], r[st])
	}
	// Output:
	// 10000 0.0001 ok
	// 15000 0.00015 ok
	// 20000  failed: toy: above 18 kV
}

// The useful length of a saturating energy curve: 90 % of the plateau.
func ExampleUsefulLength() {
	var L, E []float64
	for l := 0.05; l <= 1.0001; l += 0.05 {
		L = append(L, l)
		E = append(E, 1-math.Exp(-l/0.1))
	}
	u, rule := study.UsefulLength(L, E)
	fmt.Printf("%.3f m: %s\n", u, rule)
	// Output:
	// 0.233 m: shortest length reaching 90 % of the largest output-end energy of the scan
}

// Inside a Slurm job array the shard comes from the task variables.
func ExampleShardFromSlurm() {
	env := map[string]string{"SLURM_ARRAY_TASK_ID": "3", "SLURM_ARRAY_TASK_COUNT": "4"}
	s, ok, err := study.ShardFromSlurm(func(k string) string { return env[k] })
	fmt.Println(s, ok, err, s.Owns(2), s.Owns(3))
	// Output:
	// 3/4 true <nil> true false
}
