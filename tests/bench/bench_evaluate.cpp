// The whole demo evaluation (docs/examples/demo-station.toml): load, build the sources (MoM solves,
// power chains), evaluate every zone grid, point of interest and distance search. Target (issue 5):
// under 2 s and under 500 MB on a 2-core machine. Run: bench_evaluate --benchmark_min_time=1
// Peak memory: /usr/bin/time -v bench_evaluate (maximum resident set size).
#include <benchmark/benchmark.h>

#include "exposure/evaluate.hpp"
#include "station/sources.hpp"
#include "station/station_toml.hpp"

namespace {

void BM_DemoEvaluation(benchmark::State& state) {
  const unsigned threads = static_cast<unsigned>(state.range(0));
  for (auto _ : state) {
    const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
    const auto built = standoff::station::build(st);
    standoff::exposure::EvaluationOptions o;
    o.threads = threads;
    auto ev = standoff::exposure::evaluate(built.input, o);
    benchmark::DoNotOptimize(ev);
  }
}
BENCHMARK(BM_DemoEvaluation)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime();

// The sources alone (MoM solves, gains, power chains), to separate set-up from the grid work.
void BM_DemoBuild(benchmark::State& state) {
  const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
  for (auto _ : state) {
    auto built = standoff::station::build(st);
    benchmark::DoNotOptimize(built);
  }
}
BENCHMARK(BM_DemoBuild)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
