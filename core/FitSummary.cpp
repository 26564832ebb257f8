#include "FitSummary.h"

#include "Distributions.h"
#include "CurvatureCheck.h"
#include "YorkFit.h"

#include <algorithm>
#include <bit>
#include <cmath>
#include <limits>
#include <span>
#include <type_traits>

namespace sagline {

namespace {

// The rows that enter the fit, with their values and weights (1, 1/u(V)², or York's W_i).
struct FitInput {
    // The row of each used point. Empty while every row so far is used (the common case: point i
    // is row i), so a sweep with nothing excluded writes no page of it.
    std::vector<std::size_t> rows;
    std::size_t rowOf(std::size_t i) const { return rows.empty() ? i : rows[i]; }
    // The used points' currents and voltages: xStore and yStore gathered from the rows, or,
    // when every row of a set of columns is used as it stands, the columns themselves (no copy).
    std::span<const double> x, y;
    std::vector<double> xStore, yStore;
    std::vector<double> sx, sy;
    std::vector<double> weights;      // empty for OLS: every weight is 1
    std::vector<char> hasUI;          // the reading stated u_current_a
    // Every used reading stated u_voltage_v. sx, sy and hasUI are filled only while this holds
    // (OLS needs them only then, for the screen's σ): a CSV without uncertainties touches no
    // page of them.
    bool allStated = true;
};

bool isFitted(const Reading &reading)
{
    return !reading.excluded && !(reading.flags & (flagOverload | flagNotANumber));
}

FitSummary failure(FitSummary summary, FitStatus status, std::string message)
{
    summary.status = status;
    summary.message = std::move(message);
    return summary;
}

std::string rowName(std::size_t row)
{
    return "row " + std::to_string(row);
}

// Checks the values and uncertainties the method needs; empty string when all is well.
// What the fit reads of one reading: values, stated uncertainties and whether it is fitted.
struct RowValues {
    double currentA = 0.0;
    double voltageV = 0.0;
    std::optional<double> uCurrentA;
    std::optional<double> uVoltageV;
    bool fitted = false;
};

// The two kinds of input the fit takes, read the same way.
struct ReadingRows {
    const std::vector<Reading> &readings;
    std::size_t size() const { return readings.size(); }
    RowValues operator[](std::size_t row) const
    {
        const Reading &r = readings[row];
        return {r.currentA, r.voltageV, r.uCurrentA, r.uVoltageV, isFitted(r)};
    }
    // Readings are 320 bytes apart, so the hardware's stream prefetcher loses the pattern at
    // every 4 KiB page; asking for the line a few dozen readings ahead keeps memory busy.
    void prefetch(std::size_t row) const
    {
        if (row < readings.size())
            __builtin_prefetch(&readings[row]);
    }
};

struct ColumnRows {
    const ReadingColumns &columns;
    std::size_t size() const { return columns.currentA.size(); }
    RowValues operator[](std::size_t row) const
    {
        const std::uint8_t state = columns.state[row];
        RowValues v{columns.currentA[row], columns.voltageV[row], std::nullopt, std::nullopt,
                    (state & ReadingColumns::fitted) != 0};
        if (state & ReadingColumns::hasCurrentUncertainty)
            v.uCurrentA = columns.uCurrentA[row];
        if (state & ReadingColumns::hasVoltageUncertainty)
            v.uVoltageV = columns.uVoltageV[row];
        return v;
    }
    void prefetch(std::size_t) const {} // columns stream by themselves
};

template <typename Rows>
FitStatus gatherInput(const Rows &readings, FitMethod method, FitInput &input, std::string &message)
{
    // At most one entry per reading: reserved once, so a million readings grow no vector.
    for (auto *column : {&input.xStore, &input.yStore, &input.sx, &input.sy})
        column->reserve(readings.size());
    if (method == FitMethod::Wls) // OLS stores no weights; York's come from its own iteration
        input.weights.reserve(readings.size());
    input.hasUI.reserve(readings.size());
    for (std::size_t row = 0; row < readings.size(); ++row) {
        readings.prefetch(row + 32);
        const RowValues reading = readings[row];
        if (!reading.fitted)
            continue;
        if (!std::isfinite(reading.currentA) || !std::isfinite(reading.voltageV)) {
            message = rowName(row) + ": the current or the voltage is not a finite number";
            return FitStatus::NonFiniteValue;
        }
        const bool needU = method != FitMethod::Ols;
        const bool needUI = method == FitMethod::York;
        if (needU && !reading.uVoltageV) {
            message = rowName(row) + ": method " + toString(method) + " needs the voltage uncertainty u_voltage_v";
            return FitStatus::MissingUncertainty;
        }
        if (needUI && !reading.uCurrentA) {
            message = rowName(row) + ": method york needs the current uncertainty u_current_a";
            return FitStatus::MissingUncertainty;
        }
        const double uV = reading.uVoltageV.value_or(1.0);
        const double uI = reading.uCurrentA.value_or(1.0);
        if ((needU && !std::isfinite(uV)) || (needUI && !std::isfinite(uI))) {
            message = rowName(row) + ": an uncertainty is not a finite number";
            return FitStatus::NonFiniteValue;
        }
        if ((needU && !(uV > 0.0)) || (needUI && !(uI > 0.0))) {
            message = rowName(row) + ": a standard uncertainty must be above zero";
            return FitStatus::InvalidUncertainty;
        }
        if (!input.rows.empty() || input.xStore.size() != row) {
            if (input.rows.empty()) { // the first row left out before this one: list them from here on
                input.rows.reserve(readings.size());
                for (std::size_t i = 0; i < input.xStore.size(); ++i)
                    input.rows.push_back(i);
            }
            input.rows.push_back(row);
        }
        input.xStore.push_back(reading.currentA);
        input.yStore.push_back(reading.voltageV);
        if (method == FitMethod::Wls)
            input.weights.push_back(1.0 / (uV * uV));
        if (input.allStated && !(reading.uVoltageV && std::isfinite(uV) && uV > 0.0)) {
            input.allStated = false; // only OLS gets here (the others need u(V) > 0)
            input.sx.clear();
            input.sy.clear();
            input.hasUI.clear();
        }
        if (input.allStated) {
            input.sx.push_back(uI);
            input.sy.push_back(uV);
            input.hasUI.push_back(reading.uCurrentA && std::isfinite(uI) && uI > 0.0);
        }
    }
    input.x = input.xStore;
    input.y = input.yStore;
    return FitStatus::Ok;
}

// OLS of columns in which every row is used as it stands (fitted, finite, no uncertainty
// stated: nothing for the screen's σ): the fit reads the columns in place, as gatherInput would
// have copied them. false: gatherInput decides (and words any message).
bool useColumnsInPlace(const ReadingColumns &columns, FitMethod method, FitInput &input)
{
    if (method != FitMethod::Ols)
        return false;
    const std::size_t n = columns.size();
    const std::uint8_t *state = columns.state.data();
    const double *x = columns.currentA.data(), *y = columns.voltageV.data();
    // Integer reductions without an early exit, so both loops vectorize: a state other than
    // `fitted`, and an exponent field of all ones (infinity or NaN) in a current or a voltage,
    // which carries into bit 63 when one more exponent unit is added (add, and, or: no compare).
    std::uint8_t otherState = 0;
    for (std::size_t i = 0; i < n; ++i)
        otherState |= static_cast<std::uint8_t>(state[i] ^ ReadingColumns::fitted);
    constexpr std::uint64_t exponent = 0x7ff0000000000000u, exponentUnit = std::uint64_t{1} << 52;
    std::uint64_t carried = 0;
    for (std::size_t i = 0; i < n; ++i)
        carried |= ((std::bit_cast<std::uint64_t>(x[i]) & exponent) + exponentUnit)
                   | ((std::bit_cast<std::uint64_t>(y[i]) & exponent) + exponentUnit);
    if (otherState != 0 || (carried >> 63) != 0)
        return false;
    input.x = columns.currentA;
    input.y = columns.voltageV;
    input.allStated = n == 0;
    return true;
}

// Two-pass weighted line: means first, then centred sums (the accurate batch form). The
// status (all currents equal, overflow) comes from the same test the live fit applies. The
// standard errors wait for the residual pass of fitRows (standardErrors), which sums Σw·e².
struct CentredLine {
    LineFitResult line;      // status, slope, intercept, means, sxx
    double sumW = 0.0;       // Σ w
    double syy = 0.0;        // Σ w (y - ȳ)², the total sum of squares
};

// unit: OLS, every weight 1 (no weights stored), with the same arithmetic as stored ones.
template <bool unit>
CentredLine centredLineWith(const FitInput &input)
{
    const auto weight = [&](std::size_t i) { return unit ? 1.0 : input.weights[i]; };
    CentredLine c;
    LineFitResult &r = c.line;
    r.n = input.x.size();
    r.degreesOfFreedom = static_cast<int>(r.n) - 2;
    double sumW = 0.0, meanX = 0.0, meanY = 0.0, maxAbsX = 0.0;
    for (std::size_t i = 0; i < input.x.size(); ++i) {
        sumW += weight(i);
        meanX += weight(i) * input.x[i];
        meanY += weight(i) * input.y[i];
        maxAbsX = std::max(maxAbsX, std::fabs(input.x[i]));
    }
    meanX /= sumW;
    meanY /= sumW;
    double sxx = 0.0, sxy = 0.0, syy = 0.0;
    for (std::size_t i = 0; i < input.x.size(); ++i) {
        const double dx = input.x[i] - meanX;
        const double dy = input.y[i] - meanY;
        sxx += weight(i) * dx * dx;
        sxy += weight(i) * dx * dy;
        syy += weight(i) * dy * dy;
    }
    r.meanX = meanX;
    r.meanY = meanY;
    c.sumW = sumW;
    c.syy = syy;
    if (!lineFromCentredSums(r, sxx, sxy, syy, sumW, maxAbsX))
        return c;
    r.slope = sxy / sxx;
    r.intercept = meanY - r.slope * meanX;
    r.sxx = sxx;
    return c;
}

CentredLine centredLine(const FitInput &input)
{
    return input.weights.empty() ? centredLineWith<true>(input) : centredLineWith<false>(input);
}

// The line's standard errors from its residual sum of squares ssr = Σ w e²: absolute weights
// (WLS) from the weights alone; unit weights (OLS) from the scatter, n >= 3.
void standardErrors(FitSummary &summary, const CentredLine &c, double ssr, bool absoluteWeights)
{
    const LineFitResult &r = c.line;
    const double sxx = r.sxx, meanX = r.meanX, sumW = c.sumW;
    if (absoluteWeights) {
        summary.slopeSe = std::sqrt(1.0 / sxx);
        summary.interceptSe = std::sqrt(1.0 / sumW + meanX * meanX / sxx);
        summary.covariance = -meanX / sxx;
    } else if (r.n >= 3) {
        const double s2 = ssr / static_cast<double>(r.n - 2);
        summary.slopeSe = std::sqrt(s2 / sxx);
        summary.interceptSe = std::sqrt(s2 * (1.0 / sumW + meanX * meanX / sxx));
        summary.covariance = -meanX * s2 / sxx;
    }
}

// The residuals of the used points and their sums (plain and weighted Σe², max |y|, mean
// weight), added in input order. unit: OLS, every weight 1 (none stored).
template <bool unit>
void residualPass(const FitInput &input, const FitSummary &summary, ResultColumn &residuals, double &ssrPlain,
                  double &ssrWeighted, double &maxAbsY, double &meanW)
{
    const std::size_t n = input.x.size();
    const double a = summary.intercept, b = summary.slope, count = static_cast<double>(n);
    const double *x = input.x.data(), *y = input.y.data(), *w = input.weights.data();
    double *e = residuals.data();
    double plain = 0.0, weighted = 0.0, largest = 0.0, mean = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        const double wi = unit ? 1.0 : w[i];
        const double ei = y[i] - a - b * x[i];
        e[i] = ei;
        plain += ei * ei;
        weighted += wi * ei * ei;
        largest = std::max(largest, std::fabs(y[i]));
        mean += wi / count;
    }
    ssrPlain = plain;
    ssrWeighted = weighted;
    maxAbsY = largest;
    meanW = mean;
}

// What the per-point pass of fitRows works from: one value per used point, in input order.
// (When every row is used these become the result's columns without a copy.)
struct UsedPointResults {
    ResultColumn residuals;   // V_i - (a + b·I_i), V
    ResultColumn studentized; // shown (externally studentized); NaN where none
    ResultColumn compared;    // what the outlier screen compared (empty: the studentized
                              // residuals, one pass)
    std::vector<std::size_t> flagged; // the screen's flags, ascending
};

// Studentized residuals (information) and the outlier screen over the used points. sums are the
// fit's own Σw, x̄, Sxx and Σw·e² (the numbers the screen would compute again).
void screen(FitSummary &summary, const FitInput &input, const FitOptions &options, const ResidualSums &sums,
            double maxAbsY, double meanW, bool stated, UsedPointResults &results)
{
    const std::size_t n = input.x.size();
    std::vector<double> sigma;
    summary.statedRandomUncertainty = stated;
    if (stated) {
        sigma.resize(n);
        for (std::size_t i = 0; i < n; ++i)
            sigma[i] = std::hypot(input.sy[i], summary.slope * (input.hasUI[i] ? input.sx[i] : 0.0));
    }
    summary.scatterFloorV =
        resolutionScatterV(options.voltageResolutionV, options.currentResolutionA, summary.slope);
    // Below a billionth of the voltage a scatter is arithmetic noise, not a measurement.
    const double numericFloorV = 1e-9 * maxAbsY;
    const bool unitWeights = summary.method == FitMethod::Ols;
    const double studentFloor = unitWeights ? std::max(summary.scatterFloorV, numericFloorV)
                                            : numericFloorV * std::sqrt(meanW);
    // The externally studentized residuals, always shown (n >= 4). Without stated uncertainties
    // they are also the screen's first pass (same weights, same floor): computed once.
    externallyStudentizedResiduals(input.x, results.residuals, input.weights, studentFloor, sums,
                                   results.studentized);
    summary.outlierScreening =
        screenResiduals(input.x, results.residuals, input.weights, sigma,
                        stated ? std::max(summary.scatterFloorV, numericFloorV) : studentFloor, options.outlierScreen,
                        results.compared, results.flagged,
                        stated ? std::span<const double>() : std::span<const double>(results.studentized));
}

} // namespace

