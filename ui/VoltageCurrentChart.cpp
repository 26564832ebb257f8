#include "VoltageCurrentChart.h"

#include "ChartLegend.h"
#include "InteractiveChartView.h"
#include "UiFormat.h"

#include <QAreaSeries>
#include <QChart>
#include <QChartView>
#include <QLineSeries>
#include <QValueAxis>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

constexpr int markerPx = 9;
constexpr int unsafeGridPoints = 160;

QList<QPointF> thinned(std::span<const PlotPoint> points, std::size_t limit)
{
    return points.size() > limit ? toQtPoints(lttbDownsample(points, limit)) : toQtPoints(points);
}

} // namespace

VoltageCurrentChart::VoltageCurrentChart(const DisplayPoints &points, QWidget *parent)
    : QWidget(parent), m_view(new InteractiveChartView), m_chart(new QChart), m_legend(new ChartLegend),
      m_axisX(new QValueAxis), m_axisY(new QValueAxis), m_points(points)
{
    m_chart->legend()->hide();
    m_chart->setAnimationOptions(QChart::NoAnimation);
    m_chart->setMargins(QMargins(4, 4, 8, 4));
    m_chart->addAxis(m_axisX, Qt::AlignBottom);
    m_chart->addAxis(m_axisY, Qt::AlignLeft);
    m_axisX->setTitleText(tr("Secondary current I (A)"));
    m_axisY->setTitleText(tr("Secondary V (V)")); // short: Qt Charts cuts a title taller than the plot

    // Order of adding is drawing order: regions first, points last.
    m_unsafeUpper = new QLineSeries(this);
    m_unsafeLower = new QLineSeries(this);
    m_unsafe = new QAreaSeries(m_unsafeUpper, m_unsafeLower);
    m_chart->addSeries(m_unsafe);
    m_bandUpper = new QLineSeries(this);
    m_bandLower = new QLineSeries(this);
    m_band = new QAreaSeries(m_bandUpper, m_bandLower);
    m_chart->addSeries(m_band);
    for (auto *area : {m_unsafe, m_band}) {
        area->attachAxis(m_axisX);
        area->attachAxis(m_axisY);
    }
    m_unsafeEdge = newSeries();
    m_vaCurve = newSeries();
    m_ratedLine = newSeries();
    m_fit = newSeries();
    m_excluded = newSeries();
    m_included = newSeries();
    m_interval = newSeries();
    m_predicted = newSeries();
    m_unsafe->setName(QStringLiteral("unsafe"));
    m_included->setName(QStringLiteral("measured"));

    m_view->setChart(m_chart); // the view owns the chart
    m_view->setRenderHint(QPainter::Antialiasing);
    m_view->setMinimumSize(400, 220);
    m_view->setAccessibleName(tr("Voltage against current chart"));
    connect(m_view, &InteractiveChartView::viewChangedByUser, this, [this] {
        m_userView = true;
        retickShownRange(m_axisX);
        retickShownRange(m_axisY, 6);
    });
    connect(m_view, &InteractiveChartView::resetRequested, this, &VoltageCurrentChart::resetView);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(0);
    layout->addWidget(m_view, 1);
    layout->addWidget(m_legend);

    m_flushTimer.setSingleShot(true);
    m_flushTimer.setInterval(100);
    connect(&m_flushTimer, &QTimer::timeout, this, &VoltageCurrentChart::flushNow);
    // A wider plot can show more points: thin again for the new width.
    connect(m_chart, &QChart::plotAreaChanged, this, [this] {
        m_pointsDirty = true;
        scheduleFlush();
    });
    applyColours(false);
}

QLineSeries *VoltageCurrentChart::newSeries()
{
    auto *series = new QLineSeries;
    m_chart->addSeries(series); // the chart owns it
    series->attachAxis(m_axisX);
    series->attachAxis(m_axisY);
    return series;
}

void VoltageCurrentChart::applyColours(bool dark)
{
    m_colours = chartColours(dark);
    const auto &c = m_colours;
    m_chart->setBackgroundBrush(c.background);
    m_chart->setPlotAreaBackgroundVisible(false);
    m_view->setBackgroundBrush(c.background);
    m_legend->setColours(c.background, c.text);
    for (auto *axis : {m_axisX, m_axisY})
        styleAxis(axis, c, font());
    QColor hatch = c.unsafe;
    m_unsafe->setBrush(QBrush(hatch, Qt::BDiagPattern));
    m_unsafe->setPen(Qt::NoPen);
    m_unsafeEdge->setPen(QPen(c.unsafe, 2.5));
    m_band->setBrush(c.band);
    m_band->setPen(Qt::NoPen);
    m_vaCurve->setPen(QPen(c.vaCurve, 2, Qt::DashDotLine));
    m_ratedLine->setPen(QPen(c.ratedCurrent, 2, Qt::DashLine));
    m_fit->setPen(QPen(c.fitLine, 2));
    m_interval->setPen(QPen(c.predicted, 2.5));
    for (auto *points : {m_included, m_excluded, m_predicted}) {
        points->setPen(Qt::NoPen);
        points->setMarkerSize(markerPx);
    }
    m_included->setLightMarker(markerImage(MarkerShape::FilledCircle, c.measured, markerPx));
    m_excluded->setLightMarker(markerImage(MarkerShape::HollowSquare, c.excluded, markerPx));
    m_predicted->setMarkerSize(13);
    m_predicted->setLightMarker(markerImage(MarkerShape::FilledDiamond, c.predicted, 13));
    rebuildLegend();
}

