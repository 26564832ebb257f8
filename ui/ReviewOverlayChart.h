// The V–I readings and fitted lines of the selected sessions on one chart. Each session has
// its own marker shape and colour (Okabe–Ito hues, Okabe & Ito 2008) and its fitted line its
// own dash pattern, so sessions stay apart in grey print and for colour-blind readers; the
// legend beside the chart names each unit with its marker. Readings are drawn as light
// markers on pen-less line series (QT-NOTES §1.2), never one graphics item per point.
#pragma once

#include "SessionComparison.h"

#include <QWidget>

#include <vector>

class QChart;
class QChartView;
class QListWidget;
class QLabel;
class QValueAxis;

namespace sagline {

// The look of the n-th session on the overlay (cycles through 8 shapes × 7 colours).
struct OverlayStyle {
    QColor colour;
    int shape = 0;           // 0 circle, 1 square, 2 triangle up, 3 diamond, 4 triangle down, 5 cross, 6 plus, 7 star
    Qt::PenStyle lineStyle = Qt::SolidLine;
};
OverlayStyle overlayStyle(int index);
QImage overlayMarker(const OverlayStyle &style, int sizePx);

class ReviewOverlayChart : public QWidget {
    Q_OBJECT
public:
    static constexpr int maxSessions = 12; // more would be unreadable; the rest are named as not shown

    explicit ReviewOverlayChart(QWidget *parent = nullptr);
    void setSessions(const std::vector<const SessionRow *> &rows);
    QStringList legendEntries() const;
    int seriesCount() const;

private:
    QChartView *m_view;
    QChart *m_chart;
    QValueAxis *m_axisX;
    QValueAxis *m_axisY;
    QListWidget *m_legend;
    QLabel *m_note;
};

} // namespace sagline
