// The streamed scalars must be the tree's text byte for byte: each is compared with
// nlohmann::json's own dump() of the same value.
#include "JsonNumberText.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstring>
#include <limits>
#include <random>

using namespace sagline;

namespace {

std::string streamed(double value)
{
    std::string out;
    appendJsonNumber(out, value);
    return out;
}

} // namespace

TEST(JsonNumberText, DoublesAreWrittenAsTheTreeDumpsThem)
{
    const double edges[] = {0.0, -0.0, 1.0, -1.0, 0.1, 1e-5, 1e-4, 123456789012345.0, 1e15, 1e16, 1e17, 1e21,
                            -1.9, 26.4, 5e-324, std::numeric_limits<double>::min(),
                            std::numeric_limits<double>::max(), std::numeric_limits<double>::lowest(),
                            std::numeric_limits<double>::epsilon(), 2.0 / 3.0, -1e-300};
    for (double v : edges)
        EXPECT_EQ(streamed(v), nlohmann::json(v).dump()) << v;
    // Random bit patterns cover every exponent and digit count; residuals of a few mV and
    // values spread over decades cover what a fit writes.
    std::mt19937_64 random(7);
    int compared = 0;
    for (int i = 0; i < 200000; ++i) {
        const std::uint64_t bits = random();
        double v;
        std::memcpy(&v, &bits, sizeof v);
        if (!std::isfinite(v))
            continue;
        ASSERT_EQ(streamed(v), nlohmann::json(v).dump()) << bits;
        ++compared;
    }
    std::normal_distribution<double> residual(0.0, 0.01);
    std::uniform_real_distribution<double> decade(-12.0, 12.0);
    for (int i = 0; i < 200000; ++i) {
        const double v = residual(random) * std::pow(10.0, decade(random));
        ASSERT_EQ(streamed(v), nlohmann::json(v).dump()) << v;
    }
    EXPECT_GT(compared, 190000);
}

TEST(JsonNumberText, NonFiniteAndMissingAreNull)
{
    EXPECT_EQ(streamed(std::nan("")), nlohmann::json(std::nan("")).dump());
    EXPECT_EQ(streamed(std::numeric_limits<double>::infinity()), "null");
    std::string out;
    appendJsonNumber(out, std::optional<double>());
    appendJsonNumber(out, std::optional<double>(2.5));
    EXPECT_EQ(out, "null2.5");
}

TEST(JsonNumberText, IntegersAndBooleansAreWrittenAsTheTreeDumpsThem)
{
    for (std::int64_t v : {std::int64_t{0}, std::int64_t{-1}, std::int64_t{42}, std::numeric_limits<std::int64_t>::min(),
                           std::numeric_limits<std::int64_t>::max()}) {
        std::string out;
        appendJsonInteger(out, v);
        EXPECT_EQ(out, nlohmann::json(v).dump());
    }
    for (std::uint64_t v : {std::uint64_t{0}, std::uint64_t{999999}, std::numeric_limits<std::uint64_t>::max()}) {
        std::string out;
        appendJsonUnsigned(out, v);
        EXPECT_EQ(out, nlohmann::json(v).dump());
    }
    std::string out;
    appendJsonBool(out, true);
    appendJsonBool(out, false);
    EXPECT_EQ(out, "truefalse");
}
