// A legend under a chart, its entries flowing onto as many rows as the chart's width needs (so
// it never forces the chart wider), drawn by us so each entry shows exactly the marker, line style
// or fill its series uses (Qt Charts' own legend cannot show a light marker on a pen-less
// series).
#pragma once

#include "ChartStyle.h"

#include <QPen>
#include <QWidget>


namespace sagline {

class FlowLayout;

class ChartLegend : public QWidget {
    Q_OBJECT
public:
    explicit ChartLegend(QWidget *parent = nullptr);
    void clear();
    void setColours(const QColor &background, const QColor &text);
    void addMarker(MarkerShape shape, const QColor &colour, const QString &text);
    void addLine(const QPen &pen, const QString &text);
    void addFill(const QBrush &brush, const QPen &edge, const QString &text);
    QStringList entries() const;

protected:
    void resizeEvent(QResizeEvent *event) override;

private:
    void addEntry(const QPixmap &icon, const QString &text);
    FlowLayout *m_layout;
    QStringList m_entries;
};

} // namespace sagline
