// The primary side: open-circuit quantities, the loss balance, efficiency, the series reactance,
// regulation at a power factor and the supply referral, each against an outside source or a
// hand-worked value named beside it.
#include "PrimarySideAnalysis.h"
#include "SupplyReferral.h"
#include "TransformerFormulas.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

namespace {

Reading point(int step, double currentA, double voltageV)
{
    Reading r;
    r.id = step + 1;
    r.step = step;
    r.currentA = currentA;
    r.voltageV = voltageV;
    return r;
}

// A unit of our own (scenario for the test): V0 = 25 V, R = 0.5 Ω, X = 0.3 Ω referred to the
// secondary, P0 = 2 W and Q0 = 10 var at 230 V, read exactly at I2 = 0, 0.5, ..., 4 A (4 A rated).
std::vector<Reading> exactSweep(double uPower, double uReactive)
{
    std::vector<Reading> readings;
    for (int k = 0; k <= 8; ++k) {
        const double i = 0.5 * k;
        Reading r = point(k, i, 25.0 - 0.5 * i);
        r.uCurrentA = 0.002;
        r.uVoltageV = 0.01;
        r.primary.voltageV = 230.0;
        r.primary.uVoltageV = 0.2;
        r.primary.powerW = r.voltageV * i + 2.0 + 0.5 * i * i; // P1 = P2 + P0 + R·I²
        r.primary.uPowerW = uPower;
        r.primary.reactivePowerVar = 10.0 + 0.3 * i * i;        // Q1 = Q0 + X·I²
        r.primary.uReactivePowerVar = uReactive;
        readings.push_back(r);
    }
    return readings;
}

PrimarySideInput unitInput()
{
    PrimarySideInput in;
    in.ratedPrimaryVoltageV = 230.0;
    in.ratedPrimaryCurrentA = 100.0 / 230.0;
    in.ratedSecondaryCurrentA = 4.0;
    return in;
}

} // namespace

// Open- and short-circuit test of a 20 kVA, 8000/240 V unit (the worked example of the
// equivalent-circuit section in S. J. Chapman, "Electric Machinery Fundamentals", from memory):
// OC 8000 V, 0.214 A, 400 W; SC 489 V, 2.5 A, 240 W. The arithmetic recomputed here by hand:
// Rc = 8000²/400 = 160 000 Ω; S0 = 8000·0.214 = 1712 VA, Q0 = sqrt(1712² - 400²) = 1664.62 var,
// Xm = 8000²/1664.62 = 38 447 Ω; Req = 240/2.5² = 38.4 Ω; Qsc = sqrt((489·2.5)² - 240²) =
// 1198.71 var, Xeq = 1198.71/2.5² = 191.79 Ω (the book rounds to 38.4 kΩ and 192 Ω).
TEST(PrimarySideFormulas, OpenAndShortCircuitWorkedExample)
{
    const double q0 = formulas::reactivePower(8000.0, 0.214, 400.0);
    EXPECT_NEAR(q0, 1664.615, 1e-3);
    EXPECT_NEAR(formulas::coreLossResistance(8000.0, 400.0), 160000.0, 1e-6);
    EXPECT_NEAR(formulas::magnetizingReactance(8000.0, q0), 38447.3, 0.1);
    EXPECT_NEAR(240.0 / (2.5 * 2.5), 38.4, 1e-12);
    const double qsc = formulas::reactivePower(489.0, 2.5, 240.0);
    EXPECT_NEAR(qsc, 1198.710, 1e-3);
    EXPECT_NEAR(formulas::seriesReactance(qsc, 0.0, 2.5), 191.79, 0.01);
}

// The same open-circuit readings through the analysis: P0, I0 and its share of I1,rated =
// 20000/8000 = 2.5 A (8.56 %), pf0 = 400/1712 = 0.23364, Rc and Xm as above.
TEST(PrimarySideAnalysis, OpenCircuitPointGivesTheShuntBranch)
{
    Reading oc = point(0, 0.0, 240.0);
    oc.primary.voltageV = 8000.0;
    oc.primary.currentA = 0.214;
    oc.primary.powerW = 400.0;
    PrimarySideInput in;
    in.ratedPrimaryVoltageV = 8000.0;
    in.ratedPrimaryCurrentA = 2.5;
    in.ratedSecondaryCurrentA = 20000.0 / 240.0;
    const PrimarySideResult out = analysePrimarySide({oc}, nullptr, nullptr, in);
    ASSERT_TRUE(out.errors.empty());
    ASSERT_TRUE(out.openCircuit);
    const OpenCircuitResult &r = *out.openCircuit;
    EXPECT_NEAR(r.noLoadLossW->value, 400.0, 1e-9);
    EXPECT_NEAR(r.noLoadCurrentA->value, 0.214, 1e-12);
    EXPECT_NEAR(r.noLoadCurrentPercent->value, 8.56, 1e-9);
    EXPECT_NEAR(r.noLoadPowerFactor->value, 400.0 / 1712.0, 1e-9);
    EXPECT_NEAR(r.coreLossResistanceOhm->value, 160000.0, 1e-6);
    EXPECT_NEAR(r.magnetizingReactanceOhm->value, 38447.3, 0.1);
}

