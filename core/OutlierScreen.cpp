#include "OutlierScreen.h"

#include "Distributions.h"
#include "FitWeights.h"
#include "NumberFormat.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace sagline {

namespace {

// A statistic that does not exist for a point (PointFits.h reads it back as nullopt).
constexpr double noStatistic = std::numeric_limits<double>::quiet_NaN();

// The weighted line's centring sums: Σw, the weighted mean of x and Σw(x - x̄)².
struct Centre {
    double sumW = 0.0;
    double meanX = 0.0;
    double sxx = 0.0;
};

Centre centreOf(std::span<const double> x, FitWeights w)
{
    Centre c;
    for (std::size_t i = 0; i < x.size(); ++i) {
        c.sumW += w[i];
        c.meanX += w[i] * x[i];
    }
    c.meanX /= c.sumW;
    for (std::size_t i = 0; i < x.size(); ++i)
        c.sxx += w[i] * (x[i] - c.meanX) * (x[i] - c.meanX);
    return c;
}

// Normalized residuals e_i/sqrt(Var e_i) with known σ_j. For a line fitted with weights w,
// e = (I - H) ε with H_ij = w_j (1/W + d_i d_j/Sxx), so
// Var e_i = σ_i² (1 - 2 H_ii) + Σ_j H_ij² σ_j², whose sum takes three running sums (O(n)).
// With w = 1/σ² it is σ_i² (1 - H_ii).
void normalizedResiduals(std::span<const double> x, std::span<const double> e, FitWeights w,
                         std::span<const double> sigma, double floorV, ResultColumn &out)
{
    const Centre c = centreOf(x, w);
    double a = 0.0, b = 0.0, q = 0.0; // Σ w²σ², Σ w²σ² d, Σ w²σ² d²
    const auto sigmaOf = [&](std::size_t i) { return std::max(sigma[i], floorV); };
    for (std::size_t j = 0; j < x.size(); ++j) {
        const double d = x[j] - c.meanX;
        const double v = w[j] * w[j] * sigmaOf(j) * sigmaOf(j);
        a += v;
        b += v * d;
        q += v * d * d;
    }
    for (std::size_t i = 0; i < x.size(); ++i) {
        const double d = x[i] - c.meanX;
        const double hii = w[i] * (1.0 / c.sumW + d * d / c.sxx);
        const double s2 = sigmaOf(i) * sigmaOf(i);
        const double spread = a / (c.sumW * c.sumW) + 2.0 * d * b / (c.sumW * c.sxx) + d * d * q / (c.sxx * c.sxx);
        const double variance = s2 * (1.0 - 2.0 * hii) + spread;
        out[i] = variance > 1e-30 * s2 && hii < 1.0 - 1e-12 ? e[i] / std::sqrt(variance) : noStatistic;
    }
}

// Externally studentized residuals t_i = sqrt(w_i) e_i / (s_(i) sqrt(1 - h_i)), where s_(i) is the
// scatter without point i ((n-2)s² - w_i e_i²/(1 - h_i))/(n-3), floored by floorV. NaN where the
// line passes through the point by construction (h_i = 1) or no floor and no scatter is left.
// Written without branches, in the same arithmetic as ever (the same numbers to the last bit).
// unit: every weight is 1 (w is empty), with the same arithmetic as stored ones.
template <bool unit>
void studentizedWith(std::span<const double> x, std::span<const double> e, std::span<const double> w, double floorV,
                     const ResidualSums &c, ResultColumn &out)
{
    const std::size_t n = x.size();
    // Locals, so the stores to out cannot alias the sums (which would stop the vectorizer).
    const double ssr = c.ssr, sumW = c.sumW, meanX = c.meanX, sxx = c.sxx;
    const double dof = static_cast<double>(n) - 2.0;
    const double *px = x.data(), *pe = e.data(), *pw = w.data();
    double *po = out.data();
    for (std::size_t i = 0; i < n; ++i) {
        const double wi = unit ? 1.0 : pw[i];
        const double d = px[i] - meanX;
        const double hii = wi * (1.0 / sumW + d * d / sxx);
        const double without = (ssr - wi * pe[i] * pe[i] / (1.0 - hii)) / (dof - 1.0);
        const double root = std::sqrt(without > 0.0 ? without : 0.0);
        const double s = root < floorV ? floorV : root;
        const double t = std::sqrt(wi) * pe[i] / (s * std::sqrt(1.0 - hii));
        const bool defined = (hii < 1.0 - 1e-12) & (s > 0.0);
        po[i] = defined ? t : noStatistic;
    }
}

void studentized(std::span<const double> x, std::span<const double> e, std::span<const double> w, double floorV,
                 const ResidualSums &c, ResultColumn &out)
{
    if (w.empty())
        studentizedWith<true>(x, e, w, floorV, c, out);
    else
        studentizedWith<false>(x, e, w, floorV, c, out);
}

ResidualSums sumsOf(std::span<const double> x, std::span<const double> e, FitWeights w)
{
    const Centre c = centreOf(x, w);
    ResidualSums sums{c.sumW, c.meanX, c.sxx, 0.0};
    for (std::size_t i = 0; i < x.size(); ++i)
        sums.ssr += w[i] * e[i] * e[i];
    return sums;
}

void studentized(std::span<const double> x, std::span<const double> e, std::span<const double> w, double floorV,
                 ResultColumn &out)
{
    studentized(x, e, w, floorV, sumsOf(x, e, w), out);
}

// "5", "2.5": a percentage as people write it.
std::string shortNumber(double value)
{
    std::string text = formatSignificant(value, 4);
    if (text.find('.') != std::string::npos) {
        text.erase(text.find_last_not_of('0') + 1);
        if (text.back() == '.')
            text.pop_back();
    }
    return text;
}

} // namespace

