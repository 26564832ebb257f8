// Outputs that never destroy what they read: no command writes over its own input or any
// session file (by content); another existing file needs --force; a write that fails (the disk
// full at any point, here through a file size limit on the process) exits 1 and leaves nothing
// under the requested name. Reproducers: `export S --csv S` and `report S -o S` used to exit 0
// with the session gone; a report onto a nearly full disk said "Wrote" and left half a PDF.
#include "CliTestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>

using namespace sagline::testing;

namespace {

class OutputSafety : public ScratchFolderTest {
protected:
    OutputSafety() : ScratchFolderTest("sagline-cli-outputs-") {}

    void SetUp() override
    {
        ScratchFolderTest::SetUp();
        for (const char *name : {"s.sagline", "other.sagline"}) {
            const auto r = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", path(name)});
            ASSERT_EQ(r.exitCode, 0) << r.err;
        }
        session = path("s.sagline");
        sessionBytes = readWholeFile(session);
        otherBytes = readWholeFile(path("other.sagline"));
    }

    // Nothing but the two sessions and `expected` in the scratch folder (no temporary files).
    void expectOnly(std::vector<std::string> expected)
    {
        expected.push_back("s.sagline");
        expected.push_back("other.sagline");
        std::sort(expected.begin(), expected.end());
        std::vector<std::string> names;
        for (const auto &entry : std::filesystem::directory_iterator(path("")))
            names.push_back(entry.path().filename().string());
        std::sort(names.begin(), names.end());
        EXPECT_EQ(names, expected);
    }

    void expectSessionsUnchanged()
    {
        EXPECT_EQ(readWholeFile(session), sessionBytes);
        EXPECT_EQ(readWholeFile(path("other.sagline")), otherBytes);
    }

    std::string session;
    std::string sessionBytes;
    std::string otherBytes;
};

} // namespace

TEST_F(OutputSafety, ExportOntoItsOwnSessionIsRefused)
{
    for (const char *option : {"--csv", "--fit-csv", "--json"}) {
        const auto r = runProgram(cli, {"export", session, option, session});
        EXPECT_EQ(r.exitCode, 2) << option;
        EXPECT_NE(r.err.find(session + ": is the file this command reads"), std::string::npos) << r.err;
        // --force never makes it allowed.
        EXPECT_EQ(runProgram(cli, {"export", session, option, session, "--force"}).exitCode, 2);
    }
    expectSessionsUnchanged();
}

TEST_F(OutputSafety, ReportOntoItsOwnSessionIsRefused)
{
    const auto r = runProgram(cli, {"report", session, "-o", session, "--force"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find(session + ": is the file this command reads"), std::string::npos) << r.err;
    EXPECT_EQ(r.out.find("Wrote"), std::string::npos);
    expectSessionsUnchanged();
}

TEST_F(OutputSafety, AnyOtherSessionIsRecognisedByContentAndRefused)
{
    // Even under a name that does not say so.
    std::filesystem::copy_file(path("other.sagline"), path("looks-like.csv"));
    for (const std::string &target : {path("other.sagline"), path("looks-like.csv")}) {
        for (const std::vector<std::string> &args :
             {std::vector<std::string>{"export", session, "--csv", target, "--force"},
              std::vector<std::string>{"report", session, "-o", target, "--force"},
              std::vector<std::string>{"compare", session, "--csv", target, "--force"}}) {
            const auto r = runProgram(cli, args);
            EXPECT_EQ(r.exitCode, 2) << args[0] << ' ' << target;
            EXPECT_NE(r.err.find("is a Sagline session; a session is never written over"), std::string::npos) << r.err;
        }
    }
    expectSessionsUnchanged();
    EXPECT_EQ(readWholeFile(path("looks-like.csv")), otherBytes);
}

TEST_F(OutputSafety, AnExistingFileNeedsForce)
{
    write("report.pdf", "an older report");
    write("readings.csv", "older readings");
    const auto report = runProgram(cli, {"report", session, "-o", path("report.pdf")});
    EXPECT_EQ(report.exitCode, 2);
    EXPECT_NE(report.err.find("already exists; give --force to replace it"), std::string::npos) << report.err;
    EXPECT_EQ(readWholeFile(path("report.pdf")), "an older report");
    const auto exported = runProgram(cli, {"export", session, "--csv", path("readings.csv")});
    EXPECT_EQ(exported.exitCode, 2);
    EXPECT_EQ(readWholeFile(path("readings.csv")), "older readings");
    const auto compared = runProgram(cli, {"compare", session, "--csv", path("readings.csv")});
    EXPECT_EQ(compared.exitCode, 2);

    const auto forced = runProgram(cli, {"report", session, "-o", path("report.pdf"), "--force"});
    ASSERT_EQ(forced.exitCode, 0) << forced.err;
    EXPECT_EQ(readWholeFile(path("report.pdf")).rfind("%PDF-", 0), 0u);
    ASSERT_EQ(runProgram(cli, {"export", session, "--csv", path("readings.csv"), "--force"}).exitCode, 0);
    EXPECT_EQ(readWholeFile(path("readings.csv")).rfind("current_a,voltage_v", 0), 0u);
    expectOnly({"report.pdf", "readings.csv"});
}

TEST_F(OutputSafety, OneFileForTwoOutputsIsRefused)
{
    const auto r = runProgram(cli, {"export", session, "--csv", path("a.out"), "--json", path("a.out")});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("given for two outputs"), std::string::npos) << r.err;
    expectOnly({});
}