FitOptions fitOptionsFor(const std::optional<MeterSpecs> &meters)
{
    FitOptions options;
    if (meters) {
        options.voltageResolutionV = meters->voltmeter.resolution;
        options.currentResolutionA = meters->ammeter.resolution;
    }
    return options;
}

std::string toString(FitMethod method)
{
    switch (method) {
    case FitMethod::Ols: return "ols";
    case FitMethod::Wls: return "wls";
    case FitMethod::York: return "york";
    }
    return "ols";
}

std::optional<FitMethod> fitMethodFromString(std::string_view text)
{
    for (FitMethod m : {FitMethod::Ols, FitMethod::Wls, FitMethod::York})
        if (text == toString(m))
            return m;
    return std::nullopt;
}

std::optional<double> FitSummary::analysisSlopeSe() const
{
    if (!slopeSe)
        return std::nullopt;
    return *slopeSe * std::sqrt(std::max(1.0, mswd.value_or(1.0)));
}

std::optional<double> FitSummary::analysisInterceptSe() const
{
    if (!interceptSe)
        return std::nullopt;
    return *interceptSe * std::sqrt(std::max(1.0, mswd.value_or(1.0)));
}

std::optional<double> FitSummary::analysisCovariance() const
{
    if (!covariance)
        return std::nullopt;
    return *covariance * std::max(1.0, mswd.value_or(1.0));
}

