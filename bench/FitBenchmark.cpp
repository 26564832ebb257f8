// Speed of the fit engine: one point added to the live fit at several sizes; fitReadings (the
// batch fit the CLI, the window and the report call: line, residuals, studentized residuals,
// outlier screen, curvature) at 1e3/1e5/1e6 readings, also with every buffer on new pages;
// the bare line fitLine; GSL's gsl_fit_linear; a bandwidth floor that only sums x and y with
// four accumulators each; a floor for the fit's outputs (outputsFloor); York at 1 000 and
// 100 000 points.
// Run each case in its own process (glibc's mmap threshold moves after large frees, which
// changed york/100000 5x with what ran before it):
//   cmake --preset release && cmake --build --preset release --target FitBenchmark &&
//   bench/run-separately.sh build/release/bench/FitBenchmark
#include "FitSummary.h"
#include "LineFit.h"
#include "SupplyReferral.h"
#if SAGLINE_HAVE_LARGE_PAGE_HEAP
#include "LargePageHeap.h"
#endif
#include "YorkFit.h"

#include <benchmark/benchmark.h>

#include <algorithm>
#include <cmath>
#include <malloc.h>
#include <random>
#include <vector>

#if SAGLINE_HAVE_GSL
#include <gsl/gsl_fit.h>
#endif

using namespace sagline;

namespace {

// A made-up sweep: V = 26.4 - 1.9 I with 10 mV noise, I uniform in [0, 2.1] A.
struct Data {
    std::vector<double> x, y, sx, sy;
};

const Data &data(std::size_t n)
{
    static std::vector<std::pair<std::size_t, Data>> cache;
    for (const auto &[size, d] : cache)
        if (size == n)
            return d;
    Data d;
    std::mt19937_64 random(42);
    std::uniform_real_distribution<double> current(0.0, 2.1);
    std::normal_distribution<double> noise(0.0, 0.01);
    for (std::size_t i = 0; i < n; ++i) {
        const double x = current(random);
        d.x.push_back(x + 0.001 * noise(random));
        d.y.push_back(26.4 - 1.9 * x + noise(random));
        d.sx.push_back(0.001);
        d.sy.push_back(0.01);
    }
    cache.emplace_back(n, std::move(d));
    return cache.back().second;
}

// A live fit holding the first n points of `d`.
LineFit liveFitOf(const Data &d, std::size_t n)
{
    LineFit fit;
    for (std::size_t i = 0; i < n; ++i)
        fit.add(d.x[i], d.y[i]);
    return fit;
}

// Adding one point to a live fit that already holds n points (n grows by the iteration count;
// the cost does not depend on it).
void liveAdd(benchmark::State &state)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    const Data &d = data(n + 4096);
    LineFit fit = liveFitOf(d, n);
    std::size_t k = 0;
    for (auto _ : state) {
        fit.add(d.x[n + (k & 4095)], d.y[n + (k & 4095)]);
        ++k;
        benchmark::DoNotOptimize(fit);
    }
    state.counters["n"] = static_cast<double>(n);
}
BENCHMARK(liveAdd)->Arg(10)->Arg(1000)->Arg(100000);

// Adding then removing one point: n stays constant; both directions are O(1).
void liveAddRemove(benchmark::State &state)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    const Data &d = data(n + 4096);
    LineFit fit = liveFitOf(d, n);
    std::size_t k = 0;
    for (auto _ : state) {
        const std::size_t j = n + (k++ & 4095);
        fit.add(d.x[j], d.y[j]);
        fit.remove(d.x[j], d.y[j]);
        benchmark::DoNotOptimize(fit);
    }
}
BENCHMARK(liveAddRemove)->Arg(10)->Arg(1000)->Arg(100000);

// The full statistics of the live fit (slope, SEs, R², residual SD): O(1).
void liveResult(benchmark::State &state)
{
    const Data &d = data(1000);
    LineFit fit = liveFitOf(d, 1000);
    for (auto _ : state)
        benchmark::DoNotOptimize(fit.result());
}
BENCHMARK(liveResult);

