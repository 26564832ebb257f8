// Desktop-app speed (Google Benchmark, offscreen platform): appending one recorded point and
// bringing the charts, the table and the results up to date, at 1 000, 10 000 and 100 000
// points already on screen; with and without painting the charts. Also the batch fit the
// results panel shows (curvature, outliers), which the window refreshes at most once a second
// above 5 000 points.
//
//   UiBenchmark                       the benchmarks
//   UiBenchmark --memory-probe N      fills the window with N points, paints, prints, exits
//                                     (run under /usr/bin/time -v for the peak memory)
#include "MainWindow.h"
#include "ResidualChart.h"
#include "SetupJson.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <benchmark/benchmark.h>

#include <QApplication>
#include <QChartView>

#include <cstdio>
#include <cstring>
#include <memory>
#include <random>

using namespace sagline;

namespace {

// Invented readings of a 60 VA transformer (demo data), in sweep order: the current rises.
Reading pointAt(std::size_t i, std::size_t total, std::mt19937 &random)
{
    std::normal_distribution<double> noise(0.0, 0.01);
    Reading r;
    r.id = static_cast<std::int64_t>(i + 1);
    r.step = static_cast<int>(i * 9 / std::max<std::size_t>(total, 1));
    r.currentA = 3.33 * static_cast<double>(i) / static_cast<double>(std::max<std::size_t>(total, 1));
    r.voltageV = 19.6 - 0.48 * r.currentA + noise(random);
    r.timeUtc = "2026-12-02T02:00:00.000Z";
    r.flags = flagSimulated;
    return r;
}

std::unique_ptr<MainWindow> filledWindow(std::size_t points, std::mt19937 &random)
{
    auto window = std::make_unique<MainWindow>();
    const auto parsed = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    if (parsed.setup)
        window->loadSetup(*parsed.setup);
    window->resize(1600, 1000);
    window->show();
    for (std::size_t i = 0; i < points; ++i)
        window->workspace()->acceptRecorded(pointAt(i, points + 100000, random));
    window->flushCharts();
    QApplication::processEvents();
    return window;
}

void appendAndRefresh(benchmark::State &state, bool paint)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    std::mt19937 random(1);
    auto window = filledWindow(n, random);
    std::size_t i = n;
    for (auto _ : state) {
        window->workspace()->acceptRecorded(pointAt(i++, n + 100000, random));
        window->flushCharts();      // what the 10 Hz timers do: replace() each series, results
        QApplication::processEvents(); // the table's row insert and queued updates
        if (paint) {
            // Render both charts as the screen would (offscreen: into an image).
            benchmark::DoNotOptimize(window->chart()->chartView()->grab());
            benchmark::DoNotOptimize(window->residualChart()->grab());
        }
    }
    state.counters["points"] = static_cast<double>(window->workspace()->readings().size());
}

void BM_AppendPointAndRefresh(benchmark::State &state) { appendAndRefresh(state, false); }
void BM_AppendPointRefreshAndPaintCharts(benchmark::State &state) { appendAndRefresh(state, true); }

void BM_BatchFitSummary(benchmark::State &state)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    std::mt19937 random(1);
    std::vector<Reading> readings;
    for (std::size_t i = 0; i < n; ++i)
        readings.push_back(pointAt(i, n, random));
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(readings, FitMethod::Ols));
}

} // namespace

BENCHMARK(BM_AppendPointAndRefresh)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_AppendPointRefreshAndPaintCharts)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_BatchFitSummary)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);

int main(int argc, char **argv)
{
    if (!qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("SaglineBenchmark"));
    if (argc == 3 && std::strcmp(argv[1], "--memory-probe") == 0) {
        const auto n = static_cast<std::size_t>(std::strtoull(argv[2], nullptr, 10));
        std::mt19937 random(1);
        auto window = filledWindow(n, random);
        const QImage shown = window->grab().toImage();
        std::printf("memory probe: %zu points in the window, painted %dx%d\n", window->workspace()->readings().size(),
                    shown.width(), shown.height());
        return 0;
    }
    benchmark::Initialize(&argc, argv);
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}