// Maximum-efficiency condition, hand-worked: V0 = 25 V, R = 0.5 Ω, P0 = 2 W. I* = sqrt(2/0.5) = 2 A;
// there P2 = (25 - 1)·2 = 48 W, losses 2 + 2 = 4 W, η = 48/52 = 92.3077 %. At 4 A: P2 = 23·4 = 92 W,
// losses 2 + 8 = 10 W, η = 92/102 = 90.1961 %. The condition assumes a constant terminal
// voltage: with V2 held at 24 V, η(I) = 24I/(24I + 2 + 0.5I²) is highest at I* = 2 A.
TEST(PrimarySideFormulas, MaximumEfficiencyHandWorked)
{
    EXPECT_DOUBLE_EQ(formulas::maxEfficiencyCurrent(2.0, 0.5), 2.0);
    EXPECT_NEAR(formulas::modelEfficiency(25.0, 0.5, 2.0, 2.0), 48.0 / 52.0, 1e-12);
    EXPECT_NEAR(formulas::modelEfficiency(25.0, 0.5, 2.0, 4.0), 92.0 / 102.0, 1e-12);
    const auto constantVoltage = [](double i) { return 24.0 * i / (24.0 * i + 2.0 + 0.5 * i * i); };
    EXPECT_GT(constantVoltage(2.0), constantVoltage(1.99));
    EXPECT_GT(constantVoltage(2.0), constantVoltage(2.01));
}

// The approximate drop ΔV ≈ I(R cos φ ± X sin φ) (Chapman, the section on voltage regulation and
// the phasor diagram, from memory), hand-worked: I = 4 A, R = 0.5 Ω, X = 0.3 Ω, pf 0.8 (sin φ = 0.6):
// lagging 4·(0.4 + 0.18) = 2.32 V, leading 4·(0.4 - 0.18) = 0.88 V, unity 4·0.5 = 2 V.
TEST(PrimarySideFormulas, RegulationAtPowerFactorHandWorked)
{
    EXPECT_NEAR(formulas::approximateVoltageDrop(4.0, 0.5, 0.3, 0.8, false), 2.32, 1e-12);
    EXPECT_NEAR(formulas::approximateVoltageDrop(4.0, 0.5, 0.3, 0.8, true), 0.88, 1e-12);
    EXPECT_NEAR(formulas::approximateVoltageDrop(4.0, 0.5, 0.3, 1.0, false), 2.0, 1e-12);
    EXPECT_NEAR(formulas::reactivePowerFromPowerFactor(80.0, 0.8), 60.0, 1e-12); // 3-4-5 triangle
}

// A sweep read exactly from a known model: every loss adds up, and the analysis gives back the
// model's P0, X, efficiency and the maximum-efficiency point (values hand-worked above).
TEST(PrimarySideAnalysis, ExactSweepGivesBackTheModel)
{
    const std::vector<Reading> readings = exactSweep(0.02, 0.05);
    const FitSummary fit = fitReadings(readings, FitMethod::Ols);
    ASSERT_TRUE(fit.ok());
    const PrimarySideResult out = analysePrimarySide(readings, &fit, nullptr, unitInput());
    ASSERT_TRUE(out.errors.empty());
    ASSERT_TRUE(out.openCircuit);
    EXPECT_NEAR(out.openCircuit->noLoadLossW->value, 2.0, 1e-9);
    EXPECT_NEAR(out.openCircuit->noLoadReactivePowerVar->value, 10.0, 1e-9);
    ASSERT_EQ(out.steps.size(), 8u);
    for (const StepLosses &s : out.steps) {
        // P1 = P2 + core + copper: the remainder is nothing but rounding.
        ASSERT_TRUE(s.remainderW);
        EXPECT_NEAR(s.remainderW->value, 0.0, 1e-9) << "reading " << s.readingId;
        EXPECT_NEAR(s.totalLossW.value, 2.0 + 0.5 * s.currentA * s.currentA, 1e-9);
        EXPECT_NEAR(s.inputPowerW.value, s.outputPowerW.value + s.totalLossW.value, 1e-9);
        EXPECT_GT(*s.efficiencyPercent.standardUncertainty, 0.0);
    }
    EXPECT_NEAR(out.steps.back().efficiencyPercent.value, 9200.0 / 102.0, 1e-9);
    ASSERT_TRUE(out.seriesReactanceOhm);
    EXPECT_NEAR(out.seriesReactanceOhm->value, 0.3, 1e-9);
    EXPECT_TRUE(out.seriesReactanceResolved);
    EXPECT_NEAR(out.efficiencyAtRatedPercent->value, 9200.0 / 102.0, 1e-6);
    EXPECT_NEAR(out.maxEfficiencyCurrentA->value, 2.0, 1e-6);
    EXPECT_NEAR(out.maxEfficiencyPercent->value, 4800.0 / 52.0, 1e-6);
    EXPECT_GT(*out.maxEfficiencyCurrentA->expandedUncertainty, 0.0);
    // Regulation at 0.8 lagging, full-load base: ΔV = 2.32 V, 2.32/(25 - 2.32) = 10.2293 %.
    ASSERT_TRUE(out.regulationAtPowerFactorPercent);
    EXPECT_NEAR(out.regulationAtPowerFactorPercent->value, 232.0 / 22.68, 1e-6);
}

