#include "ReviewOverlayChart.h"

#include "ChartAxes.h"

#include <QChart>
#include <QChartView>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineSeries>
#include <QListWidget>
#include <QPainter>
#include <QPainterPath>
#include <QValueAxis>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace sagline {

OverlayStyle overlayStyle(int index)
{
    // Okabe–Ito (2008) without its yellow, which is too pale on a white chart.
    static const QColor colours[] = {QColor(0x00, 0x72, 0xB2), QColor(0xD5, 0x5E, 0x00), QColor(0x00, 0x9E, 0x73),
                                     QColor(0xCC, 0x79, 0xA7), QColor(0xE6, 0x9F, 0x00), QColor(0x56, 0xB4, 0xE9),
                                     QColor(0x00, 0x00, 0x00)};
    static const Qt::PenStyle lines[] = {Qt::SolidLine, Qt::DashLine, Qt::DotLine, Qt::DashDotLine};
    OverlayStyle style;
    style.colour = colours[index % 7];
    style.shape = index % 8;
    style.lineStyle = lines[index % 4];
    return style;
}

QImage overlayMarker(const OverlayStyle &style, int sizePx)
{
    QImage image(sizePx, sizePx, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::transparent);
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    const double s = sizePx, m = 1.5;
    const QRectF box(m, m, s - 2 * m, s - 2 * m);
    painter.setPen(QPen(style.colour, 1.6));
    painter.setBrush(style.colour);
    QPainterPath path;
    switch (style.shape) {
    case 0: path.addEllipse(box); break;
    case 1: path.addRect(box.adjusted(1, 1, -1, -1)); break;
    case 2: path.moveTo(s / 2, m); path.lineTo(s - m, s - m); path.lineTo(m, s - m); path.closeSubpath(); break;
    case 3: path.moveTo(s / 2, m); path.lineTo(s - m, s / 2); path.lineTo(s / 2, s - m); path.lineTo(m, s / 2); path.closeSubpath(); break;
    case 4: path.moveTo(m, m); path.lineTo(s - m, m); path.lineTo(s / 2, s - m); path.closeSubpath(); break;
    case 5:
        painter.setPen(QPen(style.colour, 2.2));
        painter.drawLine(QPointF(m, m), QPointF(s - m, s - m));
        painter.drawLine(QPointF(s - m, m), QPointF(m, s - m));
        return image;
    case 6:
        painter.setPen(QPen(style.colour, 2.2));
        painter.drawLine(QPointF(s / 2, m), QPointF(s / 2, s - m));
        painter.drawLine(QPointF(m, s / 2), QPointF(s - m, s / 2));
        return image;
    default: {
        for (int k = 0; k < 10; ++k) {
            const double radius = k % 2 ? s * 0.2 : s / 2 - m;
            const double angle = -M_PI / 2 + k * M_PI / 5;
            const QPointF p(s / 2 + radius * std::cos(angle), s / 2 + radius * std::sin(angle));
            k ? path.lineTo(p) : path.moveTo(p);
        }
        path.closeSubpath();
    }
    }
    painter.drawPath(path);
    return image;
}

ReviewOverlayChart::ReviewOverlayChart(QWidget *parent)
    : QWidget(parent), m_view(new QChartView), m_chart(new QChart), m_axisX(new QValueAxis), m_axisY(new QValueAxis),
      m_legend(new QListWidget), m_note(new QLabel)
{
    m_chart->legend()->hide(); // our own legend shows the real markers
    m_chart->addAxis(m_axisX, Qt::AlignBottom);
    m_chart->addAxis(m_axisY, Qt::AlignLeft);
    m_axisX->setTitleText(tr("Secondary current I (A)"));
    m_axisY->setTitleText(tr("Secondary voltage V (V)"));
    m_chart->setMargins(QMargins(4, 4, 4, 4));
    m_view->setChart(m_chart);
    m_view->setRenderHint(QPainter::Antialiasing);
    m_view->setMinimumSize(360, 260);
    m_legend->setIconSize(QSize(34, 14));
    m_legend->setMaximumWidth(230);
    m_legend->setSelectionMode(QAbstractItemView::NoSelection);
    m_note->setWordWrap(true);

    auto *side = new QVBoxLayout;
    side->addWidget(new QLabel(tr("Units shown (marker, fitted line)")));
    side->addWidget(m_legend, 1);
    side->addWidget(m_note);
    auto *layout = new QHBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_view, 1);
    layout->addLayout(side);
    setSessions({});
}

