// LTTB as described by Steinarsson (2013), chapter 4: fixed buckets of equal point count,
// one point chosen per bucket by the effective area of the triangle it forms with the
// previously chosen point and the average of the following bucket.
#include "Downsample.h"

#include <cmath>
#include <cstddef>

namespace sagline {

namespace {

bool isFinite(const PlotPoint &p) { return std::isfinite(p.x) && std::isfinite(p.y); }

// Twice the triangle's area; the factor does not change which point wins.
double doubleArea(const PlotPoint &a, const PlotPoint &b, double cx, double cy)
{
    return std::abs((a.x - cx) * (b.y - a.y) - (a.x - b.x) * (cy - a.y));
}

// The indices of the finite points, ascending: what both thinnings work on.
std::vector<std::size_t> finiteIndices(std::span<const PlotPoint> points)
{
    std::vector<std::size_t> finite;
    finite.reserve(points.size());
    for (std::size_t i = 0; i < points.size(); ++i) {
        if (isFinite(points[i]))
            finite.push_back(i);
    }
    return finite;
}

// LTTB over the finite points `finite` (indices into points, ascending).
std::vector<std::size_t> lttbOfFinite(std::span<const PlotPoint> points, const std::vector<std::size_t> &finite,
                                      std::size_t threshold)
{
    const std::size_t n = finite.size();
    if (threshold >= n || threshold < 3)
        return finite;

    const auto at = [&](std::size_t k) -> const PlotPoint & { return points[finite[k]]; };
    std::vector<std::size_t> kept;
    kept.reserve(threshold);
    kept.push_back(finite[0]);

    const std::size_t buckets = threshold - 2;
    // Bucket b covers finite indices [start(b), start(b + 1)); the interior points 1..n-2 are
    // split as evenly as integer division allows.
    const auto start = [&](std::size_t b) { return 1 + (b * (n - 2)) / buckets; };

    std::size_t previous = 0;
    for (std::size_t b = 0; b < buckets; ++b) {
        const std::size_t first = start(b);
        const std::size_t last = start(b + 1); // exclusive
        // The average of the next bucket; after the last bucket it is the last point.
        double cx = 0.0;
        double cy = 0.0;
        if (b + 1 < buckets) {
            const std::size_t nextFirst = last;
            const std::size_t nextLast = start(b + 2);
            for (std::size_t k = nextFirst; k < nextLast; ++k) {
                cx += at(k).x;
                cy += at(k).y;
            }
            const auto count = static_cast<double>(nextLast - nextFirst);
            cx /= count;
            cy /= count;
        } else {
            cx = at(n - 1).x;
            cy = at(n - 1).y;
        }
        std::size_t best = first;
        double bestArea = -1.0;
        for (std::size_t k = first; k < last; ++k) {
            const double area = doubleArea(at(previous), at(k), cx, cy);
            if (area > bestArea) {
                bestArea = area;
                best = k;
            }
        }
        kept.push_back(finite[best]);
        previous = best;
    }
    kept.push_back(finite[n - 1]);
    return kept;
}

std::vector<PlotPoint> pointsAt(std::span<const PlotPoint> points, const std::vector<std::size_t> &indices)
{
    std::vector<PlotPoint> out;
    out.reserve(indices.size());
    for (std::size_t i : indices)
        out.push_back(points[i]);
    return out;
}

} // namespace

std::vector<std::size_t> lttbIndices(std::span<const PlotPoint> points, std::size_t threshold)
{
    return lttbOfFinite(points, finiteIndices(points), threshold);
}

std::vector<PlotPoint> lttbDownsample(std::span<const PlotPoint> points, std::size_t threshold)
{
    return pointsAt(points, lttbIndices(points, threshold));
}

std::vector<std::size_t> scatterSampleIndices(std::span<const PlotPoint> points, std::size_t threshold)
{
    std::vector<std::size_t> finite = finiteIndices(points);
    if (threshold < 6)
        return lttbOfFinite(points, finite, threshold);
    if (threshold >= finite.size())
        return finite;
    const std::vector<std::size_t> extremes = lttbOfFinite(points, finite, threshold / 2);
    const std::size_t even = threshold - threshold / 2;
    std::vector<std::size_t> kept;
    kept.reserve(threshold);
    std::size_t e = 0;
    // Merge the extremes (ascending) with the even picks finite[k·n/even] (ascending).
    for (std::size_t k = 0; k < even; ++k) {
        const std::size_t pick = finite[k * finite.size() / even];
        while (e < extremes.size() && extremes[e] < pick)
            kept.push_back(extremes[e++]);
        if (e < extremes.size() && extremes[e] == pick)
            ++e;
        kept.push_back(pick);
    }
    kept.insert(kept.end(), extremes.begin() + static_cast<std::ptrdiff_t>(e), extremes.end());
    return kept;
}

std::vector<PlotPoint> scatterSample(std::span<const PlotPoint> points, std::size_t threshold)
{
    return pointsAt(points, scatterSampleIndices(points, threshold));
}

} // namespace sagline
