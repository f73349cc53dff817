// The whole demo evaluation (docs/examples/demo-station.toml): load, build the sources (MoM solves,
// peak gains, power chains), evaluate every zone grid, point of interest and distance search.
// Targets (issue 11): under 0.5 s wall with 2 threads on a 2-core machine and at least 1.7× faster
// with 2 threads than with 1 (BM_DemoEvaluation/threads:1 and /threads:2 side by side in one run).
// Run: bench_evaluate --benchmark_repetitions=5 --benchmark_report_aggregates_only=true
// Peak memory: /usr/bin/time -v bench_evaluate (maximum resident set size).
#include <benchmark/benchmark.h>

#include "core/parallel.hpp"
#include "exposure/evaluate.hpp"
#include "station/sources.hpp"
#include "station/station_toml.hpp"

namespace {

// range(0) = threads, range(1) = grid spacing in cm (50 = the CLI's default 0.5 m).
void BM_DemoEvaluation(benchmark::State& state) {
  const unsigned threads = static_cast<unsigned>(state.range(0));
  standoff::parallel::set_default_threads(threads);  // the MoM set-up too, as `--threads`
  std::size_t points = 0;
  for (auto _ : state) {
    const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
    const auto built = standoff::station::build(st);
    standoff::exposure::EvaluationOptions o;
    o.threads = threads;
    o.grid_spacing_m = static_cast<double>(state.range(1)) / 100.0;
    auto ev = standoff::exposure::evaluate(built.input, o);
    points = 0;
    for (const auto& g : ev.grids) points += static_cast<std::size_t>(g.nx) * static_cast<std::size_t>(g.ny);
    benchmark::DoNotOptimize(ev);
  }
  standoff::parallel::set_default_threads(0);
  state.counters["cells"] = static_cast<double>(points);
}
BENCHMARK(BM_DemoEvaluation)
    ->ArgNames({"threads", "grid_cm"})
    ->Args({1, 50})->Args({2, 50})  // the demo as run: the 1-vs-2-thread ratio
    ->Args({2, 100})->Args({2, 25})  // three grid sizes (with {2, 50}) for the cost growth
    ->Unit(benchmark::kMillisecond)->UseRealTime();

// The sources alone (MoM solves, gains, power chains), to separate set-up from the grid work.
void BM_DemoBuild(benchmark::State& state) {
  standoff::parallel::set_default_threads(static_cast<unsigned>(state.range(0)));
  const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
  for (auto _ : state) {
    auto built = standoff::station::build(st);
    benchmark::DoNotOptimize(built);
  }
  standoff::parallel::set_default_threads(0);
}
BENCHMARK(BM_DemoBuild)->ArgName("threads")->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime();

}  // namespace

BENCHMARK_MAIN();
