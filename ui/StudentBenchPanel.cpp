// StudentBenchWindow's left panel and the student's actions: the lab sheets of the folder, what
// the chosen sheet fixes (each locked control says why), the start with the supervisor's own
// confirmation, a reading checked against the sheet before the bench takes it, and the end.
#include "StudentBenchWindow.h"

#include "CautionStrip.h"
#include "FitPresentation.h"
#include "ManualEntry.h"
#include "NextStepStrip.h"
#include "NumberFormat.h"
#include "QuantityField.h"
#include "ResidualChart.h"
#include "SessionStore.h"
#include "SetupJson.h"
#include "SupervisedRecords.h"
#include "SweepController.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <QCheckBox>
#include <QDateTime>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QPushButton>
#include <QScrollArea>
#include <QSettings>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString q(const std::string &s) { return QString::fromStdString(s); }

} // namespace

QWidget *StudentBenchWindow::createSheetPanel()
{
    auto *panel = new QWidget;
    auto *layout = new QVBoxLayout(panel);

    auto *sheetsBox = new QGroupBox(tr("Lab sheets"));
    auto *sheetsLayout = new QVBoxLayout(sheetsBox);
    m_folderLabel = new QLabel;
    m_folderLabel->setWordWrap(true);
    m_sheetList = new QListWidget;
    m_sheetList->setMaximumHeight(110);
    auto *folders = new QHBoxLayout;
    auto *sheetFolderButton = new QPushButton(tr("Sheet folder…"));
    auto *sessionFolderButton = new QPushButton(tr("Session folder…"));
    sessionFolderButton->setToolTip(tr("Where the session files go; each is named from the student, the unit and the time"));
    folders->addWidget(sheetFolderButton);
    folders->addWidget(sessionFolderButton);
    connect(sheetFolderButton, &QPushButton::clicked, this, [this] {
        const QString folder = QFileDialog::getExistingDirectory(this, tr("Folder of lab sheets"));
        if (folder.isEmpty())
            return;
        QSettings().setValue(QStringLiteral("supervised/sheetFolder"), folder);
        setSheetFolder(folder);
    });
    connect(sessionFolderButton, &QPushButton::clicked, this, [this] {
        const QString folder = QFileDialog::getExistingDirectory(this, tr("Folder for the session files"), m_sessionFolder);
        if (folder.isEmpty())
            return;
        QSettings().setValue(QStringLiteral("supervised/sessionFolder"), folder);
        setSessionFolder(folder);
        showMessage(tr("Sessions go to %1").arg(folder));
    });
    sheetsLayout->addWidget(m_folderLabel);
    sheetsLayout->addWidget(m_sheetList);
    sheetsLayout->addLayout(folders);
    connect(m_sheetList, &QListWidget::currentRowChanged, this, [this](int row) {
        if (row >= 0)
            chooseSheet(row);
    });
    layout->addWidget(sheetsBox);

    auto *sheetBox = new QGroupBox(tr("What the sheet fixes"));
    auto *sheetLayout = new QVBoxLayout(sheetBox);
    m_sheetTitle = new QLabel;
    m_sheetTitle->setWordWrap(true);
    m_instructions = new QLabel;
    m_instructions->setWordWrap(true);
    m_instructions->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_lockBox = new QWidget;
    new QFormLayout(m_lockBox);
    sheetLayout->addWidget(m_sheetTitle);
    sheetLayout->addWidget(m_lockBox);
    sheetLayout->addWidget(m_instructions);
    layout->addWidget(sheetBox);

    auto *startBox = new QGroupBox(tr("Before you start"));
    auto *startLayout = new QVBoxLayout(startBox);
    auto *form = new QFormLayout;
    m_student = new QLineEdit;
    m_student->setPlaceholderText(tr("your name"));
    m_serial = new QLineEdit;
    m_serial->setPlaceholderText(tr("serial number on the transformer"));
    form->addRow(tr("Student"), m_student);
    form->addRow(tr("Unit serial"), m_serial);
    startLayout->addLayout(form);
    const auto wrapped = [](const QString &text) {
        auto *label = new QLabel(text);
        label->setWordWrap(true);
        return label;
    };
    startLayout->addWidget(wrapped(tr("<b>Safety checklist</b> (you tick it; it is recorded in the session):")));
    for (const ChecklistItem &item : standardSafetyChecklist({}).items) {
        // A check box does not wrap its text: the box, then the item as a wrapped label that ticks it too.
        auto *check = new QCheckBox;
        check->setToolTip(q(item.text));
        check->setAccessibleName(q(item.text));
        auto *label = new QLabel(q(item.text));
        label->setWordWrap(true);
        label->setBuddy(check);
        auto *row = new QHBoxLayout;
        row->addWidget(check, 0, Qt::AlignTop);
        row->addWidget(label, 1);
        connect(check, &QCheckBox::toggled, this, &StudentBenchWindow::refreshStartButton);
        m_checks << check;
        startLayout->addLayout(row);
    }
    startLayout->addWidget(wrapped(tr("<b>Supervisor</b>: checks the set-up and confirms it with their own name.")));
    auto *supervisorForm = new QFormLayout;
    m_supervisor = new QLineEdit;
    m_supervisor->setPlaceholderText(tr("the supervisor's name"));
    m_pin = new QLineEdit;
    m_pin->setEchoMode(QLineEdit::Password);
    m_pin->setPlaceholderText(tr("the supervisor types it"));
    m_pinLabel = new QLabel(tr("Supervisor's PIN"));
    supervisorForm->addRow(tr("Supervisor"), m_supervisor);
    supervisorForm->addRow(m_pinLabel, m_pin);
    startLayout->addLayout(supervisorForm);
    m_start = new QPushButton(tr("Start the session"));
    startLayout->addWidget(m_start);
    for (QLineEdit *edit : {m_student, m_serial, m_supervisor, m_pin})
        connect(edit, &QLineEdit::textChanged, this, &StudentBenchWindow::refreshStartButton);
    connect(m_start, &QPushButton::clicked, this, [this] {
        const QString problem = start({m_student->text(), m_serial->text(), m_supervisor->text(), m_pin->text()});
        if (!problem.isEmpty())
            showMessage(problem, true);
    });
    layout->addWidget(startBox);

    auto *endBox = new QGroupBox(tr("At the end"));
    auto *endLayout = new QHBoxLayout(endBox);
    m_nextUnit = new QPushButton(tr("Next unit"));
    m_nextUnit->setToolTip(tr("The same sheet, student and supervisor; the next transformer (checklist and confirmation again)"));
    m_close = new QPushButton(tr("Close"));
    endLayout->addWidget(m_nextUnit);
    endLayout->addWidget(m_close);
    connect(m_nextUnit, &QPushButton::clicked, this, &StudentBenchWindow::nextUnit);
    connect(m_close, &QPushButton::clicked, this, &QWidget::close);
    m_nextUnit->setEnabled(false);
    layout->addWidget(endBox);

    m_message = new QLabel;
    m_message->setWordWrap(true);
    layout->addWidget(m_message);
    layout->addStretch(1);
    m_sessionFolder = QDir::home().filePath(QStringLiteral("sagline-sessions"));
    showSheet();
    return panel;
}

