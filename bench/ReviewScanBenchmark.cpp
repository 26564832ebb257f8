// Review of a folder of saved sessions: walking the folder, opening every file untrusted and
// read-only, fitting and analysing each, and the batch statistics, i.e. everything behind the
// review window's filled table. The folder (500 sessions of 50 readings, invented demo units)
// is built once under the temp dir and reused; 100 to 2 000 sessions show that the time per
// session stays the same (items_per_second). Every case runs once untimed first (the files in
// the page cache). Figures go in DEVELOPERS.md's speed table, not in tests.
//
//   build/release/bench/ReviewScanBenchmark --benchmark_min_time=1
//   /usr/bin/time -v build/release/app/cli/sagline-cli compare /tmp/sagline-review-bench-500x50 --json > /dev/null
#include "SessionComparison.h"
#include "SessionScan.h"
#include "SessionStore.h"

#include <benchmark/benchmark.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>

namespace {

namespace fs = std::filesystem;

const char *setupJson = R"({"nameplate":{"rated_power_va":50,"primary_voltage_v":230,"secondary_voltage_v":24,)"
                        R"("secondary_no_load_voltage_v":26.4,"construction":"toroidal"}})";

// Builds `count` sessions of `points` readings once; returns the folder.
std::string benchFolder(int count, int points)
{
    const fs::path folder = fs::temp_directory_path() / ("sagline-review-bench-" + std::to_string(count) + "x" + std::to_string(points));
    if (fs::exists(folder / "done"))
        return folder.string();
    fs::remove_all(folder);
    for (int s = 0; s < count; ++s) {
        const fs::path sub = folder / ("batch" + std::to_string(s / 100));
        fs::create_directories(sub);
        sagline::NewSession session;
        session.setupJson = setupJson;
        session.operatorName = "Bench";
        session.unitSerial = "BENCH-" + std::to_string(s);
        session.windingTemperatureC = 20.0 + (s % 7);
        session.softwareVersion = "bench";
        auto store = sagline::SessionStore::create((sub / ("unit" + std::to_string(s) + ".sagline")).string(), session);
        if (!store.ok())
            return {};
        std::vector<sagline::Reading> readings;
        const double r = 1.15 + 0.01 * std::sin(s);
        for (int k = 0; k < points; ++k) {
            sagline::Reading reading;
            reading.step = k;
            reading.currentA = 2.0833 * k / (points - 1);
            reading.voltageV = 26.4 - r * reading.currentA + 0.003 * std::sin(1.3 * k + s);
            reading.timeUtc = "2026-12-01T10:00:00.000Z";
            readings.push_back(reading);
        }
        store.value->appendReadings(readings);
    }
    std::ofstream(folder / "done") << "ok";
    return folder.string();
}

void BM_ScanAndCompare(benchmark::State &state)
{
    const std::string folder = benchFolder(static_cast<int>(state.range(0)), 50);
    if (folder.empty()) {
        state.SkipWithError("cannot build the session folder");
        return;
    }
    const auto scanAndCompare = [&] {
        const auto files = sagline::findSessionFiles({folder});
        const auto rows = sagline::loadSessionRows(files.files, {});
        const auto stats = sagline::summarizeBatch(rows);
        benchmark::DoNotOptimize(stats.meanOhm);
        return rows.size() == static_cast<std::size_t>(state.range(0)) && stats.unreadable == 0;
    };
    scanAndCompare(); // warm-up
    for (auto _ : state) {
        if (!scanAndCompare())
            state.SkipWithError("not every session was compared");
    }
    state.SetItemsProcessed(state.iterations() * state.range(0));
}
BENCHMARK(BM_ScanAndCompare)->Arg(100)->Arg(500)->Arg(1000)->Arg(2000)->Unit(benchmark::kMillisecond);

void BM_OpenOneSession(benchmark::State &state)
{
    const std::string folder = benchFolder(500, 50);
    const auto files = sagline::findSessionFiles({folder});
    std::size_t i = 0;
    for (auto _ : state) {
        benchmark::DoNotOptimize(sagline::loadSessionRow(files.files[i++ % files.files.size()], {}));
    }
}
BENCHMARK(BM_OpenOneSession)->Unit(benchmark::kMicrosecond);

} // namespace

BENCHMARK_MAIN();
