#include "ResidualChart.h"

#include "ChartLegend.h"
#include "InteractiveChartView.h"
#include "VoltageCurrentChart.h"

#include <QChart>
#include <QChartView>
#include <QLineSeries>
#include <QValueAxis>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {
constexpr int markerPx = 8;
constexpr double millivoltsPerVolt = 1000.0;
} // namespace

ResidualChart::ResidualChart(const DisplayPoints &points, QWidget *parent)
    : QWidget(parent), m_view(new InteractiveChartView), m_chart(new QChart), m_legend(new ChartLegend),
      m_axisX(new QValueAxis), m_axisY(new QValueAxis), m_points(points)
{
    m_chart->legend()->hide();
    m_chart->setAnimationOptions(QChart::NoAnimation);
    m_chart->setMargins(QMargins(4, 2, 8, 2));
    m_chart->addAxis(m_axisX, Qt::AlignBottom);
    m_chart->addAxis(m_axisY, Qt::AlignLeft);
    m_axisX->setTitleText(tr("Secondary current I (A)"));
    // Short titles: Qt Charts cuts a title longer than the plot is tall, and with the alarm and
    // the session band shown a 768 px screen leaves this chart about 100 px of plot.
    m_axisY->setTitleText(tr("ΔV (mV)")); // measured − fitted, as the legend says
    for (QLineSeries **series : {&m_zero, &m_upperGuide, &m_lowerGuide, &m_excluded, &m_included}) {
        *series = new QLineSeries;
        m_chart->addSeries(*series);
        (*series)->attachAxis(m_axisX);
        (*series)->attachAxis(m_axisY);
    }
    m_view->setChart(m_chart);
    m_view->setRenderHint(QPainter::Antialiasing);
    m_view->setMinimumSize(400, 150);
    m_view->setAccessibleName(tr("Residuals chart"));
    connect(m_view, &InteractiveChartView::viewChangedByUser, this, [this] {
        m_userView = true;
        retickShownRange(m_axisX);
        retickShownRange(m_axisY, 5);
    });
    connect(m_view, &InteractiveChartView::resetRequested, this, &ResidualChart::resetView);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(0);
    layout->addWidget(m_view, 1);
    layout->addWidget(m_legend);
    m_flushTimer.setSingleShot(true);
    m_flushTimer.setInterval(100);
    connect(&m_flushTimer, &QTimer::timeout, this, &ResidualChart::flushNow);
    connect(m_chart, &QChart::plotAreaChanged, this, [this] {
        m_dirty = true;
        scheduleFlush();
    });
    applyColours(false);
}

void ResidualChart::applyColours(bool dark)
{
    m_colours = chartColours(dark);
    const auto &c = m_colours;
    m_chart->setBackgroundBrush(c.background);
    m_view->setBackgroundBrush(c.background);
    m_legend->setColours(c.background, c.text);
    for (auto *axis : {m_axisX, m_axisY})
        styleAxis(axis, c, font());
    m_zero->setPen(QPen(c.fitLine, 1.5));
    m_upperGuide->setPen(QPen(c.text, 1, Qt::DotLine));
    m_lowerGuide->setPen(QPen(c.text, 1, Qt::DotLine));
    for (auto *points : {m_included, m_excluded}) {
        points->setPen(Qt::NoPen);
        points->setMarkerSize(markerPx);
    }
    m_included->setLightMarker(markerImage(MarkerShape::FilledCircle, c.measured, markerPx));
    m_excluded->setLightMarker(markerImage(MarkerShape::HollowSquare, c.excluded, markerPx));
    m_legend->clear();
    m_legend->addMarker(MarkerShape::FilledCircle, c.measured, tr("measured − fitted"));
    m_legend->addMarker(MarkerShape::HollowSquare, c.excluded, tr("excluded"));
    m_legend->addLine(QPen(c.text, 1, Qt::DotLine), tr("± 2 × residual SD"));
    m_dirty = true;
    scheduleFlush();
}

void ResidualChart::pointsChanged()
{
    m_dirty = true;
    scheduleFlush();
}

void ResidualChart::pointsCleared()
{
    m_residual = {};
    m_x = m_y = {};
    m_dirty = true;
    scheduleFlush();
}

void ResidualChart::setResidualFunction(ResidualFunction residual, double residualSdV)
{
    m_residual = std::move(residual);
    m_residualSdV = std::isfinite(residualSdV) ? residualSdV : 0.0;
    m_dirty = true;
    scheduleFlush();
}

void ResidualChart::setCurrentSpan(double maxCurrentA)
{
    m_maxCurrentA = maxCurrentA;
    m_dirty = true;
    scheduleFlush();
}