void StudentBenchWindow::setSheetFolder(const QString &folder)
{
    std::string error;
    m_sheets = findLabSheets(folder.toStdString(), &error);
    m_folderLabel->setText(error.empty() ? tr("In %1:").arg(folder) : q(error));
    const QSignalBlocker blocker(m_sheetList);
    m_sheetList->clear();
    for (const LabSheetListing &listing : m_sheets) {
        const QString name = QFileInfo(q(listing.path)).fileName();
        auto *item = new QListWidgetItem(listing.sheet ? tr("%1 — %2").arg(q(listing.sheet->title), name)
                                                       : tr("%1 (not usable)").arg(name));
        item->setToolTip(listing.sheet ? q(listing.path) : q(listing.problem));
        if (!listing.sheet)
            item->setFlags(item->flags() & ~Qt::ItemIsEnabled);
        m_sheetList->addItem(item);
    }
    if (m_sheets.empty())
        m_folderLabel->setText(m_folderLabel->text() + tr(" no lab sheets (*.json) found."));
}

int StudentBenchWindow::sheetCount() const { return static_cast<int>(m_sheets.size()); }

QString StudentBenchWindow::chooseSheet(int index)
{
    if (index < 0 || index >= sheetCount())
        return tr("lab sheet: no sheet %1 in the folder").arg(index + 1);
    if (m_workspace->isRunning())
        return tr("lab sheet: a session is under way; finish it first");
    const LabSheetListing &listing = m_sheets[static_cast<std::size_t>(index)];
    if (!listing.sheet)
        return tr("lab sheet: %1 is not usable: %2").arg(q(listing.path), q(listing.problem));
    m_sheet = listing.sheet;
    m_workspace->openSession(QString()); // a session of another sheet closes
    m_workspace->setSetupJson(q(setupToJson(m_sheet->setup)));
    if (const auto &plan = m_workspace->plan()) {
        m_chart->setLimits(chartLimits(*plan, m_sheet->setup.nameplate.ratedPowerVa));
        m_residuals->setCurrentSpan(plan->steps.empty() ? 0.0 : plan->steps.back().currentA);
        m_caution->setPrimaryVoltage(m_sheet->setup.nameplate.primaryVoltageV);
    }
    {
        const QSignalBlocker blocker(m_sheetList);
        m_sheetList->setCurrentRow(index);
    }
    resetViews();
    showSheet();
    return {};
}

