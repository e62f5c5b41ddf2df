package measure_test

import (
	"fmt"

	"glossmith/extract/measure"
)

// Scoring one bigram: "new companies" in the corpus of Manning and Schütze
// (1999), section 5.3.1 (t = 0.999932) and table 5.8 (χ² = 1.55).
func ExampleTable_Scores() {
	t := measure.Table{F12: 8, F1: 15828, F2: 4675, N: 14307668}
	s := t.Scores()
	fmt.Printf("t = %.6f\n", s.T)
	fmt.Printf("chi2 = %.2f\n", s.Chi2)
	fmt.Printf("G2 = %.2f\n", s.G2)
	// Output:
	// t = 0.999932
	// chi2 = 1.55
	// G2 = 1.33
}

// Choosing a measure by the name given on the command line.
func ExampleLookup() {
	m, err := measure.Lookup("logdice")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %.1f\n", m.Name, m.Score(measure.Table{F12: 10, F1: 20, F2: 20, N: 100}))
	_, err = measure.Lookup("cosine")
	fmt.Println(err)
	// Output:
	// logdice: 13.0
	// unknown association measure "cosine" (known: g2, g2signed, pmi, t, chi2, dice, logdice, mi3)
}