void VoltageCurrentChart::rebuildLegend()
{
    const auto &c = m_colours;
    m_legend->clear();
    m_legend->addMarker(MarkerShape::FilledCircle, c.measured, tr("measured"));
    m_legend->addMarker(MarkerShape::HollowSquare, c.excluded, tr("excluded"));
    m_legend->addLine(QPen(c.fitLine, 2), tr("fitted line"));
    m_legend->addFill(c.band, Qt::NoPen, tr("95 % confidence band"));
    m_legend->addMarker(MarkerShape::FilledDiamond, c.predicted, tr("next step, 95 % interval"));
    if (m_limits.ratedCurrentA > 0.0) {
        m_legend->addLine(QPen(c.ratedCurrent, 2, Qt::DashLine),
                          tr("rated current %1").arg(formatQuantity(m_limits.ratedCurrentA, Unit::Ampere, 3)));
        m_legend->addLine(QPen(c.vaCurve, 2, Qt::DashDotLine),
                          tr("rated %1").arg(formatQuantity(m_limits.ratedVa, Unit::VoltAmpere, 3)));
        m_legend->addFill(QBrush(c.unsafe, Qt::BDiagPattern), QPen(c.unsafe, 2), tr("unsafe"));
    }
}

void VoltageCurrentChart::setLimits(const ChartLimits &limits)
{
    m_limits = limits;
    m_x = {};
    m_y = {};
    m_limitsDirty = true;
    rebuildLegend();
    scheduleFlush();
}

void VoltageCurrentChart::pointsChanged()
{
    m_pointsDirty = true;
    scheduleFlush();
}

void VoltageCurrentChart::rescale()
{
    m_x = {};
    m_y = {};
    m_limitsDirty = true;
    m_pointsDirty = true;
    scheduleFlush();
}

std::pair<double, double> VoltageCurrentChart::voltageAxisRange() const { return {m_y.low, m_y.high}; }

void VoltageCurrentChart::resetView()
{
    m_userView = false;
    m_chart->zoomReset();
    rescale();
    flushNow();
}

void VoltageCurrentChart::pointsCleared()
{
    m_overlay = {};
    m_pointsDirty = m_overlayDirty = true;
    scheduleFlush();
}

void VoltageCurrentChart::setFitOverlay(const FitOverlay &overlay)
{
    m_overlay = overlay;
    m_overlayDirty = true;
    scheduleFlush();
}

std::vector<double> VoltageCurrentChart::gridCurrents(int count) const
{
    // Before the axes exist, span the planned range so the first line is not clipped.
    const double high = std::max({m_x.high, m_limits.plannedTopCurrentA, m_points.maxCurrent()});
    std::vector<double> grid;
    for (int i = 0; i < count; ++i)
        grid.push_back(high * i / std::max(1, count - 1));
    return grid;
}

void VoltageCurrentChart::scheduleFlush()
{
    if (!m_flushTimer.isActive())
        m_flushTimer.start();
}

void VoltageCurrentChart::growRanges()
{
    const double topCurrent = std::max({m_limits.plannedTopCurrentA, m_limits.ratedCurrentA, m_points.maxCurrent(),
                                        m_overlay.predicted ? m_overlay.predicted->x() : 0.0});
    const AxisSpan x = grownSpan(m_x, 0.0, topCurrent > 0 ? topCurrent : 1.0, 0.12);
    // Included points only: an excluded or superseded point never sets the scale.
    double low = std::min(m_points.hasIncluded() ? m_points.minVoltage() : m_limits.expectedTopV, m_limits.expectedTopV);
    double high = std::max(m_points.hasIncluded() ? m_points.maxVoltage() : m_limits.expectedNoLoadV, m_limits.expectedNoLoadV);
    if (m_overlay.predicted) {
        low = std::min(low, m_overlay.predictionLowV);
        high = std::max(high, m_overlay.predictionHighV);
    }
    if (!(high > low)) {
        low = 0.0;
        high = std::max(1.0, high);
    }
    const AxisSpan y = grownSpan(m_y, low, high, 0.15);
    const double shownHighCurrent = m_x.high;
    const bool changed = x.low != m_x.low || x.high != m_x.high || y.low != m_y.low || y.high != m_y.high
                         || m_limitsDirty;
    m_x = {std::max(0.0, x.low), x.high};
    m_y = y;
    if (changed) {
        // The person's zoom or pan stands until reset; the autoscaled spans are kept for then.
        if (!m_userView) {
            applySpan(m_axisX, m_x);
            applySpan(m_axisY, m_y);
            m_x = {m_axisX->min(), m_axisX->max()};
            m_y = {m_axisY->min(), m_axisY->max()};
        }
        rebuildLimitSeries();
        if (m_x.high != shownHighCurrent)
            emit currentSpanChanged();
    }
    m_limitsDirty = false;
}

