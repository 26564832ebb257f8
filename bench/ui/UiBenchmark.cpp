// Desktop-app speed (Google Benchmark, offscreen platform), never a timed test:
//   OpenSession/<order>/<n>      opening a saved session of n readings in the window, up to the
//                                first painted frame (the window grabbed: every widget painted),
//                                for readings stored in rising, falling and random current order
//   AppendPoint/<order>/<n>      one recorded point more and the charts, the table and the
//                                results brought up to date, with n points already on screen
//   AppendPointAndPaint/...      the same, then both charts painted
//   BatchFitSummary/<n>          the batch fit the results panel shows (curvature, outliers),
//                                which the window refreshes at most once a second above 5 000
// Every case runs one untimed warm-up first; bench/run-separately.sh runs each case in a
// process of its own, so no case inherits another's heap (glibc's mmap threshold moves).
//
//   UiBenchmark                       the benchmarks (SAGLINE_BENCH_DIR keeps the session files)
//   UiBenchmark --memory-probe N      fills the window with N points, paints, prints, exits
//                                     (run under /usr/bin/time -v for the peak memory)
#include "DemoSession.h"
#include "InteractiveChartView.h"
#include "LargePageHeap.h"
#include "MainWindow.h"
#include "ResidualChart.h"
#include "SetupJson.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <benchmark/benchmark.h>

#include <QApplication>
#include <QChartView>
#include <QDir>
#include <QFileInfo>

#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <memory>
#include <random>

using namespace sagline;

namespace {

Setup demoSetup()
{
    const auto parsed = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    if (!parsed.setup) {
        std::fprintf(stderr, "UiBenchmark: cannot read resources/demo-setup.json\n");
        std::exit(1);
    }
    return *parsed.setup;
}

// Invented readings of a 60 VA transformer (demo data). The current of reading i of `total`
// rises, falls or is drawn at random, as a sweep up, a sweep down or a scattered log.
Reading pointAt(std::size_t i, std::size_t total, CurrentOrder order, std::mt19937 &random)
{
    std::normal_distribution<double> noise(0.0, 0.01);
    std::uniform_real_distribution<double> anywhere(0.0, 1.0);
    const double fraction = static_cast<double>(i) / static_cast<double>(std::max<std::size_t>(total, 1));
    Reading r;
    r.id = static_cast<std::int64_t>(i + 1);
    r.step = static_cast<int>(i * 9 / std::max<std::size_t>(total, 1));
    r.currentA = 3.33 * (order == CurrentOrder::Rising    ? fraction
                         : order == CurrentOrder::Falling ? 1.0 - fraction
                                                          : anywhere(random));
    r.voltageV = 19.6 - 0.48 * r.currentA + noise(random);
    r.timeUtc = "2026-12-02T02:00:00.000Z";
    r.flags = flagSimulated;
    return r;
}

std::unique_ptr<MainWindow> shownWindow()
{
    auto window = std::make_unique<MainWindow>();
    window->loadSetup(demoSetup());
    window->resize(1600, 1000);
    window->show();
    QApplication::processEvents();
    return window;
}

std::unique_ptr<MainWindow> filledWindow(std::size_t points, CurrentOrder order, std::mt19937 &random)
{
    auto window = shownWindow();
    for (std::size_t i = 0; i < points; ++i)
        window->workspace()->acceptRecorded(pointAt(i, points + 100000, order, random));
    window->flushCharts();
    QApplication::processEvents();
    return window;
}

// The session file for (n, order), written once per folder and reused.
QString sessionFile(std::size_t n, CurrentOrder order)
{
    const char *chosen = std::getenv("SAGLINE_BENCH_DIR");
    const QString folder = chosen ? QString::fromLocal8Bit(chosen) : QDir::tempPath() + QStringLiteral("/sagline-bench");
    QDir().mkpath(folder);
    const QString path = QStringLiteral("%1/open-%2-%3.sagline").arg(folder).arg(n).arg(QLatin1String(toString(order)));
    if (!QFileInfo::exists(path)) {
        const QString problem = writeDemoSession(path, demoSetup(), n, order);
        if (!problem.isEmpty()) {
            std::fprintf(stderr, "UiBenchmark: %s: %s\n", qPrintable(path), qPrintable(problem));
            std::exit(1);
        }
    }
    return path;
}

// Opens the session in a fresh, shown window and paints the whole window once.
void openAndPaint(const QString &path)
{
    auto window = shownWindow();
    if (!window->openSessionFile(path)) {
        std::fprintf(stderr, "UiBenchmark: %s\n", qPrintable(window->lastMessage()));
        std::exit(1);
    }
    benchmark::DoNotOptimize(window->grab());
}

void openSession(benchmark::State &state, CurrentOrder order)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    const QString path = sessionFile(n, order);
    openAndPaint(path); // warm-up: the file in the page cache, the fonts and styles loaded
    for (auto _ : state) {
        state.PauseTiming();
        auto window = shownWindow();
        state.ResumeTiming();
        if (!window->openSessionFile(path))
            state.SkipWithError("cannot open the session");
        benchmark::DoNotOptimize(window->grab()); // the first painted frame, session drawn
        state.PauseTiming();
        window.reset(); // waits for a background fit; not part of opening
        state.ResumeTiming();
    }
    state.counters["readings"] = static_cast<double>(n);
}

