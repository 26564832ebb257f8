// Sign-off is the review's only write: one new sign_off row and nothing else. Every other
// table is dumped row by row (raw SQLite, not through the store) before and after.
#include "ReviewTestSupport.h"
#include "SessionSchema.h"
#include "SessionSignOff.h"

#include <gtest/gtest.h>
#include <sqlite3.h>

#include <map>

using namespace sagline;
using namespace sagline::test;

namespace {

// table name -> every row as text, in rowid order; plus the schema and user_version.
std::map<std::string, std::vector<std::string>> dumpTables(const std::string &path)
{
    std::map<std::string, std::vector<std::string>> tables;
    sqlite3 *db = nullptr;
    EXPECT_EQ(sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr), SQLITE_OK);
    std::vector<std::string> names;
    sqlite3_stmt *list = nullptr;
    sqlite3_prepare_v2(db, "SELECT name, sql FROM sqlite_schema ORDER BY name", -1, &list, nullptr);
    while (sqlite3_step(list) == SQLITE_ROW) {
        const std::string name = reinterpret_cast<const char *>(sqlite3_column_text(list, 0));
        const unsigned char *sql = sqlite3_column_text(list, 1);
        tables["(schema)"].push_back(name + ": " + (sql ? reinterpret_cast<const char *>(sql) : ""));
        if (sql && std::string(reinterpret_cast<const char *>(sql)).rfind("CREATE TABLE", 0) == 0)
            names.push_back(name);
    }
    sqlite3_finalize(list);
    for (const auto &name : names) {
        sqlite3_stmt *rows = nullptr;
        const std::string sql = "SELECT * FROM \"" + name + "\" ORDER BY rowid";
        EXPECT_EQ(sqlite3_prepare_v2(db, sql.c_str(), -1, &rows, nullptr), SQLITE_OK) << name;
        auto &out = tables[name];
        while (sqlite3_step(rows) == SQLITE_ROW) {
            std::string line;
            for (int c = 0; c < sqlite3_column_count(rows); ++c) {
                const unsigned char *text = sqlite3_column_text(rows, c);
                line += std::string(sqlite3_column_name(rows, c)) + "=" + (text ? reinterpret_cast<const char *>(text) : "NULL") + "|";
            }
            out.push_back(line);
        }
        sqlite3_finalize(rows);
    }
    sqlite3_stmt *version = nullptr;
    sqlite3_prepare_v2(db, "PRAGMA user_version", -1, &version, nullptr);
    if (sqlite3_step(version) == SQLITE_ROW)
        tables["(user_version)"].push_back(std::to_string(sqlite3_column_int(version, 0)));
    sqlite3_finalize(version);
    sqlite3_close(db);
    return tables;
}

std::string makeRichSession(const TempFolder &folder)
{
    const std::string path = makeDemoSession(folder.file("signed.sagline"), DemoUnit{});
    auto store = SessionStore::openForWriting(path);
    EXPECT_TRUE(store.ok()) << store.message;
    const auto readings = store.value->readings().value;
    store.value->excludeReading(readings[2].id, "clip fell off", "A. Tester");
    store.value->recordTemperature(TemperatureKind::Winding, 41.0, "thermocouple at end");
    store.value->addNote("A. Tester", "fan on");
    SafetyStopRecord stop;
    stop.step = 10;
    stop.rule = "output-va";
    stop.message = "above rated VA";
    stop.measured = 51.0;
    stop.limitValue = 50.0;
    store.value->recordSafetyStop(stop);
    store.value->addSignOff("First Reviewer", ReviewDecision::Retest, "repeat at 80 %");
    // A sign-off seals the session: the next one needs it reopened first.
    store.value->setActor({"First Reviewer", ""});
    store.value->reopen("repeated at 80 %, ready for a second look");
    return path;
}

} // namespace

