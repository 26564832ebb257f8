// SessionStore: recording and reading back a session, append-only history, Save As.
#include "SessionSchema.h"
#include "SessionSummary.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>

using namespace sagline;
using sagline::test::sampleReading;
using sagline::test::sampleSession;
using sagline::test::TempFolder;

TEST(SessionStore, CreatesSessionAndReadsItBack)
{
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    {
        auto created = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(created.ok()) << created.message;
        auto &store = *created.value;
        EXPECT_FALSE(store.isReadOnly());
        for (int k = 0; k <= 4; ++k) {
            auto id = store.appendReading(sampleReading(k, 0.4 * k, 26.4 - 1.2 * 0.4 * k));
            ASSERT_TRUE(id.ok()) << id.message;
            EXPECT_EQ(id.value, k + 1);
        }
        ASSERT_TRUE(store.recordInstrument("voltmeter", "MAKER,MODEL-1,SN1,1.0", R"({"percent_of_reading":0.05})").ok());
        ASSERT_TRUE(store.addNote("A. Tester", "terminals retightened before step 3").ok());
    }
    auto opened = SessionStore::openForReview(path);
    ASSERT_TRUE(opened.ok()) << opened.message;
    const auto &store = *opened.value;
    EXPECT_TRUE(store.isReadOnly());
    EXPECT_TRUE(store.notice().empty());
    const auto info = store.info();
    ASSERT_TRUE(info.ok()) << info.message;
    EXPECT_EQ(info.value.operatorName, "A. Tester");
    EXPECT_EQ(info.value.unitSerial, "DEMO-0001");
    EXPECT_EQ(info.value.setupJson, sampleSession().setupJson);
    EXPECT_EQ(info.value.planJson, sampleSession().planJson);
    EXPECT_EQ(info.value.schemaVersion, sessionSchemaVersion);

    const auto readings = store.readings();
    ASSERT_TRUE(readings.ok()) << readings.message;
    ASSERT_EQ(readings.value.size(), 5u);
    const Reading expected = sampleReading(3, 1.2, 26.4 - 1.2 * 1.2);
    const Reading &got = readings.value[3];
    EXPECT_EQ(got.id, 4);
    EXPECT_EQ(got.step, 3);
    EXPECT_DOUBLE_EQ(got.currentA, expected.currentA); // REAL is an IEEE double: stored bit for bit
    EXPECT_DOUBLE_EQ(got.voltageV, expected.voltageV);
    EXPECT_EQ(got.uCurrentA, expected.uCurrentA);
    EXPECT_EQ(got.timeUtc, expected.timeUtc);
    EXPECT_EQ(got.rawText, expected.rawText);
    EXPECT_FALSE(got.excluded);

    const auto temperatures = store.temperatures();
    ASSERT_TRUE(temperatures.ok());
    ASSERT_EQ(temperatures.value.size(), 2u);
    EXPECT_EQ(temperatures.value[1].kind, TemperatureKind::Winding);
    EXPECT_DOUBLE_EQ(temperatures.value[1].celsius, 22.0);
    ASSERT_EQ(store.instruments().value.size(), 1u);
    EXPECT_EQ(store.instruments().value[0].identity, "MAKER,MODEL-1,SN1,1.0");
    ASSERT_EQ(store.notes().value.size(), 1u);
}

TEST(SessionStore, RefusesToOverwriteAnExistingFile)
{
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    ASSERT_TRUE(SessionStore::create(path, sampleSession()).ok());
    const auto again = SessionStore::create(path, sampleSession());
    EXPECT_EQ(again.code, StoreCode::FileExists);
}

TEST(SessionStore, RequiresSetupOperatorAndSerial)
{
    TempFolder folder;
    NewSession session = sampleSession();
    session.unitSerial.clear();
    const auto created = SessionStore::create(folder.file("a.sagline"), session);
    EXPECT_EQ(created.code, StoreCode::InvalidArgument);
    EXPECT_NE(created.message.find("unit serial"), std::string::npos) << created.message;
    EXPECT_FALSE(std::filesystem::exists(folder.file("a.sagline")));
}

TEST(SessionStore, ExclusionsAreNewRowsAndTheLatestWins)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("unit.sagline"), sampleSession());
    ASSERT_TRUE(created.ok());
    auto &store = *created.value;
    const auto first = store.appendReading(sampleReading(0, 0.0, 26.4)).value;
    const auto second = store.appendReading(sampleReading(1, 0.2, 26.1)).value;
    ASSERT_TRUE(store.excludeReading(second, "lead slipped", "A. Tester").ok());
    EXPECT_EQ(store.includedReadings().value.size(), 1u);
    ASSERT_TRUE(store.restoreReading(second, "lead was fine, checked photo", "Lab Lead").ok());
    EXPECT_EQ(store.includedReadings().value.size(), 2u);
    ASSERT_TRUE(store.excludeReading(first, "open-circuit point taken before warm-up", "A. Tester").ok());
    const auto included = store.includedReadings().value;
    ASSERT_EQ(included.size(), 1u);
    EXPECT_EQ(included[0].id, second);

    const auto history = store.exclusions().value;
    ASSERT_EQ(history.size(), 3u); // nothing deleted: all three decisions remain
    EXPECT_TRUE(history[0].excluded);
    EXPECT_FALSE(history[1].excluded);
    EXPECT_EQ(history[1].reason, "lead was fine, checked photo");
    EXPECT_EQ(store.readingCount().value, 2);
}

