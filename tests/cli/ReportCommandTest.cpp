// sagline-cli report: a PDF from a session, headless (no DISPLAY), A4 and Letter, clear errors.
#include "CliTestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>

using namespace sagline::testing;

namespace {

class ReportCommand : public ScratchFolderTest {
protected:
    ReportCommand() : ScratchFolderTest("sagline-cli-report-") {}

    void SetUp() override
    {
        ScratchFolderTest::SetUp();
        ASSERT_EQ(runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", path("s.sagline"), "--serial",
                                   "T60-0421", "--winding", "23"})
                      .exitCode,
                  0);
    }
};

} // namespace

TEST_F(ReportCommand, WritesAPdfWithoutADisplay)
{
    unsetenv("DISPLAY");
    unsetenv("WAYLAND_DISPLAY");
    unsetenv("QT_QPA_PLATFORM"); // the command must choose offscreen by itself
    unsetenv("XDG_RUNTIME_DIR"); // no login session (a service, root): Qt's note about it is not ours to print
    const auto r = runProgram(cli, {"report", path("s.sagline"), "-o", path("r.pdf")});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_EQ(r.err.find("XDG_RUNTIME_DIR"), std::string::npos) << r.err;
    EXPECT_EQ(readWholeFile(path("r.pdf")).substr(0, 5), "%PDF-");
    EXPECT_FALSE(std::filesystem::exists(path("r.pdf.partial")));
    const auto letter = runProgram(cli, {"report", path("s.sagline"), "-o", path("l.pdf"), "--page", "letter",
                                         "--rule", "simple", "--reference-temperature", "85"});
    ASSERT_EQ(letter.exitCode, 0) << letter.err;
    EXPECT_GT(std::filesystem::file_size(path("l.pdf")), 10000u);
}

TEST_F(ReportCommand, RejectsBadOptionsAndFiles)
{
    const auto page = runProgram(cli, {"report", path("s.sagline"), "-o", path("x.pdf"), "--page", "a3"});
    EXPECT_EQ(page.exitCode, 2);
    EXPECT_NE(page.err.find("--page"), std::string::npos) << page.err;
    const auto missing = runProgram(cli, {"report", path("s.sagline")});
    EXPECT_EQ(missing.exitCode, 2);
    const auto notSession = runProgram(cli, {"report", demoReadings, "-o", path("y.pdf")});
    EXPECT_EQ(notSession.exitCode, 2);
    EXPECT_NE(notSession.err.find("not a Sagline session"), std::string::npos) << notSession.err;
    EXPECT_FALSE(std::filesystem::exists(path("y.pdf")));
}