void externallyStudentizedResiduals(std::span<const double> x, std::span<const double> residuals,
                                    std::span<const double> weights, double floor,
                                    ResultColumn &statistics)
{
    statistics.assign(x.size(), noStatistic);
    if (x.size() >= 4)
        studentized(x, residuals, weights, floor, statistics);
}

void externallyStudentizedResiduals(std::span<const double> x, std::span<const double> residuals,
                                    std::span<const double> weights, double floor, const ResidualSums &sums,
                                    ResultColumn &statistics)
{
    statistics.assign(x.size(), noStatistic);
    if (x.size() >= 4)
        studentized(x, residuals, weights, floor, sums, statistics);
}

double resolutionScatterV(double voltageResolutionV, double currentResolutionA, double slopeVPerA)
{
    const double v = std::isfinite(voltageResolutionV) && voltageResolutionV > 0.0 ? voltageResolutionV : 0.0;
    const double i = std::isfinite(currentResolutionA) && currentResolutionA > 0.0 ? currentResolutionA : 0.0;
    return std::sqrt((v * v + slopeVPerA * slopeVPerA * i * i) / 12.0);
}

namespace {

// The statistic of every point of one pass (the active points only).
void passStatistics(bool known, std::span<const double> x, std::span<const double> e, std::span<const double> w,
                    std::span<const double> sigma, double floorV, ResultColumn &out)
{
    out.assign(x.size(), noStatistic);
    if (known && x.size() >= 3)
        normalizedResiduals(x, e, w, sigma, floorV, out);
    else if (!known && x.size() >= 4)
        studentized(x, e, w, floorV, out);
}

double criticalValue(bool known, std::size_t n, double familyAlpha)
{
    const double tail = familyAlpha / (2.0 * static_cast<double>(n));
    return known ? normalQuantile(1.0 - tail) : studentTQuantile(1.0 - tail, static_cast<double>(n) - 3.0);
}

// Residuals of the active points about the line refitted without the points set aside: the
// weighted line through (x, e) is the change of the fitted line, so e - (δa + δb·x).
void refitResiduals(std::vector<double> &x, std::vector<double> &e, FitWeights w)
{
    const Centre c = centreOf(x, w);
    double meanE = 0.0, sxe = 0.0;
    for (std::size_t i = 0; i < x.size(); ++i)
        meanE += w[i] * e[i] / c.sumW;
    for (std::size_t i = 0; i < x.size(); ++i)
        sxe += w[i] * (x[i] - c.meanX) * (e[i] - meanE);
    const double slope = c.sxx > 0.0 ? sxe / c.sxx : 0.0;
    for (std::size_t i = 0; i < x.size(); ++i)
        e[i] -= meanE + slope * (x[i] - c.meanX);
}

} // namespace

