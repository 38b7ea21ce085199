package engine

import "testing"

// BenchmarkCompile40YearsMonthly compiles the shape of a 40-year plan with
// monthly compounding and a monthly deposit: the cold part of a projection.
func BenchmarkCompile40YearsMonthly(b *testing.B) {
	sh := Shape{Months: 480, PerYear: 12, StepFrom: []int32{0}, Streams: []StreamShape{{PerYear: 12, First: 1}}}
	b.ReportAllocs()
	for b.Loop() {
		Compile(&sh)
	}
}
