// Speed of the thin-wire MoM engine: matrix fill, LU solve (Eigen's PartialPivLU, as em::solve
// uses), the machine's complex matrix-product rate (Eigen GEMM) for reference, and near-field
// evaluation (points × segments per second), each at three or more sizes so that
// docs/performance.md can state measured cost exponents. Never a timed unit test.
// Run: bench_em --benchmark_repetitions=5 --benchmark_report_aggregates_only=true
#include <benchmark/benchmark.h>

#include <vector>

#include <Eigen/Dense>

#include "core/parallel.hpp"
#include "em/builders.hpp"
#include "em/fields.hpp"
#include "em/near_field.hpp"
#include "em/solve.hpp"

namespace {

using namespace standoff;

constexpr double kF = 14.2e6;

// A horizontal dipole at 10 m over perfect ground with `segments` segments (segments − 1 unknowns).
em::Model dipole_model(int segments) {
  em::Placement at;
  at.height_m = 10.0;
  em::Model m = em::dipole(kF, 10.3, at, {1e-3, constants::sigma_copper}, em::perfect_ground());
  m.wires[0].segments = segments;
  return m;
}

// Impedance matrix only. Counter: matrix entries per second.
void BM_Fill(benchmark::State& state) {
  const em::Model m = dipole_model(static_cast<int>(state.range(0)));
  for (auto _ : state) benchmark::DoNotOptimize(em::assemble(m).z.data());
  const double n = static_cast<double>(state.range(0) - 1);
  state.counters["unknowns"] = n;
  state.counters["entries_per_s"] = benchmark::Counter(n * n, benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_Fill)->Arg(251)->Arg(501)->Arg(1001)->Unit(benchmark::kMillisecond);

// LU factorisation and solve of the dipole's own matrix, as em::solve does it. Counter: GFLOP/s at
// (8/3)N³ real flops (complex LU: (2/3)N³ complex multiply-adds).
void BM_LU(benchmark::State& state) {
  const Eigen::MatrixXcd z = em::assemble(dipole_model(static_cast<int>(state.range(0)))).z;
  const Eigen::VectorXcd v = Eigen::VectorXcd::Ones(z.rows());
  for (auto _ : state) {
    Eigen::PartialPivLU<Eigen::MatrixXcd> lu(z);
    Eigen::VectorXcd x = lu.solve(v);
    benchmark::DoNotOptimize(x.data());
  }
  const double n = static_cast<double>(z.rows());
  state.counters["unknowns"] = n;
  state.counters["GFLOPs"] =
      benchmark::Counter(8.0 / 3.0 * n * n * n * 1e-9, benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_LU)->Arg(251)->Arg(501)->Arg(1001)->Unit(benchmark::kMillisecond);

// Reference rate of the machine for this build: a complex matrix product (Eigen's blocked GEMM,
// 8N³ real flops), one thread (Eigen is not built with OpenMP here).
void BM_ComplexGemm(benchmark::State& state) {
  const auto n = static_cast<Eigen::Index>(state.range(0));
  const Eigen::MatrixXcd a = Eigen::MatrixXcd::Random(n, n), b = Eigen::MatrixXcd::Random(n, n);
  Eigen::MatrixXcd c(n, n);
  for (auto _ : state) {
    c.noalias() = a * b;
    benchmark::DoNotOptimize(c.data());
  }
  const double nn = static_cast<double>(n);
  state.counters["GFLOPs"] = benchmark::Counter(8.0 * nn * nn * nn * 1e-9, benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_ComplexGemm)->Arg(1000)->Unit(benchmark::kMillisecond);

// Fill + LU + feed results (no pattern integral).
void BM_Solve(benchmark::State& state) {
  const em::Model m = dipole_model(static_cast<int>(state.range(0)));
  em::SolveOptions o;
  o.integrate_pattern = false;
  for (auto _ : state) benchmark::DoNotOptimize(em::solve(m, o).currents.data());
}
BENCHMARK(BM_Solve)->Arg(251)->Arg(501)->Arg(1001)->Unit(benchmark::kMillisecond);

// Observation points on a horizontal sheet 7.5–8.5 m below the dipole (every segment far from
// every point: the 2-point rule), or within 0.3–1.5 m of the wire (`close`: 4-point and graded
// rules for the nearest segments).
std::vector<Eigen::Vector3d> sheet(int n, bool close) {
  std::vector<Eigen::Vector3d> pts;
  for (int i = 0; i < n; ++i) {
    const double u = static_cast<double>(i) / n;
    if (close) pts.emplace_back(-5.0 + 10.0 * u, 0.3 + 1.2 * u, 10.0 - 0.5 + u);
    else pts.emplace_back(-20.0 + 40.0 * u, 3.0 + 10.0 * u, 1.5 + u);
  }
  return pts;
}

// range(0) = points, range(1) = segments of the dipole (the evaluator sums direct + image
// segments), range(2) = threads, range(3) = 1 for the close sheet. Counter: point·segment
// interactions per second (wall clock: UseRealTime).
void BM_NearFields(benchmark::State& state) {
  const int npts = static_cast<int>(state.range(0)), segments = static_cast<int>(state.range(1));
  const unsigned threads = static_cast<unsigned>(state.range(2));
  const em::NearFieldEvaluator nf(em::solve(dipole_model(segments)));
  const std::vector<Eigen::Vector3d> pts = sheet(npts, state.range(3) != 0);
  std::vector<em::FieldPoint> out(pts.size());
  for (auto _ : state) {
    parallel::for_chunks(
        pts.size(), 256,
        [&](std::size_t b, std::size_t e) {
          nf.evaluate(std::span<const Eigen::Vector3d>(pts).subspan(b, e - b), 100.0,
                      std::span<em::FieldPoint>(out).subspan(b, e - b));
        },
        threads);
    benchmark::DoNotOptimize(out.data());
  }
  state.counters["point_segments_per_s"] = benchmark::Counter(
      static_cast<double>(pts.size()) * static_cast<double>(nf.segment_count()), benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_NearFields)
    ->ArgNames({"points", "segments", "threads", "close"})
    // Cost growth with segments (1000 points) and with points (80 segments), one thread.
    ->Args({1000, 20, 1, 0})->Args({1000, 80, 1, 0})->Args({1000, 320, 1, 0})
    ->Args({250, 80, 1, 0})->Args({4000, 80, 1, 0})
    // Two threads, and points close to the wire.
    ->Args({4000, 80, 2, 0})->Args({4000, 80, 1, 1})->Args({4000, 80, 2, 1})
    ->Unit(benchmark::kMillisecond)->UseRealTime();

}  // namespace

BENCHMARK_MAIN();
