// Colours and marker shapes shared by the charts and their legends. Hues come from the
// Okabe–Ito colour-universal-design palette (Okabe & Ito 2008), which stays distinct for the
// common colour-vision deficiencies; every series also differs by marker shape or line style,
// so nothing depends on hue alone. Light and dark variants follow the desktop palette.
#pragma once

#include <QColor>
#include <QImage>
#include <QPalette>

class QFont;
class QValueAxis;

namespace sagline {

enum class MarkerShape { FilledCircle, HollowSquare, FilledDiamond };

struct ChartColours {
    QColor background;
    QColor text;
    QColor grid;
    QColor measured;      // included points
    QColor excluded;      // excluded points
    QColor fitLine;
    QColor band;          // 95 % confidence band fill (translucent)
    QColor predicted;     // next-step prediction and its interval
    QColor ratedCurrent;  // rated-current line
    QColor vaCurve;       // rated-VA curve
    QColor unsafe;        // hatching of the unsafe region and its edge
};

bool isDarkPalette(const QPalette &palette);
ChartColours chartColours(bool dark);
// Axis labels a little larger than the window's font and bold titles, in the scheme's text
// and grid colours: the same on every chart.
void styleAxis(QValueAxis *axis, const ChartColours &colours, const QFont &baseFont);
// A marker drawn once and handed to QXYSeries::setLightMarker (no graphics item per point).
QImage markerImage(MarkerShape shape, const QColor &colour, int sizePx);

} // namespace sagline
