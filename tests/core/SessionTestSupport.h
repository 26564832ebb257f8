// Shared helpers for the session-store tests: a fresh temporary folder and a sample session.
#pragma once

#include "SessionStore.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <string>

namespace sagline::test {

// A folder under the system temp dir, removed with its contents when the fixture ends.
class TempFolder {
public:
    TempFolder()
    {
        std::random_device seed;
        m_path = std::filesystem::temp_directory_path() / ("sagline-test-" + std::to_string(seed()));
        std::filesystem::create_directories(m_path);
    }
    ~TempFolder()
    {
        std::error_code ignored;
        std::filesystem::remove_all(m_path, ignored);
    }
    std::string file(const std::string &name) const { return (m_path / name).string(); }

private:
    std::filesystem::path m_path;
};

// An invented demo session (not a real unit).
inline NewSession sampleSession()
{
    NewSession session;
    session.setupJson = R"({"nameplate":{"rated_power_va":50,"primary_voltage_v":230,"secondary_voltage_v":24,)"
                        R"("secondary_no_load_voltage_v":26.4}})";
    session.planJson = R"({"steps":[]})";
    session.operatorName = "A. Tester";
    session.unitSerial = "DEMO-0001";
    session.ambientTemperatureC = 21.5;
    session.windingTemperatureC = 22.0;
    session.softwareVersion = "test";
    return session;
}

inline Reading sampleReading(int step, double current, double voltage)
{
    Reading reading;
    reading.step = step;
    reading.currentA = current;
    reading.voltageV = voltage;
    reading.uCurrentA = 0.002;
    reading.uVoltageV = 0.01;
    reading.timeUtc = "2026-12-02T10:00:0" + std::to_string(step % 10) + ".000Z";
    reading.rawText = "VOLT " + std::to_string(voltage) + ";CURR " + std::to_string(current);
    return reading;
}

inline std::string fileBytes(const std::string &path)
{
    std::ifstream in(path, std::ios::binary);
    return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
}

inline void writeBytes(const std::string &path, const std::string &bytes)
{
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

} // namespace sagline::test
