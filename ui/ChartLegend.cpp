#include "ChartLegend.h"

#include <QHBoxLayout>
#include <QLabel>
#include <QPainter>

namespace sagline {

namespace {
constexpr int iconWidth = 28;
constexpr int iconHeight = 14;
} // namespace

ChartLegend::ChartLegend(QWidget *parent) : QWidget(parent), m_layout(new QHBoxLayout(this))
{
    m_layout->setContentsMargins(8, 0, 8, 2);
    m_layout->setSpacing(14);
    m_layout->addStretch(1);
}

void ChartLegend::clear()
{
    while (m_layout->count() > 1) {
        QLayoutItem *item = m_layout->takeAt(0);
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
    row->addWidget(new QLabel(text));
    m_layout->insertWidget(m_layout->count() - 1, entry);
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

QStringList ChartLegend::entries() const { return m_entries; }

} // namespace sagline
