#include "SupervisedWindow.h"

#include "CautionStrip.h"
#include "NumberFormat.h"
#include "ReadingsTableModel.h"

#include <QCheckBox>
#include <QDir>
#include <QFileDialog>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QTableView>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString q(const std::string &s) { return QString::fromStdString(s); }

} // namespace

SupervisedWindow::SupervisedWindow(const LabSheet &sheet, QWidget *parent)
    : QWidget(parent), m_session(std::make_unique<SupervisedSession>(sheet)), m_student(new QLineEdit),
      m_serial(new QLineEdit), m_path(new QLineEdit), m_start(new QPushButton(tr("Start the session"))),
      m_instruction(new QLabel), m_voltage(new QLineEdit), m_current(new QLineEdit),
      m_record(new QPushButton(tr("Record reading"))), m_message(new QLabel), m_readings(new ReadingsTableModel(this)),
      m_readingsView(new QTableView)
{
    setWindowTitle(tr("Supervised session: %1").arg(q(sheet.title)));
    auto *caution = new CautionStrip;
    auto *left = new QVBoxLayout;
    left->addWidget(createSheetBox());
    left->addWidget(createStartBox());
    left->addStretch(1);
    auto *right = new QVBoxLayout;
    right->addWidget(createEntryBox());
    right->addWidget(m_readingsView, 1);
    auto *columns = new QHBoxLayout;
    columns->addLayout(left, 1);
    columns->addLayout(right, 1);
    auto *layout = new QVBoxLayout(this);
    layout->addWidget(caution);
    layout->addLayout(columns, 1);

    m_readingsView->setModel(m_readings);
    m_readingsView->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_readingsView->verticalHeader()->hide();
    m_readingsView->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    connect(m_start, &QPushButton::clicked, this, [this] {
        const QString problem = startSession(m_path->text(), m_student->text(), m_serial->text());
        m_message->setText(problem.isEmpty() ? tr("Session started. Follow the steps.") : problem);
    });
    connect(m_record, &QPushButton::clicked, this, [this] { enterReading(m_voltage->text(), m_current->text()); });
    connect(m_current, &QLineEdit::returnPressed, m_record, &QPushButton::click);
    for (QLineEdit *edit : {m_student, m_serial, m_path})
        connect(edit, &QLineEdit::textChanged, this, &SupervisedWindow::refresh);
    refresh();
    resize(1400, 780);
}

QGroupBox *SupervisedWindow::createSheetBox()
{
    const LabSheet &sheet = m_session->sheet();
    auto *box = new QGroupBox(tr("Lab sheet: %1").arg(q(sheet.title)));
    auto *form = new QFormLayout(box);
    auto *instructions = new QLabel(q(sheet.instructions));
    instructions->setWordWrap(true);
    form->addRow(instructions);
    const QString why = tr("Locked by the lab sheet \"%1\": your supervisor fixed it.").arg(q(sheet.title));
    auto locked = [&](const QString &label, const QString &value, const QString &reason) {
        auto *field = new QLineEdit(value);
        field->setReadOnly(true);
        field->setEnabled(false);
        field->setToolTip(reason);
        auto *row = new QWidget;
        auto *h = new QHBoxLayout(row);
        h->setContentsMargins(0, 0, 0, 0);
        h->addWidget(field, 1);
        auto *lock = new QLabel(tr("locked"));
        lock->setToolTip(reason);
        h->addWidget(lock);
        form->addRow(label, row);
        m_locked << field;
    };
    const Nameplate &p = sheet.setup.nameplate;
    locked(tr("Nameplate"), tr("%1, %2 to %3").arg(q(formatQuantity(p.ratedPowerVa, "VA", 3)), q(formatQuantity(p.primaryVoltageV, "V", 3)),
                                                    q(formatQuantity(p.secondaryVoltageV, "V", 3))), why);
    locked(tr("Plan"), tr("%n step(s), fixed", "", m_session->stepCount()), why + tr(" The plan cannot be edited."));
    locked(tr("Highest load"), tr("%1 (%2 % of rated current)")
                                   .arg(q(formatQuantity(labSheetMaxCurrentA(sheet), "A", 3)))
                                   .arg(sheet.locks.maxLoadFraction * 100.0, 0, 'g', 3),
           why + tr(" Readings above it are refused and reported to your supervisor."));
    locked(tr("Fuse to fit"), tr("%1 %2").arg(q(formatQuantity(sheet.locks.requiredFuse.ratingA, "A", 3)), q(toString(sheet.locks.requiredFuse.type))),
           why + tr(" Fit exactly this fuse in the primary."));
    auto *meters = new QPushButton(tr("Connect meters…"));
    meters->setEnabled(false);
    meters->setToolTip(why + tr(" Readings are typed in by hand in this lab."));
    form->addRow(tr("Instruments"), meters);
    m_locked << meters;
    if (!m_session->hasPlan())
        form->addRow(new QLabel(tr("This lab sheet cannot be used: %1").arg(m_session->planProblem())));
    return box;
}