OutlierScreening screenResiduals(std::span<const double> x, std::span<const double> residuals,
                                 std::span<const double> weights, std::span<const double> knownSigmaV,
                                 double scatterFloorV, const OutlierScreenOptions &options,
                                 ResultColumn &statistics, std::vector<std::size_t> &flagged,
                                 std::span<const double> firstPass)
{
    const std::size_t n = x.size();
    flagged.clear();
    OutlierScreening screening;
    const bool known = !knownSigmaV.empty();
    const double floorV = std::isfinite(scatterFloorV) && scatterFloorV > 0.0 ? scatterFloorV : 0.0;
    const std::string family = "Bonferroni, " + shortNumber(options.familyAlpha * 100.0) + " % per sweep";
    const std::string sequence = "; the largest beyond it is flagged and set aside, the rest screened again";
    if (known)
        screening.rule = "normalized residual e/(σ·sqrt(1 - h)) with the readings' stated random uncertainty, "
                         "against z(1 - α/(2n)) (" + family + ")" + sequence;
    else
        screening.rule = "externally studentized residual (n - 3 degrees of freedom"
                         + std::string(floorV > 0.0 ? ", scatter floored by the resolution" : "")
                         + "), against t(1 - α/(2n), n - 3) (" + family + ")" + sequence;
    const bool given = !known && !firstPass.empty() && firstPass.size() == n;
    if (given)
        statistics.clear();
    else
        passStatistics(known, x, residuals, weights, knownSigmaV, floorV, statistics);
    const std::span<const double> first = given ? firstPass : std::span<const double>(statistics);
    if (n < options.minimumPoints) {
        screening.reason = "too few points to screen (" + std::to_string(n) + "; the screen needs "
                           + std::to_string(options.minimumPoints) + ")";
        return screening;
    }
    screening.screened = true;
    screening.criticalValue = criticalValue(known, n, options.familyAlpha);
    // On a clean sweep only the first pass can flag, so the family level holds; setting a flagged
    // point aside before looking again keeps one gross misread from dragging the line (and,
    // with a known σ, every other residual) past the critical value.
    // The first pass reads statistics itself; the points still active and their copies exist
    // only once a point is flagged (a clean million-point sweep needs none of them).
    // (NaN, no statistic, is never beyond: every comparison with it is false.)
    const auto largestBeyond = [](std::span<const double> values, double critical) {
        std::optional<std::size_t> worst;
        double largest = critical;
        for (std::size_t k = 0; k < values.size(); ++k)
            if (std::fabs(values[k]) > largest) {
                largest = std::fabs(values[k]);
                worst = k;
            }
        return worst;
    };
    const std::optional<std::size_t> firstWorst = largestBeyond(first, *screening.criticalValue);
    if (!firstWorst)
        return screening;
    flagged.push_back(*firstWorst);
    if (given)
        statistics.assign(firstPass.begin(), firstPass.end()); // the later passes replace the active points' values
    std::vector<std::size_t> active;
    active.reserve(n - 1);
    for (std::size_t i = 0; i < n; ++i)
        if (i != *firstWorst)
            active.push_back(i);
    std::vector<double> ax, ae, aw, as;
    ResultColumn passed;
    const FitWeights weight(weights);
    while (active.size() >= options.minimumPoints) {
        ax.clear(), ae.clear(), aw.clear(), as.clear();
        for (std::size_t i : active) {
            ax.push_back(x[i]);
            ae.push_back(residuals[i]);
            aw.push_back(weight[i]);
            if (known)
                as.push_back(knownSigmaV[i]);
        }
        refitResiduals(ax, ae, aw);
        passStatistics(known, ax, ae, aw, as, floorV, passed);
        for (std::size_t k = 0; k < active.size(); ++k)
            statistics[active[k]] = passed[k];
        const std::optional<std::size_t> worst =
            largestBeyond(passed, criticalValue(known, active.size(), options.familyAlpha));
        if (!worst)
            break;
        flagged.push_back(active[*worst]);
        active.erase(active.begin() + static_cast<std::ptrdiff_t>(*worst));
    }
    std::sort(flagged.begin(), flagged.end());
    return screening;
}

} // namespace sagline
