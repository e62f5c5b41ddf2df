package termstat_test

import (
	"fmt"
	"strings"

	"glossmith/extract/termstat"
)

func ExampleCValue() {
	cands := []termstat.Candidate{
		{Words: strings.Fields("drip control valve"), Freq: 6},
		{Words: strings.Fields("control valve"), Freq: 20},
		{Words: strings.Fields("irrigation zone"), Freq: 9},
	}
	res, err := termstat.CValue(cands, termstat.CValueOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, r := range res {
		fmt.Printf("%-20s %6.2f nested in %d\n", strings.Join(cands[i].Words, " "), r.Score, r.Containers)
	}
	// Output:
	// drip control valve     9.51 nested in 0
	// control valve         14.00 nested in 1
	// irrigation zone        9.00 nested in 0
}

func ExampleContrast_LL() {
	// "setpoint" in a 10,000-token controller manual against a
	// 20,000-token general reference corpus. By hand: LL = 100 ln 2; G² adds
	// 2(9900 ln(9900/9950) + 19950 ln(19950/19900)) = 0.377 for the other
	// words; weirdness = (100/10000)·(20001/51) = 3.92.
	k := termstat.Contrast{Study: 100, Reference: 50, StudySize: 10000, ReferenceSize: 20000}
	fmt.Printf("LL %.2f, G2 %.2f, weirdness %.2f\n", k.LL(), k.G2(), k.Weirdness())
	// Output:
	// LL 69.31, G2 69.69, weirdness 3.92
}

func ExampleParts_DP() {
	p, err := termstat.NewParts([]float64{9, 10, 10, 10, 11})
	if err != nil {
		fmt.Println(err)
		return
	}
	dp, _ := p.DP([]float64{1, 2, 3, 4, 5})
	norm, _ := p.DPNorm([]float64{1, 2, 3, 4, 5})
	fmt.Printf("DP %.4f, DPnorm %.4f\n", dp, norm)
	// Output:
	// DP 0.1800, DPnorm 0.2195
}