void StudentBenchWindow::showSheet()
{
    auto *form = static_cast<QFormLayout *>(m_lockBox->layout());
    while (form->rowCount() > 0)
        form->removeRow(0);
    m_locked.clear();
    if (!m_sheet) {
        m_sheetTitle->setText(tr("Choose a lab sheet above."));
        m_instructions->clear();
        m_pinLabel->hide();
        m_pin->hide();
        refreshStartButton();
        return;
    }
    const LabSheet &sheet = *m_sheet;
    setWindowTitle(tr("Sagline: supervised session: %1").arg(q(sheet.title)));
    m_sheetTitle->setText(tr("<b>%1</b>").arg(q(sheet.title).toHtmlEscaped()));
    m_instructions->setText(q(sheet.instructions));
    const QString why = tr("Locked by the lab sheet: your supervisor fixed it.");
    // Each value whole on as many lines as the panel needs (a narrow field cut them short),
    // greyed as a control that cannot be changed, the reason in its tooltip.
    const auto locked = [&](const QString &label, const QString &value, const QString &reason) {
        auto *field = new QLabel(tr("%1 (locked)").arg(value));
        field->setWordWrap(true);
        field->setEnabled(false);
        field->setToolTip(reason);
        auto *name = new QLabel(label);
        name->setToolTip(reason);
        form->addRow(name, field);
        m_locked << field;
    };
    const Nameplate &p = sheet.setup.nameplate;
    locked(tr("Nameplate"), tr("%1, %2 to %3").arg(q(formatQuantity(p.ratedPowerVa, "VA", 3)),
                                                    q(formatQuantity(p.primaryVoltageV, "V", 3)),
                                                    q(formatQuantity(p.secondaryVoltageV, "V", 3))),
           why);
    const auto &plan = m_workspace->plan();
    locked(tr("Plan"), plan ? tr("steps 0 to %1, fixed").arg(plan->steps.back().index) : tr("cannot be made"),
           why + tr(" The plan cannot be edited; step 0 is the open circuit."));
    locked(tr("Highest load"),
           tr("%1 (%2 % of rated current)")
               .arg(q(formatQuantity(labSheetMaxCurrentA(sheet), "A", 3)))
               .arg(sheet.locks.maxLoadFraction * 100.0, 0, 'g', 3),
           why + tr(" A reading above it is refused and recorded for your supervisor."));
    locked(tr("Fuse to fit"),
           tr("%1 %2").arg(q(formatQuantity(sheet.locks.requiredFuse.ratingA, "A", 3)), q(toString(sheet.locks.requiredFuse.type))),
           why + tr(" Fit exactly this fuse in the primary."));
    locked(tr("Instruments"), tr("readings typed in by hand"), why + tr(" No meter link in this lab."));
    const bool pin = sheet.locks.supervisorPin.has_value();
    m_pinLabel->setVisible(pin);
    m_pin->setVisible(pin);
    refreshStartButton();
}

void StudentBenchWindow::setChecklistTicked(int item, bool ticked)
{
    if (item >= 0 && item < m_checks.size())
        m_checks[item]->setChecked(ticked);
}

void StudentBenchWindow::refreshStartButton()
{
    bool ticked = true;
    for (QCheckBox *check : m_checks)
        ticked = ticked && check->isChecked();
    const bool open = m_sheet && !m_workspace->store();
    m_start->setEnabled(open && ticked && !m_student->text().trimmed().isEmpty() && !m_serial->text().trimmed().isEmpty()
                        && !m_supervisor->text().trimmed().isEmpty()
                        && (!m_sheet->locks.supervisorPin || !m_pin->text().isEmpty()));
    for (QWidget *w : std::initializer_list<QWidget *>{m_student, m_serial, m_supervisor, m_pin})
        w->setEnabled(!m_workspace->store());
    for (QCheckBox *check : m_checks)
        check->setEnabled(!m_workspace->store());
}

