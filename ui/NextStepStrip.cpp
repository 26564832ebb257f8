#include "NextStepStrip.h"

#include "ActionButton.h"
#include "QuantityField.h"

#include <QAction>
#include <QApplication>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QVBoxLayout>

namespace sagline {

QString stepHeading(int step, int firstStep, int lastStep)
{
    return QObject::tr("Step %1 (plan steps %2–%3)").arg(step).arg(firstStep).arg(lastStep);
}

NextStepStrip::NextStepStrip(QWidget *parent)
    : QWidget(parent), m_banner(new QLabel), m_step(new QLabel), m_expect(new QLabel), m_countdown(new QLabel),
      m_waiting(new QLabel),
      m_current(new QuantityField(QStringLiteral("reading.current_a"), Unit::Ampere, tr("e.g. 1.25 A"))),
      m_voltage(new QuantityField(QStringLiteral("reading.voltage_v"), Unit::Volt, tr("e.g. 24.6 V"))),
      m_entry(new QWidget), m_recordAction(new QAction(tr("● &Record  (Ctrl+Enter)"), this)),
      m_pauseAction(new QAction(tr("❚❚ &Pause"), this)), m_stopAction(new QAction(tr("■ &Stop"), this)),
      m_record(new QPushButton), m_pause(new QPushButton), m_stop(new QPushButton)
{
    setObjectName(QStringLiteral("nextStepStrip"));
    setAutoFillBackground(true);
    auto *layout = new QHBoxLayout(this);
    layout->setContentsMargins(10, 6, 10, 6);
    auto *text = new QVBoxLayout;
    QFont big = font();
    big.setPointSizeF(big.pointSizeF() * 1.5);
    big.setBold(true);
    m_step->setFont(big);
    m_step->setWordWrap(true);
    QFont medium = font();
    medium.setPointSizeF(medium.pointSizeF() * 1.25);
    m_expect->setFont(medium);
    m_expect->setWordWrap(true);
    QFont bannerFont = medium;
    bannerFont.setBold(true);
    m_banner->setFont(bannerFont);
    m_banner->setWordWrap(true);
    m_banner->setObjectName(QStringLiteral("sweepBanner"));
    m_banner->hide();
    m_countdown->setFont(bannerFont);
    m_countdown->setObjectName(QStringLiteral("dwellCountdown"));
    m_countdown->hide();
    text->addWidget(m_banner);
    text->addWidget(m_step);
    text->addWidget(m_expect);
    text->addWidget(m_countdown);
    m_waiting->setWordWrap(true);
    m_waiting->setObjectName(QStringLiteral("pausedFor"));
    m_waiting->hide();
    text->addWidget(m_waiting);
    layout->addLayout(text, 3);

    auto *entry = new QHBoxLayout(m_entry);
    entry->setContentsMargins(0, 0, 0, 0);
    auto *currentLabel = new QLabel(tr("I (A)"));
    auto *voltageLabel = new QLabel(tr("V (V)"));
    currentLabel->setBuddy(m_current->lineEdit());
    voltageLabel->setBuddy(m_voltage->lineEdit());
    for (auto *field : {m_current, m_voltage}) {
        field->lineEdit()->setFont(medium);
        field->setMinimumWidth(130);
    }
    entry->addWidget(currentLabel);
    entry->addWidget(m_current);
    entry->addWidget(voltageLabel);
    entry->addWidget(m_voltage);
    layout->addWidget(m_entry, 2);

    // Ctrl+Enter on either Enter key; the window's Sweep menu holds the same actions.
    m_recordAction->setShortcuts({QKeySequence(Qt::CTRL | Qt::Key_Return), QKeySequence(Qt::CTRL | Qt::Key_Enter)});
    m_recordAction->setShortcutContext(Qt::WindowShortcut);
    m_pauseAction->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Period));
    m_pauseAction->setShortcutContext(Qt::WindowShortcut);
    // Stop ends the sweep: no shortcut (nothing one key away from a frequent one), and the
    // window asks before it acts.
    m_stopAction->setToolTip(tr("End the sweep; every recorded point stays in the session file"));
    // The placeholder stays short enough to show whole at 1366 px; the other forms are here.
    m_current->lineEdit()->setToolTip(tr("The current with its unit: 1.25 A or 1250 mA; a plain number is in amperes"));
    m_voltage->lineEdit()->setToolTip(tr("The voltage with its unit: 24.6 V or 24600 mV; a plain number is in volts"));
    addActions({m_recordAction, m_pauseAction});

    QFont buttonFont = font();
    buttonFont.setPointSizeF(buttonFont.pointSizeF() * 1.3);
    buttonFont.setBold(true);
    m_record->setFont(buttonFont);
    m_record->setMinimumSize(200, 56);
    m_record->setDefault(true);
    for (auto *button : {m_pause, m_stop}) {
        button->setFont(buttonFont);
        button->setMinimumHeight(56);
    }
    layout->addWidget(m_record);
    layout->addWidget(m_pause);
    layout->addWidget(m_stop);

    connect(m_recordAction, &QAction::triggered, this, &NextStepStrip::recordRequested);
    connect(m_pauseAction, &QAction::triggered, this, &NextStepStrip::pauseRequested);
    connect(m_stopAction, &QAction::triggered, this, &NextStepStrip::stopRequested);
    bindButtonToAction(m_record, m_recordAction);
    bindButtonToAction(m_pause, m_pauseAction);
    bindButtonToAction(m_stop, m_stopAction);
    // Enter in the current field moves to the voltage; Enter in the voltage records.
    connect(m_current->lineEdit(), &QLineEdit::returnPressed, m_voltage->lineEdit(),
            qOverload<>(&QWidget::setFocus));
    connect(m_voltage->lineEdit(), &QLineEdit::returnPressed, m_recordAction, &QAction::trigger);
    setTypedEntry(true);
    setRunning(false);
}

