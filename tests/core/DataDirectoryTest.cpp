// Data directory lookup: the installed layout (<prefix>/bin + <prefix>/share/sagline), the
// explicit override, and the build-tree fallback, on folders made for each test.
#include "DataDirectory.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>

namespace sagline {
namespace {

namespace fs = std::filesystem;

class DataDirectory : public ::testing::Test {
protected:
    void SetUp() override
    {
        std::random_device seed;
        m_root = fs::temp_directory_path() / ("sagline-datadir-" + std::to_string(seed()));
        fs::create_directories(m_root / "prefix" / "bin");
        fs::create_directories(m_root / "source" / "resources");
    }
    void TearDown() override
    {
        std::error_code ignored;
        fs::remove_all(m_root, ignored);
    }
    fs::path installedData() const { return m_root / "prefix" / "share" / "sagline"; }
    fs::path program() const { return m_root / "prefix" / "bin" / "sagline-cli"; }
    fs::path sourceData() const { return m_root / "source" / "resources"; }

    fs::path m_root;
};

TEST_F(DataDirectory, FindsShareSaglineBesideTheProgramsFolder)
{
    fs::create_directories(installedData());
    const auto result = locateDataDirectory({"", program(), sourceData()});
    ASSERT_TRUE(result.ok()) << result.message;
    EXPECT_EQ(result.path, fs::canonical(installedData()));
}

TEST_F(DataDirectory, FallsBackToTheSourceTreeWhenNotInstalled)
{
    const auto result = locateDataDirectory({"", program(), sourceData()});
    ASSERT_TRUE(result.ok()) << result.message;
    EXPECT_EQ(result.path, fs::canonical(sourceData()));
}

TEST_F(DataDirectory, OverrideWinsOverTheInstalledLayout)
{
    fs::create_directories(installedData());
    const auto result = locateDataDirectory({sourceData().string(), program(), {}});
    ASSERT_TRUE(result.ok()) << result.message;
    EXPECT_EQ(result.path, fs::canonical(sourceData()));
}

TEST_F(DataDirectory, MissingOverrideIsAFailureNamingTheVariable)
{
    fs::create_directories(installedData());
    const auto missing = (m_root / "nowhere").string();
    const auto result = locateDataDirectory({missing, program(), sourceData()});
    EXPECT_FALSE(result.ok());
    EXPECT_NE(result.message.find("SAGLINE_DATA_DIR"), std::string::npos) << result.message;
    EXPECT_NE(result.message.find(missing), std::string::npos) << result.message;
}

TEST_F(DataDirectory, NothingFoundNamesEveryPlaceSearched)
{
    const auto goneSource = m_root / "deleted-source";
    const auto result = locateDataDirectory({"", program(), goneSource});
    EXPECT_FALSE(result.ok());
    EXPECT_NE(result.message.find((m_root / "prefix" / "share" / "sagline").string()), std::string::npos) << result.message;
    EXPECT_NE(result.message.find(goneSource.string()), std::string::npos) << result.message;
}

TEST_F(DataDirectory, AFileNamedLikeTheFolderDoesNotCount)
{
    fs::create_directories(installedData().parent_path());
    { std::ofstream(installedData()) << "not a folder"; }
    const auto result = locateDataDirectory({"", program(), sourceData()});
    ASSERT_TRUE(result.ok()) << result.message;
    EXPECT_EQ(result.path, fs::canonical(sourceData()));
}

TEST(DataDirectoryOfThisProcess, BuildTreeRunFindsTheDemoSetup)
{
    ::unsetenv(dataDirectoryVariable);
    const auto result = findDataDirectory();
    ASSERT_TRUE(result.ok()) << result.message;
    EXPECT_TRUE(fs::is_regular_file(result.path / "demo-setup.json")) << result.path;
}

} // namespace
} // namespace sagline
