// Finding session files: recursion, order, duplicates, missing paths, unreadable folders, cancel.
#include "SessionScan.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <unistd.h>

using namespace sagline;
using sagline::test::TempFolder;
using sagline::test::writeBytes;

TEST(SessionScan, WalksFoldersRecursivelyForSessionFiles)
{
    TempFolder folder;
    std::filesystem::create_directories(folder.file("lab/b/deeper"));
    writeBytes(folder.file("lab/z.sagline"), "x");
    writeBytes(folder.file("lab/b/a.sagline"), "x");
    writeBytes(folder.file("lab/b/deeper/c.SAGLINE"), "x");
    writeBytes(folder.file("lab/b/notes.txt"), "x");
    writeBytes(folder.file("lab/sagline"), "x");
    const SessionFileList list = findSessionFiles({folder.file("lab")});
    EXPECT_TRUE(list.problems.empty());
    EXPECT_FALSE(list.cancelled);
    ASSERT_EQ(list.files.size(), 3u);
    EXPECT_EQ(list.files[0], folder.file("lab/b/a.sagline"));
    EXPECT_EQ(list.files[1], folder.file("lab/b/deeper/c.SAGLINE"));
    EXPECT_EQ(list.files[2], folder.file("lab/z.sagline"));
}

TEST(SessionScan, ExplicitFilesMissingPathsAndDuplicates)
{
    TempFolder folder;
    writeBytes(folder.file("one.sagline"), "x");
    writeBytes(folder.file("renamed.db"), "x");
    const SessionFileList list =
        findSessionFiles({folder.file("renamed.db"), folder.file("missing.sagline"), folder.file(""), folder.file("one.sagline")});
    ASSERT_EQ(list.files.size(), 2u); // the folder and the explicit file name the same one.sagline once
    EXPECT_EQ(list.files[0], folder.file("renamed.db"));
    ASSERT_EQ(list.problems.size(), 1u);
    EXPECT_EQ(list.problems[0].path, folder.file("missing.sagline"));
    EXPECT_EQ(list.problems[0].reason, "does not exist");
}

TEST(SessionScan, UnreadableSubfolderIsListedAndTheRestWalked)
{
    if (geteuid() == 0)
        GTEST_SKIP() << "root reads every folder; permission cannot be denied";
    TempFolder folder;
    std::filesystem::create_directories(folder.file("lab/locked"));
    writeBytes(folder.file("lab/locked/hidden.sagline"), "x");
    writeBytes(folder.file("lab/open.sagline"), "x");
    std::filesystem::permissions(folder.file("lab/locked"), std::filesystem::perms::none);
    const SessionFileList list = findSessionFiles({folder.file("lab")});
    std::filesystem::permissions(folder.file("lab/locked"), std::filesystem::perms::owner_all);
    ASSERT_EQ(list.files.size(), 1u);
    ASSERT_EQ(list.problems.size(), 1u);
    EXPECT_EQ(list.problems[0].path, folder.file("lab/locked"));
    EXPECT_NE(list.problems[0].reason.find("cannot be read"), std::string::npos);
}

TEST(SessionScan, CancelKeepsWhatWasFound)
{
    TempFolder folder;
    for (int i = 0; i < 20; ++i)
        writeBytes(folder.file("s" + std::to_string(i) + ".sagline"), "x");
    int calls = 0;
    const SessionFileList list = findSessionFiles({folder.file("")}, [&](std::size_t) { return ++calls <= 5; });
    EXPECT_TRUE(list.cancelled);
    EXPECT_EQ(list.files.size(), 5u);
}