QGroupBox *SupervisedWindow::createStartBox()
{
    auto *box = new QGroupBox(tr("Before you start"));
    auto *layout = new QVBoxLayout(box);
    auto *form = new QFormLayout;
    m_student->setPlaceholderText(tr("your name"));
    m_serial->setPlaceholderText(tr("serial number on the transformer"));
    m_path->setText(QDir::home().filePath(QStringLiteral("supervised.sagline")));
    form->addRow(tr("Student"), m_student);
    form->addRow(tr("Unit serial"), m_serial);
    form->addRow(tr("Session file"), m_path);
    layout->addLayout(form);
    layout->addWidget(new QLabel(tr("<b>Safety checklist</b> (recorded in the session):")));
    for (const ChecklistItem &item : standardSafetyChecklist({}).items) {
        auto *check = new QCheckBox(q(item.text));
        check->setToolTip(q(item.text));
        connect(check, &QCheckBox::toggled, this, &SupervisedWindow::refresh);
        m_checks << check;
        layout->addWidget(check);
    }
    layout->addWidget(m_start);
    return box;
}

QGroupBox *SupervisedWindow::createEntryBox()
{
    auto *box = new QGroupBox(tr("Readings, step by step (typed in)"));
    auto *layout = new QVBoxLayout(box);
    QFont big = m_instruction->font();
    big.setPointSizeF(big.pointSizeF() * 1.3);
    big.setBold(true);
    m_instruction->setFont(big);
    m_instruction->setWordWrap(true);
    layout->addWidget(m_instruction);
    auto *form = new QFormLayout;
    m_voltage->setPlaceholderText(tr("e.g. 25.3 V"));
    m_current->setPlaceholderText(tr("e.g. 850 mA"));
    form->addRow(tr("Secondary voltage (V)"), m_voltage);
    form->addRow(tr("Secondary current (A)"), m_current);
    layout->addLayout(form);
    layout->addWidget(m_record);
    m_message->setWordWrap(true);
    layout->addWidget(m_message);
    return box;
}

void SupervisedWindow::setChecklistTicked(int item, bool ticked)
{
    if (item >= 0 && item < m_checks.size())
        m_checks[item]->setChecked(ticked);
}

QString SupervisedWindow::startSession(const QString &path, const QString &student, const QString &unitSerial)
{
    SafetyChecklist checklist = standardSafetyChecklist(student.toStdString());
    for (int i = 0; i < m_checks.size() && i < static_cast<int>(checklist.items.size()); ++i)
        checklist.items[static_cast<std::size_t>(i)].ticked = m_checks[i]->isChecked();
    const QString problem = m_session->start(path, student, unitSerial, checklist);
    refresh();
    return problem;
}

SupervisedSession::Outcome SupervisedWindow::enterReading(const QString &voltage, const QString &current)
{
    const SupervisedSession::Outcome outcome = m_session->submit(voltage, current);
    if (outcome.recorded || outcome.safetyStop) {
        const auto readings = m_session->store()->readings();
        if (readings.ok() && !readings.value.empty())
            m_readings->append(readings.value.back());
        m_voltage->clear();
        m_current->clear();
        m_voltage->setFocus();
    }
    showOutcome(outcome);
    refresh();
    return outcome;
}

void SupervisedWindow::showOutcome(const SupervisedSession::Outcome &outcome)
{
    const QString prefix = outcome.safetyStop ? tr("STOP: ") : outcome.limitHit ? tr("Refused by the lab sheet: ")
                           : outcome.recorded ? tr("✔ ") : tr("Not recorded: ");
    m_message->setText(prefix + outcome.message);
}

void SupervisedWindow::refresh()
{
    bool ticked = true;
    for (QCheckBox *check : m_checks)
        ticked = ticked && check->isChecked();
    const bool started = m_session->isStarted();
    const bool ready = ticked && !m_student->text().trimmed().isEmpty() && !m_serial->text().trimmed().isEmpty()
                       && !m_path->text().trimmed().isEmpty() && m_session->hasPlan();
    m_start->setEnabled(!started && ready);
    m_start->setToolTip(ready ? QString() : tr("Give your name, the unit serial and a file, and tick every checklist item."));
    for (QCheckBox *check : m_checks)
        check->setEnabled(!started);
    for (QLineEdit *edit : {m_student, m_serial, m_path})
        edit->setReadOnly(started);
    const bool entering = started && !m_session->isFinished();
    m_voltage->setEnabled(entering);
    m_current->setEnabled(entering);
    m_record->setEnabled(entering);
    m_instruction->setText(started ? m_session->instruction() : tr("Tick the safety checklist and start the session."));
}

QString SupervisedWindow::messageText() const { return m_message->text(); }
QString SupervisedWindow::instructionText() const { return m_instruction->text(); }

} // namespace sagline
