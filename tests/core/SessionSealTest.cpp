// The sealed sign-off, who did what, and retakes: a signed session refuses changes until it is
// reopened with a reason; the digest tells an altered file (edited with plain SQLite here)
// from an intact one; every record carries the person and the OS account.
#include "OsAccount.h"
#include "SessionSeal.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>
#include <sqlite3.h>

using namespace sagline;
using namespace sagline::test;

namespace {

void rawExec(const std::string &path, const char *sql)
{
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    char *error = nullptr;
    const int rc = sqlite3_exec(db, sql, nullptr, nullptr, &error);
    EXPECT_EQ(rc, SQLITE_OK) << (error ? error : "");
    sqlite3_free(error);
    sqlite3_close(db);
}

// A session with three readings, one excluded, a note, signed off by a reviewer.
std::string signedSession(const TempFolder &folder, const std::string &name = "signed.sagline")
{
    const std::string path = folder.file(name);
    auto created = SessionStore::create(path, sampleSession());
    EXPECT_TRUE(created.ok()) << created.message;
    SessionStore &store = *created.value;
    store.setActor({"B. Operator", ""});
    std::int64_t first = 0;
    for (int step = 0; step < 3; ++step) {
        const auto id = store.appendReading(sampleReading(step, 0.5 * step, 26.4 - 0.9 * step));
        EXPECT_TRUE(id.ok()) << id.message;
        if (step == 0)
            first = id.value;
    }
    EXPECT_TRUE(store.excludeReading(first, "lead loose", "B. Operator").ok());
    EXPECT_TRUE(store.addNote("B. Operator", "fan on").ok());
    store.setActor({"C. Lead", ""});
    const auto signedOff = store.addSignOff("C. Lead", ReviewDecision::Accepted, "");
    EXPECT_TRUE(signedOff.ok()) << signedOff.message;
    return path;
}

SealReport sealOf(const std::string &path)
{
    auto review = SessionStore::openForReview(path);
    EXPECT_TRUE(review.ok()) << review.message;
    auto report = checkSeal(*review.value);
    EXPECT_TRUE(report.ok()) << report.message;
    return report.value;
}

} // namespace

TEST(SessionSeal, SignedSessionRefusesEveryChangeUntilReopened)
{
    TempFolder folder;
    const std::string path = signedSession(folder);
    auto store = SessionStore::openForWriting(path);
    ASSERT_TRUE(store.ok()) << store.message;
    EXPECT_TRUE(store.value->isSealed());
    const auto readings = store.value->readings().value;
    EXPECT_EQ(store.value->excludeReading(readings[2].id, "too high", "D. Someone").code, StoreCode::Sealed);
    EXPECT_EQ(store.value->restoreReading(readings[0].id, "fixed", "D. Someone").code, StoreCode::Sealed);
    EXPECT_EQ(store.value->addNote("D. Someone", "after the fact").code, StoreCode::Sealed);
    EXPECT_EQ(store.value->appendReading(sampleReading(3, 1.5, 23.7)).code, StoreCode::Sealed);
    EXPECT_EQ(store.value->recordTemperature(TemperatureKind::Ambient, 22.0, "room").code, StoreCode::Sealed);
    EXPECT_EQ(store.value->addSignOff("D. Someone", ReviewDecision::Rejected, "no").code, StoreCode::Sealed);
    EXPECT_EQ(store.value->readingCount().value, 3);
    EXPECT_EQ(sealOf(path).state, SealState::Signed);
}

TEST(SessionSeal, ReopenNeedsAPersonAndAReasonAndRecordsBoth)
{
    TempFolder folder;
    const std::string path = signedSession(folder);
    auto store = SessionStore::openForWriting(path);
    ASSERT_TRUE(store.ok());
    store.value->setActor({"", ""});
    EXPECT_EQ(store.value->reopen("typo in a reading").code, StoreCode::InvalidArgument);
    store.value->setActor({"D. Lead", ""});
    EXPECT_EQ(store.value->reopen("  ").code, StoreCode::InvalidArgument);
    ASSERT_TRUE(store.value->reopen("full-load point to be excluded").ok());
    EXPECT_FALSE(store.value->isSealed());
    const auto readings = store.value->readings().value;
    ASSERT_TRUE(store.value->excludeReading(readings[2].id, "clip fell off", "D. Lead").ok());

    const SealReport report = sealOf(path);
    EXPECT_EQ(report.state, SealState::ChangedAfterSignOff);
    ASSERT_TRUE(report.reopen);
    EXPECT_EQ(report.reopen->actor.person, "D. Lead");
    EXPECT_EQ(report.reopen->actor.osAccount, currentOsAccount());
    EXPECT_EQ(report.reopen->reason, "full-load point to be excluded");
    EXPECT_NE(report.summary().find("changed after sign-off"), std::string::npos) << report.summary();
    EXPECT_NE(report.summary().find("D. Lead"), std::string::npos);
    EXPECT_TRUE(report.findings.empty());
}