void appendAndRefresh(benchmark::State &state, CurrentOrder order, bool paint)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    std::mt19937 random(1);
    auto window = filledWindow(n, order, random);
    std::size_t i = n;
    const auto once = [&] {
        window->workspace()->acceptRecorded(pointAt(i++, n + 100000, order, random));
        window->flushCharts();         // what the 10 Hz timers do: replace() each series, results
        QApplication::processEvents(); // the table's row insert and queued updates
        if (paint) {
            // Render both charts as the screen would (offscreen: into an image).
            benchmark::DoNotOptimize(window->chart()->chartView()->grab());
            benchmark::DoNotOptimize(window->residualChart()->grab());
        }
    };
    once(); // warm-up
    for (auto _ : state)
        once();
    state.counters["points"] = static_cast<double>(window->workspace()->readings().size());
}

void batchFitSummary(benchmark::State &state)
{
    const auto n = static_cast<std::size_t>(state.range(0));
    std::mt19937 random(1);
    std::vector<Reading> readings;
    for (std::size_t i = 0; i < n; ++i)
        readings.push_back(pointAt(i, n, CurrentOrder::Random, random));
    benchmark::DoNotOptimize(fitReadings(readings, FitMethod::Ols)); // warm-up
    for (auto _ : state)
        benchmark::DoNotOptimize(fitReadings(readings, FitMethod::Ols));
}

void registerBenchmarks()
{
    for (CurrentOrder order : {CurrentOrder::Rising, CurrentOrder::Falling, CurrentOrder::Random}) {
        const std::string name = toString(order);
        benchmark::RegisterBenchmark(("OpenSession/" + name).c_str(), openSession, order)
            ->Arg(10000)
            ->Arg(100000)
            ->Arg(1000000)
            ->Iterations(3)
            ->Unit(benchmark::kMillisecond);
        benchmark::RegisterBenchmark(("AppendPoint/" + name).c_str(), appendAndRefresh, order, false)
            ->Arg(1000)
            ->Arg(10000)
            ->Arg(100000)
            ->Unit(benchmark::kMillisecond);
        benchmark::RegisterBenchmark(("AppendPointAndPaint/" + name).c_str(), appendAndRefresh, order, true)
            ->Arg(1000)
            ->Arg(10000)
            ->Arg(100000)
            ->Unit(benchmark::kMillisecond);
    }
    benchmark::RegisterBenchmark("BatchFitSummary", batchFitSummary)
        ->Arg(1000)
        ->Arg(10000)
        ->Arg(100000)
        ->Unit(benchmark::kMillisecond);
}

} // namespace

int main(int argc, char **argv)
{
    sagline::adviseLargePagesForHeap(); // the heap the desktop app runs with (app/gui/main.cpp)
    if (!qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("SaglineBenchmark"));
    if (argc == 3 && std::strcmp(argv[1], "--memory-probe") == 0) {
        const auto n = static_cast<std::size_t>(std::strtoull(argv[2], nullptr, 10));
        std::mt19937 random(1);
        auto window = filledWindow(n, CurrentOrder::Rising, random);
        const QImage shown = window->grab().toImage();
        std::printf("memory probe: %zu points in the window, painted %dx%d\n", window->workspace()->readings().size(),
                    shown.width(), shown.height());
        return 0;
    }
    registerBenchmarks();
    benchmark::Initialize(&argc, argv);
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}