// The efficiency's uncertainty follows the meters: u(η)/η = sqrt((u_V/V)² + (u_I/I)² + (u_P/P)²)
// for independent readings (GUM 5.1.2 for a product and quotient, relative form).
TEST(PrimarySideAnalysis, EfficiencyUncertaintyFromTheMeters)
{
    const std::vector<Reading> readings = exactSweep(0.5, 0.05);
    const PrimarySideResult out = analysePrimarySide(readings, nullptr, nullptr, unitInput());
    ASSERT_FALSE(out.steps.empty());
    const StepLosses &top = out.steps.back();
    const double v = 23.0, i = 4.0, p = 102.0;
    const double relative = std::sqrt(std::pow(0.01 / v, 2) + std::pow(0.002 / i, 2) + std::pow(0.5 / p, 2));
    EXPECT_NEAR(*top.efficiencyPercent.standardUncertainty, top.efficiencyPercent.value * relative, 1e-9);
    EXPECT_FALSE(top.copperLossW) << "no fit, no copper loss";
}

// Reactive power read far too coarsely for the series reactance: X is still given, with a
// warning that the meters do not resolve it.
TEST(PrimarySideAnalysis, UnresolvedReactanceIsWarned)
{
    const std::vector<Reading> readings = exactSweep(0.02, 5.0);
    const FitSummary fit = fitReadings(readings, FitMethod::Ols);
    const PrimarySideResult out = analysePrimarySide(readings, &fit, nullptr, unitInput());
    ASSERT_TRUE(out.seriesReactanceOhm);
    EXPECT_FALSE(out.seriesReactanceResolved);
    bool warned = false;
    for (const std::string &w : out.warnings)
        warned = warned || w.find("not resolved") != std::string::npos;
    EXPECT_TRUE(warned);
}

// A loss that the model cannot explain (4 W extra at the top step) is named.
TEST(PrimarySideAnalysis, LossesThatDoNotAddUpAreWarned)
{
    std::vector<Reading> readings = exactSweep(0.02, 0.05);
    *readings.back().primary.powerW += 4.0;
    const FitSummary fit = fitReadings(readings, FitMethod::Ols);
    const PrimarySideResult out = analysePrimarySide(readings, &fit, nullptr, unitInput());
    EXPECT_NEAR(out.steps.back().remainderW->value, 4.0, 1e-9);
    ASSERT_FALSE(out.warnings.empty());
    EXPECT_NE(out.warnings.front().find("do not add up"), std::string::npos) << out.warnings.front();
}

// A supply with its own impedance (a scenario of our own): EMF 230 V behind 18.4 Ω, a = 9.2,
// transformer R = 0.5 Ω, loads RL from open circuit down to 5 Ω. The secondary sees the supply's
// impedance as 18.4/9.2² = 0.2174 Ω more R; referring each reading to the rated 230 V (V2 and I2
// scaled alike: the same load at the rated supply) gives back 0.5 Ω exactly, and the sag
// (8 % here) is flagged against the 2 % tolerance.
TEST(SupplyReferral, ReferredFitRemovesTheSupplySag)
{
    const double a = 9.2, rs = 18.4, r = 0.5;
    std::vector<Reading> readings;
    const double loads[] = {0.0, 50.0, 25.0, 12.0, 8.0, 5.0};
    for (int k = 0; k < 6; ++k) {
        const double i = k == 0 ? 0.0 : (230.0 / a) / (r + loads[k] + rs / (a * a));
        const double v1 = 230.0 - rs * i / a;
        Reading reading = point(k, i, k == 0 ? 230.0 / a : i * loads[k]);
        reading.primary.voltageV = v1;
        readings.push_back(reading);
    }
    const FitSummary raw = fitReadings(readings, FitMethod::Ols);
    const FitSummary referred = fitReadings(referToRatedSupply(readings, 230.0), FitMethod::Ols);
    EXPECT_NEAR(raw.seriesResistanceOhm(), r + rs / (a * a), 1e-9);
    EXPECT_NEAR(referred.seriesResistanceOhm(), r, 1e-9);
    EXPECT_NEAR(referred.noLoadVoltageV(), 230.0 / a, 1e-9);
    const SupplyAssessment supply = assessSupply(readings, 230.0, FitVoltages::Referred);
    EXPECT_EQ(supply.fitVoltages, FitVoltages::Referred);
    EXPECT_NEAR(*supply.driftPercent, (230.0 - *readings.back().primary.voltageV) / 230.0 * 100.0, 1e-9);
    EXPECT_TRUE(supply.drifted);
    EXPECT_NE(supply.statement.find("referred"), std::string::npos) << supply.statement;
    EXPECT_NE(supply.statement.find("drifted"), std::string::npos) << supply.statement;
    EXPECT_EQ(assessSupply(readings, 230.0, FitVoltages::Raw).fitVoltages, FitVoltages::Raw);
}

