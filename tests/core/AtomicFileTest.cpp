// writeFileAtomically under faults (after SQLite's test VFS and KeePassXC's FailDevice): a
// fault-injecting FileSystemCalls fails the k-th call of each kind (ENOSPC on a write, a failing
// fsync, close or rename, a folder that cannot take a new file), for every k the write makes.
// Each time: a failure naming the file and the reason, nothing new under the name, a file that
// was there unchanged, and no temporary file left in the folder.
#include "AtomicFile.h"

#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <cerrno>
#include <filesystem>
#include <string>

using namespace sagline;
using sagline::test::fileBytes;
using sagline::test::TempFolder;
using sagline::test::writeBytes;

namespace {

enum class Stage { Open, Write, Fsync, Close, Rename };

// The system's calls, except that the `failAt`-th call (0-based) of `stage` fails with `error`.
// Writes take at most 4096 bytes at a time, so a large file is many writes.
struct FaultyCalls {
    Stage stage;
    int failAt;
    int error = ENOSPC;
    int seen = 0;
    FileSystemCalls calls;

    FaultyCalls(Stage s, int k, int e = ENOSPC) : stage(s), failAt(k), error(e)
    {
        const FileSystemCalls &real = FileSystemCalls::system();
        const auto fault = [this](Stage at) {
            if (at != stage || seen++ != failAt)
                return false;
            errno = error;
            return true;
        };
        calls.open = [=](const char *path, int flags, mode_t mode) { return fault(Stage::Open) ? -1 : real.open(path, flags, mode); };
        calls.write = [=](int fd, const void *data, std::size_t size) -> ssize_t {
            return fault(Stage::Write) ? -1 : real.write(fd, data, std::min<std::size_t>(size, 4096));
        };
        calls.fsync = [=](int fd) { return fault(Stage::Fsync) ? -1 : real.fsync(fd); };
        calls.close = [=](int fd) {
            const int rc = real.close(fd); // the descriptor is gone either way, as with close(2)
            return fault(Stage::Close) ? -1 : rc;
        };
        calls.rename = [=](const char *from, const char *to) { return fault(Stage::Rename) ? -1 : real.rename(from, to); };
        calls.unlink = real.unlink;
    }
};

std::size_t entriesIn(const std::string &folder)
{
    return static_cast<std::size_t>(std::distance(std::filesystem::directory_iterator(folder), {}));
}

} // namespace

TEST(AtomicFile, WritesTheBytesAndLeavesNoTemporaryFile)
{
    TempFolder folder;
    const std::string path = folder.file("out.csv");
    const std::string bytes(100000, 'x');
    ASSERT_TRUE(writeFileAtomically(path, bytes).ok());
    EXPECT_EQ(fileBytes(path), bytes);
    EXPECT_EQ(entriesIn(folder.file("")), 1u);
}

TEST(AtomicFile, AFailureAtAnyStageLeavesNothingUnderTheName)
{
    TempFolder folder;
    const std::string path = folder.file("report.pdf");
    const std::string bytes(3 * 4096 + 17, 'r'); // four writes of at most 4096 bytes
    const std::pair<Stage, int> faults[] = {{Stage::Open, 0},  {Stage::Write, 0}, {Stage::Write, 1}, {Stage::Write, 2},
                                            {Stage::Write, 3}, {Stage::Fsync, 0}, {Stage::Close, 0}, {Stage::Rename, 0}};
    for (const auto &[stage, k] : faults) {
        FaultyCalls faulty(stage, k);
        const StoreStatus status = writeFileAtomically(path, bytes, faulty.calls);
        ASSERT_FALSE(status.ok()) << static_cast<int>(stage) << ' ' << k;
        EXPECT_EQ(status.code, StoreCode::IoError);
        EXPECT_NE(status.message.find(path), std::string::npos) << status.message;
        EXPECT_NE(status.message.find("the disk is full"), std::string::npos) << status.message;
        EXPECT_FALSE(std::filesystem::exists(path)) << static_cast<int>(stage) << ' ' << k;
        EXPECT_EQ(entriesIn(folder.file("")), 0u) << "a temporary file was left, stage " << static_cast<int>(stage);
    }
}

TEST(AtomicFile, AFailedReplacementKeepsTheOldFileWhole)
{
    TempFolder folder;
    const std::string path = folder.file("summary.json");
    writeBytes(path, "{\"old\": true}\n");
    for (int k = 0; k < 3; ++k) {
        FaultyCalls faulty(Stage::Write, k);
        EXPECT_FALSE(writeFileAtomically(path, std::string(3 * 4096, 'n'), faulty.calls).ok());
        EXPECT_EQ(fileBytes(path), "{\"old\": true}\n");
        EXPECT_EQ(entriesIn(folder.file("")), 1u);
    }
    ASSERT_TRUE(writeFileAtomically(path, "{\"new\": true}\n").ok());
    EXPECT_EQ(fileBytes(path), "{\"new\": true}\n");
}

TEST(AtomicFile, ReasonsNameTheCause)
{
    TempFolder folder;
    const std::string path = folder.file("out.csv");
    FaultyCalls readOnly(Stage::Open, 0, EROFS);
    EXPECT_NE(writeFileAtomically(path, "x", readOnly.calls).message.find("read-only"), std::string::npos);
    FaultyCalls denied(Stage::Open, 0, EACCES);
    EXPECT_NE(writeFileAtomically(path, "x", denied.calls).message.find("permission denied"), std::string::npos);
    const StoreStatus missing = writeFileAtomically(folder.file("no/such/folder/out.csv"), "x");
    EXPECT_NE(missing.message.find("the folder does not exist"), std::string::npos) << missing.message;
}

TEST(AtomicFile, TemporaryNamesAreHiddenBesideTheTarget)
{
    const std::string name = temporarySibling("/some/folder/unit.sagline");
    EXPECT_EQ(name.rfind("/some/folder/.unit.sagline.", 0), 0u) << name;
    EXPECT_EQ(name.substr(name.size() - 8), ".partial");
    EXPECT_NE(temporarySibling("/x/a.csv"), temporarySibling("/x/a.csv"));
}
