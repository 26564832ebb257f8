// Opening files from other people (sqlite.org security.html, "Defense Against the Dark Arts"):
// every kind of bad file gets a clear status and message, never a crash, and opening for
// review never changes a byte of the file. Also the schema upgrade path from version 1.
#include "SessionSchema.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>
#include <sqlite3.h>

#include <filesystem>

using namespace sagline;
using sagline::test::fileBytes;
using sagline::test::sampleReading;
using sagline::test::sampleSession;
using sagline::test::TempFolder;
using sagline::test::writeBytes;

namespace {

// Runs SQL on a file directly, as someone with the sqlite3 shell would.
void tamper(const std::string &path, const char *sql)
{
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    char *error = nullptr;
    const int rc = sqlite3_exec(db, sql, nullptr, nullptr, &error);
    EXPECT_EQ(rc, SQLITE_OK) << (error ? error : "");
    sqlite3_free(error);
    ASSERT_EQ(sqlite3_close(db), SQLITE_OK);
}

std::string makeSession(const TempFolder &folder, const std::string &name, int readings)
{
    const std::string path = folder.file(name);
    auto created = SessionStore::create(path, sampleSession());
    EXPECT_TRUE(created.ok()) << created.message;
    for (int k = 0; k < readings; ++k)
        EXPECT_TRUE(created.value->appendReading(sampleReading(k, 0.01 * k, 26.4 - 0.012 * k)).ok());
    return path;
}

// Both ways of opening must refuse with `code`, and the review attempt must leave the file as it was.
void expectRefused(const std::string &path, StoreCode code, const std::string &wordInMessage)
{
    const std::string before = fileBytes(path);
    const auto review = SessionStore::openForReview(path);
    EXPECT_EQ(review.code, code) << toString(review.code) << ": " << review.message;
    EXPECT_NE(review.message.find(wordInMessage), std::string::npos) << review.message;
    EXPECT_EQ(fileBytes(path), before) << "opening for review changed the file";
    const auto writing = SessionStore::openForWriting(path);
    EXPECT_EQ(writing.code, code) << writing.message;
}

} // namespace

TEST(SessionStoreUntrusted, MissingFileIsCannotOpen)
{
    TempFolder folder;
    const auto opened = SessionStore::openForReview(folder.file("absent.sagline"));
    EXPECT_EQ(opened.code, StoreCode::CannotOpen);
    EXPECT_NE(opened.message.find("no such file"), std::string::npos) << opened.message;
    EXPECT_FALSE(std::filesystem::exists(folder.file("absent.sagline"))) << "opening must never create a file";
}

TEST(SessionStoreUntrusted, EmptyAndTextFilesAreNotSessions)
{
    TempFolder folder;
    writeBytes(folder.file("empty.sagline"), "");
    expectRefused(folder.file("empty.sagline"), StoreCode::NotASession, "empty");
    writeBytes(folder.file("readings.sagline"), "current_a,voltage_v\n0.1,26.3\n");
    expectRefused(folder.file("readings.sagline"), StoreCode::NotASession, "not an SQLite database");
}

TEST(SessionStoreUntrusted, OtherSqliteDatabaseIsNotASession)
{
    TempFolder folder;
    const std::string path = folder.file("other.sagline");
    tamper(path, "CREATE TABLE reading (x); INSERT INTO reading VALUES (1);");
    expectRefused(path, StoreCode::NotASession, "not a Sagline session");
}

TEST(SessionStoreUntrusted, TruncatedFileIsCorrupt)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "cut.sagline", 300);
    const std::string bytes = fileBytes(path);
    writeBytes(path, bytes.substr(0, bytes.size() / 2));
    expectRefused(path, StoreCode::Corrupt, "truncated");
    writeBytes(path, bytes.substr(0, 60)); // not even a whole header
    expectRefused(path, StoreCode::Corrupt, "truncated");
}

TEST(SessionStoreUntrusted, DamagedPagesAreCorrupt)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "damaged.sagline", 300);
    std::string bytes = fileBytes(path);
    const std::size_t pageSize = 4096;
    ASSERT_GT(bytes.size(), 6 * pageSize);
    for (std::size_t i = 3 * pageSize + 8; i < 5 * pageSize; i += 7)
        bytes[i] = static_cast<char>(bytes[i] ^ 0x5A); // scribble over two b-tree pages
    writeBytes(path, bytes);
    expectRefused(path, StoreCode::Corrupt, "damaged");
}

TEST(SessionStoreUntrusted, TriggerIsRejected)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "trigger.sagline", 3);
    tamper(path, "CREATE TRIGGER wipe AFTER INSERT ON note BEGIN DELETE FROM reading; END;");
    expectRefused(path, StoreCode::UnexpectedSchema, "trigger named 'wipe'");
}

TEST(SessionStoreUntrusted, ViewIsRejected)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "view.sagline", 3);
    tamper(path, "CREATE VIEW reading_view AS SELECT * FROM reading;");
    expectRefused(path, StoreCode::UnexpectedSchema, "view named 'reading_view'");
}