TEST(SessionSeal, SecondSignOffAfterReopenSealsAgainAndBothDigestsHold)
{
    TempFolder folder;
    const std::string path = signedSession(folder);
    {
        auto store = SessionStore::openForWriting(path);
        ASSERT_TRUE(store.ok());
        store.value->setActor({"D. Lead", ""});
        ASSERT_TRUE(store.value->reopen("one more note").ok());
        ASSERT_TRUE(store.value->addNote("D. Lead", "checked the fuse").ok());
        ASSERT_TRUE(store.value->addSignOff("D. Lead", ReviewDecision::Accepted, "").ok());
    }
    const SealReport report = sealOf(path);
    EXPECT_EQ(report.state, SealState::Signed) << report.summary();
    EXPECT_TRUE(report.findings.empty());
    ASSERT_TRUE(report.signOff);
    EXPECT_EQ(report.signOff->reviewer, "D. Lead");
    EXPECT_EQ(report.signOff->digest.size(), 64u);
}

TEST(SessionSeal, DigestRevealsAReadingEditedOutsideSagline)
{
    TempFolder folder;
    const std::string path = signedSession(folder);
    ASSERT_EQ(sealOf(path).state, SealState::Signed);
    rawExec(path, "UPDATE reading SET voltage_v = 24.0 WHERE id = 3");
    const SealReport report = sealOf(path);
    EXPECT_EQ(report.state, SealState::Altered);
    ASSERT_FALSE(report.findings.empty());
    EXPECT_NE(report.summary().find("no longer matches its SHA-256 digest"), std::string::npos) << report.summary();
}

TEST(SessionSeal, DigestRevealsAnEditedSignOffAndAnAddedRow)
{
    TempFolder folder;
    const std::string renamed = signedSession(folder, "renamed.sagline");
    rawExec(renamed, "UPDATE sign_off SET reviewer = 'Someone Else'");
    EXPECT_EQ(sealOf(renamed).state, SealState::Altered);

    const std::string added = signedSession(folder, "added.sagline");
    rawExec(added, "INSERT INTO exclusion (reading_id, excluded, reason, author, time_utc) "
                   "VALUES (3, 1, 'quietly', 'X', '2026-12-02T11:00:00.000Z')");
    const SealReport report = sealOf(added);
    EXPECT_EQ(report.state, SealState::Altered);
    EXPECT_NE(report.summary().find("after the sign-off without a reopen"), std::string::npos) << report.summary();
}

TEST(SessionSeal, UnsignedSessionIsNotSigned)
{
    TempFolder folder;
    const std::string path = folder.file("open.sagline");
    ASSERT_TRUE(SessionStore::create(path, sampleSession()).ok());
    const SealReport report = sealOf(path);
    EXPECT_EQ(report.state, SealState::NotSigned);
    EXPECT_EQ(report.summary(), "not signed off");
}

TEST(SessionActor, EveryRecordCarriesThePersonAndTheOsAccount)
{
    TempFolder folder;
    const std::string path = folder.file("who.sagline");
    NewSession session = sampleSession();
    session.createdBy = {"B. Operator", ""};
    auto created = SessionStore::create(path, session);
    ASSERT_TRUE(created.ok());
    SessionStore &store = *created.value;
    const std::string account = currentOsAccount();
    EXPECT_FALSE(account.empty());
    const auto reading = store.appendReading(sampleReading(1, 0.5, 25.5));
    ASSERT_TRUE(reading.ok());
    store.setActor({"E. Checker", ""}); // someone else takes the keyboard
    ASSERT_TRUE(store.excludeReading(reading.value, "misread", "E. Checker").ok());
    ASSERT_TRUE(store.addNote("E. Checker", "meter swapped").ok());
    ASSERT_TRUE(store.recordTemperature(TemperatureKind::Winding, 35.0, "thermocouple").ok());

    const auto info = store.info().value;
    EXPECT_EQ(info.createdBy.person, "B. Operator");
    EXPECT_EQ(info.createdBy.osAccount, account);
    const auto temperatures = store.temperatures().value;
    EXPECT_EQ(temperatures.front().actor.person, "B. Operator"); // entered at the start
    EXPECT_EQ(temperatures.back().actor.person, "E. Checker");
    EXPECT_EQ(store.exclusions().value.back().author, "E. Checker");
    EXPECT_EQ(store.exclusions().value.back().osAccount, account);
    EXPECT_EQ(store.notes().value.back().actor, (Actor{"E. Checker", account}));
    EXPECT_EQ(store.excludeReading(reading.value, "again", " ").code, StoreCode::InvalidArgument);
}

