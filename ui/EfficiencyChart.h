// Efficiency and the loss split against load current, beside the V–I chart: each loaded
// reading's measured efficiency (points, left axis) and its core and copper loss (right axis),
// with core's model curves (core/PrimarySideAnalysis.h efficiencyCurve) drawn through them. The
// values all come from core; this widget only lays them out (Qt Charts stays inside ui/).
#pragma once

#include "ChartStyle.h"
#include "FitSummary.h"
#include "PrimarySideAnalysis.h"

#include <QWidget>

class QChart;
class QChartView;
class QLabel;
class QLineSeries;
class QValueAxis;

namespace sagline {

class ChartLegend;

class EfficiencyChart : public QWidget {
    Q_OBJECT
public:
    explicit EfficiencyChart(QWidget *parent = nullptr);
    // Shows the result (nothing, with a line saying why, when it has no loaded step with P1).
    // `maxCurrentA`: the current axis' extent (the plan's top step), 0 = from the readings.
    void setResult(const std::optional<PrimarySideResult> &result, const FitSummary &fit, double maxCurrentA);
    void applyColours(bool dark);
    int drawnEfficiencyPoints() const;
    QString statusText() const;

private:
    QChartView *m_view;
    QChart *m_chart;
    ChartLegend *m_legend;
    QLabel *m_status;
    QValueAxis *m_axisX;
    QValueAxis *m_axisEfficiency;
    QValueAxis *m_axisLoss;
    QLineSeries *m_efficiencyPoints;
    QLineSeries *m_efficiencyCurve;
    QLineSeries *m_corePoints;
    QLineSeries *m_coreCurve;
    QLineSeries *m_copperPoints;
    QLineSeries *m_copperCurve;
    ChartColours m_colours;
};

} // namespace sagline
