#include "PlanPanel.h"

#include "ActionButton.h"
#include <QAction>

#include "PlanTableModel.h"
#include "UiFormat.h"

#include <QHBoxLayout>
#include <QHeaderView>
#include <QSplitter>
#include <QStyle>
#include <QStyleOptionViewItem>
#include <QAbstractItemDelegate>

#include <algorithm>
#include <QScrollBar>
#include <QScrollArea>
#include <QDialogButtonBox>
#include <QDialog>
#include <QLabel>
#include <QPushButton>
#include <QTableView>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString row(const QString &name, const QString &value, const QString &note = {})
{
    QString html = QStringLiteral("<tr><td>") + name.toHtmlEscaped() + QStringLiteral("</td><td align=right style=\"white-space:nowrap\"><b>")
                   + value.toHtmlEscaped() + QStringLiteral("</b></td>");
    if (!note.isEmpty())
        html += QStringLiteral("<td><i>") + note.toHtmlEscaped() + QStringLiteral("</i></td>");
    return html + QStringLiteral("</tr>");
}

// The step table as the panel and the every-column window show it: one row per step, columns
// as wide as their contents.
void setUpStepTable(QTableView *table, PlanTableModel *model)
{
    table->setModel(model);
    table->verticalHeader()->hide();
    table->setSelectionBehavior(QAbstractItemView::SelectRows);
    table->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
}

} // namespace

PlanPanel::PlanPanel(QWidget *parent)
    : QWidget(parent), m_summary(new QLabel), m_warnings(new QLabel), m_table(new QTableView),
      m_model(new PlanTableModel(this)), m_accept(new QPushButton(tr("Accept plan and start the sweep"))),
      m_acceptAction(new QAction(tr("&Accept plan and start the sweep"), this)),
      m_blocked(new QLabel), m_safeSteps(new QPushButton(tr("Use only the safe steps"))),
      m_override(new QPushButton(tr("Override the limits…"))), m_everyColumn(new QPushButton(tr("Every column…")))
{
    m_summary->setTextFormat(Qt::RichText);
    m_summary->setWordWrap(true);
    m_summary->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_warnings->setWordWrap(true);
    m_warnings->setStyleSheet(QStringLiteral("QLabel { color: #b35000; font-weight: bold; }"));
    m_warnings->hide();
    // The figures scroll up and down above the step table; nothing scrolls sideways.
    auto *figures = new QWidget;
    auto *figuresLayout = new QVBoxLayout(figures);
    figuresLayout->setContentsMargins(0, 0, 0, 0);
    figuresLayout->addWidget(m_summary);
    figuresLayout->addWidget(m_warnings);
    figuresLayout->addStretch(1);
    auto *figuresScroll = new QScrollArea;
    figuresScroll->setWidget(figures);
    figuresScroll->setWidgetResizable(true);
    figuresScroll->setFrameShape(QFrame::NoFrame);
    figuresScroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    setUpStepTable(m_table, m_model);
    m_table->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    m_table->setAccessibleName(tr("Planned load steps"));
    // The panel shows what the person at the bench acts on; the loads, losses and margins are
    // one click away, in a table wide enough for every column.
    for (int column : {PlanTableModel::LoadPower, PlanTableModel::OutputVa, PlanTableModel::CopperLoss,
                       PlanTableModel::PrimaryCurrent, PlanTableModel::VaMargin})
        m_table->setColumnHidden(column, true);
    connect(m_everyColumn, &QPushButton::clicked, this, &PlanPanel::showEveryColumn);
    m_everyColumn->setToolTip(tr("The step table with the load power, output VA, copper loss, primary current and VA margin"));
    m_accept->setEnabled(false);
    m_accept->setMinimumHeight(36);
    auto *split = new QSplitter(Qt::Vertical);
    split->addWidget(figuresScroll);
    auto *steps = new QWidget;
    auto *stepsLayout = new QVBoxLayout(steps);
    stepsLayout->setContentsMargins(0, 0, 0, 0);
    stepsLayout->addWidget(m_table, 1);
    auto *tableButtons = new QHBoxLayout;
    tableButtons->addStretch(1);
    tableButtons->addWidget(m_everyColumn);
    stepsLayout->addLayout(tableButtons);
    split->addWidget(steps);
    split->setChildrenCollapsible(false);
    split->setStretchFactor(0, 2);
    split->setStretchFactor(1, 3);
    split->setSizes({400, 600});
    auto *layout = new QVBoxLayout(this);
    layout->addWidget(split, 1);
    m_blocked->setWordWrap(true);
    m_blocked->setStyleSheet(QStringLiteral("QLabel { color: #b35000; font-weight: bold; }"));
    m_blocked->hide();
    auto *gate = new QHBoxLayout;
    gate->addWidget(m_safeSteps);
    gate->addWidget(m_override);
    gate->addStretch(1);
    m_safeSteps->hide();
    m_override->hide();
    m_safeSteps->setToolTip(tr("Plan only the steps the rheostat and the fuse can take (recorded in the session)"));
    m_override->setToolTip(tr("Run every step anyway: your name and your reason are recorded; the hard stops still apply"));
    layout->addWidget(m_blocked);
    layout->addLayout(gate);
    layout->addWidget(m_accept);
    // The button and the Sweep menu's item are one action: enabled together. Code that sets
    // the button's enabled state reaches the action through the binding.
    m_acceptAction->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_A));
    m_acceptAction->setEnabled(false);
    connect(m_acceptAction, &QAction::triggered, this, &PlanPanel::acceptRequested);
    bindButtonToAction(m_accept, m_acceptAction);
    connect(m_safeSteps, &QPushButton::clicked, this, &PlanPanel::safeStepsRequested);
    connect(m_override, &QPushButton::clicked, this, &PlanPanel::overrideRequested);
    setPlan(std::nullopt);
}

