#include "ReportText.h"

#include "OutputText.h"

#include <QTextBoundaryFinder>

namespace sagline::reporttext {

namespace {

constexpr int unbrokenRun = 24; // characters without a space before a break opportunity

QString shown(const QString &text)
{
    QString out;
    out.reserve(text.size());
    int run = 0;
    QTextBoundaryFinder graphemes(QTextBoundaryFinder::Grapheme, text);
    qsizetype start = 0;
    for (qsizetype end = graphemes.toNextBoundary(); end != -1; start = end, end = graphemes.toNextBoundary()) {
        const QStringView character = QStringView(text).mid(start, end - start);
        const char16_t first = character.front().unicode();
        if (first == u'\n' || first == u'\t' || character.front().isSpace()) {
            out += character;
            run = 0;
            continue;
        }
        if (first < 0x20 || first == 0x7F || (first >= 0x80 && first <= 0x9F)) {
            out += QStringLiteral("\\x") + QStringLiteral("%1").arg(int(first), 2, 16, QLatin1Char('0')).toUpper();
            ++run;
            continue;
        }
        if (run >= unbrokenRun) {
            out += QChar(0x200B);
            run = 0;
        }
        out += character;
        ++run;
    }
    return out;
}

} // namespace

QString q(const std::string &text)
{
    return shown(QString::fromStdString(validUtf8(text)));
}

QString shortened(const std::string &text, int maxCharacters)
{
    const QString whole = QString::fromStdString(validUtf8(text));
    QTextBoundaryFinder graphemes(QTextBoundaryFinder::Grapheme, whole);
    qsizetype cut = 0;
    for (int n = 0; n < maxCharacters; ++n) {
        const qsizetype next = graphemes.toNextBoundary();
        if (next == -1)
            return shown(whole);
        cut = next;
    }
    if (graphemes.toNextBoundary() == -1)
        return shown(whole);
    return shown(whole.left(cut)) + QStringLiteral(" … (%1 more characters in the session file)").arg(whole.size() - cut);
}

} // namespace sagline::reporttext
