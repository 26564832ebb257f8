// The live V–I chart: measured and excluded points, the fitted line with its 95 % confidence
// band, the predicted next point with its prediction interval, the rated-current line, the
// rated-VA curve, and the unsafe region (above the hard-stop VA, beyond the rheostat's safe
// current or where the fuse may open) with its edge drawn. Every number it draws comes from
// core; this class only lays them out. Changes are batched: setters mark the chart dirty and a
// ~10 Hz timer pushes each series with one replace() (QT-NOTES §1.1); points beyond a few
// thousand are thinned with LTTB for display only.
#pragma once

#include "ChartAxes.h"
#include "ChartStyle.h"
#include "DisplayPoints.h"

#include <QList>
#include <QPointF>
#include <QTimer>
#include <QWidget>

#include <optional>

class QAreaSeries;
class QChart;
class QLineSeries;
class QValueAxis;

namespace sagline {

class ChartLegend;
class InteractiveChartView;

struct ChartLimits {
    double ratedCurrentA = 0.0;
    double ratedVa = 0.0;
    double hardStopVa = 0.0;                   // rated VA × overload factor
    std::optional<double> rheostatSafeCurrentA;
    std::optional<double> fuseRiskCurrentA;    // lowest planned current at which the fuse may open
    double plannedTopCurrentA = 0.0;
    double expectedNoLoadV = 0.0;
    double expectedTopV = 0.0;                 // predicted voltage at the top planned step
};

struct FitOverlay {
    QList<QPointF> line;                       // fitted V on the grid; empty: no fit yet
    QList<QPointF> bandUpper;                  // 95 % confidence band, same grid
    QList<QPointF> bandLower;
    std::optional<QPointF> predicted;          // the next planned step
    double predictionLowV = 0.0;               // its 95 % prediction interval
    double predictionHighV = 0.0;
};

class VoltageCurrentChart : public QWidget {
    Q_OBJECT
public:
    // `points` (shared with the residual chart) is owned by the caller and outlives the chart.
    explicit VoltageCurrentChart(const DisplayPoints &points, QWidget *parent = nullptr);

    void setLimits(const ChartLimits &limits);
    // The shared points gained, lost or changed points: drawn at the next refresh.
    void pointsChanged();
    // The points were cleared: the fit overlay goes too.
    void pointsCleared();
    // The axes fit the included points afresh (an exclusion changed: they may shrink).
    void rescale();
    std::pair<double, double> voltageAxisRange() const; // as drawn after the last flush, V
    void setFitOverlay(const FitOverlay &overlay);
    // `count` currents spanning the current axis, for core to evaluate the line and band on.
    std::vector<double> gridCurrents(int count) const;
    void applyColours(bool dark);
    // Zoom and pan (InteractiveChartView): while the person's view stands, new points do not
    // rescale the axes; resetView() returns to the autoscaled view of the included points.
    bool isUserView() const { return m_userView; }
    void resetView();
    // Pushes pending changes to the series at once (the timer does this ~10 times a second).
    void flushNow();

    // What is on screen, for tests and the benchmark.
    int drawnIncludedCount() const;
    int drawnExcludedCount() const;
    int drawnFitPointCount() const;
    bool hasPrediction() const;
    InteractiveChartView *chartView() const { return m_view; }
    ChartLegend *legend() const { return m_legend; }

signals:
    // The current axis now reaches further: the fit overlay should be evaluated again over
    // gridCurrents() so the line and band span the plot.
    void currentSpanChanged();

private:
    void scheduleFlush();
    void growRanges();
    void rebuildLimitSeries();
    void rebuildLegend();
    QLineSeries *newSeries();

    InteractiveChartView *m_view;
    bool m_userView = false; // zoomed or panned by the person: no autoscaling until reset
    QChart *m_chart;
    ChartLegend *m_legend;
    QValueAxis *m_axisX;
    QValueAxis *m_axisY;
    QLineSeries *m_unsafeUpper;
    QLineSeries *m_unsafeLower;
    QAreaSeries *m_unsafe;
    QLineSeries *m_unsafeEdge;
    QLineSeries *m_bandUpper;
    QLineSeries *m_bandLower;
    QAreaSeries *m_band;
    QLineSeries *m_vaCurve;
    QLineSeries *m_ratedLine;
    QLineSeries *m_fit;
    QLineSeries *m_included;
    QLineSeries *m_excluded;
    QLineSeries *m_interval;
    QLineSeries *m_predicted;

    ChartColours m_colours;
    ChartLimits m_limits;
    const DisplayPoints &m_points;
    FitOverlay m_overlay;
    AxisSpan m_x;
    AxisSpan m_y;
    bool m_pointsDirty = false;
    bool m_overlayDirty = false;
    bool m_limitsDirty = false;
    QTimer m_flushTimer;
};

} // namespace sagline
