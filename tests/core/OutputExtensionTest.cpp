// An output's name says what is inside it: a CSV export is refused under ".pdf", a name
// without an extension gets the format's own.
#include "OutputExtension.h"

#include <gtest/gtest.h>

using namespace sagline;

TEST(OutputExtension, AddsTheFormatsExtensionWhenThereIsNone)
{
    EXPECT_EQ(outputNameFor("/tmp/readings", "CSV", {"csv"}).path, "/tmp/readings.csv");
    EXPECT_TRUE(outputNameFor("/tmp/readings", "CSV", {"csv"}).ok());
    // A dot in a folder's name or a leading dot is no extension.
    EXPECT_EQ(outputNameFor("/tmp/v1.2/readings", "CSV", {"csv"}).path, "/tmp/v1.2/readings.csv");
    EXPECT_EQ(outputNameFor("/tmp/.readings", "CSV", {"csv"}).path, "/tmp/.readings.csv");
}

TEST(OutputExtension, KeepsTheRightExtensionInAnyCase)
{
    EXPECT_EQ(outputNameFor("/tmp/a.CSV", "CSV", {"csv"}).path, "/tmp/a.CSV");
    EXPECT_TRUE(outputNameFor("/tmp/a.CSV", "CSV", {"csv"}).ok());
    EXPECT_TRUE(outputNameFor("chart.svg", "image", {"png", "svg"}).ok());
}

TEST(OutputExtension, RefusesAnotherFormatsExtensionNamingTheFile)
{
    const OutputName refused = outputNameFor("/tmp/report.pdf", "CSV", {"csv"});
    EXPECT_FALSE(refused.ok());
    EXPECT_EQ(refused.error, "/tmp/report.pdf: a CSV file must end in .csv (not .pdf); nothing was written");
    EXPECT_NE(outputNameFor("chart.jpg", "image", {"png", "svg"}).error.find(".png or .svg"), std::string::npos);
    EXPECT_FALSE(outputNameFor("", "CSV", {"csv"}).ok());
    EXPECT_FALSE(outputNameFor("/tmp/", "CSV", {"csv"}).ok());
}
