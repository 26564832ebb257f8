// Residuals (measured minus fitted voltage, in mV) against current, under the V–I chart: a
// bend or a drift shows here long before it shows on the line. The residual of each point is
// supplied by core through `setResidualFunction`; this class lays the values out, batched and
// thinned like the V–I chart.
#pragma once

#include "ChartAxes.h"
#include "ChartStyle.h"
#include "DisplayPoints.h"

#include <QTimer>
#include <QWidget>

#include <functional>

class QChart;
class QLineSeries;
class QValueAxis;

namespace sagline {

class ChartLegend;
class InteractiveChartView;

class ResidualChart : public QWidget {
    Q_OBJECT
public:
    // Residual in volts of a point (current A, voltage V) against the current fit.
    using ResidualFunction = std::function<double(double, double)>;

    // `points` (shared with the V–I chart) is owned by the caller and outlives the chart.
    explicit ResidualChart(const DisplayPoints &points, QWidget *parent = nullptr);
    void pointsChanged();  // the shared points changed: drawn at the next refresh
    void pointsCleared();  // they were cleared: the residual function and the axes go too
    // An empty function (no fit yet) hides the points. `residualSdV` draws ±2 s guide lines.
    void setResidualFunction(ResidualFunction residual, double residualSdV);
    void setCurrentSpan(double maxCurrentA);
    void applyColours(bool dark);
    // Zoom and pan (InteractiveChartView): while the person's view stands, new points do not
    // rescale the axes; resetView() returns to the autoscaled view of the included points.
    bool isUserView() const { return m_userView; }
    void resetView();
    void flushNow();
    InteractiveChartView *chartView() const { return m_view; }
    int drawnIncludedCount() const;
    std::pair<double, double> residualAxisRange() const; // as drawn after the last flush, mV

private:
    void scheduleFlush();

    InteractiveChartView *m_view;
    bool m_userView = false; // zoomed or panned by the person: no autoscaling until reset
    QChart *m_chart;
    ChartLegend *m_legend;
    QValueAxis *m_axisX;
    QValueAxis *m_axisY;
    QLineSeries *m_zero;
    QLineSeries *m_upperGuide;
    QLineSeries *m_lowerGuide;
    QLineSeries *m_excluded;
    QLineSeries *m_included;
    ChartColours m_colours;
    const DisplayPoints &m_points;
    ResidualFunction m_residual;
    double m_residualSdV = 0.0;
    double m_maxCurrentA = 0.0;
    AxisSpan m_x;
    AxisSpan m_y;
    bool m_dirty = false;
    QTimer m_flushTimer;
};

} // namespace sagline
