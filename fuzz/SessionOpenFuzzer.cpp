// libFuzzer target: a session file from an untrusted source. The bytes are written to a file and
// opened for review, then everything is read back; any crash, sanitizer report or hang is a bug.
// With SAGLINE_FUZZ_SEED_DIR set, LLVMFuzzerInitialize writes a valid session there as the seed.
#include "SessionStore.h"

#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <unistd.h>

using namespace sagline;

namespace {

std::string scratchPath()
{
    static const std::string path =
        (std::filesystem::temp_directory_path() / ("sagline-fuzz-open-" + std::to_string(getpid()) + ".sagline")).string();
    return path;
}

void writeSeed(const std::string &folder)
{
    const std::string path = folder + "/seed.sagline";
    std::error_code ignored;
    std::filesystem::create_directories(folder, ignored);
    if (std::filesystem::exists(path))
        return;
    NewSession session;
    session.setupJson = R"({"nameplate":{"rated_power_va":50}})";
    session.operatorName = "fuzz";
    session.unitSerial = "SEED";
    session.ambientTemperatureC = 20.0;
    auto created = SessionStore::create(path, session);
    if (!created.ok())
        return;
    for (int k = 0; k < 12; ++k) {
        Reading reading;
        reading.step = k;
        reading.currentA = 0.1 * k;
        reading.voltageV = 26.4 - 0.12 * k;
        reading.uVoltageV = 0.01;
        reading.rawText = "+2.6E+01";
        created.value->appendReading(reading);
    }
    created.value->excludeReading(3, "seed", "fuzz");
    created.value->addNote("fuzz", "seed note");
    created.value->addSignOff("fuzz", ReviewDecision::Accepted, "seed");
}

} // namespace

extern "C" int LLVMFuzzerInitialize(int *, char ***)
{
    if (const char *seedDir = std::getenv("SAGLINE_FUZZ_SEED_DIR"))
        writeSeed(seedDir);
    return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const std::string path = scratchPath();
    std::error_code ignored;
    std::filesystem::remove(path + "-journal", ignored);
    {
        std::ofstream out(path, std::ios::binary | std::ios::trunc);
        out.write(reinterpret_cast<const char *>(data), static_cast<std::streamsize>(size));
    }
    auto opened = SessionStore::openForReview(path);
    if (opened.ok()) {
        const SessionStore &store = *opened.value;
        (void)store.info();
        (void)store.readings();
        (void)store.includedReadings();
        (void)store.exclusions();
        (void)store.temperatures();
        (void)store.instruments();
        (void)store.notes();
        (void)store.safetyStops();
        (void)store.signOffs();
    } else if (opened.message.empty()) {
        __builtin_trap(); // every refusal must say why
    }
    return 0;
}