void PlanPanel::setPlan(const std::optional<Plan> &plan)
{
    m_model->setPlan(plan);
    m_hasPlan = plan.has_value();
    m_accept->setEnabled(m_hasPlan && !m_isBlocked);
    if (!plan) {
        m_summary->setText(tr("<i>No plan yet: complete the nameplate; the rule each field breaks is shown under it.</i>"));
        m_warnings->hide();
        return;
    }
    const Plan &p = *plan;
    QString html = QStringLiteral("<table cellspacing=0 cellpadding=2>");
    html += row(tr("Rated secondary current"), formatQuantity(p.ratedSecondaryCurrentA, Unit::Ampere));
    html += row(tr("Rated primary current"), formatQuantity(p.ratedPrimaryCurrentA, Unit::Ampere));
    html += row(tr("No-load voltage"), formatQuantity(p.noLoadVoltageV, Unit::Volt));
    html += row(tr("Turns ratio (V1 / V2 no-load)"), formatNumber(p.turnsRatio));
    html += row(tr("Series resistance (secondary, estimated)"), formatQuantity(p.seriesResistanceOhm, Unit::Ohm));
    html += row(tr("Regulation (nameplate)"), formatQuantity(p.regulationPercent, Unit::Percent, 3));
    html += row(tr("Hard stop above"), formatQuantity(p.overloadLimitVa, Unit::VoltAmpere, 3),
                tr("rated VA × overload factor"));
    if (p.rheostatSafeCurrentA)
        html += row(tr("Rheostat safe current"), formatQuantity(*p.rheostatSafeCurrentA, Unit::Ampere),
                    tr("√(P rated / R track)"));
    const auto &fuse = p.recommendedFuse;
    html += row(tr("Recommended primary fuse"),
                formatQuantity(fuse.ratingA, Unit::Ampere, 3) + QLatin1Char(' ')
                    + (fuse.type == FuseType::TimeLag ? tr("time-lag (T)") : tr("quick-acting (F)")),
                tr("smallest IEC 60127 rating ≥ %1 × rated primary current").arg(formatNumber(fuse.factor, 3)));
    html += row(tr("NEC 450.3(B) primary-only ceiling"), formatQuantity(p.maxPrimaryProtectionA, Unit::Ampere, 3),
                tr("the most a primary-only protective device may be rated where NEC applies"));
    html += row(tr("Sweep time"), formatQuantity(p.totalTimeS, Unit::Second, 3));
    html += QStringLiteral("</table>");
    if (!p.defaultsUsed.empty()) {
        QStringList names;
        for (const auto &name : p.defaultsUsed)
            names << (m_fieldLabel ? m_fieldLabel(QString::fromStdString(name)) : QString::fromStdString(name));
        html += QStringLiteral("<p><i>") + tr("Defaults used (common practice): %1").arg(names.join(QStringLiteral(", ")).toHtmlEscaped())
                + QStringLiteral("</i></p>");
    }
    m_summary->setText(html);
    fitTableWidth();
    QStringList warnings;
    for (const auto &warning : p.warnings)
        warnings << QStringLiteral("▲ ") + QString::fromStdString(warning);
    m_warnings->setText(warnings.join(QLatin1Char('\n')));
    m_warnings->setVisible(!warnings.isEmpty());
}

