// Small text helpers shared by the report sections: core's number formats as QString.
#pragma once

#include "NumberFormat.h"
#include "ResultAnalysis.h"
#include "UncertaintyFormat.h"

#include <QString>

#include <optional>
#include <string>

namespace sagline::reporttext {

// Text from a session for the PDF, drawn as plain text whatever it holds: valid UTF-8 (U+FFFD
// for a byte that is not), control characters shown as \xHH except line breaks and tabs, and
// a break opportunity (U+200B) after every 24 characters without a space, so a long name wraps
// inside its cell instead of running out of it, never between the parts of one character.
QString q(const std::string &text);

// The same, cut after `maxCharacters` characters (whole ones) with a note of how much more the
// session holds: a 15 MB note is not laid out page after page.
QString shortened(const std::string &text, int maxCharacters);

// "0.4797 Ω ± 0.0057 Ω, U (k = 2.08, 95 %)" or the value alone when there is no uncertainty.
inline QString withU(const UncertainValue &value, const std::string &unit)
{
    if (value.expandedUncertainty)
        return q(formatWithUncertainty(value.value, *value.expandedUncertainty, unit) + ", "
                 + expandedUncertaintyLabel(value));
    return q(formatQuantity(value.value, unit));
}

inline QString quantity(const std::optional<double> &value, const std::string &unit, int digits = 4)
{
    return value ? q(formatQuantity(*value, unit, digits)) : QStringLiteral("—");
}

inline QString fixed(double value, int decimals)
{
    return q(formatFixed(value, decimals));
}

inline QString fixed(const std::optional<double> &value, int decimals)
{
    return value ? fixed(*value, decimals) : QString();
}

// A file name or path that may break across lines after '/', '-', '_' and '.' (a zero-width
// space there), so a long name wraps instead of being cut at the column's edge.
inline QString breakable(QString text)
{
    static const QString breaks = QStringLiteral("/-_.");
    QString out;
    out.reserve(text.size() + text.size() / 4);
    for (const QChar c : text) {
        out += c;
        if (breaks.contains(c))
            out += QChar(0x200B);
    }
    return out;
}

// "L. Lead (account lead)", "(name not given) (account lead)", "" for nobody at all.
inline QString whoDid(const std::string &person, const std::string &account)
{
    if (person.empty() && account.empty())
        return QStringLiteral("(not recorded)");
    QString text = person.empty() ? QStringLiteral("(name not given)") : q(person);
    if (!account.empty())
        text += QStringLiteral(" (account %1)").arg(q(account));
    return text;
}

// "2026-12-02T10:15:03.250Z" -> "2026-12-02 10:15:03 UTC"
inline QString readableUtc(const std::string &iso)
{
    if (iso.size() < 19)
        return q(iso);
    return q(iso.substr(0, 10) + " " + iso.substr(11, 8) + " UTC");
}

} // namespace sagline::reporttext
