// A plain x–y chart drawn with QPainter for the printed report (no Qt Charts): framed plot,
// "nice" 1-2-5 ticks, a dotted grid, marker shapes that stay distinct in black and white, solid
// and dashed lines, a grey band, and a legend. The caller supplies values already computed by core.
#pragma once

#include <QList>
#include <QPointF>
#include <QString>

class QPainter;
class QRectF;

namespace sagline {

enum class ChartMarker {
    FilledCircle, // a point used in the fit
    OpenCircleCross, // an excluded point
    OpenSquare,   // an outlier (used, but flagged)
    OpenTriangle, // not fitted (overload, not-a-number)
};

struct ChartSeriesPoints {
    QString legend;
    ChartMarker marker = ChartMarker::FilledCircle;
    QList<QPointF> points;
};

struct ChartLine {
    QString legend;
    QList<QPointF> points;   // a polyline
    bool dashed = false;
    double widthPt = 1.0;
};

struct ChartBand {
    QString legend;           // e.g. "95 % confidence band of the line"
    QList<QPointF> lower;     // same x values as upper, ascending
    QList<QPointF> upper;
};

struct ChartSpec {
    QString title;
    QString xLabel;           // with unit, e.g. "secondary current I (A)"
    QString yLabel;
    QList<ChartBand> bands;
    QList<ChartLine> lines;
    QList<ChartSeriesPoints> series;
    bool includeZeroY = false; // residual charts: keep y = 0 in range
};

// Draws `spec` in `area` (device units); `unit` = device units per point (1/72 in).
void drawChart(QPainter &painter, const QRectF &area, double unit, const ChartSpec &spec);

} // namespace sagline
