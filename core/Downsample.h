// Thinning a long point series for display: Largest-Triangle-Three-Buckets (LTTB),
// S. Steinarsson, "Downsampling Time Series for Visual Representation", MSc thesis,
// University of Iceland, 2013 (hdl.handle.net/1946/15343). Display only: fits always use
// every point.
#pragma once

#include <cstddef>
#include <span>
#include <vector>

namespace sagline {

struct PlotPoint {
    double x = 0.0;
    double y = 0.0;
};

// Indices (ascending) of the points LTTB keeps out of `points`, which must be ordered by x
// (non-decreasing; the chart sorts by current first). Points with a non-finite coordinate are
// never kept. When `threshold` is at least the number of finite points, or below 3, every
// finite point is kept (below 3 there is no bucket to choose from, so thinning would only
// drop data). Otherwise the result has exactly `threshold` indices: the first and last
// finite points, and from each of the threshold - 2 equal buckets in between the point that
// forms the largest triangle with the point kept before it and the mean of the next bucket.
std::vector<std::size_t> lttbIndices(std::span<const PlotPoint> points, std::size_t threshold);

// The kept points themselves, in order.
std::vector<PlotPoint> lttbDownsample(std::span<const PlotPoint> points, std::size_t threshold);

// Thinning for a scatter whose spread is the message (residuals): LTTB alone keeps each
// bucket's most deviating point, so thinned noise looks like two bands with nothing between
// them. Kept here, ascending and at most `threshold`: the points LTTB keeps at half the budget
// (every spike and the edges of the spread) and, with the other half, finite points evenly
// spaced by index (the middle of the spread, in proportion). Every finite point when the
// budget allows; below 6 it is LTTB's rule.
std::vector<std::size_t> scatterSampleIndices(std::span<const PlotPoint> points, std::size_t threshold);
std::vector<PlotPoint> scatterSample(std::span<const PlotPoint> points, std::size_t threshold);

} // namespace sagline
