// The whole demo evaluation (docs/examples/demo-station.toml): load, build the sources (MoM solves,
// peak gains, power chains), evaluate every zone grid, point of interest and distance search.
// Targets (issue 11): under 0.5 s wall with 2 threads on a 2-core machine and at least 1.7× faster
// with 2 threads than with 1 (BM_DemoEvaluation/threads:1 and /threads:2 side by side in one run).
// Run: bench_evaluate --benchmark_repetitions=5 --benchmark_report_aggregates_only=true
// Peak memory: /usr/bin/time -v bench_evaluate (maximum resident set size).
#include <benchmark/benchmark.h>

#include <memory>

#include "core/parallel.hpp"
#include "em/builders.hpp"
#include "em/near_field.hpp"
#include "exposure/evaluate.hpp"
#include "io/limits_toml.hpp"
#include "assemble/sources.hpp"
#include "io/station_toml.hpp"

namespace {

// range(0) = threads, range(1) = grid spacing in cm (50 = the CLI's default 0.5 m).
void BM_DemoEvaluation(benchmark::State& state) {
  const unsigned threads = static_cast<unsigned>(state.range(0));
  standoff::parallel::set_default_threads(threads);  // the MoM set-up too, as `--threads`
  std::size_t points = 0;
  for (auto _ : state) {
    const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
    const auto built = standoff::assemble::build(st);
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
    ->Args({1, 100})->Args({1, 25})  // three grid sizes (with {1, 50}) for the cost growth
    ->Unit(benchmark::kMillisecond)->UseRealTime();

// The sources alone (MoM solves, gains, power chains), to separate set-up from the grid work.
void BM_DemoBuild(benchmark::State& state) {
  standoff::parallel::set_default_threads(static_cast<unsigned>(state.range(0)));
  const auto st = standoff::station::load_station(standoff::station::demo_station_text(), "demo-station.toml");
  for (auto _ : state) {
    auto built = standoff::assemble::build(st);
    benchmark::DoNotOptimize(built);
  }
  standoff::parallel::set_default_threads(0);
}
BENCHMARK(BM_DemoBuild)->ArgName("threads")->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime();

// A large zone (issue 14: "a realistic 1 km² zone in seconds and under 500 MB"): a 14.2 MHz dipole at
// 10 m over average ground, 400 W, in the middle of a square zone of side range(0) m, 0.5 m grid,
// 2 threads. Peak memory: /usr/bin/time -v bench_evaluate --benchmark_filter=LargeZone/1000.
void BM_LargeZone(benchmark::State& state) {
  namespace ex = standoff::exposure;
  namespace lim = standoff::limits;
  const double side = static_cast<double>(state.range(0)), f = 14.2e6, p = 400.0;
  standoff::em::Placement at{0.0, 0.0, 10.0, standoff::constants::pi / 2};
  const auto sol = standoff::em::solve(standoff::em::dipole(f, 10.1, at, standoff::em::Conductor{1e-3},
                                                            standoff::em::real_ground(15.0, 0.005, "average")));
  auto nf = std::make_shared<const standoff::em::NearFieldEvaluator>(sol);
  ex::EvaluationInput in;
  ex::SourceInput src;
  src.name = "dipole";
  src.frequency_hz = f;
  src.pep_w = src.average_power_w = p;
  src.method = "detailed (MoM)";
  for (const auto& w : sol.model.wires) src.footprint.push_back({{w.a.x(), w.a.y()}, {w.b.x(), w.b.y()}});
  src.field = [nf, p](std::span<const Eigen::Vector3d> pts) { return nf->evaluate(pts, p); };
  in.sources = {src};
  const auto& t = lim::builtin_limit_table_ref(lim::Standard::fcc);
  ex::SourceLimits l;
  l.controlled = lim::lookup(t, lim::Tier::controlled, standoff::units::hertz(f));
  l.uncontrolled = lim::lookup(t, lim::Tier::uncontrolled, standoff::units::hertz(f));
  in.limits = {l};
  ex::ZoneInput z;
  z.name = "zone";
  z.tier = lim::Tier::uncontrolled;
  z.polygon = {{-side / 2, -side / 2}, {side / 2, -side / 2}, {side / 2, side / 2}, {-side / 2, side / 2}};
  in.zones = {z};
  ex::EvaluationOptions o;
  o.threads = 2;
  for (auto _ : state) {
    auto ev = ex::evaluate(in, o);
    benchmark::DoNotOptimize(ev);
  }
  state.counters["cells"] = side * side / 0.25;
}
BENCHMARK(BM_LargeZone)->ArgName("side_m")->Arg(100)->Arg(300)->Arg(1000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);

}  // namespace

BENCHMARK_MAIN();