void ReviewOverlayChart::setSessions(const std::vector<const SessionRow *> &rows)
{
    m_chart->removeAllSeries();
    m_legend->clear();
    double minI = 0.0, maxI = 0.0, minV = 0.0, maxV = 0.0;
    bool any = false;
    int shown = 0;
    int skipped = 0;
    for (const SessionRow *row : rows) {
        if (!row->opened || row->points.empty()) {
            ++skipped;
            continue;
        }
        if (shown >= maxSessions) {
            ++skipped;
            continue;
        }
        const OverlayStyle style = overlayStyle(shown);
        auto *points = new QLineSeries;
        points->setPen(Qt::NoPen);
        points->setLightMarker(overlayMarker(style, 9));
        points->setMarkerSize(9);
        QList<QPointF> list;
        for (const ComparisonPoint &p : row->points) {
            if (!p.used)
                continue;
            list.append(QPointF(p.currentA, p.voltageV));
            if (!any) {
                minI = maxI = p.currentA;
                minV = maxV = p.voltageV;
                any = true;
            }
            minI = std::min(minI, p.currentA);
            maxI = std::max(maxI, p.currentA);
            minV = std::min(minV, p.voltageV);
            maxV = std::max(maxV, p.voltageV);
        }
        points->replace(list);
        m_chart->addSeries(points);
        points->attachAxis(m_axisX);
        points->attachAxis(m_axisY);
        if (row->fit.ok() && !list.isEmpty()) {
            double top = 0.0;
            for (const QPointF &p : list)
                top = std::max(top, p.x());
            auto *line = new QLineSeries;
            line->setPen(QPen(style.colour, 1.6, style.lineStyle));
            line->replace({QPointF(0.0, row->fit.intercept), QPointF(top, row->fit.intercept + row->fit.slope * top)});
            m_chart->addSeries(line);
            line->attachAxis(m_axisX);
            line->attachAxis(m_axisY);
        }
        // Legend icon: the marker on a short piece of the line's dash pattern.
        QPixmap icon(34, 14);
        icon.fill(Qt::transparent);
        {
            QPainter painter(&icon);
            painter.setRenderHint(QPainter::Antialiasing);
            painter.setPen(QPen(style.colour, 1.6, style.lineStyle));
            painter.drawLine(0, 7, 34, 7);
            painter.drawImage(QPointF(11, 1), overlayMarker(style, 12));
        }
        const QString name = QString::fromStdString(row->unitSerial.empty() ? row->path : row->unitSerial);
        m_legend->addItem(new QListWidgetItem(QIcon(icon), name));
        ++shown;
    }
    if (any) {
        // Current starts at zero (open circuit); a little headroom on the right only.
        applySpan(m_axisX, {std::min(0.0, minI), maxI > 0.0 ? maxI * 1.05 : 1.0});
        applySpan(m_axisY, grownSpan({}, minV, maxV, 0.08));
    } else {
        applySpan(m_axisX, {0.0, 1.0});
        applySpan(m_axisY, {0.0, 1.0});
    }
    if (shown == 0)
        m_note->setText(tr("Select sessions in the table to compare their readings here."));
    else if (skipped > 0)
        m_note->setText(tr("%n selected session(s) not drawn (no readings, unreadable, or beyond the first %1).", "", skipped)
                            .arg(maxSessions));
    else
        m_note->clear();
}

QStringList ReviewOverlayChart::legendEntries() const
{
    QStringList names;
    for (int i = 0; i < m_legend->count(); ++i)
        names << m_legend->item(i)->text();
    return names;
}

int ReviewOverlayChart::seriesCount() const
{
    return static_cast<int>(m_chart->series().size());
}

} // namespace sagline
