#include "NextStepStrip.h"

#include "QuantityField.h"

#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QShortcut>
#include <QVBoxLayout>

namespace sagline {

NextStepStrip::NextStepStrip(QWidget *parent)
    : QWidget(parent), m_step(new QLabel), m_expect(new QLabel), m_waiting(new QLabel),
      m_current(new QuantityField(QStringLiteral("reading.current_a"), Unit::Ampere, tr("e.g. 1.25 A or 1250 mA"))),
      m_voltage(new QuantityField(QStringLiteral("reading.voltage_v"), Unit::Volt, tr("e.g. 24.6 V"))),
      m_entry(new QWidget), m_record(new QPushButton(tr("● Record  (Ctrl+Enter)"))),
      m_pause(new QPushButton(tr("❚❚ Pause"))), m_stop(new QPushButton(tr("■ Stop")))
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
    text->addWidget(m_step);
    text->addWidget(m_expect);
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

    QFont buttonFont = font();
    buttonFont.setPointSizeF(buttonFont.pointSizeF() * 1.3);
    buttonFont.setBold(true);
    m_record->setFont(buttonFont);
    m_record->setMinimumSize(200, 56);
    m_record->setDefault(true);
    m_record->setToolTip(tr("Record the reading for this step (Ctrl+Enter)"));
    for (auto *button : {m_pause, m_stop}) {
        button->setFont(buttonFont);
        button->setMinimumHeight(56);
    }
    layout->addWidget(m_record);
    layout->addWidget(m_pause);
    layout->addWidget(m_stop);

    connect(m_record, &QPushButton::clicked, this, &NextStepStrip::recordRequested);
    connect(m_pause, &QPushButton::clicked, this, &NextStepStrip::pauseRequested);
    connect(m_stop, &QPushButton::clicked, this, &NextStepStrip::stopRequested);
    // Enter in the current field moves to the voltage; Enter in the voltage records.
    connect(m_current->lineEdit(), &QLineEdit::returnPressed, m_voltage->lineEdit(),
            qOverload<>(&QWidget::setFocus));
    connect(m_voltage->lineEdit(), &QLineEdit::returnPressed, this, [this] {
        if (m_record->isEnabled())
            emit recordRequested();
    });
    for (const auto &keys : {QKeySequence(Qt::CTRL | Qt::Key_Return), QKeySequence(Qt::CTRL | Qt::Key_Enter)}) {
        auto *shortcut = new QShortcut(keys, this);
        shortcut->setContext(Qt::WindowShortcut);
        connect(shortcut, &QShortcut::activated, this, [this] {
            if (m_record->isEnabled())
                emit recordRequested();
        });
    }
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
    m_record->setText(typed ? tr("● Record  (Ctrl+Enter)") : tr("● Load is set  (Ctrl+Enter)"));
    m_record->setToolTip(typed ? tr("Record the typed-in reading for this step (Ctrl+Enter)")
                               : tr("Tell the meters the load is set for this step; they read it (Ctrl+Enter)"));
}

void NextStepStrip::setRecordNeeded(bool needed)
{
    m_recordNeeded = needed;
    m_record->setEnabled(m_running && m_recordNeeded);
}

void NextStepStrip::setRunning(bool running)
{
    m_running = running;
    m_record->setEnabled(running && m_recordNeeded);
    m_pause->setEnabled(running);
    m_stop->setEnabled(running);
    m_current->setReadOnly(!running);
    m_voltage->setReadOnly(!running);
}

void NextStepStrip::setPaused(bool paused) { m_pause->setText(paused ? tr("▶ Resume") : tr("❚❚ Pause")); }

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
