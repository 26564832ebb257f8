// Shared by the sagline-cli tests: the program under test, the demo input files, and a fixture
// that gives each test a scratch folder of its own.
#pragma once

#include "RunProgram.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <random>
#include <string>
#include <utility>

namespace sagline::testing {

inline const std::string cli = SAGLINE_CLI_PATH;
inline const std::string demoSetup = std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json";
inline const std::string demoReadings = std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-readings.csv";

// A fresh folder in the system's temporary directory for each test (a random suffix, so
// parallel test runs never share one), removed after the test.
class ScratchFolderTest : public ::testing::Test {
protected:
    explicit ScratchFolderTest(std::string prefix) : m_prefix(std::move(prefix)) {}

    void SetUp() override
    {
        std::random_device seed;
        m_dir = std::filesystem::temp_directory_path() / (m_prefix + std::to_string(seed()));
        std::filesystem::create_directories(m_dir);
    }
    void TearDown() override { std::filesystem::remove_all(m_dir); }

    std::string path(const std::string &name) const { return (m_dir / name).string(); }

    // Writes `text` byte for byte into the scratch folder; returns the file's path.
    std::string write(const std::string &name, const std::string &text) const
    {
        std::ofstream(path(name), std::ios::binary) << text;
        return path(name);
    }

private:
    std::string m_prefix;
    std::filesystem::path m_dir;
};

} // namespace sagline::testing
