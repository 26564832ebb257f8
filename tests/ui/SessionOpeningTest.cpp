// Opening a session in the window never changes it: a file written by an older Sagline is
// shown read-only instead of being migrated on disk (a copy saved from it is in the current
// format), and a session another program is writing is shown for review, naming the holder.
#include "UiTestSupport.h"

#include "PlanJson.h"
#include "SessionSchema.h"
#include "SessionStore.h"
#include "SetupJson.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QFile>
#include <QTemporaryDir>

#include <sqlite3.h>
#include <unistd.h>

using namespace sagline;
using namespace sagline::test;

namespace {

QByteArray bytesOf(const QString &path)
{
    QFile file(path);
    return file.open(QIODevice::ReadOnly) ? file.readAll() : QByteArray();
}

// A file as the first release wrote it: the version-1 baseline with the demo setup and a reading.
void writeVersionOneSession(const QString &path)
{
    const auto setup = loadSetupFile(SAGLINE_SOURCE_DIR "/resources/demo-setup.json");
    ASSERT_TRUE(setup.setup.has_value());
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.toStdString().c_str(), &db), SQLITE_OK);
    ASSERT_TRUE(createBaselineSchema(db).ok());
    sqlite3_stmt *insert = nullptr;
    ASSERT_EQ(sqlite3_prepare_v2(db, "INSERT INTO session VALUES (1, '2026-01-01T00:00:00.000Z', '0.0.1', 'Old', 'SN-OLD', ?, '')",
                                 -1, &insert, nullptr),
              SQLITE_OK);
    const std::string json = setupToJson(*setup.setup);
    sqlite3_bind_text(insert, 1, json.c_str(), -1, SQLITE_TRANSIENT);
    ASSERT_EQ(sqlite3_step(insert), SQLITE_DONE);
    sqlite3_finalize(insert);
    ASSERT_EQ(sqlite3_exec(db,
                           "INSERT INTO reading (time_utc, step, current_a, voltage_v, flags, raw_text) "
                           "VALUES ('2026-01-01T00:00:01.000Z', 0, 0.0, 19.6, 0, '');",
                           nullptr, nullptr, nullptr),
              SQLITE_OK);
    ASSERT_EQ(sqlite3_close(db), SQLITE_OK);
}

} // namespace

TEST(SessionOpening, AnOlderSessionIsShownReadOnlyAndNotMigrated)
{
    // Reproducer: merely opening a version-1 session in the window migrated it on disk.
    QTemporaryDir folder;
    const QString path = folder.filePath(QStringLiteral("old.sagline"));
    writeVersionOneSession(path);
    const QByteArray before = bytesOf(path);
    auto window = demoWindow(folder.path());
    ASSERT_TRUE(window->openSessionFile(path)) << window->lastMessage().toStdString();
    SessionStore *store = window->workspace()->store();
    ASSERT_NE(store, nullptr);
    EXPECT_TRUE(store->isReadOnly());
    EXPECT_EQ(window->workspace()->readings().size(), 1u);
    EXPECT_TRUE(window->lastMessage().contains(QStringLiteral("for review only"))) << window->lastMessage().toStdString();
    EXPECT_TRUE(window->lastMessage().contains(QStringLiteral("older Sagline"))) << window->lastMessage().toStdString();
    // A copy saved from it is in the current format, with the same reading.
    const QString copy = folder.filePath(QStringLiteral("copy.sagline"));
    ASSERT_TRUE(store->saveCopyAs(copy.toStdString()).ok());
    window.reset();
    EXPECT_EQ(bytesOf(path), before) << "opening must not change the file";
    auto reopened = SessionStore::openForReview(copy.toStdString());
    ASSERT_TRUE(reopened.ok()) << reopened.message;
    EXPECT_EQ(reopened.value->fileSchemaVersion(), sessionSchemaVersion);
    EXPECT_EQ(reopened.value->readings().value.size(), 1u);
}

TEST(SessionOpening, ASessionBeingWrittenElsewhereIsShownForReviewNamingTheWriter)
{
    QTemporaryDir folder;
    const QString path = folder.filePath(QStringLiteral("busy.sagline"));
    NewSession session;
    const auto setup = loadSetupFile(SAGLINE_SOURCE_DIR "/resources/demo-setup.json");
    session.setupJson = setupToJson(*setup.setup);
    session.planJson = planToJson(*makePlan(*setup.setup).plan);
    session.operatorName = "Writer";
    session.unitSerial = "BUSY-1";
    auto writer = SessionStore::create(path.toStdString(), session); // another program, as far as the window knows
    ASSERT_TRUE(writer.ok()) << writer.message;
    auto window = demoWindow(folder.path());
    ASSERT_TRUE(window->openSessionFile(path)) << window->lastMessage().toStdString();
    EXPECT_TRUE(window->workspace()->store()->isReadOnly());
    const QString shown = window->lastMessage();
    EXPECT_TRUE(shown.contains(QStringLiteral("being written by process %1").arg(::getpid()))) << shown.toStdString();
    // The writer goes on undisturbed.
    Reading reading;
    reading.step = 0;
    reading.currentA = 0.0;
    reading.voltageV = 19.6;
    EXPECT_TRUE(writer.value->appendReading(reading).ok());
}

TEST(SessionOpening, AStoredSetupNestedTooDeeplyIsNamedNotACrash)
{
    // Reproducer: a session whose stored setup held a value nested 50 000 arrays deep crashed
    // the window on opening (stack overflow while building the error message).
    QTemporaryDir folder;
    const QString path = folder.filePath(QStringLiteral("deep.sagline"));
    NewSession session;
    session.setupJson = R"({"nameplate": )" + std::string(50000, '[') + "1" + std::string(50000, ']') + "}";
    session.planJson = "{}";
    session.operatorName = "Attacker";
    session.unitSerial = "X-1";
    {
        auto store = SessionStore::create(path.toStdString(), session);
        ASSERT_TRUE(store.ok()) << store.message;
        Reading reading;
        reading.step = 0;
        reading.voltageV = 19.6;
        ASSERT_TRUE(store.value->appendReading(reading).ok());
    }
    const QByteArray before = bytesOf(path);
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    window->openSessionFile(path); // shown for review or refused; either way it says why
    const QString said = window->lastMessage();
    EXPECT_TRUE(said.contains(QStringLiteral("nested more than 32 levels deep"))) << said.toStdString();
    EXPECT_TRUE(said.contains(QStringLiteral("stored setup cannot be read"))) << said.toStdString();
    EXPECT_LT(said.size(), 2000) << "the hostile text was echoed";
    // The form shows no nameplate rather than the demo's (or the last session's).
    EXPECT_TRUE(window->setupForm()->quantityField(QStringLiteral("nameplate.rated_power_va"))->text().isEmpty());
    EXPECT_EQ(window->workspace()->readings().size(), 1u);
    // The window still works: New gives the program's defaults.
    QTest::keyClick(window.get(), Qt::Key_N, Qt::ControlModifier);
    EXPECT_FALSE(window->workspace()->store());
    window.reset();
    EXPECT_EQ(bytesOf(path), before) << "opening must not change the file";
}
