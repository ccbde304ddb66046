package swarm

import (
	"math"
	"strings"
	"testing"

	"n2pulse/units"
)

// TestPowerSplitSumsToFieldPower: the channels of the power split add up to the power the
// electrons take from the field, within the solver's own power balance (1e-3, TestBalances)
// where ionisation outpaces attachment, and every channel that the gas has is positive. In
// air at 30 Td attachment outpaces ionisation: the negative growth term is left out, so the
// sum may exceed the field power by that term and no more (a conservation test).
func TestPowerSplitSumsToFieldPower(t *testing.T) {
	t.Parallel()
	for _, x := range []struct{ n, o float64 }{{1, 0}, {AirNitrogen, AirOxygen}} {
		mix, _ := SetMixture(SetOriginal, x.n, x.o, 0)
		s, err := NewSolver(mix, nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, td := range []float64{30, 100, 300, 1000} {
			r, err := s.Solve(td * units.Townsend)
			if err != nil {
				t.Fatal(err)
			}
			sum := 0.0
			for _, p := range r.Power {
				sum += p
			}
			allowed := 1e-3*r.PowerField + max(-r.PowerGrowth, 0)
			if d := math.Abs(sum - r.PowerField); d > allowed {
				t.Errorf("N2 %g, %g Td: split sums to %.6g, field power %.6g (allowed ±%.3g)", x.n, td, sum, r.PowerField, allowed)
			}
			for _, c := range []Channel{ChannelElastic, ChannelVibrational, ChannelB, ChannelW, ChannelBPrime, ChannelC} {
				if !(r.Power[c] > 0) {
					t.Errorf("N2 %g, %g Td: channel %s has power %g, want > 0", x.n, td, c, r.Power[c])
				}
			}
			if x.o > 0 && td <= 100 && !(r.Power[ChannelAttachment] > 0) {
				t.Errorf("air, %g Td: no power in attachment", td)
			}
			// The W and B′ rates of the power split are the rates of the table: power = k·x·threshold.
			kW, _ := r.RateOf("N2", "W")
			if d := math.Abs(kW - r.ExciteW); d > 1e-12*kW {
				t.Errorf("N2 %g, %g Td: ExciteW %g, rate of W %g", x.n, td, r.ExciteW, kW)
			}
		}
	}
}

// TestChannelOf sorts processes by kind, label and species.
func TestChannelOf(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		species, label string
		kind           Kind
		want           Channel
	}{
		{"N2", "", Elastic, ChannelElastic},
		{"N2", "vib3", Excitation, ChannelVibrational},
		{"O2", "vib", Excitation, ChannelVibrational},
		{"N2", "Bp", Excitation, ChannelBPrime},
		{"N2", "W", Excitation, ChannelW},
		{"N2", "C", Excitation, ChannelC},
		{"O2", "a", Excitation, ChannelOtherElectronic},
		{"O2", "B", Excitation, ChannelOtherElectronic}, // only N₂ states have channels of their own
		{"N2", "diss", Excitation, ChannelOtherElectronic},
		{"He", "ion", Ionisation, ChannelIonisation},
		{"O2", "att", Attachment, ChannelAttachment},
	} {
		if got := channelOf(c.species, c.kind, c.label); got != c.want {
			t.Errorf("%s %s %v: channel %s, want %s", c.species, c.label, c.kind, got, c.want)
		}
	}
}

// TestOptionalColumns: a table without the optional columns reads with no power split; one
// with a negative optional value is refused, naming the column.
func TestOptionalColumns(t *testing.T) {
	t.Parallel()
	head := strings.Join(Columns, ",")
	rows := "10,1,2e4,0,0,0,0,0,0,0\n20,1,3e4,0,0,0,0,0,0,0\n"
	tb, err := ReadCSV(strings.NewReader(head+"\n"+rows), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	if r := tb.Rows()[0]; r.HasPowerSplit() || r.ExciteW != 0 {
		t.Errorf("table without optional columns: power split %v, k_W %g", r.Power, r.ExciteW)
	}
	in := head + ",power_C_eV_m3_s\n10,1,2e4,0,0,0,0,0,0,0,2e-17\n20,1,3e4,0,0,0,0,0,0,0,-1\n"
	if _, err := ReadCSV(strings.NewReader(in), "t.csv"); err == nil || !strings.Contains(err.Error(), "t.csv:3: power_C_eV_m3_s: -1 is negative") {
		t.Errorf("negative power column: error %v", err)
	}
	tb, err = ReadCSV(strings.NewReader(head+",power_C_eV_m3_s\n10,1,2e4,0,0,0,0,0,0,0,2e-17\n20,1,3e4,0,0,0,0,0,0,0,4e-17\n"), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	if got := tb.Rows()[1].Power[ChannelC]; math.Abs(got-4e-17*units.ElectronVolt) > 1e-12*got {
		t.Errorf("power_C read as %g J m³/s, want %g", got, 4e-17*units.ElectronVolt)
	}
}
