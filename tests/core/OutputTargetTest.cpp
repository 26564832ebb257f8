// checkOutputPath: a session (by content, whatever its name), the command's own input (also by
// another path to the same file), a folder or a device is never written; another existing file
// only when replacing was asked for.
#include "OutputTarget.h"

#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <unistd.h>

using namespace sagline;
using sagline::test::sampleSession;
using sagline::test::TempFolder;
using sagline::test::writeBytes;

TEST(OutputTarget, ASessionIsRecognisedByContentAndNeverWrittenOver)
{
    TempFolder folder;
    const std::string session = folder.file("results.csv"); // a session under a misleading name
    ASSERT_TRUE(SessionStore::create(session, sampleSession()).ok());
    EXPECT_TRUE(isSessionFile(session));
    for (bool replace : {false, true}) {
        const StoreStatus status = checkOutputPath(session, {}, replace);
        EXPECT_EQ(status.code, StoreCode::InvalidArgument);
        EXPECT_NE(status.message.find("is a Sagline session; a session is never written over"), std::string::npos)
            << status.message;
        EXPECT_NE(status.message.find(session), std::string::npos);
    }
}

TEST(OutputTarget, TheCommandsOwnInputIsRefusedUnderAnySpelling)
{
    TempFolder folder;
    const std::string input = folder.file("readings.csv");
    writeBytes(input, "current_a,voltage_v\n0,20\n");
    const std::string otherSpelling = folder.file("./readings.csv");
    const std::string hardLink = folder.file("same-file.csv");
    ASSERT_EQ(::link(input.c_str(), hardLink.c_str()), 0);
    for (const std::string &output : {input, otherSpelling, hardLink}) {
        const StoreStatus status = checkOutputPath(output, {input}, true);
        EXPECT_EQ(status.code, StoreCode::InvalidArgument) << output;
        EXPECT_NE(status.message.find("is the file this command reads"), std::string::npos) << status.message;
    }
}

TEST(OutputTarget, AnExistingFileNeedsPermissionToBeReplaced)
{
    TempFolder folder;
    const std::string existing = folder.file("report.pdf");
    writeBytes(existing, "%PDF-1.4 old");
    const StoreStatus refused = checkOutputPath(existing, {}, false);
    EXPECT_EQ(refused.code, StoreCode::InvalidArgument);
    EXPECT_NE(refused.message.find("already exists; give --force"), std::string::npos) << refused.message;
    EXPECT_TRUE(checkOutputPath(existing, {}, true).ok());
    EXPECT_TRUE(checkOutputPath(folder.file("new.pdf"), {}, false).ok());
    EXPECT_TRUE(checkOutputPath("-", {}, false).ok());
}

TEST(OutputTarget, FoldersAndDevicesAreRefused)
{
    TempFolder folder;
    const StoreStatus directory = checkOutputPath(folder.file(""), {}, true);
    EXPECT_NE(directory.message.find("is a folder"), std::string::npos) << directory.message;
    const StoreStatus device = checkOutputPath("/dev/null", {}, true);
    EXPECT_NE(device.message.find("not a regular file"), std::string::npos) << device.message;
}

TEST(OutputTarget, AnEmptyOrForeignFileIsNotASession)
{
    TempFolder folder;
    writeBytes(folder.file("empty"), "");
    writeBytes(folder.file("text"), "SQLite format 3 but not really");
    EXPECT_FALSE(isSessionFile(folder.file("empty")));
    EXPECT_FALSE(isSessionFile(folder.file("text")));
    EXPECT_FALSE(isSessionFile(folder.file("missing")));
}
