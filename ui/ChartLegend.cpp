#include "ChartLegend.h"

#include "FlowLayout.h"

#include <QHBoxLayout>
#include <QLabel>
#include <QPainter>

namespace sagline {

namespace {
constexpr int iconWidth = 28;
constexpr int iconHeight = 14;
} // namespace

ChartLegend::ChartLegend(QWidget *parent) : QWidget(parent), m_layout(new FlowLayout(this))
{
    m_layout->setContentsMargins(8, 0, 8, 2);
    QSizePolicy policy(QSizePolicy::Preferred, QSizePolicy::Preferred);
    policy.setHeightForWidth(true); // a narrow chart gets a taller legend
    setSizePolicy(policy);
    setAutoFillBackground(true);
}

void ChartLegend::setColours(const QColor &background, const QColor &text)
{
    QPalette p = palette();
    p.setColor(QPalette::Window, background);
    p.setColor(QPalette::WindowText, text);
    setPalette(p);
}

void ChartLegend::clear()
{
    while (QLayoutItem *item = m_layout->takeAt(0)) {
        delete item->widget();
        delete item;
    }
    m_entries.clear();
}

void ChartLegend::addEntry(const QPixmap &icon, const QString &text)
{
    auto *entry = new QWidget;
    auto *row = new QHBoxLayout(entry);
    row->setContentsMargins(0, 0, 0, 0);
    row->setSpacing(4);
    auto *iconLabel = new QLabel;
    iconLabel->setPixmap(icon);
    row->addWidget(iconLabel);
    auto *label = new QLabel(text);
    row->addWidget(label);
    m_layout->addWidget(entry);
    m_entries << text;
}

void ChartLegend::addMarker(MarkerShape shape, const QColor &colour, const QString &text)
{
    QPixmap icon(iconWidth, iconHeight);
    icon.fill(Qt::transparent);
    QPainter painter(&icon);
    painter.drawImage(QPoint((iconWidth - 11) / 2, (iconHeight - 11) / 2), markerImage(shape, colour, 11));
    painter.end();
    addEntry(icon, text);
}

void ChartLegend::addLine(const QPen &pen, const QString &text)
{
    QPixmap icon(iconWidth, iconHeight);
    icon.fill(Qt::transparent);
    QPainter painter(&icon);
    painter.setRenderHint(QPainter::Antialiasing);
    painter.setPen(pen);
    painter.drawLine(QPointF(1, iconHeight / 2.0), QPointF(iconWidth - 1, iconHeight / 2.0));
    painter.end();
    addEntry(icon, text);
}

void ChartLegend::addFill(const QBrush &brush, const QPen &edge, const QString &text)
{
    QPixmap icon(iconWidth, iconHeight);
    icon.fill(Qt::transparent);
    QPainter painter(&icon);
    painter.setPen(edge);
    painter.setBrush(brush);
    painter.drawRect(QRectF(1, 1, iconWidth - 2, iconHeight - 2));
    painter.end();
    addEntry(icon, text);
}

void ChartLegend::resizeEvent(QResizeEvent *event)
{
    QWidget::resizeEvent(event);
    // Splitters look at minimum sizes, not at height-for-width: the rows this width needs become
    // the minimum, so the chart above is never drawn over its legend.
    const int needed = m_layout->heightForWidth(width());
    if (needed != minimumHeight())
        setMinimumHeight(needed);
}

QStringList ChartLegend::entries() const { return m_entries; }

} // namespace sagline