// Every product path fits columnsToFit(readings, ...) instead of fitReadings(referToRatedSupply(...)):
// the columns must hold the referred readings' values to the bit (rows without V1 and an
// unusable rating as read), so each published number stays the same.
TEST(SupplyReferral, ColumnsToFitHoldTheReferredReadingsToTheBit)
{
    std::vector<Reading> readings;
    for (int k = 0; k < 9; ++k) {
        Reading reading = point(k, 0.25 * k, 26.0 - 0.5 * 0.25 * k);
        if (k % 3 != 1)
            reading.primary.voltageV = 231.7 - 1.3 * k; // some rows carry V1, one never
        if (k % 2 == 0) {
            reading.uCurrentA = 0.002;
            reading.uVoltageV = 0.01;
        }
        reading.excluded = k == 5;
        readings.push_back(reading);
    }
    const auto columnsOf = [](const std::vector<Reading> &rows) {
        ReadingColumns columns;
        for (const Reading &r : rows)
            columns.append(r);
        return columns;
    };
    const auto expectSameColumns = [](const ReadingColumns &a, const ReadingColumns &b) {
        EXPECT_EQ(a.currentA, b.currentA);
        EXPECT_EQ(a.voltageV, b.voltageV);
        EXPECT_EQ(a.uCurrentA, b.uCurrentA);
        EXPECT_EQ(a.uVoltageV, b.uVoltageV);
        EXPECT_EQ(a.state, b.state);
    };
    const ReadingColumns referred = columnsToFit(readings, FitVoltages::Referred, 230.0);
    expectSameColumns(referred, columnsOf(referToRatedSupply(readings, 230.0)));
    EXPECT_NE(referred.voltageV[0], readings[0].voltageV); // referred where V1 was read
    EXPECT_EQ(referred.voltageV[1], readings[1].voltageV); // as read where it was not
    expectSameColumns(columnsToFit(readings, FitVoltages::Raw, 230.0), columnsOf(readings));
    expectSameColumns(columnsToFit(readings, FitVoltages::Referred, 0.0), columnsOf(readings));
    const FitSummary a = fitReadings(referred, FitMethod::Ols);
    const FitSummary b = fitReadings(referToRatedSupply(readings, 230.0), FitMethod::Ols);
    ASSERT_TRUE(a.ok());
    EXPECT_EQ(a.slope, b.slope);
    EXPECT_EQ(a.intercept, b.intercept);
    EXPECT_EQ(a.slopeSe, b.slopeSe);
}

TEST(SupplyReferral, WithoutAPrimaryVoltmeterTheAssumptionIsStated)
{
    const std::vector<Reading> readings{point(0, 0.0, 25.0), point(1, 1.0, 24.5)};
    const SupplyAssessment supply = assessSupply(readings, 230.0, FitVoltages::Referred);
    EXPECT_EQ(supply.fitVoltages, FitVoltages::Raw);
    EXPECT_FALSE(supply.driftPercent);
    EXPECT_NE(supply.statement.find("assumed to have held its rated 230 V"), std::string::npos) << supply.statement;
    const auto same = referToRatedSupply(readings, 230.0);
    EXPECT_EQ(same[1].voltageV, 24.5);
}

TEST(PrimarySideAnalysis, BadRatingsAreNamed)
{
    PrimarySideInput in = unitInput();
    in.ratedPrimaryVoltageV = 0.0;
    in.regulationPowerFactor = 1.5;
    const PrimarySideResult out = analysePrimarySide(exactSweep(0.02, 0.05), nullptr, nullptr, in);
    ASSERT_EQ(out.errors.size(), 2u);
    EXPECT_EQ(out.errors[0].field, "rated_primary_voltage_v");
    EXPECT_EQ(out.errors[1].field, "power_factor");
    EXPECT_FALSE(out.hasResults());
}
