// Session store figures for the issue notes (never timed tests):
//   AppendReadingDurable      one reading per commit (synchronous=EXTRA, rollback journal)
//   OpenAndLoad100k           open a 100 000-reading session for review and load its readings
//   OpenLoadAndFit100k        the same plus the batch OLS fit the report and CLI show
// Run: build/release/bench/StoreBenchmark --benchmark_filter=Append --benchmark_min_time=1
// SAGLINE_BENCH_DIR chooses the folder for the files (default: the system temp folder); the
// durable-append figure depends on that disk's fsync.
#include "FitSummary.h"
#include "SessionStore.h"

#include <benchmark/benchmark.h>
#include <sqlite3.h>

#include <cstdlib>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

using namespace sagline;
namespace fs = std::filesystem;

namespace {

fs::path benchFolder()
{
    const char *chosen = std::getenv("SAGLINE_BENCH_DIR");
    fs::path folder = chosen ? fs::path(chosen) : fs::temp_directory_path() / "sagline-bench";
    fs::create_directories(folder);
    return folder;
}

NewSession demoSession()
{
    NewSession session;
    session.setupJson = R"({"nameplate":{"rated_power_va":50}})";
    session.operatorName = "bench";
    session.unitSerial = "BENCH-1";
    session.softwareVersion = "bench";
    return session;
}

Reading demoReading(std::int64_t k)
{
    Reading reading;
    reading.step = static_cast<int>(k % 11);
    reading.currentA = 0.2 * static_cast<double>(k % 11);
    reading.voltageV = 26.4 - 1.2 * reading.currentA + 0.001 * static_cast<double>(k % 7);
    reading.uCurrentA = 0.002;
    reading.uVoltageV = 0.01;
    reading.timeUtc = "2026-12-02T10:00:00.000Z";
    reading.rawText = "+2.6321E+01;+4.0000E-01";
    return reading;
}

// A 100 000-reading session built quickly: created by the store, rows added in one transaction.
std::string largeSession()
{
    const fs::path path = benchFolder() / "large-100k.sagline";
    if (fs::exists(path))
        return path.string();
    {
        auto created = SessionStore::create(path.string(), demoSession());
        if (!created.ok())
            return {};
    }
    sqlite3 *db = nullptr;
    sqlite3_open(path.c_str(), &db);
    sqlite3_exec(db, "BEGIN", nullptr, nullptr, nullptr);
    sqlite3_stmt *insert = nullptr;
    sqlite3_prepare_v2(db,
                       "INSERT INTO reading (time_utc, step, current_a, voltage_v, u_current_a, u_voltage_v, flags, raw_text) "
                       "VALUES (?, ?, ?, ?, ?, ?, 0, ?)",
                       -1, &insert, nullptr);
    for (std::int64_t k = 0; k < 100000; ++k) {
        const Reading reading = demoReading(k);
        sqlite3_bind_text(insert, 1, reading.timeUtc.c_str(), -1, SQLITE_TRANSIENT);
        sqlite3_bind_int(insert, 2, reading.step);
        sqlite3_bind_double(insert, 3, reading.currentA);
        sqlite3_bind_double(insert, 4, reading.voltageV);
        sqlite3_bind_double(insert, 5, *reading.uCurrentA);
        sqlite3_bind_double(insert, 6, *reading.uVoltageV);
        sqlite3_bind_text(insert, 7, reading.rawText.c_str(), -1, SQLITE_TRANSIENT);
        sqlite3_step(insert);
        sqlite3_reset(insert);
    }
    sqlite3_finalize(insert);
    sqlite3_exec(db, "COMMIT", nullptr, nullptr, nullptr);
    sqlite3_close(db);
    return path.string();
}

void AppendReadingDurable(benchmark::State &state)
{
    const fs::path path = benchFolder() / "append.sagline";
    fs::remove(path);
    auto created = SessionStore::create(path.string(), demoSession());
    if (!created.ok()) {
        state.SkipWithError(created.message.c_str());
        return;
    }
    std::int64_t k = 0;
    for (auto _ : state) {
        const auto id = created.value->appendReading(demoReading(k++));
        if (!id.ok()) {
            state.SkipWithError(id.message.c_str());
            break;
        }
    }
    state.SetItemsProcessed(state.iterations());
    created.value.reset();
    fs::remove(path);
}
BENCHMARK(AppendReadingDurable)->Iterations(10000)->Unit(benchmark::kMicrosecond);

// Opens `path` for review and loads its included readings; nothing (and the benchmark marked
// skipped) when it cannot be opened.
std::optional<std::vector<Reading>> openAndLoad(benchmark::State &state, const std::string &path)
{
    auto opened = SessionStore::openForReview(path);
    if (!opened.ok()) {
        state.SkipWithError(opened.message.c_str());
        return std::nullopt;
    }
    return opened.value->includedReadings().value;
}

void OpenAndLoad100k(benchmark::State &state)
{
    const std::string path = largeSession();
    for (auto _ : state) {
        auto readings = openAndLoad(state, path);
        if (!readings)
            break;
        benchmark::DoNotOptimize(readings->data());
    }
}
BENCHMARK(OpenAndLoad100k)->Unit(benchmark::kMillisecond);

void OpenLoadAndFit100k(benchmark::State &state)
{
    const std::string path = largeSession();
    for (auto _ : state) {
        const auto readings = openAndLoad(state, path);
        if (!readings)
            break;
        const FitSummary fit = fitReadings(*readings, FitMethod::Ols);
        if (!fit.ok()) {
            state.SkipWithError(fit.message.c_str());
            break;
        }
        benchmark::DoNotOptimize(fit.slope);
    }
}
BENCHMARK(OpenLoadAndFit100k)->Unit(benchmark::kMillisecond);

} // namespace

BENCHMARK_MAIN();