QString StudentBenchWindow::start(const StudentStart &start)
{
    if (!m_sheet)
        return tr("lab sheet: choose one first");
    if (m_workspace->store())
        return tr("session: one is open; use Next unit for the next transformer");
    if (start.student.trimmed().isEmpty())
        return tr("student: your name is required");
    if (start.unitSerial.trimmed().isEmpty())
        return tr("unit serial: the transformer's serial number is required");
    for (QCheckBox *check : m_checks)
        if (!check->isChecked())
            return tr("safety checklist: tick every item before the first reading");
    SupervisorConfirmation confirmation{start.supervisor.trimmed().toStdString(), start.student.trimmed().toStdString(),
                                        false, {}};
    if (const std::string error = supervisorConfirmationError(confirmation); !error.empty())
        return q(error);
    if (const auto &lock = m_sheet->locks.supervisorPin) {
        if (start.supervisorPin.isEmpty())
            return tr("supervisor's PIN: this lab sheet asks for it");
        if (!supervisorPinMatches(*lock, start.supervisorPin.toStdString())) {
            m_pin->clear();
            return tr("supervisor's PIN: does not match the lab sheet's; nothing was recorded");
        }
        confirmation.pinChecked = true;
    }
    // The form shows who started it, also when a test or a script called start() directly.
    m_student->setText(start.student.trimmed());
    m_serial->setText(start.unitSerial.trimmed());
    m_supervisor->setText(start.supervisor.trimmed());
    m_pin->clear();
    m_workspace->setPerson(start.student.trimmed());
    const QString stamp = QDateTime::currentDateTimeUtc().toString(QStringLiteral("yyyyMMdd-HHmmss"));
    const QString named =
        q(supervisedSessionFileName(start.student.toStdString(), start.unitSerial.toStdString(), stamp.toStdString()));
    // The same student and unit again within the second (a retest straight away): "…Z-2.sagline".
    QString fileName = named;
    const QString extension = QStringLiteral(".sagline");
    for (int n = 2; QFileInfo::exists(QDir(m_sessionFolder).filePath(fileName)) && n < 100; ++n)
        fileName = named.chopped(extension.size()) + QStringLiteral("-%1").arg(n) + extension;
    m_workspace->setNextSessionFileName(fileName);
    SessionDetails details;
    details.operatorName = start.student.trimmed();
    details.unitSerial = start.unitSerial.trimmed();
    SourceChoice typed;
    typed.source = ReadingSource::TypedIn;
    if (const QString error = m_workspace->startSweep(details, m_sessionFolder, typed); !error.isEmpty())
        return error;
    recordSupervision(start, confirmation.pinChecked);
    m_nextStep->clearEntry();
    m_nextStep->currentField()->lineEdit()->setFocus();
    refreshStartButton();
    showMessage(tr("Session started: %1").arg(m_workspace->sessionPath()));
    return {};
}

void StudentBenchWindow::recordSupervision(const StudentStart &start, bool pinChecked)
{
    SessionStore *store = m_workspace->store();
    const std::string student = start.student.trimmed().toStdString();
    SafetyChecklist checklist = standardSafetyChecklist(student);
    for (std::size_t i = 0; i < checklist.items.size() && i < static_cast<std::size_t>(m_checks.size()); ++i)
        checklist.items[i].ticked = m_checks[static_cast<int>(i)]->isChecked();
    const SupervisorConfirmation confirmation{start.supervisor.trimmed().toStdString(), student, pinChecked, {}};
    for (const auto &[author, text] : {std::pair{labSheetNoteAuthor, labSheetNoteText(labSheetStamp(*m_sheet, student))},
                                       std::pair{checklistNoteAuthor, checklistNoteText(checklist)},
                                       std::pair{supervisorNoteAuthor, supervisorNoteText(confirmation)}}) {
        const auto added = store->addNote(author, text);
        if (!added.ok())
            showMessage(tr("Could not record the supervision in the session: %1").arg(q(added.message)), true);
    }
}

QString StudentBenchWindow::enterReading(const QString &current, const QString &voltage)
{
    m_nextStep->currentField()->setText(current);
    m_nextStep->voltageField()->setText(voltage);
    const int before = static_cast<int>(m_workspace->readings().size());
    handleRecord();
    return static_cast<int>(m_workspace->readings().size()) > before ? QString() : m_lastMessage;
}