TEST(SessionStore, ExclusionNeedsAReasonAndAnExistingReading)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("unit.sagline"), sampleSession());
    auto &store = *created.value;
    const auto id = store.appendReading(sampleReading(0, 0.0, 26.4)).value;
    EXPECT_EQ(store.excludeReading(id, "", "x").code, StoreCode::InvalidArgument);
    EXPECT_EQ(store.excludeReading(id + 41, "typo", "x").code, StoreCode::NotFound);
    EXPECT_TRUE(store.exclusions().value.empty());
}

TEST(SessionStore, RejectsNonFiniteValuesUnlessFlagged)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("unit.sagline"), sampleSession());
    auto &store = *created.value;
    Reading bad = sampleReading(1, NAN, 26.0);
    EXPECT_EQ(store.appendReading(bad).code, StoreCode::InvalidArgument);
    Reading negativeU = sampleReading(1, 0.1, 26.0);
    negativeU.uVoltageV = -0.1;
    EXPECT_EQ(store.appendReading(negativeU).code, StoreCode::InvalidArgument);
    EXPECT_EQ(store.readingCount().value, 0);

    Reading overload = sampleReading(2, 0.3, INFINITY);
    overload.flags = flagOverload;
    ASSERT_TRUE(store.appendReading(overload).ok());
    const auto back = store.readings().value;
    ASSERT_EQ(back.size(), 1u);
    EXPECT_TRUE(std::isnan(back[0].voltageV)); // "no value", with the flag that says why
    EXPECT_EQ(back[0].flags, flagOverload);
}

TEST(SessionStore, RecordsSafetyStopsAndSignOffs)
{
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    {
        auto created = SessionStore::create(path, sampleSession());
        auto &store = *created.value;
        store.setClock([] { return std::string("2026-12-02T11:00:00.000Z"); });
        SafetyStopRecord stop;
        stop.step = 7;
        stop.rule = "rated-va";
        stop.message = "output 61 VA above the 50 VA limit";
        stop.measured = 61.0;
        stop.limitValue = 50.0;
        ASSERT_TRUE(store.recordSafetyStop(stop).ok());
        ASSERT_TRUE(store.addSignOff("Lab Lead", ReviewDecision::Retest, "repeat from step 6 with a cooler unit").ok());
        EXPECT_EQ(store.addSignOff("", ReviewDecision::Accepted, "").code, StoreCode::InvalidArgument);
    }
    auto opened = SessionStore::openForReview(path);
    ASSERT_TRUE(opened.ok()) << opened.message;
    const auto stops = opened.value->safetyStops().value;
    ASSERT_EQ(stops.size(), 1u);
    EXPECT_EQ(stops[0].step, 7);
    EXPECT_EQ(stops[0].rule, "rated-va");
    EXPECT_EQ(stops[0].measured, 61.0);
    EXPECT_EQ(stops[0].timeUtc, "2026-12-02T11:00:00.000Z");
    const auto signOffs = opened.value->signOffs().value;
    ASSERT_EQ(signOffs.size(), 1u);
    EXPECT_EQ(signOffs[0].decision, ReviewDecision::Retest);
    EXPECT_EQ(signOffs[0].reviewer, "Lab Lead");
}

TEST(SessionStore, ReviewStoreRefusesEveryWrite)
{
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    ASSERT_TRUE(SessionStore::create(path, sampleSession()).ok());
    auto opened = SessionStore::openForReview(path);
    ASSERT_TRUE(opened.ok());
    auto &store = *opened.value;
    EXPECT_EQ(store.appendReading(sampleReading(0, 0, 26)).code, StoreCode::ReadOnly);
    EXPECT_EQ(store.addNote("x", "y").code, StoreCode::ReadOnly);
    EXPECT_EQ(store.addSignOff("x", ReviewDecision::Accepted, "").code, StoreCode::ReadOnly);
}

TEST(SessionStore, ResumesAnExistingSessionAndAppends)
{
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    {
        auto created = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(created.value->appendReading(sampleReading(0, 0, 26.4)).ok());
    }
    auto resumed = SessionStore::openForWriting(path);
    ASSERT_TRUE(resumed.ok()) << resumed.message;
    EXPECT_EQ(resumed.value->appendReading(sampleReading(1, 0.2, 26.2)).value, 2);
    EXPECT_EQ(resumed.value->readingCount().value, 2);
}