namespace {

template <typename Rows>
FitSummary fitRows(const Rows &readings, FitMethod method, const FitOptions &options)
{
    FitSummary summary;
    summary.method = method;
    summary.confidence = options.confidence;
    FitInput input;
    std::string message;
    bool inPlace = false;
    if constexpr (std::is_same_v<Rows, ColumnRows>)
        inPlace = useColumnsInPlace(readings.columns, method, input);
    const FitStatus inputStatus = inPlace ? FitStatus::Ok : gatherInput(readings, method, input, message);
    if (inputStatus != FitStatus::Ok)
        return failure(std::move(summary), inputStatus, std::move(message));
    const std::size_t n = input.x.size();
    summary.n = n;
    summary.degreesOfFreedom = n >= 2 ? static_cast<int>(n) - 2 : 0;
    if (n < 2)
        return failure(std::move(summary), FitStatus::TooFewPoints,
                       "a line needs at least 2 fitted readings, got " + std::to_string(n)
                           + (readings.size() > n ? " (the others are excluded or flagged)" : ""));

    CentredLine line; // OLS and WLS: the line's own sums, which the per-point pass reuses
    if (method == FitMethod::York) {
        YorkOptions york;
        york.maxIterations = options.yorkMaxIterations;
        york.tolerance = options.yorkTolerance;
        YorkFitResult r = yorkFit(input.x, input.y, input.sx, input.sy, {}, york);
        if (!r.ok())
            return failure(std::move(summary), r.status, r.message);
        summary.slope = r.slope;
        summary.intercept = r.intercept;
        summary.slopeSe = r.slopeSe;
        summary.interceptSe = r.interceptSe;
        summary.covariance = r.covariance;
        summary.iterations = r.iterations;
        input.weights = std::move(r.weights);
        if (n >= 3)
            summary.chiSquared = r.chiSquared;
    } else {
        line = centredLine(input);
        const LineFitResult &r = line.line;
        if (!r.ok())
            return failure(std::move(summary), r.status, r.message);
        summary.slope = r.slope;
        summary.intercept = r.intercept;
    }
    summary.status = FitStatus::Ok;
    // The curvature check first: its working matrices are gone before the per-point results
    // are allocated, which keeps the peak of a million-reading fit lower.
    {
        const QuadraticFitResult quadratic = fitQuadratic(input.x, input.y, input.weights);
        if (quadratic.ok() && quadratic.curvatureP) {
            summary.curvatureP = quadratic.curvatureP;
            summary.curvatureCoefficient = quadratic.c2;
        }
    }

    // One pass over the used points: the residuals and their sums. OLS and WLS take Σw, the
    // means, Sxx and SST from the line's own two passes (the same sums, added in the same order);
    // York's weights are its own, so their sums are taken here.
    UsedPointResults used;
    used.residuals.resize(n);
    const bool york = method == FitMethod::York;
    double sumW = 0.0, sumWY = 0.0, sumWX = 0.0, ssrPlain = 0.0, ssrWeighted = 0.0, maxAbsY = 0.0, meanW = 0.0;
    const bool stated = input.allStated;
    if (input.weights.empty())
        residualPass<true>(input, summary, used.residuals, ssrPlain, ssrWeighted, maxAbsY, meanW);
    else
        residualPass<false>(input, summary, used.residuals, ssrPlain, ssrWeighted, maxAbsY, meanW);
    double sst = 0.0, sxx = 0.0, meanX = 0.0;
    if (york) {
        for (std::size_t i = 0; i < n; ++i) {
            const double w = input.weights[i];
            sumW += w;
            sumWY += w * input.y[i];
            sumWX += w * input.x[i];
        }
        const double meanY = sumWY / sumW;
        meanX = sumWX / sumW;
        for (std::size_t i = 0; i < n; ++i) {
            const double w = input.weights[i];
            sst += w * (input.y[i] - meanY) * (input.y[i] - meanY);
            sxx += w * (input.x[i] - meanX) * (input.x[i] - meanX);
        }
    } else {
        sumW = line.sumW;
        meanX = line.line.meanX;
        sxx = line.line.sxx;
        sst = line.syy;
        standardErrors(summary, line, ssrWeighted, method == FitMethod::Wls);
    }
    if (sst > 0.0)
        summary.rSquared = std::clamp(1.0 - ssrWeighted / sst, 0.0, 1.0);
    if (n >= 3) {
        const double dof = static_cast<double>(n - 2);
        summary.residualSdV = std::sqrt(ssrPlain / dof);
        if (method != FitMethod::Ols) {
            summary.chiSquared = method == FitMethod::Wls ? ssrWeighted : summary.chiSquared;
            summary.mswd = *summary.chiSquared / dof;
            summary.slopeSeScaled = *summary.slopeSe * std::sqrt(*summary.mswd);
            summary.interceptSeScaled = *summary.interceptSe * std::sqrt(*summary.mswd);
        }
        const double t = studentTCoverageFactor(options.confidence, dof);
        const double half = t * *summary.analysisSlopeSe();
        const double r = summary.seriesResistanceOhm();
        summary.seriesResistanceCi = Interval{r - half, r + half};
    }
    summary.sumWeights = sumW;
    summary.meanCurrentA = meanX;
    summary.sxx = sxx;
    screen(summary, input, options, ResidualSums{sumW, meanX, sxx, ssrWeighted}, maxAbsY, meanW, stated, used);

    // One result per input row. Every row used (the common case): the used points' columns are
    // the rows' columns, moved. Otherwise used rows take theirs and any other row's residual
    // comes from its own values.
    PointFits &points = summary.points;
    if (n == readings.size()) {
        points.residualV = std::move(used.residuals);
        points.studentized = std::move(used.studentized);
        points.screening = std::move(used.compared);
        points.state.assign(n, PointFits::used);
        for (std::size_t i : used.flagged) {
            points.state[i] |= PointFits::outlier;
            summary.outlierRows.push_back(i);
        }
        return summary;
    }
    const std::size_t rows = readings.size();
    points.residualV.resize(rows);
    points.studentized.assign(rows, std::numeric_limits<double>::quiet_NaN());
    if (!used.compared.empty())
        points.screening.assign(rows, std::numeric_limits<double>::quiet_NaN());
    points.state.assign(rows, 0);
    std::size_t next = 0; // the next used point
    for (std::size_t row = 0; row < rows; ++row) {
        if (next < n && input.rowOf(next) == row) {
            points.residualV[row] = used.residuals[next];
            points.studentized[row] = used.studentized[next];
            if (!used.compared.empty())
                points.screening[row] = used.compared[next];
            points.state[row] = PointFits::used;
            ++next;
        } else {
            const RowValues reading = readings[row];
            points.residualV[row] = std::isfinite(reading.currentA) && std::isfinite(reading.voltageV)
                                        ? reading.voltageV - summary.intercept - summary.slope * reading.currentA
                                        : 0.0;
        }
    }
    for (std::size_t i : used.flagged) {
        points.state[input.rowOf(i)] |= PointFits::outlier;
        summary.outlierRows.push_back(input.rowOf(i));
    }
    return summary;
}

} // namespace