void PlanPanel::setAcceptBlocked(const QString &reason, bool unsafeSteps)
{
    m_isBlocked = !reason.isEmpty();
    m_blocked->setText(reason);
    m_blocked->setVisible(m_isBlocked);
    m_acceptAction->setToolTip(reason);
    m_safeSteps->setVisible(unsafeSteps);
    m_override->setVisible(unsafeSteps);
    m_accept->setEnabled(m_hasPlan && !m_isBlocked);
}

QString PlanPanel::acceptBlockedReason() const { return m_isBlocked ? m_blocked->text() : QString(); }

void PlanPanel::setAccepted(bool accepted)
{
    m_acceptAction->setText(accepted ? tr("Plan accepted: sweep in progress") : tr("&Accept plan and start the sweep"));
    if (accepted)
        m_accept->setEnabled(false);
}

QString PlanPanel::summaryText() const { return m_summary->text(); }

void PlanPanel::fitTableWidth()
{
    // The panel is at least as wide as the shown columns' contents, so none needs a sideways
    // scroll bar.
    int width = 2 * m_table->frameWidth() + m_table->style()->pixelMetric(QStyle::PM_ScrollBarExtent) + 4;
    QStyleOptionViewItem option;
    option.initFrom(m_table);
    option.widget = m_table;
    for (int column = 0; column < m_model->columnCount(); ++column) {
        if (m_table->isColumnHidden(column))
            continue;
        int widest = m_table->horizontalHeader()->sectionSizeHint(column);
        for (int row = 0; row < m_model->rowCount(); ++row) // a plan has tens of steps, not thousands
            widest = std::max(widest, m_table->itemDelegate()->sizeHint(option, m_model->index(row, column)).width());
        m_table->resizeColumnToContents(column);
        width += std::max(widest + int(m_table->showGrid()), m_table->columnWidth(column));
    }
    m_table->setMinimumWidth(width);
}

void PlanPanel::showEveryColumn()
{
    auto *dialog = new QDialog(this);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    dialog->setWindowTitle(tr("Planned load steps, every column"));
    auto *table = new QTableView;
    setUpStepTable(table, m_model);
    table->setAccessibleName(tr("Planned load steps, every column"));
    auto *buttons = new QDialogButtonBox(QDialogButtonBox::Close);
    connect(buttons, &QDialogButtonBox::rejected, dialog, &QDialog::close);
    auto *layout = new QVBoxLayout(dialog);
    layout->addWidget(table);
    layout->addWidget(buttons);
    table->resizeColumnsToContents();
    int width = table->frameWidth() * 2 + table->verticalScrollBar()->sizeHint().width();
    for (int column = 0; column < m_model->columnCount(); ++column)
        width += table->columnWidth(column);
    dialog->resize(width + layout->contentsMargins().left() + layout->contentsMargins().right(), 420);
    m_everyColumnDialog = dialog;
    dialog->show();
}

} // namespace sagline
