#include "ReviewTrendChart.h"

#include "ChartAxes.h"
#include "ChartStyle.h"
#include "NumberFormat.h"

#include <QChart>
#include <QChartView>
#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLegendMarker>
#include <QLineSeries>
#include <QScatterSeries>
#include <QValueAxis>
#include <QVBoxLayout>

#include <algorithm>

namespace sagline {

namespace {

QString ohm(double value) { return QString::fromStdString(formatQuantity(value, "Ω")); }

// A horizontal line across the units, for the centre line and the limits.
QLineSeries *levelLine(double y, int count, const QPen &pen, const QString &name)
{
    auto *line = new QLineSeries;
    line->setName(name);
    line->setPen(pen);
    line->replace({QPointF(0.5, y), QPointF(count + 0.5, y)});
    return line;
}

} // namespace

ReviewTrendChart::ReviewTrendChart(QWidget *parent)
    : QWidget(parent), m_design(new QComboBox), m_view(new QChartView), m_chart(new QChart),
      m_axisX(new QValueAxis), m_axisY(new QValueAxis), m_note(new QLabel)
{
    m_chart->addAxis(m_axisX, Qt::AlignBottom);
    m_chart->addAxis(m_axisY, Qt::AlignLeft);
    m_axisX->setTitleText(tr("Unit, in the order its session was started (1 = earliest)"));
    m_axisX->setLabelFormat(QStringLiteral("%d"));
    m_chart->legend()->setAlignment(Qt::AlignBottom);
    m_chart->setMargins(QMargins(4, 4, 4, 4));
    m_view->setChart(m_chart);
    m_view->setRenderHint(QPainter::Antialiasing);
    m_view->setMinimumSize(360, 240);
    m_note->setWordWrap(true);
    m_note->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_design->setSizeAdjustPolicy(QComboBox::AdjustToContents);

    auto *top = new QHBoxLayout;
    top->addWidget(new QLabel(tr("Design")));
    top->addWidget(m_design, 1);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addLayout(top);
    layout->addWidget(m_view, 1);
    layout->addWidget(m_note);
    connect(m_design, &QComboBox::currentIndexChanged, this, [this] { draw(); });
    draw();
}

void ReviewTrendChart::setBatch(const std::vector<const SessionRow *> &rows, const BatchStatistics &stats, double referenceC)
{
    const QString shown = shownDesign();
    m_rows = rows;
    m_stats = stats;
    m_referenceC = referenceC;
    const QSignalBlocker blocker(m_design);
    m_design->clear();
    int keep = 0;
    for (std::size_t g = 0; g < m_stats.designs.size(); ++g) {
        const DesignStatistics &d = m_stats.designs[g];
        const QString name = QString::fromStdString(d.design);
        m_design->addItem(tr("%1 (%n unit(s) with R)", "", static_cast<int>(d.resistanceCount)).arg(name), name);
        if (name == shown)
            keep = static_cast<int>(g);
    }
    m_design->setCurrentIndex(m_design->count() ? keep : -1);
    draw();
}

void ReviewTrendChart::showDesign(int index) { m_design->setCurrentIndex(index); }
int ReviewTrendChart::designCount() const { return m_design->count(); }
QString ReviewTrendChart::shownDesign() const { return m_design->currentData().toString(); }
int ReviewTrendChart::pointCount() const { return m_points; }
int ReviewTrendChart::outsideCount() const { return m_outside; }
QString ReviewTrendChart::noteText() const { return m_note->text(); }

bool ReviewTrendChart::hasLimits() const
{
    const int g = m_design->currentIndex();
    return g >= 0 && static_cast<std::size_t>(g) < m_stats.designs.size() && m_stats.designs[static_cast<std::size_t>(g)].chart.hasLimits();
}

void ReviewTrendChart::draw()
{
    m_chart->removeAllSeries();
    m_points = 0;
    m_outside = 0;
    const ChartColours colours = chartColours(isDarkPalette(palette()));
    const bool atReference = m_stats.atReferenceTemperature;
    m_axisY->setTitleText(atReference ? tr("R at %1 °C (Ω)").arg(m_referenceC) : tr("R as measured (Ω)"));
    const int g = m_design->currentIndex();
    if (g < 0 || static_cast<std::size_t>(g) >= m_stats.designs.size()) {
        applySpan(m_axisX, {0.5, 1.5});
        applySpan(m_axisY, {0.0, 1.0});
        m_note->setText(tr("Open sessions to see each design's trend of R with its control limits."));
        return;
    }
    const DesignStatistics &design = m_stats.designs[static_cast<std::size_t>(g)];
    const IndividualsChart &chart = design.chart;
    QList<QPointF> values;
    QList<QPointF> outside;
    QStringList outsideNames;
    double low = 0.0, high = 0.0;
    for (std::size_t k = 0; k < design.chartRows.size(); ++k) {
        const SessionRow *row = m_rows[design.chartRows[k]];
        const auto r = row->comparedResistanceOhm(atReference);
        if (!r)
            continue;
        const QPointF point(static_cast<double>(k + 1), *r);
        values.append(point);
        low = values.size() == 1 ? *r : std::min(low, *r);
        high = values.size() == 1 ? *r : std::max(high, *r);
        if (std::find(chart.outside.begin(), chart.outside.end(), k) != chart.outside.end()) {
            outside.append(point);
            outsideNames << QString::fromStdString(row->unitSerial);
        }
    }
    m_points = static_cast<int>(values.size());
    m_outside = static_cast<int>(outside.size());

    auto *units = new QLineSeries;
    units->setName(tr("R of each unit"));
    units->setPen(QPen(colours.measured, 1.0, Qt::DotLine));
    units->setLightMarker(markerImage(MarkerShape::FilledCircle, colours.measured, 9));
    units->setMarkerSize(9);
    units->replace(values);
    m_chart->addSeries(units);
    const int count = std::max(1, m_points);
    if (chart.centre) {
        m_chart->addSeries(levelLine(*chart.centre, count, QPen(colours.fitLine, 1.6),
                                     tr("mean %1").arg(ohm(*chart.centre))));
        low = std::min(low, *chart.centre);
        high = std::max(high, *chart.centre);
    }
    if (chart.hasLimits()) {
        const QPen limitPen(colours.unsafe, 1.6, Qt::DashLine);
        m_chart->addSeries(levelLine(*chart.upper, count, limitPen, tr("UCL %1").arg(ohm(*chart.upper))));
        m_chart->addSeries(levelLine(*chart.lower, count, limitPen, tr("LCL %1").arg(ohm(*chart.lower))));
        low = std::min(low, *chart.lower);
        high = std::max(high, *chart.upper);
    }
    if (!outside.isEmpty()) {
        // A scatter series, so that the legend shows the same hollow square as the chart (a line
        // series without a pen showed a black one).
        auto *marks = new QScatterSeries;
        marks->setName(tr("outside the limits"));
        marks->setMarkerShape(QScatterSeries::MarkerShapeRectangle);
        marks->setMarkerSize(15);
        marks->setBrush(Qt::NoBrush);
        marks->setPen(QPen(colours.unsafe, 2.0));
        marks->replace(outside);
        m_chart->addSeries(marks);
        for (QLegendMarker *marker : m_chart->legend()->markers(marks)) {
            marker->setPen(QPen(colours.unsafe, 2.0));
            marker->setBrush(Qt::NoBrush);
        }
    }
    for (QAbstractSeries *series : m_chart->series()) {
        series->attachAxis(m_axisX);
        series->attachAxis(m_axisY);
    }
    applySpan(m_axisX, {0.5, count + 0.5}, std::min(count + 1, 11));
    if (!(high > low)) {
        low -= 0.05 * std::max(1e-3, std::abs(low));
        high += 0.05 * std::max(1e-3, std::abs(high));
    }
    applySpan(m_axisY, grownSpan({}, low, high, 0.1));

    QString note = QString::fromStdString(chart.note);
    if (chart.hasLimits())
        note = tr("Centre %1, limits %2 to %3 (σ = %4 from the average moving range %5 / 1.128). %6")
                   .arg(ohm(*chart.centre), ohm(*chart.lower), ohm(*chart.upper), ohm(*chart.sigma),
                        ohm(*chart.averageMovingRange),
                        outsideNames.isEmpty() ? tr("No unit outside the limits.")
                                               : tr("Outside the limits: %1.").arg(outsideNames.join(QStringLiteral(", "))))
               + (chart.preliminary ? tr(" Preliminary: fewer than 20 units.") : QString());
    m_note->setText(note);
}

} // namespace sagline
