// The trend of one design for a lab lead: R of each unit in the order the sessions were started
// (at the reference temperature when every session has one), with the individuals control
// chart's centre line and ±3σ limits from core (IndividualsChart). Units outside the limits get
// a second, larger marker of another shape and colour, so they stand out without colour too.
// The chart only draws what core computed; it picks the design to show.
#pragma once

#include "SessionComparison.h"

#include <QWidget>

#include <vector>

class QChart;
class QChartView;
class QComboBox;
class QLabel;
class QLineSeries;
class QValueAxis;

namespace sagline {

class ReviewTrendChart : public QWidget {
    Q_OBJECT
public:
    explicit ReviewTrendChart(QWidget *parent = nullptr);
    // `stats` must be summarizeBatch(rows); the designs on offer are its groups.
    void setBatch(const std::vector<const SessionRow *> &rows, const BatchStatistics &stats, double referenceC);
    void showDesign(int index);

    int designCount() const;
    QString shownDesign() const;
    int pointCount() const;        // units drawn for the shown design
    int outsideCount() const;      // of which outside the limits
    bool hasLimits() const;
    QString noteText() const;

private:
    void draw();

    QComboBox *m_design;
    QChartView *m_view;
    QChart *m_chart;
    QValueAxis *m_axisX;
    QValueAxis *m_axisY;
    QLabel *m_note;
    std::vector<const SessionRow *> m_rows;
    BatchStatistics m_stats;
    double m_referenceC = 75.0;
    int m_points = 0;
    int m_outside = 0;
};

} // namespace sagline
