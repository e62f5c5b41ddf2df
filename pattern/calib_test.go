package pattern

import "testing"

func BenchmarkCalib(b *testing.B) {
	corpus := syntheticCorpus(2000)
	ntok := 0
	for _, s := range corpus {
		ntok += len(s)
	}
	b.ResetTimer()
	x := 0
	for i := 0; i < b.N; i++ {
		for _, s := range corpus {
			for k := range s {
				x += len(s[k].UPOS) + int(s[k].Form[0])
			}
		}
	}
	b.ReportMetric(float64(ntok)*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
	b.ReportMetric(float64(ntok), "ntok")
	_ = x
}
