#include "EfficiencyChart.h"

#include "ChartAxes.h"
#include "ChartLegend.h"

#include <QChart>
#include <QChartView>
#include <QLabel>
#include <QLineSeries>
#include <QValueAxis>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {
constexpr int markerPx = 8;
constexpr int curvePoints = 120;
} // namespace

EfficiencyChart::EfficiencyChart(QWidget *parent)
    : QWidget(parent), m_view(new QChartView), m_chart(new QChart), m_legend(new ChartLegend), m_status(new QLabel),
      m_axisX(new QValueAxis), m_axisEfficiency(new QValueAxis), m_axisLoss(new QValueAxis)
{
    m_chart->legend()->hide();
    m_chart->setAnimationOptions(QChart::NoAnimation);
    m_chart->setMargins(QMargins(4, 2, 4, 2));
    m_chart->addAxis(m_axisX, Qt::AlignBottom);
    m_chart->addAxis(m_axisEfficiency, Qt::AlignLeft);
    m_chart->addAxis(m_axisLoss, Qt::AlignRight);
    m_axisX->setTitleText(tr("Secondary current I (A)"));
    m_axisEfficiency->setTitleText(tr("η (%)")); // short: Qt Charts elides a title taller than the plot
    m_axisLoss->setTitleText(tr("Loss (W)"));
    const auto add = [this](QLineSeries *&series, QValueAxis *y) {
        series = new QLineSeries;
        m_chart->addSeries(series);
        series->attachAxis(m_axisX);
        series->attachAxis(y);
    };
    add(m_efficiencyCurve, m_axisEfficiency);
    add(m_coreCurve, m_axisLoss);
    add(m_copperCurve, m_axisLoss);
    add(m_efficiencyPoints, m_axisEfficiency);
    add(m_corePoints, m_axisLoss);
    add(m_copperPoints, m_axisLoss);
    m_view->setChart(m_chart);
    m_view->setRenderHint(QPainter::Antialiasing);
    m_view->setMinimumSize(320, 150);
    m_view->setFocusPolicy(Qt::NoFocus);
    m_view->setAccessibleName(tr("Efficiency and losses chart"));
    m_status->setWordWrap(true);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(0);
    layout->addWidget(m_view, 1);
    layout->addWidget(m_legend);
    layout->addWidget(m_status);
    applyColours(false);
    setResult(std::nullopt, FitSummary{}, 0.0);
}

void EfficiencyChart::applyColours(bool dark)
{
    m_colours = chartColours(dark);
    const auto &c = m_colours;
    m_chart->setBackgroundBrush(c.background);
    m_view->setBackgroundBrush(c.background);
    m_legend->setColours(c.background, c.text);
    for (auto *axis : {m_axisX, m_axisEfficiency, m_axisLoss})
        styleAxis(axis, c, font());
    m_efficiencyCurve->setPen(QPen(c.fitLine, 2));
    m_coreCurve->setPen(QPen(c.predicted, 1.5, Qt::DashLine));
    m_copperCurve->setPen(QPen(c.ratedCurrent, 1.5, Qt::DotLine));
    for (auto *points : {m_efficiencyPoints, m_corePoints, m_copperPoints}) {
        points->setPen(Qt::NoPen);
        points->setMarkerSize(markerPx);
    }
    m_efficiencyPoints->setLightMarker(markerImage(MarkerShape::FilledCircle, c.measured, markerPx));
    m_corePoints->setLightMarker(markerImage(MarkerShape::HollowSquare, c.predicted, markerPx));
    m_copperPoints->setLightMarker(markerImage(MarkerShape::FilledDiamond, c.ratedCurrent, markerPx));
    m_legend->clear();
    m_legend->addMarker(MarkerShape::FilledCircle, c.measured, tr("efficiency P2/P1 (left)"));
    m_legend->addLine(QPen(c.fitLine, 2), tr("model η"));
    m_legend->addMarker(MarkerShape::HollowSquare, c.predicted, tr("core loss (right)"));
    m_legend->addMarker(MarkerShape::FilledDiamond, c.ratedCurrent, tr("copper loss R·I² (right)"));
}

void EfficiencyChart::setResult(const std::optional<PrimarySideResult> &result, const FitSummary &fit, double maxCurrentA)
{
    QList<QPointF> efficiency, core, copper;
    double top = maxCurrentA;
    double lowestEfficiency = 100.0;
    double largestLoss = 0.0;
    if (result) {
        for (const StepLosses &s : result->steps) {
            efficiency << QPointF(s.currentA, s.efficiencyPercent.value);
            core << QPointF(s.currentA, s.coreLossW.value);
            if (s.copperLossW)
                copper << QPointF(s.currentA, s.copperLossW->value);
            top = std::max(top, s.currentA);
            lowestEfficiency = std::min(lowestEfficiency, s.efficiencyPercent.value);
            largestLoss = std::max({largestLoss, s.coreLossW.value, s.copperLossW ? s.copperLossW->value : 0.0});
        }
    }
    QList<QPointF> efficiencyLine, coreLine, copperLine;
    if (result && top > 0.0) {
        for (const EfficiencyCurvePoint &p : efficiencyCurve(*result, fit, top, curvePoints)) {
            if (p.currentA > 0.0)
                efficiencyLine << QPointF(p.currentA, p.efficiencyPercent);
            coreLine << QPointF(p.currentA, p.coreLossW);
            copperLine << QPointF(p.currentA, p.copperLossW);
            largestLoss = std::max({largestLoss, p.coreLossW, p.copperLossW});
        }
    }
    m_efficiencyPoints->replace(efficiency);
    m_corePoints->replace(core);
    m_copperPoints->replace(copper);
    m_efficiencyCurve->replace(efficiencyLine);
    m_coreCurve->replace(coreLine);
    m_copperCurve->replace(copperLine);
    // Efficiency from a round floor below the lowest measured value to 100 %; losses from 0.
    const double floor = std::max(0.0, std::floor((lowestEfficiency - 5.0) / 10.0) * 10.0);
    applySpan(m_axisEfficiency, {efficiency.isEmpty() ? 0.0 : floor, 100.0}, 6);
    applySpan(m_axisLoss, {0.0, largestLoss > 0.0 ? largestLoss * 1.15 : 1.0}, 6);
    applySpan(m_axisX, {0.0, top > 0.0 ? top * 1.05 : 1.0}, 6);
    if (!result || result->steps.empty())
        m_status->setText(tr("No efficiency yet: it needs the primary power with the readings (a power analyser or "
                             "primary power meter)."));
    else if (!result->openCircuit || !result->openCircuit->noLoadLossW)
        m_status->setText(tr("No open-circuit point with primary power: no core loss and no model curve."));
    else
        m_status->clear();
    m_status->setVisible(!m_status->text().isEmpty());
}

int EfficiencyChart::drawnEfficiencyPoints() const { return static_cast<int>(m_efficiencyPoints->count()); }

QString EfficiencyChart::statusText() const { return m_status->text(); }

} // namespace sagline
