// The virtual bench's mains-side analyser reads V1 and I1 through its own channels: their own gain
// errors (drawn once per seed from their own accuracy, independent of the secondary meters'), their
// own noise and resolution, and the same numbers for a seed every time.
#include "InstrumentsTestSupport.h"

#include "LinkAddress.h"
#include "VirtualBench.h"

#include <QDateTime>

#include <cmath>
#include <vector>

using namespace sagline;
using namespace sagline::test;

namespace {

VirtualBenchOptions benchOptions(std::uint64_t seed)
{
    const sagline::Setup setup = demoSetup();
    return virtualBenchOptionsFor(setup, planFor(setup), seed);
}

std::int64_t startMs()
{
    return QDateTime(QDate(2026, 12, 3), QTime(9, 0), Qt::UTC).toMSecsSinceEpoch();
}

// The exact supply voltage at the primary terminals, read without noise or rounding.
VirtualBenchOptions quiet(VirtualBenchOptions options)
{
    options.primaryVoltmeter.noiseSd = 1e-12; // normal_distribution needs a σ above zero
    options.primaryVoltmeter.resolution = 0.0;
    return options;
}

} // namespace

TEST(VirtualBenchPrimaryMeters, ThePrimaryVoltmeterHasItsOwnGainNotTheSecondaryOnes)
{
    VirtualClock clock(startMs());
    // A perfect secondary voltmeter: the primary reading must still carry the analyser's gain.
    VirtualBenchOptions options = quiet(benchOptions(3));
    options.voltmeter.accuracy = {0.0, 0.0};
    VirtualBench bench(options, &clock);
    EXPECT_EQ(bench.voltmeterGain(), 1.0);
    EXPECT_NE(bench.primaryVoltmeterGain(), 1.0);
    // Drawn within a third of its ±0.5 % (VirtualBench.cpp, common practice).
    EXPECT_LE(std::abs(bench.primaryVoltmeterGain() - 1.0), 0.5 / 300.0 + 1e-15);
    const double truth = bench.state().primaryVoltageV;
    const auto read = bench.readPrimaryVoltage();
    ASSERT_TRUE(read);
    EXPECT_NEAR(*read, truth * bench.primaryVoltmeterGain(), 1e-9 * truth);

    // And the other way round: a perfect analyser reads the supply as it is, whatever the
    // secondary voltmeter's gain.
    VirtualBenchOptions perfectPrimary = quiet(benchOptions(3));
    perfectPrimary.primaryVoltmeter.accuracy = {0.0, 0.0};
    VirtualBench other(perfectPrimary, &clock);
    EXPECT_NE(other.voltmeterGain(), 1.0);
    EXPECT_EQ(other.primaryVoltmeterGain(), 1.0);
    const auto exact = other.readPrimaryVoltage();
    ASSERT_TRUE(exact);
    EXPECT_NEAR(*exact, other.state().primaryVoltageV, 1e-9);
}

TEST(VirtualBenchPrimaryMeters, ThePrimaryAmmeterHasItsOwnGainAndTheSpecsReachTheRig)
{
    VirtualClock clock(startMs());
    VirtualBenchOptions options = benchOptions(5);
    options.ammeter.accuracy = {0.0, 0.0};
    VirtualBench bench(options, &clock);
    EXPECT_EQ(bench.ammeterGain(), 1.0);
    EXPECT_NE(bench.primaryAmmeterGain(), 1.0);
    EXPECT_LE(std::abs(bench.primaryAmmeterGain() - 1.0), 1.0 / 300.0 + 1e-15);
    // The rig's primary roles state the analyser's own accuracy and resolution.
    options.primaryVoltmeter.accuracy = {0.2, 2.0};
    options.primaryVoltmeter.resolution = 0.1;
    const RoleConfig v1 = virtualBenchPrimaryRoleConfig(options, MeterRole::PrimaryVoltage);
    EXPECT_DOUBLE_EQ(v1.accuracy.percentOfReading, 0.2);
    EXPECT_DOUBLE_EQ(v1.accuracy.counts, 2.0);
    EXPECT_DOUBLE_EQ(v1.resolution, 0.1);
    const RoleConfig i1 = virtualBenchPrimaryRoleConfig(options, MeterRole::PrimaryCurrent);
    EXPECT_DOUBLE_EQ(i1.resolution, options.primaryAmmeter.resolution);
}

TEST(VirtualBenchPrimaryMeters, ASeedGivesTheSameReadingsAndLeavesTheSecondaryOnesAlone)
{
    VirtualClock clock(startMs());
    VirtualBench first(benchOptions(7), &clock);
    VirtualBench again(benchOptions(7), &clock);
    VirtualBench secondaryOnly(benchOptions(7), &clock);
    VirtualBench otherSeed(benchOptions(8), &clock);
    EXPECT_NE(first.primaryVoltmeterGain(), otherSeed.primaryVoltmeterGain());
    for (VirtualBench *bench : {&first, &again, &secondaryOnly})
        bench->setLoad(8.0);
    std::vector<double> a, b, v2First, v2Alone;
    for (int k = 0; k < 20; ++k) {
        a.push_back(first.readPrimaryVoltage().value_or(-1.0));
        a.push_back(first.readPrimaryCurrent().value_or(-1.0));
        b.push_back(again.readPrimaryVoltage().value_or(-1.0));
        b.push_back(again.readPrimaryCurrent().value_or(-1.0));
        v2First.push_back(first.readVoltage().value_or(-1.0));
        v2Alone.push_back(secondaryOnly.readVoltage().value_or(-1.0)); // never reads the primary
    }
    EXPECT_EQ(a, b);
    EXPECT_EQ(v2First, v2Alone) << "reading the primary must not move the secondary meters' noise";
}