FitSummary fitReadings(const std::vector<Reading> &readings, FitMethod method, const FitOptions &options)
{
    return fitRows(ReadingRows{readings}, method, options);
}

FitSummary fitReadings(const ReadingColumns &columns, FitMethod method, const FitOptions &options)
{
    return fitRows(ColumnRows{columns}, method, options);
}

void ReadingColumns::reserve(std::size_t n)
{
    currentA.reserve(n);
    voltageV.reserve(n);
    uCurrentA.reserve(n);
    uVoltageV.reserve(n);
    state.reserve(n);
}

void ReadingColumns::append(const Reading &reading, double scale)
{
    currentA.push_back(reading.currentA * scale);
    voltageV.push_back(reading.voltageV * scale);
    uCurrentA.push_back(reading.uCurrentA.value_or(0.0) * scale);
    uVoltageV.push_back(reading.uVoltageV.value_or(0.0) * scale);
    state.push_back(static_cast<std::uint8_t>((isFitted(reading) ? fitted : 0)
                                              | (reading.uCurrentA ? hasCurrentUncertainty : 0)
                                              | (reading.uVoltageV ? hasVoltageUncertainty : 0)));
}

void ReadingColumns::clear()
{
    *this = ReadingColumns();
}

LinePrediction predictVoltage(const FitSummary &summary, double currentA, std::optional<double> uNewReadingV)
{
    LinePrediction p;
    if (!summary.ok() || !std::isfinite(currentA))
        return p;
    p.value = summary.intercept + summary.slope * currentA;
    const auto varA = summary.analysisInterceptSe();
    const auto varB = summary.analysisSlopeSe();
    const auto cov = summary.analysisCovariance();
    if (!varA || !varB || !cov || summary.degreesOfFreedom < 1)
        return p;
    const double lineVariance =
        std::max(0.0, *varA * *varA + currentA * currentA * *varB * *varB + 2.0 * currentA * *cov);
    const double newVariance = uNewReadingV ? *uNewReadingV * *uNewReadingV
                                            : summary.residualSdV.value_or(0.0) * summary.residualSdV.value_or(0.0);
    const double t = studentTCoverageFactor(summary.confidence, summary.degreesOfFreedom);
    p.standardError = std::sqrt(lineVariance);
    p.confidence = Interval{p.value - t * *p.standardError, p.value + t * *p.standardError};
    const double halfNew = t * std::sqrt(lineVariance + newVariance);
    p.prediction = Interval{p.value - halfNew, p.value + halfNew};
    return p;
}

FitSummary summaryOfLiveFit(const LineFit &live)
{
    const LineFitResult r = live.result();
    FitSummary summary;
    summary.status = r.status;
    summary.message = r.message;
    summary.method = FitMethod::Ols;
    summary.n = r.n;
    summary.degreesOfFreedom = r.degreesOfFreedom;
    summary.slope = r.slope;
    summary.intercept = r.intercept;
    summary.slopeSe = r.slopeSe;
    summary.interceptSe = r.interceptSe;
    summary.covariance = r.covariance;
    summary.residualSdV = r.residualSd;
    summary.rSquared = r.rSquared;
    summary.meanCurrentA = r.meanX;
    summary.sxx = r.sxx;
    summary.sumWeights = static_cast<double>(r.n);
    summary.outlierScreening.reason = "not screened (live fit)";
    return summary;
}

} // namespace sagline