void ResidualChart::scheduleFlush()
{
    if (!m_flushTimer.isActive())
        m_flushTimer.start();
}

void ResidualChart::flushNow()
{
    m_flushTimer.stop();
    if (!m_dirty)
        return;
    m_dirty = false;
    std::vector<PlotPoint> included;
    std::vector<PlotPoint> excluded;
    const std::size_t limit = drawnPointBudget(m_chart->plotArea().width());
    if (m_residual) {
        // Thin the voltages, then map only the kept points: subtracting the fitted line is a
        // shear, which keeps every triangle's area, so LTTB keeps the same points either way
        // (tests/core/DownsampleTest), the even half is by index, and a refresh computes
        // hundreds of residuals, not all. scatterSample, not LTTB alone: thinned noise must
        // not look like two bands with a gap at zero.
        const auto residualsOf = [&](std::span<const PlotPoint> voltages) {
            std::vector<PlotPoint> kept = voltages.size() > limit
                                              ? scatterSample(voltages, limit)
                                              : std::vector<PlotPoint>(voltages.begin(), voltages.end());
            for (auto &p : kept)
                p.y = m_residual(p.x, p.y) * millivoltsPerVolt;
            return kept;
        };
        included = residualsOf(m_points.included());
        excluded = residualsOf(m_points.excluded());
    }
    // Included points only size the axis: an excluded or superseded point far off (a slip of
    // the decimal point) would flatten every other residual into the zero line.
    double largest = 2.0 * m_residualSdV * millivoltsPerVolt;
    for (const auto &p : included)
        if (std::isfinite(p.y))
            largest = std::max(largest, std::abs(p.y));
    // Two points fit exactly: their residuals are rounding noise (1e-13 mV), not a scale to
    // draw; below a microvolt the axis says nothing a meter could show.
    constexpr double smallestShownMv = 1e-3;
    if (!std::isfinite(largest) || largest < smallestShownMv)
        largest = std::max(smallestShownMv, 2.0 * m_residualSdV * millivoltsPerVolt);
    if (!std::isfinite(largest) || !(largest > 0.0))
        largest = 1.0;
    // Fewer than three points leave no scatter to draw (none yet, or an exact fit): the axis
    // shows ±1 mV, a span a bench voltmeter resolves, not ±0.002 mV of nothing.
    if (m_points.included().size() < 3)
        largest = std::max(largest, 1.0);
    // The residual axis is symmetric about zero and rescales both ways: residuals shrink as
    // the fit settles, and a fixed wide axis would flatten them into the zero line.
    const AxisSpan y{-largest * 1.2, largest * 1.2};
    const double top = std::max(m_maxCurrentA, m_points.maxCurrent());
    const AxisSpan x = grownSpan(m_x, 0.0, top > 0.0 ? top : 1.0, 0.12);
    // The person's zoom or pan stands until reset; the autoscaled spans are kept for then.
    if (std::abs(y.high - m_y.high) > 0.25 * m_y.high || m_y.isEmpty() || y.high > m_y.high) {
        if (m_userView) {
            m_y = y;
        } else {
            applySpan(m_axisY, y, 5);
            m_y = {m_axisY->min(), m_axisY->max()};
        }
    }
    if (x.high != m_x.high || x.low != m_x.low) {
        if (m_userView) {
            m_x = {std::max(0.0, x.low), x.high};
        } else {
            applySpan(m_axisX, {std::max(0.0, x.low), x.high});
            m_x = {m_axisX->min(), m_axisX->max()};
        }
    }
    m_included->replace(toQtPoints(included));
    m_excluded->replace(toQtPoints(excluded));
    m_zero->replace({QPointF(m_x.low, 0.0), QPointF(m_x.high, 0.0)});
    const double guide = 2.0 * m_residualSdV * millivoltsPerVolt;
    if (guide > 0.0) {
        m_upperGuide->replace({QPointF(m_x.low, guide), QPointF(m_x.high, guide)});
        m_lowerGuide->replace({QPointF(m_x.low, -guide), QPointF(m_x.high, -guide)});
    } else {
        m_upperGuide->clear();
        m_lowerGuide->clear();
    }
}

void ResidualChart::resetView()
{
    m_userView = false;
    m_chart->zoomReset();
    m_x = m_y = {};
    m_dirty = true;
    flushNow();
}

std::pair<double, double> ResidualChart::residualAxisRange() const { return {m_y.low, m_y.high}; }

int ResidualChart::drawnIncludedCount() const { return static_cast<int>(m_included->count()); }

} // namespace sagline
