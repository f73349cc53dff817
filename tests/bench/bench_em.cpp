// Speed of the thin-wire MoM engine: matrix fill, fill + LU solve, and near-field evaluation
// (points × segments per second). Figures go to docs/performance.md; never a timed unit test.
#include <benchmark/benchmark.h>

#include <vector>

#include "em/builders.hpp"
#include "em/fields.hpp"
#include "em/solve.hpp"

namespace {

using namespace standoff;

constexpr double kF = 14.2e6;

// A horizontal dipole at 10 m over perfect ground with `segments` segments.
em::Model dipole_model(int segments) {
  em::Placement at;
  at.height_m = 10.0;
  em::Model m = em::dipole(kF, 10.3, at, {1e-3, constants::sigma_copper}, em::perfect_ground());
  m.wires[0].segments = segments;
  return m;
}

void BM_Fill(benchmark::State& state) {
  const em::Model m = dipole_model(static_cast<int>(state.range(0)));
  for (auto _ : state) benchmark::DoNotOptimize(em::assemble(m).z.data());
  state.counters["unknowns"] = static_cast<double>(state.range(0) - 1);
}
BENCHMARK(BM_Fill)->Arg(20)->Arg(80)->Arg(320)->Unit(benchmark::kMillisecond);

void BM_Solve(benchmark::State& state) {
  const em::Model m = dipole_model(static_cast<int>(state.range(0)));
  em::SolveOptions o;
  o.integrate_pattern = false;
  for (auto _ : state) benchmark::DoNotOptimize(em::solve(m, o).currents.data());
}
BENCHMARK(BM_Solve)->Arg(20)->Arg(80)->Arg(320)->Arg(1000)->Unit(benchmark::kMillisecond);

void BM_NearFields(benchmark::State& state) {
  const int segments = static_cast<int>(state.range(0));
  const auto sol = em::solve(dipole_model(segments));
  std::vector<Eigen::Vector3d> pts;
  for (int i = 0; i < 1000; ++i) pts.emplace_back(-20.0 + 0.04 * i, 3.0 + 0.01 * i, 1.5 + 0.001 * i);
  for (auto _ : state) benchmark::DoNotOptimize(em::near_fields(sol, pts, 100.0).data());
  // Each point sums the direct and image segments.
  state.counters["point_segments_per_s"] = benchmark::Counter(
      static_cast<double>(pts.size()) * 2 * segments, benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_NearFields)->Arg(20)->Arg(80)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
