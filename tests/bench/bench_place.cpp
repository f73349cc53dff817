// The placement search on the demo station (issue 10): the default search (step 1 m, 12 azimuths,
// the doublet) under 5 s on a 2-core machine; and the map reuse against direct near-field
// evaluation of each candidate, side by side in the same run (target: ≥ 20× faster per candidate).
// Run: bench_place --benchmark_min_time=1   (figures in docs/performance.md, section "place")
#include <benchmark/benchmark.h>

#include <cmath>

#include "siting/place.hpp"
#include "assemble/placement.hpp"
#include "io/station_toml.hpp"

namespace {

constexpr double kPi = 3.14159265358979323846;

standoff::assemble::PlaceOptions demo_options(unsigned threads) {
  standoff::assemble::PlaceOptions o;
  o.step_m = 1.0;
  for (int k = 0; k < 12; ++k) o.azimuths_rad.push_back(k * kPi / 6.0);
  o.threads = threads;
  return o;
}

// Whole search: maps (MoM already solved per operation inside), every candidate, the ranking.
void BM_PlaceDemoDefault(benchmark::State& state) {
  const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
  const unsigned threads = static_cast<unsigned>(state.range(0));
  for (auto _ : state) {
    auto in = standoff::assemble::place_input(st, demo_options(threads));
    auto res = standoff::siting::place(in.setup);
    benchmark::DoNotOptimize(res);
    state.counters["placements"] = static_cast<double>(res.placements);
  }
}
BENCHMARK(BM_PlaceDemoDefault)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime()->UseRealTime()->Iterations(1)->Repetitions(2);

// Set-up alone: MoM solve of the doublet and its antenna-frame maps.
void BM_PlaceDemoSetup(benchmark::State& state) {
  const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
  for (auto _ : state) {
    auto in = standoff::assemble::place_input(st, demo_options(1));
    benchmark::DoNotOptimize(in);
  }
}
BENCHMARK(BM_PlaceDemoSetup)->Unit(benchmark::kMillisecond)->Iterations(1)->Repetitions(2);

// Per candidate, one thread: the same 16 placements read from the map, or evaluated directly
// (every zone cell's body line and the point of interest computed from the MoM currents).
void per_candidate(benchmark::State& state, standoff::siting::PlaceMode mode) {
  static const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
  static const auto in = standoff::assemble::place_input(st, demo_options(2));
  static const standoff::siting::PlaceEngine engine(in.setup);
  std::size_t n = 0;
  for (auto _ : state) {
    for (int k = 0; k < 16; ++k) {
      const double x = 15.5 + (k % 4) * 3.0, y = 30.5 + (k / 4) * 8.0, az = k * kPi / 8.0;
      auto c = engine.evaluate(x, y, az, 50.0, mode, false);
      benchmark::DoNotOptimize(c);
      ++n;
    }
  }
  state.counters["candidates_per_s"] = benchmark::Counter(static_cast<double>(n), benchmark::Counter::kIsRate);
}
void BM_CandidateFromMap(benchmark::State& state) { per_candidate(state, standoff::siting::PlaceMode::map); }
void BM_CandidateDirect(benchmark::State& state) { per_candidate(state, standoff::siting::PlaceMode::direct); }
BENCHMARK(BM_CandidateFromMap)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_CandidateDirect)->Unit(benchmark::kMillisecond)->Iterations(1);

}  // namespace

BENCHMARK_MAIN();
