// Write failures (after SQLite's test/writecrash.test and its fault VFS): fail the Nth write,
// sync or truncate of an append for N = 0, 1, 2, ... until the append gets through. Each time
// the call must report the failure (never an id for a reading that is not stored), everything
// recorded before must remain, and the file must pass integrity_check once the disk is healthy.
#include "FaultVfs.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>

using namespace sagline;
using sagline::testing::FaultVfsScope;
using sagline::testing::faultPlan;
using sagline::test::sampleReading;
using sagline::test::sampleSession;
using sagline::test::TempFolder;

namespace {

void checkFailuresAtEveryWrite(int failureCode)
{
    TempFolder folder;
    FaultVfsScope vfs;
    ASSERT_TRUE(vfs.isRegistered());
    const std::string path = folder.file("fault.sagline");
    std::int64_t recorded = 0;
    {
        auto created = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(created.ok()) << created.message;
        for (; recorded < 3; ++recorded)
            ASSERT_TRUE(created.value->appendReading(sampleReading(static_cast<int>(recorded), 0.1, 26.0)).ok());
    }
    int failedAppends = 0;
    for (int allowed = 0; allowed < 50; ++allowed) {
        auto opened = SessionStore::openForWriting(path);
        ASSERT_TRUE(opened.ok()) << "after failing at write " << allowed << ": " << opened.message;
        faultPlan() = {allowed, failureCode, 0};
        const auto id = opened.value->appendReading(sampleReading(static_cast<int>(recorded), 0.2, 25.9));
        const bool injected = faultPlan().failures > 0;
        faultPlan() = {};
        if (id.ok()) {
            ++recorded; // a failure after the commit point (journal already gone) does not undo the commit
        } else {
            ++failedAppends;
            EXPECT_EQ(id.code, StoreCode::IoError) << id.message;
            EXPECT_NE(id.message.find("nothing was recorded"), std::string::npos) << id.message;
            // The same connection keeps working once the disk is healthy again.
            const auto retry = opened.value->appendReading(sampleReading(static_cast<int>(recorded), 0.2, 25.9));
            ASSERT_TRUE(retry.ok()) << retry.message;
            ++recorded;
        }
        opened.value.reset();
        auto check = SessionStore::openForReview(path);
        ASSERT_TRUE(check.ok()) << check.message;
        EXPECT_TRUE(check.value->integrityCheck().ok()) << check.value->integrityCheck().message;
        EXPECT_EQ(check.value->readingCount().value, recorded) << "after failing at write " << allowed;
        if (!injected)
            break; // the append needed fewer writes than allowed: every position has been tried
    }
    EXPECT_GE(failedAppends, 3) << "the fault VFS hardly ever fired; the test proved little";
}

} // namespace

TEST(SessionStoreFault, IoErrorAtAnyWriteLosesNothingRecorded)
{
    checkFailuresAtEveryWrite(SQLITE_IOERR_WRITE);
}

TEST(SessionStoreFault, DiskFullAtAnyWriteLosesNothingRecorded)
{
    checkFailuresAtEveryWrite(SQLITE_FULL);
}