TEST_F(OutputSafety, NewSessionsNeverReplaceAFile)
{
    write("existing.csv", "current_a,voltage_v\n0,20\n");
    const auto imported = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", path("existing.csv")});
    EXPECT_EQ(imported.exitCode, 2);
    EXPECT_EQ(readWholeFile(path("existing.csv")), "current_a,voltage_v\n0,20\n");
    const auto selfImport = runProgram(cli, {"import", path("existing.csv"), "--setup", demoSetup, "-o", path("existing.csv")});
    EXPECT_EQ(selfImport.exitCode, 2);
    const auto run = runProgram(cli, {"run", demoSetup, "--sim", "-o", session});
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_NE(run.err.find("already exists"), std::string::npos) << run.err;
    expectSessionsUnchanged();
}

TEST_F(OutputSafety, AReportThatCannotBeWrittenWhollyIsNotWrittenAtAll)
{
    const auto whole = runProgram(cli, {"report", session, "-o", path("whole.pdf")});
    ASSERT_EQ(whole.exitCode, 0) << whole.err;
    const auto size = std::filesystem::file_size(path("whole.pdf"));
    ASSERT_GT(size, 1000u);
    // The disk fills up at the first byte, in the middle, and just before the end. Not one byte
    // before: the report prints the time it was made, so two runs differ by a few bytes of
    // compressed page content, and a second report a byte shorter would fit (1 run in 8).
    for (const rlim_t limit : {rlim_t{0}, rlim_t{1}, rlim_t{size / 2}, rlim_t{size - 512}}) {
        RunOptions options;
        options.fileSizeLimit = limit;
        const auto r = runProgram(cli, {"report", session, "-o", path("full.pdf")}, {}, options);
        EXPECT_EQ(r.exitCode, 1) << "limit " << limit << ": " << r.err;
        EXPECT_NE(r.err.find(path("full.pdf") + ": cannot write (the file is larger than this system allows)"),
                  std::string::npos)
            << r.err;
        EXPECT_EQ(r.out.find("Wrote"), std::string::npos) << r.out;
        EXPECT_FALSE(std::filesystem::exists(path("full.pdf"))) << "limit " << limit;
    }
    expectOnly({"whole.pdf"});
    expectSessionsUnchanged();
}