void VoltageCurrentChart::rebuildLimitSeries()
{
    const double x1 = m_x.high;
    const double x0 = m_x.low;
    const double y0 = m_y.low;
    const double y1 = m_y.high;
    QList<QPointF> va;
    QList<QPointF> lower;
    QList<QPointF> rated;
    if (m_limits.ratedCurrentA > 0.0 && m_limits.hardStopVa > 0.0) {
        // The current beyond which the load or the fuse is at risk, whichever comes first.
        double currentLimit = x1 * 2.0;
        if (m_limits.rheostatSafeCurrentA)
            currentLimit = std::min(currentLimit, *m_limits.rheostatSafeCurrentA);
        if (m_limits.fuseRiskCurrentA)
            currentLimit = std::min(currentLimit, *m_limits.fuseRiskCurrentA);
        for (int i = 0; i <= unsafeGridPoints; ++i) {
            const double current = std::max(0.0, x0) + (x1 - std::max(0.0, x0)) * i / unsafeGridPoints;
            const double atRated = current > 0.0 ? m_limits.ratedVa / current : y1 * 4;
            if (atRated <= y1 * 4)
                va.append(QPointF(current, atRated));
            if (current > currentLimit)
                continue;
            const double atLimit = current > 0.0 ? m_limits.hardStopVa / current : y1;
            lower.append(QPointF(current, std::clamp(atLimit, y0, y1)));
        }
        if (currentLimit <= x1) {
            const double atLimit = m_limits.hardStopVa / currentLimit;
            lower.append(QPointF(currentLimit, std::clamp(atLimit, y0, y1)));
            lower.append(QPointF(currentLimit, y0));
            lower.append(QPointF(x1, y0));
        }
        rated = {QPointF(m_limits.ratedCurrentA, y0), QPointF(m_limits.ratedCurrentA, y1)};
    }
    m_unsafeUpper->replace(lower.isEmpty() ? QList<QPointF>{} : QList<QPointF>{QPointF(x0, y1), QPointF(x1, y1)});
    m_unsafeLower->replace(lower);
    // The edge is the limit itself: the VA curve where it lies inside the plot, then the drop
    // at the current limit; not the plot's own border.
    QList<QPointF> edge;
    for (const auto &p : lower) {
        if (p.y() < y1 && !(p.y() <= y0 && p.x() >= x1))
            edge.append(p);
    }
    m_unsafeEdge->replace(edge);
    m_vaCurve->replace(va);
    m_ratedLine->replace(rated);
}

void VoltageCurrentChart::flushNow()
{
    m_flushTimer.stop();
    if (!m_pointsDirty && !m_overlayDirty && !m_limitsDirty)
        return;
    growRanges();
    if (m_pointsDirty) {
        const std::size_t budget = drawnPointBudget(m_chart->plotArea().width());
        m_included->replace(thinned(m_points.included(), budget));
        m_excluded->replace(thinned(m_points.excluded(), budget));
    }
    if (m_overlayDirty) {
        m_fit->replace(m_overlay.line);
        m_bandUpper->replace(m_overlay.bandUpper);
        m_bandLower->replace(m_overlay.bandLower);
        if (m_overlay.predicted) {
            const double x = m_overlay.predicted->x();
            const double cap = (m_x.high - m_x.low) * 0.012;
            const double lo = m_overlay.predictionLowV;
            const double hi = m_overlay.predictionHighV;
            m_interval->replace({QPointF(x - cap, lo), QPointF(x + cap, lo), QPointF(x, lo), QPointF(x, hi),
                                 QPointF(x - cap, hi), QPointF(x + cap, hi)});
            m_predicted->replace({*m_overlay.predicted});
        } else {
            m_interval->clear();
            m_predicted->clear();
        }
    }
    m_pointsDirty = m_overlayDirty = false;
}

int VoltageCurrentChart::drawnIncludedCount() const { return static_cast<int>(m_included->count()); }
int VoltageCurrentChart::drawnExcludedCount() const { return static_cast<int>(m_excluded->count()); }
int VoltageCurrentChart::drawnFitPointCount() const { return static_cast<int>(m_fit->count()); }
bool VoltageCurrentChart::hasPrediction() const { return m_predicted->count() > 0; }

} // namespace sagline
