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

std::string outlierScreenFootnote(const FitSummary &fit)
{
    if (!fit.ok())
        return "No line was fitted, so nothing was screened for outliers.";
    const OutlierScreening &screen = fit.outlierScreening;
    if (!screen.screened || !screen.criticalValue)
        return "Outlier screen: " + (screen.reason.empty() ? std::string("not run") : screen.reason) + ".";
    const std::string statistic = fit.statedRandomUncertainty
                                      ? "normalized residual (from the readings' stated uncertainty, not the Stud. column)"
                                      : "externally studentized residual";
    return "Outlier screen: a reading whose " + statistic + " lies beyond ±" + formatSignificant(*screen.criticalValue, 3)
           + " is flagged (the critical value for this number of points; the rule is under the fit). A flagged reading "
             "stays in the fit unless excluded with a reason.";
}

} // namespace sagline