TEST(SessionRetake, NewReadingSupersedesTheOldOneWhichStays)
{
    TempFolder folder;
    const std::string path = folder.file("retake.sagline");
    auto created = SessionStore::create(path, sampleSession());
    ASSERT_TRUE(created.ok());
    SessionStore &store = *created.value;
    store.setActor({"B. Operator", ""});
    const auto wrong = store.appendReading(sampleReading(2, 417.0, 19.4)); // 417 typed for 0.417 A
    ASSERT_TRUE(wrong.ok());
    EXPECT_EQ(store.appendRetake(sampleReading(2, 0.417, 19.4), wrong.value, " ").code, StoreCode::InvalidArgument);
    const auto retake = store.appendRetake(sampleReading(2, 0.417, 19.4), wrong.value, "typed A for mA");
    ASSERT_TRUE(retake.ok()) << retake.message;
    EXPECT_EQ(store.appendRetake(sampleReading(2, 0.418, 19.4), wrong.value, "again").code, StoreCode::InvalidArgument);
    EXPECT_EQ(store.appendRetake(sampleReading(2, 0.418, 19.4), 999, "none").code, StoreCode::NotFound);

    const auto readings = store.readings().value;
    ASSERT_EQ(readings.size(), 2u);
    EXPECT_TRUE(readings[0].superseded);
    EXPECT_TRUE(readings[0].excluded); // out of every fit
    EXPECT_FALSE(readings[1].superseded);
    EXPECT_FALSE(readings[1].excluded);
    EXPECT_EQ(store.includedReadings().value.size(), 1u);
    const auto history = store.supersessions().value;
    ASSERT_EQ(history.size(), 1u);
    EXPECT_EQ(history[0].readingId, wrong.value);
    EXPECT_EQ(history[0].replacementId, retake.value);
    EXPECT_EQ(history[0].reason, "typed A for mA");
    EXPECT_EQ(history[0].actor.person, "B. Operator");
}

TEST(SessionEvents, SweepEventsReadBackInOrder)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("events.sagline"), sampleSession());
    ASSERT_TRUE(created.ok());
    SessionStore &store = *created.value;
    store.setActor({"B. Operator", ""});
    ASSERT_TRUE(store.recordSweepEvent(SweepEventKind::Started, 0, "").ok());
    ASSERT_TRUE(store.recordSweepEvent(SweepEventKind::Stopped, 4, "operator").ok());
    ASSERT_TRUE(store.recordSweepEvent(SweepEventKind::Resumed, 5, "").ok());
    const auto events = store.sweepEvents().value;
    ASSERT_EQ(events.size(), 3u);
    EXPECT_EQ(events[1].kind, SweepEventKind::Stopped);
    EXPECT_EQ(events[1].step, 4);
    EXPECT_EQ(events[2].kind, SweepEventKind::Resumed);
    EXPECT_EQ(events[2].actor.person, "B. Operator");
}

// Who recorded each reading, read back compactly: the few recorders once each, in order of
// first appearance, and every reading's index into them (a hand change of recorder included).
TEST(ReadingRecordersTest, EachReadingKeepsItsOwnRecorder)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("recorders.sagline"), sampleSession());
    ASSERT_TRUE(created.ok()) << created.message;
    SessionStore &store = *created.value;
    const Actor first{"B. Operator", "bench1"};
    const Actor second{"C. Student", "bench1"};
    const Actor sameNameOtherAccount{"B. Operator", "lab2"};
    const Actor order[] = {first, first, second, first, sameNameOtherAccount, second};
    for (std::size_t i = 0; i < std::size(order); ++i) {
        store.setActor(order[i]);
        ASSERT_TRUE(store.appendReading(sampleReading(static_cast<int>(i), 0.5 * static_cast<double>(i), 26.0)).ok());
    }
    const auto recorders = store.readingRecorders();
    ASSERT_TRUE(recorders.ok()) << recorders.message;
    const ReadingRecorders &r = recorders.value;
    ASSERT_EQ(r.distinct.size(), 3u);
    EXPECT_EQ(r.distinct[0], first);
    EXPECT_EQ(r.distinct[1], second);
    EXPECT_EQ(r.distinct[2], sameNameOtherAccount);
    for (std::size_t i = 0; i < std::size(order); ++i)
        EXPECT_EQ(r.of(i), order[i]) << "reading " << i;
    EXPECT_EQ(r.of(std::size(order)), Actor{}); // past the end
}
