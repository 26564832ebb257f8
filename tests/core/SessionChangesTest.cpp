// The rules the window and sagline-cli share for changing a recorded session.
#include "SessionChanges.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

namespace {

std::unique_ptr<SessionStore> threeReadings(const TempFolder &folder)
{
    auto created = SessionStore::create(folder.file("changes.sagline"), sampleSession());
    EXPECT_TRUE(created.ok());
    for (int step = 0; step < 3; ++step)
        created.value->appendReading(sampleReading(step, 0.5 * step, 26.4 - 0.9 * step));
    return std::move(created.value);
}

} // namespace

TEST(SessionChanges, RefusesWithoutAPersonNamingTheField)
{
    TempFolder folder;
    auto store = threeReadings(folder);
    store->setActor({"  ", ""});
    const auto refused = excludeReadingNumber(*store, 2, "misread");
    EXPECT_EQ(refused.code, StoreCode::InvalidArgument);
    EXPECT_EQ(refused.message.rfind("by: ", 0), 0u) << refused.message;
    EXPECT_EQ(addPersonNote(*store, "hello").code, StoreCode::InvalidArgument);
}

TEST(SessionChanges, ExcludesAndRestoresByNumberWithTheActor)
{
    TempFolder folder;
    auto store = threeReadings(folder);
    store->setActor({"E. Checker", ""});
    EXPECT_EQ(excludeReadingNumber(*store, 0, "x").code, StoreCode::NotFound);
    const auto outOfRange = excludeReadingNumber(*store, 4, "x");
    EXPECT_EQ(outOfRange.code, StoreCode::NotFound);
    EXPECT_NE(outOfRange.message.find("it has 3"), std::string::npos) << outOfRange.message;
    EXPECT_EQ(excludeReadingNumber(*store, 3, " ").code, StoreCode::InvalidArgument);
    ASSERT_TRUE(excludeReadingNumber(*store, 3, "clip fell off").ok());
    EXPECT_EQ(excludeReadingNumber(*store, 3, "again").code, StoreCode::InvalidArgument);
    EXPECT_EQ(restoreReadingNumber(*store, 2, "not excluded").code, StoreCode::InvalidArgument);
    ASSERT_TRUE(restoreReadingNumber(*store, 3, "clip was fine").ok());
    const auto history = store->exclusions().value;
    ASSERT_EQ(history.size(), 2u);
    EXPECT_EQ(history[0].author, "E. Checker");
    EXPECT_EQ(history[1].reason, "clip was fine");
    EXPECT_FALSE(store->readings().value[2].excluded);
}

TEST(SessionChanges, SupersededReadingCannotBeRestoredOrExcluded)
{
    TempFolder folder;
    auto store = threeReadings(folder);
    store->setActor({"E. Checker", ""});
    const auto first = store->readings().value[2];
    ASSERT_TRUE(store->appendRetake(sampleReading(2, 1.0, 24.6), first.id, "lead loose").ok());
    EXPECT_EQ(restoreReadingNumber(*store, 3, "want it back").code, StoreCode::InvalidArgument);
    EXPECT_EQ(excludeReadingNumber(*store, 3, "twice").code, StoreCode::InvalidArgument);
    EXPECT_TRUE(excludeReadingNumber(*store, 4, "the retake was bad too").ok());
}
