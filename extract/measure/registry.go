package measure

import (
	"fmt"
	"strings"
)

// Scores holds every measure of one table, as computed by [Table.Scores].
type Scores struct {
	G2       float64 // log-likelihood G², see G2
	SignedG2 float64 // G² signed by attraction (+) or repulsion (−), see SignedG2
	PMI      float64 // pointwise mutual information in bits, see PMI
	T        float64 // t-score, see TScore
	Chi2     float64 // Pearson χ², see ChiSquare
	Dice     float64 // Dice coefficient, see Dice
	LogDice  float64 // logDice, see LogDice
	MI3      float64 // cubic association ratio, see MI3
}

// Scores computes all measures of the table at once, sharing the work they
// have in common. Each field equals what the function of the same name
// returns. It does not allocate.
func (t Table) Scores() Scores {
	if !t.Valid() {
		return Scores{}
	}
	d := t.excess()
	var s Scores
	s.G2 = g2(t, d)
	s.SignedG2 = s.G2
	if d < 0 {
		s.SignedG2 = -s.G2
	}
	s.T = tscore(t, d)
	s.Chi2 = chiSquare(t, d)
	s.Dice = dice(t)
	s.LogDice = logDice(t)
	s.PMI = pmi(t, 1)
	s.MI3 = pmi(t, 3)
	return s
}

// G2 returns [G2] of the table.
func (t Table) G2() float64 { return G2(t) }

// SignedG2 returns [SignedG2] of the table.
func (t Table) SignedG2() float64 { return SignedG2(t) }

// PMI returns [PMI] of the table.
func (t Table) PMI() float64 { return PMI(t) }

// TScore returns [TScore] of the table.
func (t Table) TScore() float64 { return TScore(t) }

// ChiSquare returns [ChiSquare] of the table.
func (t Table) ChiSquare() float64 { return ChiSquare(t) }

// Dice returns [Dice] of the table.
func (t Table) Dice() float64 { return Dice(t) }

// LogDice returns [LogDice] of the table.
func (t Table) LogDice() float64 { return LogDice(t) }

// MI3 returns [MI3] of the table.
func (t Table) MI3() float64 { return MI3(t) }

// Measure is a named association measure, as chosen on the command line.
type Measure struct {
	// Name is the short lower-case name used by flags, e.g. "logdice".
	Name string
	// Title is a human-readable name with its source, for help text.
	Title string
	// Score computes the measure; higher means more strongly associated.
	Score func(Table) float64
	// Field returns the same value from precomputed Scores.
	Field func(Scores) float64
}

// measures is the registry, in the order Names lists it.
var measures = []Measure{
	{"g2", "log-likelihood G² (Dunning 1993)", G2, func(s Scores) float64 { return s.G2 }},
	{"g2signed", "log-likelihood G², negative for repulsion (common practice)", SignedG2, func(s Scores) float64 { return s.SignedG2 }},
	{"pmi", "pointwise mutual information in bits (Church and Hanks 1990)", PMI, func(s Scores) float64 { return s.PMI }},
	{"t", "t-score (Church et al. 1991; Manning and Schütze 1999)", TScore, func(s Scores) float64 { return s.T }},
	{"chi2", "Pearson chi-square, 2×2 (Manning and Schütze 1999)", ChiSquare, func(s Scores) float64 { return s.Chi2 }},
	{"dice", "Dice coefficient (Dice 1945)", Dice, func(s Scores) float64 { return s.Dice }},
	{"logdice", "logDice (Rychlý 2008)", LogDice, func(s Scores) float64 { return s.LogDice }},
	{"mi3", "cubic association ratio MI³ (Daille 1994)", MI3, func(s Scores) float64 { return s.MI3 }},
}

// Names returns the registered measure names in a fixed order.
func Names() []string {
	names := make([]string, len(measures))
	for i, m := range measures {
		names[i] = m.Name
	}
	return names
}

// All returns the registered measures in the order of [Names].
func All() []Measure {
	return append([]Measure(nil), measures...)
}

// Lookup returns the measure with the given name (case-insensitive). The
// error lists the known names, ready to show to a user.
func Lookup(name string) (Measure, error) {
	key := strings.ToLower(strings.TrimSpace(name))
	for _, m := range measures {
		if m.Name == key {
			return m, nil
		}
	}
	return Measure{}, fmt.Errorf("unknown association measure %q (known: %s)", name, strings.Join(Names(), ", "))
}