void StudentBenchWindow::handleRecord()
{
    auto *current = m_nextStep->currentField();
    auto *voltage = m_nextStep->voltageField();
    current->setError(QString());
    voltage->setError(QString());
    // The sheet's own limit first: a refused current is recorded for the supervisor, never as a reading.
    const ManualValue typedCurrent = parseManualValue(MeterRole::SecondaryCurrent, current->text());
    if (m_sheet && typedCurrent.ok && m_workspace->store()) {
        const LimitCheck check = checkReadingAgainstSheet(*m_sheet, typedCurrent.value);
        if (!check.allowed) {
            LimitHit hit;
            hit.rule = check.rule;
            hit.message = check.message;
            const SweepRun *run = m_workspace->run();
            hit.step = run && run->controller() ? run->controller()->currentStep() : -1;
            hit.currentA = typedCurrent.value;
            m_workspace->store()->addNote(limitHitNoteAuthor, limitHitNoteText(hit));
            current->setError(q(check.message));
            showMessage(tr("Not recorded: %1").arg(q(check.message)), true);
            return;
        }
    }
    TypedOutcome outcome = m_workspace->submitTyped(current->text(), voltage->text());
    if (!outcome.question.isEmpty()) {
        // As at the bench: a value far from the step's expectation is not taken on the first Enter.
        const bool aboutCurrent = outcome.confirmField == current->field();
        (aboutCurrent ? current : voltage)->setError(outcome.question + tr(" — check it; Record again to keep it"));
        showMessage(tr("Check the typed value: %1").arg(outcome.question), true);
        if (!m_pendingConfirmation) {
            m_pendingConfirmation = true;
            return;
        }
        outcome = m_workspace->submitTyped(current->text(), voltage->text(), true);
    }
    m_pendingConfirmation = false;
    if (outcome.refusal.isEmpty()) {
        m_nextStep->clearEntry();
        // Numbered as the plan, the strip and the readings table number it.
        const std::vector<Reading> &readings = m_workspace->readings();
        showMessage(!readings.empty() && readings.back().step >= 0
                        ? tr("Recorded step %1 (reading %2).").arg(readings.back().step).arg(readings.size())
                        : tr("Recorded."));
        return;
    }
    const bool aboutCurrent = outcome.refusal.startsWith(current->field());
    (aboutCurrent ? current : voltage)->setError(outcome.refusal.mid(outcome.refusal.indexOf(QLatin1Char(':')) + 1).trimmed());
    showMessage(outcome.refusal, true);
}

void StudentBenchWindow::handleRunningChanged(bool running)
{
    m_nextStep->setRunning(running);
    m_nextStep->setPaused(m_workspace->isPaused());
    const bool ended = !running && m_workspace->store();
    m_nextUnit->setEnabled(ended);
    if (ended) {
        refreshFitViews();
        const SessionProgress progress = m_workspace->progress();
        m_nextStep->setInstruction(progress.isComplete() ? tr("Session complete") : tr("Session ended"),
                                   progress.isComplete()
                                       ? tr("Every step is recorded in %1. Close, or go on with the next unit.").arg(m_workspace->sessionPath())
                                       : tr("%1. Call your supervisor before the next unit.").arg(q(progress.label())));
        // The strip names Close and Next unit: bring them into view (the panel was scrolled to the
        // top), once the layout has taken the strip's new text.
        QTimer::singleShot(0, this, [this] {
            m_sheetScroll->ensureWidgetVisible(m_nextUnit);
            m_sheetScroll->ensureWidgetVisible(m_close);
        });
    }
    refreshStartButton();
}

void StudentBenchWindow::nextUnit()
{
    if (m_workspace->isRunning())
        return;
    m_workspace->openSession(QString());
    if (m_sheet)
        m_workspace->setSetupJson(q(setupToJson(m_sheet->setup)));
    resetViews();
    m_serial->clear();
    m_pin->clear();
    for (QCheckBox *check : m_checks)
        check->setChecked(false); // a new transformer is wired: check it again
    m_nextUnit->setEnabled(false);
    m_nextStep->setInstruction(tr("Next unit"), tr("Type its serial, tick the checklist again, and ask your supervisor to confirm."));
    refreshStartButton();
    m_serial->setFocus();
}

} // namespace sagline