void NextStepStrip::setInstruction(const QString &step, const QString &expectation)
{
    m_step->setText(step);
    m_expect->setText(expectation);
}

void NextStepStrip::setTypedEntry(bool typed)
{
    m_entry->setVisible(typed);
    // One name for the action whatever takes the reading; the tooltip says who reads it.
    m_recordAction->setToolTip(typed ? tr("Record the typed-in reading for this step (Ctrl+Enter)")
                                     : tr("Record this step: the load is set, the meters read it after the dwell "
                                          "(Ctrl+Enter)"));
}

void NextStepStrip::setRecordNeeded(bool needed)
{
    m_recordNeeded = needed;
    updateEnabled();
}

void NextStepStrip::setRunning(bool running)
{
    m_running = running;
    if (!running)
        setSweepState(StripState::Idle);
    m_current->setReadOnly(!running);
    m_voltage->setReadOnly(!running);
    updateEnabled();
}

void NextStepStrip::setPaused(bool paused)
{
    m_pauseAction->setText(paused ? tr("▶ &Resume") : tr("❚❚ &Pause"));
    m_pauseAction->setToolTip(paused ? tr("Resume the sweep (Ctrl+.)") : tr("Pause the sweep (Ctrl+.)"));
}

void NextStepStrip::setSweepState(StripState state, const QString &banner, const QString &countdown)
{
    const bool changed = state != m_state;
    m_state = state;
    m_banner->setText(banner);
    m_banner->setVisible(!banner.isEmpty());
    m_countdown->setText(countdown);
    m_countdown->setVisible(!countdown.isEmpty());
    if (changed)
        applyColours(m_dark);
    updateEnabled();
}

QString NextStepStrip::bannerText() const { return m_banner->isHidden() ? QString() : m_banner->text(); }

QString NextStepStrip::countdownText() const { return m_countdown->isHidden() ? QString() : m_countdown->text(); }

void NextStepStrip::updateEnabled()
{
    const bool waitingForOperator = m_state == StripState::Ready || m_state == StripState::Idle;
    m_recordAction->setEnabled(m_running && m_recordNeeded && waitingForOperator);
    m_pauseAction->setEnabled(m_running);
    m_stopAction->setEnabled(m_running);
}

void NextStepStrip::applyColours(bool dark)
{
    m_dark = dark;
    // Paused is amber, a lost link red; each also says so in words, so colour is not the only cue.
    QColor background = QApplication::palette().color(QPalette::AlternateBase);
    if (m_state == StripState::Paused)
        background = dark ? QColor(0x5a, 0x45, 0x00) : QColor(0xff, 0xe3, 0x8f);
    else if (m_state == StripState::LinkLost)
        background = dark ? QColor(0x6b, 0x1d, 0x16) : QColor(0xff, 0xc4, 0xb8);
    QPalette stripPalette = palette();
    stripPalette.setColor(QPalette::Window, background);
    setPalette(stripPalette);
}

void NextStepStrip::setWaiting(const QString &text)
{
    m_waiting->setText(text);
    m_waiting->setVisible(!text.isEmpty());
}

QString NextStepStrip::waitingText() const { return m_waiting->text(); }

QString NextStepStrip::instructionText() const { return m_step->text() + QLatin1Char('\n') + m_expect->text(); }

void NextStepStrip::clearEntry()
{
    m_current->setText(QString());
    m_voltage->setText(QString());
    m_current->setError(QString());
    m_voltage->setError(QString());
    m_current->lineEdit()->setFocus();
}

} // namespace sagline
