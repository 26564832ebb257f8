#include "CautionStrip.h"

#include <QLabel>
#include <QVBoxLayout>

namespace sagline {

namespace {
// IEC 61140 / IEC 60364 treat up to 50 V AC as extra-low voltage (from memory); above it
// the caution is always shown. A zero (not yet typed) voltage also shows it: the tool is for
// mains transformers, so the safe default is to warn.
constexpr double extraLowVoltageLimitV = 50.0;
} // namespace

CautionStrip::CautionStrip(QWidget *parent)
    : QWidget(parent), m_caution(new QLabel(this)), m_alarm(new QLabel(this))
{
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(2);
    m_caution->setWordWrap(true);
    m_caution->setTextFormat(Qt::RichText);
    m_caution->setText(tr("<b>⚠ Caution: hazardous voltage.</b> The primary is at mains voltage. "
                          "Use a fused, isolated supply; meters and leads rated for the measurement "
                          "category; never exceed the transformer's or the load's rating; follow "
                          "local codes and licensed practice."));
    m_caution->setStyleSheet(QStringLiteral(
        "QLabel { background: #f0e442; color: #1a1a1a; padding: 6px 10px; border: 2px solid #1a1a1a; }"));
    m_caution->setAccessibleName(tr("Mains voltage caution"));
    m_alarm->setWordWrap(true);
    m_alarm->setTextFormat(Qt::RichText);
    m_alarm->setStyleSheet(QStringLiteral(
        "QLabel { background: #d55e00; color: #ffffff; padding: 8px 10px; border: 3px solid #1a1a1a;"
        " font-size: 14pt; }"));
    m_alarm->setAccessibleName(tr("Safety stop"));
    m_alarm->hide();
    layout->addWidget(m_alarm);
    layout->addWidget(m_caution);
}

void CautionStrip::setPrimaryVoltage(double volts)
{
    m_caution->setVisible(!(volts > 0.0 && volts <= extraLowVoltageLimitV));
}

void CautionStrip::showAlarm(const QString &text)
{
    m_alarm->setText(QStringLiteral("<b>■ STOPPED:</b> ") + text.toHtmlEscaped());
    m_alarm->setProperty("plainAlarm", text);
    m_alarm->show();
}

void CautionStrip::clearAlarm() { m_alarm->hide(); }
bool CautionStrip::isAlarmShown() const { return !m_alarm->isHidden(); }
QString CautionStrip::alarmText() const { return m_alarm->property("plainAlarm").toString(); }
bool CautionStrip::isCautionShown() const { return !m_caution->isHidden(); }

} // namespace sagline
