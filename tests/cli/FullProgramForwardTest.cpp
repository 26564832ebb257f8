// sagline-cli hands `run` and `report` to sagline-cli-full (app/cli/ForwardToFullProgram.cpp):
// the handed-over command behaves as the command itself (its usage errors, its exit code), and a
// missing helper is named with where it was looked for, not a silent failure.
#include "CliTestSupport.h"

#include <filesystem>

namespace sagline::testing {
namespace {

class FullProgramForward : public ScratchFolderTest {
protected:
    FullProgramForward() : ScratchFolderTest("sagline-forward-") {}
};

TEST_F(FullProgramForward, RunAndReportAnswerAsThemselves)
{
    auto r = runProgram(cli, {"report"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("sagline-cli report: give SESSION.sagline"), std::string::npos) << r.err;
    r = runProgram(cli, {"run", "no-such-setup.json", "--sim", "-o", path("s.sagline")});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("no-such-setup.json"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(path("s.sagline")));
}

TEST_F(FullProgramForward, AMissingHelperIsNamedWithWhereItWasLookedFor)
{
    // A copy of sagline-cli alone in a folder: the helper is neither beside it nor in ../libexec.
    const std::filesystem::path alone = std::filesystem::path(path("bin")) / "sagline-cli";
    std::filesystem::create_directories(alone.parent_path());
    std::filesystem::copy_file(cli, alone);
    const auto r = runProgram(alone.string(), {"report", "x.sagline", "-o", path("x.pdf")});
    EXPECT_EQ(r.exitCode, 1);
    EXPECT_NE(r.err.find("sagline-cli report: cannot start sagline-cli-full"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find(path("bin") + "/sagline-cli-full"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("reinstall the package"), std::string::npos) << r.err;
    // Everything else still works without it.
    EXPECT_EQ(runProgram(alone.string(), {"fit", demoReadings}).exitCode, 0);
}

} // namespace
} // namespace sagline::testing