constexpr std::int64_t million = 1000000;

void batchOls(benchmark::State &state)
{
    const Data &d = data(static_cast<std::size_t>(state.range(0)));
    for (auto _ : state)
        benchmark::DoNotOptimize(fitLine(d.x, d.y));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(batchOls)->Arg(million)->Unit(benchmark::kMillisecond);

#if SAGLINE_HAVE_GSL
void gslFitLinear(benchmark::State &state)
{
    const Data &d = data(static_cast<std::size_t>(state.range(0)));
    for (auto _ : state) {
        double c0, c1, cov00, cov01, cov11, sumsq;
        gsl_fit_linear(d.x.data(), 1, d.y.data(), 1, d.x.size(), &c0, &c1, &cov00, &cov01, &cov11, &sumsq);
        benchmark::DoNotOptimize(c1);
        benchmark::DoNotOptimize(sumsq);
    }
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(gslFitLinear)->Arg(million)->Unit(benchmark::kMillisecond);
#endif

// The floor: one pass that only sums x and y, four independent accumulators per array so the
// loop waits on memory, not on the latency of one chain of additions.
void sumFloor(benchmark::State &state)
{
    const Data &d = data(static_cast<std::size_t>(state.range(0)));
    const std::size_t n = d.x.size();
    for (auto _ : state) {
        double sx[4] = {0.0, 0.0, 0.0, 0.0}, sy[4] = {0.0, 0.0, 0.0, 0.0};
        std::size_t i = 0;
        for (; i + 4 <= n; i += 4)
            for (std::size_t k = 0; k < 4; ++k) {
                sx[k] += d.x[i + k];
                sy[k] += d.y[i + k];
            }
        for (; i < n; ++i) {
            sx[0] += d.x[i];
            sy[0] += d.y[i];
        }
        benchmark::DoNotOptimize(sx[0] + sx[1] + sx[2] + sx[3]);
        benchmark::DoNotOptimize(sy[0] + sy[1] + sy[2] + sy[3]);
    }
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(sumFloor)->Arg(million)->Unit(benchmark::kMillisecond);

// A floor for what fitReadings must produce, not only sum: the line (means, then centred sums),
// the curvature check's moments, every residual and every externally studentized residual,
// written out, with every freedom the product does not take (four accumulators, sums in any
// order, one division and one square root per point, the curvature moments in the line's pass,
// the screen's largest |t| in the studentized pass). Its numbers are not the product's (sums in
// another order): it is a lower bound to compare fitColumnsProductHeap with, and shows how far
// above sumFloor any fit with these outputs must stay. Own process (bench/run-separately.sh).
void outputsFloor(benchmark::State &state)
{
#if SAGLINE_HAVE_LARGE_PAGE_HEAP
    adviseLargePagesForHeap();
#endif
    const Data &d = data(static_cast<std::size_t>(state.range(0)));
    const std::size_t n = d.x.size();
    const double *x = d.x.data(), *y = d.y.data();
    std::vector<double> e(n), t(n);
    constexpr std::size_t lanes = 4;
    if (n % lanes != 0) { // the passes after the first have no tail loop
        state.SkipWithError("outputsFloor needs a multiple of 4 points");
        return;
    }
    for (auto _ : state) {
        double sx[lanes] = {}, sy[lanes] = {};
        std::size_t i = 0;
        for (; i + lanes <= n; i += lanes)
            for (std::size_t k = 0; k < lanes; ++k) {
                sx[k] += x[i + k];
                sy[k] += y[i + k];
            }
        for (; i < n; ++i) {
            sx[0] += x[i];
            sy[0] += y[i];
        }
        const double meanX = (sx[0] + sx[1] + sx[2] + sx[3]) / static_cast<double>(n);
        const double meanY = (sy[0] + sy[1] + sy[2] + sy[3]) / static_cast<double>(n);
        // Centred sums of the line and the quadratic's moments Σd³, Σd⁴, Σd²·dy, in one pass.
        double sxx[lanes] = {}, sxy[lanes] = {}, syy[lanes] = {}, s3[lanes] = {}, s4[lanes] = {}, m2[lanes] = {};
        for (i = 0; i + lanes <= n; i += lanes)
            for (std::size_t k = 0; k < lanes; ++k) {
                const double dx = x[i + k] - meanX, dy = y[i + k] - meanY, dx2 = dx * dx;
                sxx[k] += dx2;
                sxy[k] += dx * dy;
                syy[k] += dy * dy;
                s3[k] += dx2 * dx;
                s4[k] += dx2 * dx2;
                m2[k] += dx2 * dy;
            }
        const double Sxx = sxx[0] + sxx[1] + sxx[2] + sxx[3];
        const double slope = (sxy[0] + sxy[1] + sxy[2] + sxy[3]) / Sxx;
        const double intercept = meanY - slope * meanX;
        benchmark::DoNotOptimize(syy[0] + s3[0] + s4[0] + m2[0] + syy[1] + s3[1] + s4[1] + m2[1]);
        // Residuals, written, and their sum of squares.
        double ssr[lanes] = {};
        for (i = 0; i + lanes <= n; i += lanes)
            for (std::size_t k = 0; k < lanes; ++k) {
                const double r = y[i + k] - intercept - slope * x[i + k];
                e[i + k] = r;
                ssr[k] += r * r;
            }
        const double SSR = ssr[0] + ssr[1] + ssr[2] + ssr[3];
        // Externally studentized residuals, written, and the largest |t| for the screen.
        const double perN = 1.0 / static_cast<double>(n), perSxx = 1.0 / Sxx;
        const double perDof = 1.0 / (static_cast<double>(n) - 3.0);
        double largest[lanes] = {};
        for (i = 0; i + lanes <= n; i += lanes)
            for (std::size_t k = 0; k < lanes; ++k) {
                const double dx = x[i + k] - meanX, r = e[i + k];
                const double h = perN + dx * dx * perSxx, keep = 1.0 - h;
                const double without = (SSR * keep - r * r) * perDof; // s²(i)·(1 - h)
                const double ti = r / std::sqrt(without > 0.0 ? without : 0.0);
                t[i + k] = ti;
                largest[k] = std::max(largest[k], std::fabs(ti));
            }
        benchmark::DoNotOptimize(largest[0] + largest[1] + largest[2] + largest[3]);
        benchmark::DoNotOptimize(e.data());
        benchmark::DoNotOptimize(t.data());
        benchmark::ClobberMemory();
    }
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(outputsFloor)->Arg(million)->Unit(benchmark::kMillisecond);

void york(benchmark::State &state)
{
    const Data &d = data(static_cast<std::size_t>(state.range(0)));
    int iterations = 0;
    for (auto _ : state) {
        const YorkFitResult r = yorkFit(d.x, d.y, d.sx, d.sy);
        iterations = r.iterations;
        benchmark::DoNotOptimize(r.slope);
    }
    state.counters["iterations"] = iterations;
}
BENCHMARK(york)->Arg(1000)->Arg(100000)->Unit(benchmark::kMillisecond);

std::vector<Reading> readingsOf(const Data &d)
{
    std::vector<Reading> readings(d.x.size());
    for (std::size_t i = 0; i < d.x.size(); ++i) {
        readings[i].currentA = d.x[i];
        readings[i].voltageV = d.y[i];
    }
    return readings;
}

// fitReadings as the product calls it (OLS: line, residuals, studentized residuals, the outlier
// screen and the curvature check), its buffers reused from the iteration before.
void fitReadingsOls(benchmark::State &state)
{
    const std::vector<Reading> readings = readingsOf(data(static_cast<std::size_t>(state.range(0))));
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(readings, FitMethod::Ols));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(fitReadingsOls)->Arg(20)->Arg(1000)->Arg(100000)->Arg(million)->Unit(benchmark::kMillisecond);

// A fresh heap, as in a process that fits once without the programs' large-page heap: every
// buffer above 128 KiB comes from the kernel as new pages and goes back when freed (the mmap
// threshold is pinned at glibc's starting value, so it cannot rise after the first free). Run
// such a case in its own process (bench/run-separately.sh): the setting stays for the program.
void pinFreshHeap()
{
    mallopt(M_MMAP_THRESHOLD, 128 * 1024);
    mallopt(M_TRIM_THRESHOLD, 128 * 1024);
}

// fitReadings from a fresh heap.
void fitReadingsFreshHeap(benchmark::State &state)
{
    const std::vector<Reading> readings = readingsOf(data(static_cast<std::size_t>(state.range(0))));
    pinFreshHeap();
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(readings, FitMethod::Ols));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(fitReadingsFreshHeap)->Arg(million)->Unit(benchmark::kMillisecond);

// The fit of columns (what every product path calls) from a fresh heap, likewise.
void fitColumnsFreshHeap(benchmark::State &state)
{
    const std::vector<Reading> readings = readingsOf(data(static_cast<std::size_t>(state.range(0))));
    const ReadingColumns columns = columnsToFit(readings, FitVoltages::Raw, 0.0);
    pinFreshHeap();
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(columns, FitMethod::Ols));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(fitColumnsFreshHeap)->Arg(million)->Unit(benchmark::kMillisecond);

#if SAGLINE_HAVE_LARGE_PAGE_HEAP
// The same on the heap the programs run with (app/common/LargePageHeap: large pages, big blocks
// kept by malloc). Own process (bench/run-separately.sh): the setting stays for the program.
void fitReadingsProductHeap(benchmark::State &state)
{
    adviseLargePagesForHeap();
    const std::vector<Reading> readings = readingsOf(data(static_cast<std::size_t>(state.range(0))));
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(readings, FitMethod::Ols));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(fitReadingsProductHeap)->Arg(100000)->Arg(million)->Unit(benchmark::kMillisecond);

// The same fit of readings held as columns, as `sagline-cli fit FILE.csv` calls it (the CSV is
// read straight into columns), on the programs' heap. Own process (bench/run-separately.sh).
void fitColumnsProductHeap(benchmark::State &state)
{
    adviseLargePagesForHeap();
    const Data &d = data(static_cast<std::size_t>(state.range(0)));
    ReadingColumns columns;
    columns.reserve(d.x.size());
    for (std::size_t i = 0; i < d.x.size(); ++i) {
        Reading reading;
        reading.currentA = d.x[i];
        reading.voltageV = d.y[i];
        columns.append(reading);
    }
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(columns, FitMethod::Ols));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(fitColumnsProductHeap)->Arg(100000)->Arg(million)->Unit(benchmark::kMillisecond);

// What a session, the window and the report do with readings in memory: lay out the columns
// the fit reads, referred to the rated supply (every reading here carries V1, so every row is
// scaled), then fit them. On the programs' heap, own process (bench/run-separately.sh).
void fitSessionReadingsProductHeap(benchmark::State &state)
{
    adviseLargePagesForHeap();
    std::vector<Reading> readings = readingsOf(data(static_cast<std::size_t>(state.range(0))));
    for (std::size_t i = 0; i < readings.size(); ++i)
        readings[i].primary.voltageV = 229.0 + 0.5 * static_cast<double>(i % 5);
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(columnsToFit(readings, FitVoltages::Referred, 230.0), FitMethod::Ols));
    state.SetBytesProcessed(state.iterations() * state.range(0) * 16);
}
BENCHMARK(fitSessionReadingsProductHeap)->Arg(100000)->Arg(million)->Unit(benchmark::kMillisecond);
#endif

} // namespace

BENCHMARK_MAIN();