TEST(SessionStore, SaveCopyAsWritesACompleteSessionWhileOpen)
{
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    const std::string copy = folder.file("copy.sagline");
    auto created = SessionStore::create(path, sampleSession());
    auto &store = *created.value;
    for (int k = 0; k < 20; ++k)
        ASSERT_TRUE(store.appendReading(sampleReading(k, 0.1 * k, 26.4 - 0.1 * k)).ok());
    ASSERT_TRUE(store.saveCopyAs(copy).ok());
    EXPECT_EQ(store.saveCopyAs(copy).code, StoreCode::FileExists);
    auto opened = SessionStore::openForReview(copy);
    ASSERT_TRUE(opened.ok()) << opened.message;
    EXPECT_EQ(opened.value->readingCount().value, 20);
    EXPECT_TRUE(opened.value->integrityCheck().ok());
    EXPECT_EQ(opened.value->info().value.unitSerial, "DEMO-0001");
}

TEST(SessionStore, LeavesNoSideFileAfterACommit)
{
    // The .sagline alone is complete: no -wal or -journal file remains after a reading is recorded.
    TempFolder folder;
    const std::string path = folder.file("unit.sagline");
    auto created = SessionStore::create(path, sampleSession());
    ASSERT_TRUE(created.value->appendReading(sampleReading(0, 0, 26.4)).ok());
    EXPECT_FALSE(std::filesystem::exists(path + "-wal"));
    EXPECT_FALSE(std::filesystem::exists(path + "-journal"));
    // A plain copy of the file taken between commits (what a user mailing it gets) has the reading.
    std::filesystem::copy_file(path, folder.file("mailed.sagline"));
    auto mailed = SessionStore::openForReview(folder.file("mailed.sagline"));
    ASSERT_TRUE(mailed.ok()) << mailed.message;
    EXPECT_EQ(mailed.value->readingCount().value, 1);
}

TEST(SessionStore, BatchAppendIsAllOrNothing)
{
    TempFolder folder;
    auto created = SessionStore::create(folder.file("unit.sagline"), sampleSession());
    auto &store = *created.value;
    std::vector<Reading> batch{sampleReading(0, 0.0, 26.4), sampleReading(1, 0.2, 26.2), sampleReading(2, NAN, 26.0)};
    const auto refused = store.appendReadings(batch);
    EXPECT_EQ(refused.code, StoreCode::InvalidArgument);
    EXPECT_NE(refused.message.find("reading 3 of 3"), std::string::npos) << refused.message;
    EXPECT_EQ(store.readingCount().value, 0);
    batch.pop_back();
    const auto ids = store.appendReadings(batch);
    ASSERT_TRUE(ids.ok()) << ids.message;
    EXPECT_EQ(ids.value, (std::vector<std::int64_t>{1, 2}));
    EXPECT_EQ(store.readingCount().value, 2);
}

TEST(SessionSummary, TwoPointsGiveNoGuardedVerdict)
{
    // Two readings fit exactly and carry no uncertainty: the guarded rules (ILAC-G8:09/2019
    // §4.2.2, §4.2.3) have no guard band to apply and must not pass the unit.
    TempFolder folder;
    const std::string path = folder.file("two.sagline");
    {
        NewSession session = sampleSession();
        session.setupJson = R"({"nameplate":{"rated_power_va":50,"primary_voltage_v":230,"secondary_voltage_v":24,)"
                            R"("secondary_no_load_voltage_v":26.4}})";
        auto created = SessionStore::create(path, session);
        ASSERT_TRUE(created.ok()) << created.message;
        ASSERT_TRUE(created.value->appendReading(sampleReading(0, 0.0, 26.4)).ok());
        ASSERT_TRUE(created.value->appendReading(sampleReading(1, 1.0, 25.9)).ok());
    }
    for (DecisionRule rule : {DecisionRule::Guarded, DecisionRule::NonBinary}) {
        ReviewOptions options;
        options.rule = rule;
        options.regulationLimit = RegulationLimitChoice{RegulationLimitChoice::Kind::Nameplate, 0.0};
        const auto summary = loadSessionSummary(path, options);
        ASSERT_TRUE(summary.ok()) << summary.message;
        ASSERT_TRUE(summary.value.fit.ok()) << summary.value.fit.message;
        ASSERT_TRUE(summary.value.analysis.has_value()) << summary.value.analysisProblem;
        ASSERT_TRUE(summary.value.verdict.has_value());
        ASSERT_EQ(summary.value.verdict->limits.size(), 1u);
        EXPECT_EQ(summary.value.verdict->outcome, ConformityOutcome::NotJudged);
    }
}
