#include "OutlierFlagText.h"

#include "NumberFormat.h"

namespace sagline {

std::string outlierFlagText(const FitSummary &fit, std::size_t row)
{
    if (row >= fit.points.size() || !fit.points[row].outlier)
        return {};
    const PointFit &point = fit.points[row];
    const OutlierScreening &screen = fit.outlierScreening;
    std::string text = "Flagged by the outlier screen";
    if (point.screeningStatistic && screen.criticalValue)
        text += ": statistic " + formatSignificant(*point.screeningStatistic, 3) + ", beyond the critical value ±"
                + formatSignificant(*screen.criticalValue, 3);
    text += ".\nRule: " + screen.rule + ".\nSource: " + screen.source
            + ".\nShown, never applied: the reading stays in the fit unless it is excluded with a reason.";
    return text;
}

} // namespace sagline
