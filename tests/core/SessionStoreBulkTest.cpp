// SessionStore::appendReadings, the import's one transaction: readings written in batches of
// several rows with the ids assigned by the store, the readings an import marks excluded
// excluded in the same transaction, and all or nothing when it is refused or a write fails.
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

// `count` readings, every seventh marked excluded; 150 spans two full batches and a short one.
std::vector<Reading> markedBatch(std::size_t count)
{
    std::vector<Reading> batch;
    for (std::size_t i = 0; i < count; ++i) {
        Reading reading = sampleReading(static_cast<int>(i), 0.01 * static_cast<double>(i), 26.4 - 0.012 * static_cast<double>(i));
        reading.excluded = i % 7 == 3;
        batch.push_back(reading);
    }
    return batch;
}

MarkedExclusions marks()
{
    return {"A. Importer", [](std::size_t i) { return "marked excluded in data.csv line " + std::to_string(i + 2); }};
}

} // namespace

TEST(SessionStoreBulk, BatchesContinueTheIdsAndReadBackInOrder)
{
    TempFolder folder;
    const std::string path = folder.file("bulk.sagline");
    auto created = SessionStore::create(path, sampleSession());
    ASSERT_TRUE(created.ok()) << created.message;
    SessionStore &store = *created.value;
    for (int k = 0; k < 3; ++k)
        ASSERT_TRUE(store.appendReading(sampleReading(k, 0.1 * k, 26.0)).ok());
    const std::vector<Reading> batch = markedBatch(150);
    const auto ids = store.appendReadings(batch); // without marks: `excluded` is ignored
    ASSERT_TRUE(ids.ok()) << ids.message;
    ASSERT_EQ(ids.value.size(), batch.size());
    for (std::size_t i = 0; i < ids.value.size(); ++i)
        EXPECT_EQ(ids.value[i], static_cast<std::int64_t>(4 + i));
    // A single append afterwards takes the next id.
    const auto next = store.appendReading(sampleReading(9, 2.0, 25.0));
    ASSERT_TRUE(next.ok());
    EXPECT_EQ(next.value, 154);

    const auto readings = store.readings();
    ASSERT_TRUE(readings.ok()) << readings.message;
    ASSERT_EQ(readings.value.size(), 154u);
    for (std::size_t i = 0; i < batch.size(); ++i) {
        const Reading &got = readings.value[3 + i];
        EXPECT_EQ(got.id, ids.value[i]);
        EXPECT_EQ(got.step, batch[i].step);
        EXPECT_EQ(got.currentA, batch[i].currentA);
        EXPECT_EQ(got.voltageV, batch[i].voltageV);
        EXPECT_EQ(got.uVoltageV, batch[i].uVoltageV);
        EXPECT_EQ(got.timeUtc, batch[i].timeUtc);
        EXPECT_EQ(got.rawText, batch[i].rawText);
        EXPECT_FALSE(got.excluded);
    }
}

TEST(SessionStoreBulk, MarkedReadingsAreExcludedWithTheirReasons)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("marked.sagline"), sampleSession());
    ASSERT_TRUE(created.ok());
    const std::vector<Reading> batch = markedBatch(150);
    const MarkedExclusions marked = marks();
    const auto ids = created.value->appendReadings(batch, &marked);
    ASSERT_TRUE(ids.ok()) << ids.message;
    const auto readings = created.value->readings();
    const auto exclusions = created.value->exclusions();
    ASSERT_TRUE(readings.ok() && exclusions.ok());
    std::size_t expected = 0;
    for (std::size_t i = 0; i < batch.size(); ++i) {
        EXPECT_EQ(readings.value[i].excluded, batch[i].excluded) << "reading " << i;
        if (!batch[i].excluded)
            continue;
        ASSERT_LT(expected, exclusions.value.size());
        const ExclusionRecord &record = exclusions.value[expected++];
        EXPECT_EQ(record.readingId, ids.value[i]);
        EXPECT_TRUE(record.excluded);
        EXPECT_EQ(record.reason, "marked excluded in data.csv line " + std::to_string(i + 2));
        EXPECT_EQ(record.author, "A. Importer");
    }
    EXPECT_EQ(exclusions.value.size(), expected);
    EXPECT_EQ(expected, 21u); // i % 7 == 3 below 150
}

TEST(SessionStoreBulk, ABlankReasonOrAuthorRefusesTheWholeBatch)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("refused.sagline"), sampleSession());
    ASSERT_TRUE(created.ok());
    const std::vector<Reading> batch = markedBatch(40);
    MarkedExclusions blankReason{"A. Importer", [](std::size_t i) { return i == 10 ? std::string(" ") : "drift"; }};
    const auto refused = created.value->appendReadings(batch, &blankReason);
    EXPECT_EQ(refused.code, StoreCode::InvalidArgument);
    EXPECT_NE(refused.message.find("reading 11: exclusion: a reason is required"), std::string::npos) << refused.message;
    MarkedExclusions blankAuthor{"", [](std::size_t) { return std::string("drift"); }};
    EXPECT_EQ(created.value->appendReadings(batch, &blankAuthor).code, StoreCode::InvalidArgument);
    EXPECT_EQ(created.value->readingCount().value, 0);
    EXPECT_TRUE(created.value->exclusions().value.empty());
}

TEST(SessionStoreBulk, AFailedWriteAnywhereRecordsNothing)
{
    // After SQLite's test/writecrash.test: fail the Nth write of the batch for N = 0, 1, ...
    // until it gets through; each failure leaves the readings recorded before, and only them.
    TempFolder folder;
    FaultVfsScope vfs;
    ASSERT_TRUE(vfs.isRegistered());
    const std::string path = folder.file("fault.sagline");
    {
        auto created = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(created.ok()) << created.message;
        ASSERT_TRUE(created.value->appendReading(sampleReading(0, 0.0, 26.4)).ok());
    }
    const std::vector<Reading> batch = markedBatch(300);
    const MarkedExclusions marked = marks();
    std::int64_t recorded = 1;
    int failed = 0;
    for (int allowed = 0; allowed < 200; ++allowed) {
        auto opened = SessionStore::openForWriting(path);
        ASSERT_TRUE(opened.ok()) << opened.message;
        faultPlan() = {allowed, SQLITE_IOERR_WRITE, 0};
        const auto ids = opened.value->appendReadings(batch, &marked);
        const bool injected = faultPlan().failures > 0;
        faultPlan() = {};
        if (ids.ok()) {
            recorded += static_cast<std::int64_t>(batch.size());
        } else {
            ++failed;
            EXPECT_EQ(ids.code, StoreCode::IoError) << ids.message;
            EXPECT_NE(ids.message.find("none was recorded"), std::string::npos) << ids.message;
        }
        opened.value.reset();
        auto check = SessionStore::openForReview(path);
        ASSERT_TRUE(check.ok()) << check.message;
        EXPECT_TRUE(check.value->integrityCheck().ok());
        EXPECT_EQ(check.value->readingCount().value, recorded) << "after failing at write " << allowed;
        EXPECT_EQ(check.value->exclusions().value.size(), static_cast<std::size_t>((recorded - 1) / 300 * 43));
        if (!injected)
            break;
    }
    EXPECT_GE(failed, 3) << "the fault VFS hardly ever fired; the test proved little";
}
