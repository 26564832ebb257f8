// The measurement's verdict (metrology rules) and the reviewer's decision (sign-off) are two
// vocabularies: no word and no column name is shared, so a reader never takes one for the other.
#include "ComparisonExport.h"
#include "ConformityDecision.h"
#include "SessionComparison.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <set>
#include <string>
#include <vector>

using namespace sagline;

namespace {

constexpr ConformityOutcome everyOutcome[] = {ConformityOutcome::Pass, ConformityOutcome::ConditionalPass,
                                              ConformityOutcome::ConditionalFail, ConformityOutcome::Fail,
                                              ConformityOutcome::NotJudged};
constexpr ReviewDecision everyDecision[] = {ReviewDecision::Accepted, ReviewDecision::Rejected, ReviewDecision::Retest};

// Lower-case words of a phrase: "CONDITIONAL PASS" -> {conditional, pass}; "not-judged" -> {not, judged}.
std::set<std::string> wordsOf(const std::string &phrase)
{
    std::set<std::string> words;
    std::string word;
    for (char c : phrase + " ") {
        if (std::isalpha(static_cast<unsigned char>(c))) {
            word.push_back(static_cast<char>(std::tolower(static_cast<unsigned char>(c))));
        } else if (!word.empty()) {
            words.insert(word);
            word.clear();
        }
    }
    return words;
}

// Every phrase the review state of a session can read, as the table, CSV, JSON and PDF show it.
std::vector<std::string> reviewStates()
{
    std::vector<std::string> states;
    SessionRow row;
    states.push_back(row.reviewState()); // never signed off
    for (ReviewDecision decision : everyDecision) {
        row.signOffs = {{1, "2026-12-03T09:00:00Z", "Lab Lead", decision, "", "", "", ""}};
        states.push_back(row.reviewState());
    }
    row.seal.state = SealState::ChangedAfterSignOff;
    states.push_back(row.reviewState());
    row.seal.state = SealState::Altered;
    states.push_back(row.reviewState());
    return states;
}

} // namespace

TEST(VerdictDecisionVocabulary, NoWordIsShared)
{
    std::set<std::string> verdictWords = wordsOf(noAnalysisWords);
    for (ConformityOutcome outcome : everyOutcome) {
        for (const std::string &w : wordsOf(outcomeWords(outcome)))
            verdictWords.insert(w);
        for (const std::string &w : wordsOf(toString(outcome)))
            verdictWords.insert(w);
    }
    SessionRow incomplete;
    incomplete.progress.state = Completeness::Stopped;
    incomplete.progress.plannedSteps = 9;
    incomplete.progress.recordedSteps = 4;
    for (const std::string &w : wordsOf(incomplete.verdictWords()))
        verdictWords.insert(w);
    ASSERT_TRUE(verdictWords.count("incomplete")) << "the incomplete label is part of the verdict's words";

    std::set<std::string> decisionWords;
    for (ReviewDecision decision : everyDecision)
        for (const std::string &w : wordsOf(toString(decision)))
            decisionWords.insert(w);
    for (const std::string &state : reviewStates())
        for (const std::string &w : wordsOf(state))
            decisionWords.insert(w);
    ASSERT_TRUE(decisionWords.count("retest"));

    for (const std::string &w : decisionWords)
        EXPECT_EQ(verdictWords.count(w), 0u) << "\"" << w << "\" is both a verdict word and a reviewer's decision word";
}

TEST(VerdictDecisionVocabulary, EachHasItsOwnColumn)
{
    const std::vector<std::string> columns = comparisonCsvColumns();
    const auto has = [&](const char *name) { return std::find(columns.begin(), columns.end(), name) != columns.end(); };
    ASSERT_TRUE(has("verdict"));
    ASSERT_TRUE(has("review_decision"));
    for (const std::string &column : columns) {
        const std::set<std::string> words = wordsOf(column);
        EXPECT_FALSE(words.count("verdict") && words.count("review")) << column;
    }
    // The CSV holds the verdict's tokens and the decision's words in their own columns: a row
    // signed off "rejected" with a verdict of pass keeps both, each where it belongs.
    SessionRow row;
    row.opened = true;
    row.path = "u1.sagline";
    row.figures.ok = true;
    row.figures.verdict = ConformityOutcome::Pass;
    row.signOffs = {{1, "2026-12-03T09:00:00Z", "Lab Lead", ReviewDecision::Rejected, "leads swapped", "", "", ""}};
    const std::vector<SessionRow> rows = {row};
    const std::string csv = comparisonCsv(rows, summarizeBatch(rows));
    const std::string header = csv.substr(0, csv.find('\n'));
    const std::string line = csv.substr(csv.find('\n') + 1);
    const auto fieldOf = [](const std::string &text, std::size_t index) {
        std::size_t start = 0;
        for (std::size_t i = 0; i < index; ++i)
            start = text.find(',', start) + 1;
        return text.substr(start, text.find_first_of(",\n", start) - start);
    };
    const auto indexOf = [&](const char *name) {
        return static_cast<std::size_t>(std::find(columns.begin(), columns.end(), name) - columns.begin());
    };
    EXPECT_EQ(fieldOf(header, indexOf("verdict")), "verdict");
    EXPECT_EQ(fieldOf(line, indexOf("verdict")), "pass");
    EXPECT_EQ(fieldOf(line, indexOf("review_decision")), "rejected");
}
