#include "ReportChart.h"

#include "NumberFormat.h"

#include <QFont>
#include <QFontMetricsF>
#include <QPainter>
#include <QPainterPath>
#include <QPolygonF>
#include <QRectF>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <unordered_set>

namespace sagline {

namespace {

struct Range {
    double low = std::numeric_limits<double>::infinity();
    double high = -std::numeric_limits<double>::infinity();
    void include(double v)
    {
        if (std::isfinite(v)) {
            low = std::min(low, v);
            high = std::max(high, v);
        }
    }
    bool valid() const { return low <= high; }
};

// Tick step of 1, 2 or 5 × 10^k giving about `target` intervals over the span.
double niceStep(double span, int target)
{
    const double raw = span / target;
    const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
    const double fraction = raw / magnitude;
    const double nice = fraction <= 1.0 ? 1.0 : fraction <= 2.0 ? 2.0 : fraction <= 5.0 ? 5.0 : 10.0;
    return nice * magnitude;
}

struct Axis {
    double low = 0.0, high = 1.0, step = 0.2;
};

Axis makeAxis(Range range, int target)
{
    if (!range.valid()) {
        range.low = 0.0;
        range.high = 1.0;
    }
    if (range.high - range.low < 1e-12 * std::max(1.0, std::abs(range.high))) {
        const double pad = std::max(std::abs(range.high) * 0.05, 1e-6);
        range.low -= pad;
        range.high += pad;
    }
    Axis axis;
    axis.step = niceStep(range.high - range.low, target);
    axis.low = std::floor(range.low / axis.step) * axis.step;
    axis.high = std::ceil(range.high / axis.step) * axis.step;
    return axis;
}

QString tickLabel(double value, double step)
{
    if (std::abs(value) < step * 1e-6)
        value = 0.0;
    const int decimals = std::max(0, -static_cast<int>(std::floor(std::log10(step) + 1e-9)));
    return QString::fromStdString(formatFixed(value, decimals));
}

void drawMarker(QPainter &painter, QPointF at, ChartMarker marker, double size)
{
    const double r = size / 2.0;
    switch (marker) {
    case ChartMarker::FilledCircle:
        painter.setBrush(Qt::black);
        painter.drawEllipse(at, r, r);
        break;
    case ChartMarker::OpenCircleCross:
        painter.setBrush(Qt::white);
        painter.drawEllipse(at, r, r);
        painter.drawLine(at + QPointF(-r, -r), at + QPointF(r, r));
        painter.drawLine(at + QPointF(-r, r), at + QPointF(r, -r));
        break;
    case ChartMarker::OpenSquare:
        painter.setBrush(Qt::white);
        painter.drawRect(QRectF(at.x() - r, at.y() - r, size, size));
        break;
    case ChartMarker::OpenTriangle: {
        painter.setBrush(Qt::white);
        const QPolygonF triangle{at + QPointF(0, -r), at + QPointF(r, r), at + QPointF(-r, r)};
        painter.drawPolygon(triangle);
        break;
    }
    }
    painter.setBrush(Qt::NoBrush);
}

} // namespace

void drawChart(QPainter &painter, const QRectF &area, double unit, const ChartSpec &spec)
{
    painter.save();
    QFont small(QStringLiteral("DejaVu Sans"));
    small.setPointSizeF(7.0);
    QFont titleFont = small;
    titleFont.setPointSizeF(9.0);
    titleFont.setBold(true);
    const QFontMetricsF metrics(small, painter.device());

    Range xs, ys;
    for (const auto &series : spec.series)
        for (const QPointF &p : series.points) {
            xs.include(p.x());
            ys.include(p.y());
        }
    for (const auto &line : spec.lines)
        for (const QPointF &p : line.points) {
            xs.include(p.x());
            ys.include(p.y());
        }
    for (const auto &band : spec.bands) {
        for (const QPointF &p : band.lower)
            ys.include(p.y());
        for (const QPointF &p : band.upper)
            ys.include(p.y());
    }
    if (spec.includeZeroY)
        ys.include(0.0);
    const Axis xAxis = makeAxis(xs, 8);
    const Axis yAxis = makeAxis(ys, 6);

    const double titleHeight = 14.0 * unit;
    const double legendHeight = 12.0 * unit;
    const QRectF plot(area.left() + 52.0 * unit, area.top() + titleHeight, area.width() - 60.0 * unit,
                      area.height() - titleHeight - 30.0 * unit - legendHeight);
    auto map = [&](QPointF p) {
        return QPointF(plot.left() + (p.x() - xAxis.low) / (xAxis.high - xAxis.low) * plot.width(),
                       plot.bottom() - (p.y() - yAxis.low) / (yAxis.high - yAxis.low) * plot.height());
    };

    painter.setFont(titleFont);
    painter.setPen(QPen(Qt::black, 0.5 * unit));
    painter.drawText(QRectF(area.left(), area.top(), area.width(), titleHeight), Qt::AlignLeft | Qt::AlignTop, spec.title);

    // Grid and ticks.
    painter.setFont(small);
    const QPen gridPen(QColor(150, 150, 150), 0.3 * unit, Qt::DotLine);
    const QPen axisPen(Qt::black, 0.7 * unit);
    const int xTicks = static_cast<int>(std::lround((xAxis.high - xAxis.low) / xAxis.step));
    for (int i = 0; i <= xTicks; ++i) {
        const double value = xAxis.low + i * xAxis.step;
        const double x = map(QPointF(value, yAxis.low)).x();
        painter.setPen(gridPen);
        painter.drawLine(QPointF(x, plot.top()), QPointF(x, plot.bottom()));
        painter.setPen(axisPen);
        painter.drawLine(QPointF(x, plot.bottom()), QPointF(x, plot.bottom() + 3 * unit));
        painter.drawText(QRectF(x - 30 * unit, plot.bottom() + 4 * unit, 60 * unit, 10 * unit), Qt::AlignHCenter | Qt::AlignTop,
                         tickLabel(value, xAxis.step));
    }
    const int yTicks = static_cast<int>(std::lround((yAxis.high - yAxis.low) / yAxis.step));
    for (int i = 0; i <= yTicks; ++i) {
        const double value = yAxis.low + i * yAxis.step;
        const double y = map(QPointF(xAxis.low, value)).y();
        painter.setPen(gridPen);
        painter.drawLine(QPointF(plot.left(), y), QPointF(plot.right(), y));
        painter.setPen(axisPen);
        painter.drawLine(QPointF(plot.left() - 3 * unit, y), QPointF(plot.left(), y));
        painter.drawText(QRectF(plot.left() - 50 * unit, y - 5 * unit, 45 * unit, 10 * unit), Qt::AlignRight | Qt::AlignVCenter,
                         tickLabel(value, yAxis.step));
    }
    painter.drawText(QRectF(plot.left(), plot.bottom() + 14 * unit, plot.width(), 10 * unit), Qt::AlignHCenter | Qt::AlignTop,
                     spec.xLabel);
    painter.save();
    painter.translate(area.left() + 4 * unit, plot.center().y());
    painter.rotate(-90);
    painter.drawText(QRectF(-plot.height() / 2, 0, plot.height(), 10 * unit), Qt::AlignHCenter | Qt::AlignTop, spec.yLabel);
    painter.restore();

    painter.save();
    painter.setClipRect(plot);
    for (const auto &band : spec.bands) {
        QPolygonF polygon;
        for (const QPointF &p : band.upper)
            polygon << map(p);
        for (auto it = band.lower.rbegin(); it != band.lower.rend(); ++it)
            polygon << map(*it);
        painter.setPen(Qt::NoPen);
        painter.setBrush(QColor(215, 215, 215));
        painter.drawPolygon(polygon);
        painter.setBrush(Qt::NoBrush);
        painter.setPen(QPen(Qt::black, 0.4 * unit, Qt::DashLine));
        for (const auto *edge : {&band.lower, &band.upper}) {
            QPolygonF line;
            for (const QPointF &p : *edge)
                line << map(p);
            painter.drawPolyline(line);
        }
    }
    for (const auto &line : spec.lines) {
        QPolygonF polyline;
        for (const QPointF &p : line.points)
            polyline << map(p);
        painter.setPen(QPen(Qt::black, line.widthPt * unit, line.dashed ? Qt::DashLine : Qt::SolidLine));
        painter.drawPolyline(polyline);
    }
    painter.setPen(QPen(Qt::black, 0.6 * unit));
    // A marker whose centre falls in the same 0.5 pt cell as one already drawn of its series is
    // skipped: it would print on top of it (0.18 mm apart at most, markers are 4.5 pt wide).
    // Large sessions (100 000 readings) would otherwise put every point into the PDF.
    const double cell = 0.5 * unit;
    for (const auto &series : spec.series) {
        std::unordered_set<std::uint64_t> drawn;
        for (const QPointF &p : series.points) {
            const QPointF at = map(p);
            const auto cx = static_cast<std::uint32_t>(static_cast<std::int32_t>(std::floor(at.x() / cell)));
            const auto cy = static_cast<std::uint32_t>(static_cast<std::int32_t>(std::floor(at.y() / cell)));
            if (!drawn.insert((std::uint64_t(cx) << 32) | cy).second)
                continue;
            drawMarker(painter, at, series.marker, (series.marker == ChartMarker::FilledCircle ? 4.5 : 5.5) * unit);
        }
    }
    painter.restore();

    painter.setPen(axisPen);
    painter.drawRect(plot);

    // Legend: one row under the x label.
    double x = plot.left();
    const double legendY = area.bottom() - legendHeight / 2;
    auto legendText = [&](const QString &text) {
        const double width = metrics.horizontalAdvance(text);
        painter.setPen(QPen(Qt::black, 0.5 * unit));
        painter.drawText(QPointF(x, legendY + metrics.ascent() / 2.5), text);
        x += width + 12 * unit;
    };
    for (const auto &band : spec.bands) {
        if (band.legend.isEmpty())
            continue;
        painter.setPen(QPen(Qt::black, 0.4 * unit, Qt::DashLine));
        painter.setBrush(QColor(215, 215, 215));
        painter.drawRect(QRectF(x, legendY - 3 * unit, 14 * unit, 6 * unit));
        painter.setBrush(Qt::NoBrush);
        x += 18 * unit;
        legendText(band.legend);
    }
    for (const auto &line : spec.lines) {
        if (line.legend.isEmpty())
            continue;
        painter.setPen(QPen(Qt::black, line.widthPt * unit, line.dashed ? Qt::DashLine : Qt::SolidLine));
        painter.drawLine(QPointF(x, legendY), QPointF(x + 14 * unit, legendY));
        x += 18 * unit;
        legendText(line.legend);
    }
    for (const auto &series : spec.series) {
        if (series.legend.isEmpty() || series.points.isEmpty())
            continue;
        painter.setPen(QPen(Qt::black, 0.6 * unit));
        drawMarker(painter, QPointF(x + 4 * unit, legendY), series.marker, 4.0 * unit);
        x += 10 * unit;
        legendText(series.legend);
    }
    painter.restore();
}

} // namespace sagline
