#include "ControlChart.h"

#include <cmath>

namespace sagline {

IndividualsChart individualsChart(const std::vector<double> &valuesInTimeOrder)
{
    IndividualsChart chart;
    std::vector<double> values;
    std::vector<std::size_t> positions; // index into valuesInTimeOrder of each finite value
    for (std::size_t i = 0; i < valuesInTimeOrder.size(); ++i) {
        if (std::isfinite(valuesInTimeOrder[i])) {
            values.push_back(valuesInTimeOrder[i]);
            positions.push_back(i);
        }
    }
    chart.n = values.size();
    const std::size_t skipped = valuesInTimeOrder.size() - values.size();
    const std::string skippedNote =
        skipped ? "; " + std::to_string(skipped) + " value(s) without a number left out" : std::string();
    if (values.empty()) {
        chart.note = "no values" + skippedNote;
        return chart;
    }
    double sum = 0.0;
    for (double v : values)
        sum += v;
    const double centre = sum / static_cast<double>(values.size());
    chart.centre = centre;
    if (values.size() < controlChartMinimumValues) {
        chart.note = "no limits: an individuals chart needs at least " + std::to_string(controlChartMinimumValues)
                     + " units, got " + std::to_string(values.size()) + skippedNote;
        return chart;
    }
    double ranges = 0.0;
    for (std::size_t i = 1; i < values.size(); ++i)
        ranges += std::fabs(values[i] - values[i - 1]);
    const double averageRange = ranges / static_cast<double>(values.size() - 1);
    chart.averageMovingRange = averageRange;
    if (!(averageRange > 0.0)) {
        chart.note = "no limits: every unit has the same value, the moving range is zero" + skippedNote;
        return chart;
    }
    const double sigma = averageRange / movingRangeD2;
    chart.sigma = sigma;
    chart.upper = centre + 3.0 * sigma;
    chart.lower = centre - 3.0 * sigma;
    for (std::size_t k = 0; k < values.size(); ++k) {
        if (values[k] > *chart.upper || values[k] < *chart.lower)
            chart.outside.push_back(positions[k]);
    }
    chart.preliminary = values.size() < controlChartSettledValues;
    chart.note = "individuals chart: mean ± 3σ, σ = average moving range / 1.128 (Montgomery), "
                 + std::to_string(values.size()) + " units in time order"
                 + (chart.preliminary ? "; preliminary limits (fewer than 20 units)" : std::string()) + skippedNote;
    return chart;
}

} // namespace sagline
