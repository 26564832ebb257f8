// The open-circuit step's reading against the nameplate's no-load voltage.
#include "NoLoadCheck.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

TEST(NoLoadCheck, AsksAboutAReadingFarFromTheNameplate)
{
    // 19.6 V read where 26.4 V is expected: -25.8 %.
    const auto question = noLoadQuestion(26.4, 19.6);
    ASSERT_TRUE(question.has_value());
    EXPECT_NE(question->find("19.60 V"), std::string::npos) << *question;
    EXPECT_NE(question->find("26.40 V"), std::string::npos) << *question;
    EXPECT_NE(question->find("-25.8 %"), std::string::npos) << *question;
    EXPECT_NE(question->find("tap"), std::string::npos) << *question;
    EXPECT_TRUE(noLoadQuestion(19.6, 26.4)->find("+34.7 %") != std::string::npos) << *noLoadQuestion(19.6, 26.4);
}

TEST(NoLoadCheck, LeavesReadingsWithinTheSupplyToleranceAlone)
{
    EXPECT_FALSE(noLoadQuestion(26.4, 26.4).has_value());
    EXPECT_FALSE(noLoadQuestion(26.4, 26.4 * 1.099).has_value()); // just inside the edge
    EXPECT_FALSE(noLoadQuestion(26.4, 26.4 * 0.905).has_value());
    EXPECT_TRUE(noLoadQuestion(26.4, 26.4 * 0.89).has_value());
    EXPECT_TRUE(noLoadQuestion(26.4, 26.4 * 1.03, 2.0).has_value()); // a tighter stated tolerance
}

TEST(NoLoadCheck, NeverAsksOnValuesThatAreNotThere)
{
    EXPECT_FALSE(noLoadQuestion(0.0, 19.6).has_value());
    EXPECT_FALSE(noLoadQuestion(26.4, std::nan("")).has_value());
    EXPECT_FALSE(noLoadQuestion(-26.4, 19.6).has_value());
}