TEST(SessionSignOff, WritesOnlyOneNewSignOffRow)
{
    TempFolder folder;
    const std::string path = makeRichSession(folder);
    const auto before = dumpTables(path);
    ASSERT_EQ(before.at("sign_off").size(), 1u);
    ASSERT_FALSE(before.at("reading").empty());

    const auto id = signOffSession(path, {"Lab Lead", ReviewDecision::Accepted, "matches the batch"});
    ASSERT_TRUE(id.ok()) << id.message;

    const auto after = dumpTables(path);
    ASSERT_EQ(after.size(), before.size());
    for (const auto &[table, rows] : before) {
        if (table == "sign_off")
            continue;
        EXPECT_EQ(after.at(table), rows) << "table " << table << " changed";
    }
    const auto &signOffs = after.at("sign_off");
    ASSERT_EQ(signOffs.size(), 2u);
    EXPECT_EQ(signOffs[0], before.at("sign_off")[0]); // the earlier sign-off is untouched
    EXPECT_NE(signOffs[1].find("reviewer=Lab Lead|"), std::string::npos) << signOffs[1];
    EXPECT_NE(signOffs[1].find("verdict=accepted|"), std::string::npos) << signOffs[1];
    EXPECT_NE(signOffs[1].find("comment=matches the batch|"), std::string::npos) << signOffs[1];
    EXPECT_NE(signOffs[1].find("Z|"), std::string::npos) << "time must be UTC: " << signOffs[1];

    auto review = SessionStore::openForReview(path);
    ASSERT_TRUE(review.ok());
    const auto history = review.value->signOffs().value;
    ASSERT_EQ(history.size(), 2u);
    EXPECT_EQ(history[1].decision, ReviewDecision::Accepted);
}

TEST(SessionSignOff, IncompleteRequestChangesNothing)
{
    TempFolder folder;
    const std::string path = makeRichSession(folder);
    const std::string before = fileBytes(path);
    auto result = signOffSession(path, {"   ", ReviewDecision::Accepted, ""});
    EXPECT_EQ(result.code, StoreCode::InvalidArgument);
    EXPECT_NE(result.message.find("reviewer"), std::string::npos);
    result = signOffSession(path, {"Lab Lead", ReviewDecision::Rejected, ""});
    EXPECT_EQ(result.code, StoreCode::InvalidArgument);
    EXPECT_NE(result.message.find("comment"), std::string::npos);
    EXPECT_EQ(fileBytes(path), before);
}

TEST(SessionSignOff, OlderAndNewerSchemasAreRefusedUnchanged)
{
    TempFolder folder;
    const std::string older = folder.file("v1.sagline");
    {
        sqlite3 *db = nullptr;
        ASSERT_EQ(sqlite3_open(older.c_str(), &db), SQLITE_OK);
        ASSERT_TRUE(createBaselineSchema(db).ok());
        ASSERT_EQ(sqlite3_exec(db, "INSERT INTO session VALUES (1, '2026-01-01T00:00:00.000Z', '0.0.1', 'Old', 'SN-OLD', '{}', '');",
                               nullptr, nullptr, nullptr),
                  SQLITE_OK);
        sqlite3_close(db);
    }
    std::string before = fileBytes(older);
    auto result = signOffSession(older, {"Lab Lead", ReviewDecision::Accepted, ""});
    EXPECT_FALSE(result.ok());
    EXPECT_NE(result.message.find("older"), std::string::npos) << result.message;
    EXPECT_EQ(fileBytes(older), before);

    const std::string newer = makeDemoSession(folder.file("newer.sagline"), DemoUnit{});
    runSql(newer, "CREATE TABLE calibration (id INTEGER PRIMARY KEY); PRAGMA user_version = 9;");
    before = fileBytes(newer);
    result = signOffSession(newer, {"Lab Lead", ReviewDecision::Accepted, ""});
    EXPECT_EQ(result.code, StoreCode::NewerVersion) << result.message;
    EXPECT_EQ(fileBytes(newer), before);

    result = signOffSession(folder.file("missing.sagline"), {"Lab Lead", ReviewDecision::Accepted, ""});
    EXPECT_EQ(result.code, StoreCode::CannotOpen) << result.message;
}