TEST(SessionStoreUntrusted, UnknownTableAndMissingTableAreRejected)
{
    TempFolder folder;
    const std::string extra = makeSession(folder, "extra.sagline", 1);
    tamper(extra, "CREATE TABLE payload (x);");
    expectRefused(extra, StoreCode::UnexpectedSchema, "payload");
    const std::string missing = makeSession(folder, "missing.sagline", 1);
    tamper(missing, "DROP TABLE note;");
    expectRefused(missing, StoreCode::UnexpectedSchema, "'note'");
}

TEST(SessionStoreUntrusted, CraftedNonFiniteValueIsReportedNotLoaded)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "inf.sagline", 2);
    tamper(path, "UPDATE reading SET voltage_v = 1e999 WHERE id = 2;"); // 1e999 is +Inf in SQLite
    auto opened = SessionStore::openForReview(path);
    ASSERT_TRUE(opened.ok()) << opened.message;
    const auto readings = opened.value->readings();
    EXPECT_EQ(readings.code, StoreCode::Corrupt);
    EXPECT_NE(readings.message.find("reading row 2"), std::string::npos) << readings.message;
}

TEST(SessionStoreUntrusted, ReviewNeverModifiesTheFile)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "review.sagline", 50);
    const std::string before = fileBytes(path);
    const auto modifiedBefore = std::filesystem::last_write_time(path);
    {
        auto opened = SessionStore::openForReview(path);
        ASSERT_TRUE(opened.ok()) << opened.message;
        EXPECT_TRUE(opened.value->readings().ok());
        EXPECT_TRUE(opened.value->signOffs().ok());
        EXPECT_TRUE(opened.value->integrityCheck().ok());
        EXPECT_TRUE(opened.value->saveCopyAs(folder.file("copy.sagline")).ok());
    }
    EXPECT_EQ(fileBytes(path), before);
    EXPECT_EQ(std::filesystem::last_write_time(path), modifiedBefore);
    EXPECT_FALSE(std::filesystem::exists(path + "-journal"));
}

TEST(SessionStoreUntrusted, NewerSchemaOpensReadOnlyWithNotice)
{
    TempFolder folder;
    const std::string path = makeSession(folder, "future.sagline", 4);
    tamper(path, "CREATE TABLE calibration (id INTEGER PRIMARY KEY, text TEXT); PRAGMA user_version = 7;");
    const std::string before = fileBytes(path);
    auto review = SessionStore::openForReview(path);
    ASSERT_TRUE(review.ok()) << review.message;
    EXPECT_TRUE(review.value->isReadOnly());
    EXPECT_NE(review.value->notice().find("newer Sagline (schema version 7"), std::string::npos) << review.value->notice();
    EXPECT_EQ(review.value->readingCount().value, 4);
    EXPECT_EQ(fileBytes(path), before);
    const auto writing = SessionStore::openForWriting(path);
    EXPECT_EQ(writing.code, StoreCode::NewerVersion);
    EXPECT_NE(writing.message.find("open it for review"), std::string::npos) << writing.message;
}

// A file as the first release wrote it: the version-1 baseline only, no sign_off table.
TEST(SessionStoreMigration, ReviewOfVersionOneUpgradesACopyOnly)
{
    TempFolder folder;
    const std::string path = folder.file("v1.sagline");
    {
        sqlite3 *db = nullptr;
        ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
        ASSERT_TRUE(createBaselineSchema(db).ok());
        ASSERT_EQ(sqlite3_exec(db,
                               "INSERT INTO session VALUES (1, '2026-01-01T00:00:00.000Z', '0.0.1', 'Old', 'SN-OLD', '{}', '');"
                               "INSERT INTO reading (time_utc, step, current_a, voltage_v, flags, raw_text) "
                               "VALUES ('2026-01-01T00:00:01.000Z', 0, 0.0, 12.6, 0, '');",
                               nullptr, nullptr, nullptr),
                  SQLITE_OK);
        ASSERT_EQ(sqlite3_close(db), SQLITE_OK);
    }
    const std::string before = fileBytes(path);
    {
        auto review = SessionStore::openForReview(path);
        ASSERT_TRUE(review.ok()) << review.message;
        EXPECT_EQ(review.value->fileSchemaVersion(), 1);
        EXPECT_EQ(review.value->readingCount().value, 1);
        const auto signOffs = review.value->signOffs(); // table exists in the upgraded copy
        ASSERT_TRUE(signOffs.ok()) << signOffs.message;
        EXPECT_TRUE(signOffs.value.empty());
    }
    EXPECT_EQ(fileBytes(path), before) << "review must not upgrade the file on disk";

    auto writing = SessionStore::openForWriting(path);
    ASSERT_TRUE(writing.ok()) << writing.message;
    EXPECT_TRUE(writing.value->addSignOff("Lab Lead", ReviewDecision::Accepted, "migrated file").ok());
    writing.value.reset();
    auto again = SessionStore::openForReview(path);
    ASSERT_TRUE(again.ok()) << again.message;
    EXPECT_EQ(again.value->fileSchemaVersion(), sessionSchemaVersion);
    EXPECT_EQ(again.value->signOffs().value.size(), 1u);
    EXPECT_EQ(again.value->info().value.unitSerial, "SN-OLD");
}
