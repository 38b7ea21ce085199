package plan

// BenchPlan is walkBenchPlan for the external tests' benchmarks.
const BenchPlan = walkBenchPlan