TEST_F(OutputSafety, AFileSizeLimitFromTheShellIsAFailedWriteNotAKill)
{
    // Found by hand: under `ulimit -f 20` the report was killed by SIGXFSZ mid-write (exit 153),
    // said nothing and left its hidden temporary file behind.
    RunOptions options;
    options.fileSizeLimit = 20000;
    options.defaultFileSizeSignal = true;
    const auto r = runProgram(cli, {"report", session, "-o", path("limited.pdf")}, {}, options);
    EXPECT_EQ(r.exitCode, 1) << r.err;
    EXPECT_NE(r.err.find(path("limited.pdf") + ": cannot write (the file is larger than this system allows)"), std::string::npos)
        << r.err;
    expectOnly({});
    expectSessionsUnchanged();
}

TEST_F(OutputSafety, AnExportThatCannotBeWrittenLeavesTheOldFileAndNoTemporary)
{
    write("readings.csv", "older readings");
    RunOptions options;
    options.fileSizeLimit = 64;
    const auto r = runProgram(cli, {"export", session, "--csv", path("readings.csv"), "--force"}, {}, options);
    EXPECT_EQ(r.exitCode, 1);
    EXPECT_NE(r.err.find("cannot write"), std::string::npos) << r.err;
    EXPECT_EQ(readWholeFile(path("readings.csv")), "older readings");
    const auto compared = runProgram(cli, {"compare", session, "--csv", path("table.csv")}, {}, options);
    EXPECT_EQ(compared.exitCode, 1) << compared.err;
    expectOnly({"readings.csv"});
}

TEST_F(OutputSafety, AReadOnlyFolderIsNamedAsSuch)
{
    if (::geteuid() == 0)
        GTEST_SKIP() << "root writes into read-only folders";
    std::filesystem::create_directory(path("locked"));
    std::filesystem::permissions(path("locked"), std::filesystem::perms::owner_read | std::filesystem::perms::owner_exec);
    const auto r = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", path("locked/s.sagline")});
    std::filesystem::permissions(path("locked"), std::filesystem::perms::owner_all);
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("permission denied (is the folder writable?)"), std::string::npos) << r.err;
}

TEST_F(OutputSafety, OfTwoRunsOnOnePathAtOnceOneRecordsAndTheOtherIsRefused)
{
    // Reproducer: two `run`s started on one path at once; the loser failed ("table session
    // already exists") and its clean-up deleted the finished session.
    for (int round = 0; round < 6; ++round) {
        const std::string target = path("race-" + std::to_string(round) + ".sagline");
        pid_t pids[2];
        for (int i = 0; i < 2; ++i) {
            pids[i] = ::fork();
            ASSERT_GE(pids[i], 0);
            if (pids[i] == 0) {
                const std::string log = path("race-" + std::to_string(round) + "-" + std::to_string(i) + ".log");
                if (!std::freopen(log.c_str(), "w", stdout) || !std::freopen(log.c_str(), "a", stderr)
                    || !std::freopen("/dev/null", "r", stdin))
                    _exit(127);
                ::execl(cli.c_str(), cli.c_str(), "run", demoSetup.c_str(), "--sim", "-o", target.c_str(),
                        static_cast<char *>(nullptr));
                _exit(127);
            }
        }
        int codes[2];
        for (int i = 0; i < 2; ++i) {
            int status = 0;
            ::waitpid(pids[i], &status, 0);
            ASSERT_TRUE(WIFEXITED(status));
            codes[i] = WEXITSTATUS(status);
        }
        std::sort(codes, codes + 2);
        EXPECT_EQ(codes[0], 0) << "round " << round;
        EXPECT_EQ(codes[1], 2) << "round " << round;
        const auto fit = runProgram(cli, {"fit", target, "--json"});
        ASSERT_EQ(fit.exitCode, 0) << "round " << round << ": the winner's session is gone or damaged: " << fit.err;
        EXPECT_NE(fit.out.find("\"n\": 9,"), std::string::npos) << fit.out.substr(0, 200);
    }
    for (const auto &entry : std::filesystem::directory_iterator(path("")))
        EXPECT_EQ(entry.path().string().find(".partial"), std::string::npos) << entry.path();
}
