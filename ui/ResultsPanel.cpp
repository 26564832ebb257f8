#include "ResultsPanel.h"

#include "BudgetDialog.h"

#include <QGridLayout>
#include <QLabel>
#include <QPushButton>
#include <QVBoxLayout>

namespace sagline {

namespace {

// A value keeps a fixed size that only ever grows: a new value that fits then repaints its
// own label, where a free size would lay the whole panel out again (re-wrapping and
// re-shaping every label) on each point.
void setValueText(QLabel *value, const QString &text)
{
    if (value->text() == text)
        return;
    const QFontMetrics metrics(value->font());
    const int needed = metrics.horizontalAdvance(text) + metrics.averageCharWidth();
    if (needed > value->minimumWidth())
        value->setFixedWidth(needed + metrics.averageCharWidth()); // a little headroom: fewer re-layouts
    value->setText(text);
}

} // namespace

VerdictState verdictStateOf(ConformityOutcome outcome)
{
    switch (outcome) {
    case ConformityOutcome::Pass: return VerdictState::Pass;
    case ConformityOutcome::ConditionalPass: return VerdictState::ConditionalPass;
    case ConformityOutcome::ConditionalFail: return VerdictState::ConditionalFail;
    case ConformityOutcome::Fail: return VerdictState::Fail;
    case ConformityOutcome::NotJudged: return VerdictState::NotJudged;
    }
    return VerdictState::None;
}

ResultsPanel::ResultsPanel(QWidget *parent)
    : QWidget(parent), m_grid(new QGridLayout), m_verdict(new QLabel), m_rule(new QLabel), m_placeholder(new QLabel),
      m_budgetButton(new QPushButton(tr("Uncertainty budget…")))
{
    auto *layout = new QVBoxLayout(this);
    auto *title = new QLabel(tr("Results"));
    QFont titleFont = title->font();
    titleFont.setBold(true);
    titleFont.setPointSizeF(titleFont.pointSizeF() * 1.25);
    title->setFont(titleFont);
    layout->addWidget(title);
    m_verdict->setObjectName(QStringLiteral("verdict"));
    QFont verdictFont = m_verdict->font();
    verdictFont.setBold(true);
    verdictFont.setPointSizeF(verdictFont.pointSizeF() * 1.6);
    m_verdict->setFont(verdictFont);
    m_verdict->setWordWrap(true);
    m_rule->setWordWrap(true);
    m_placeholder->setWordWrap(true);
    m_placeholder->setText(tr("No points yet."));
    layout->addWidget(m_verdict);
    layout->addWidget(m_rule);
    layout->addWidget(m_placeholder);
    m_grid->setHorizontalSpacing(12);
    m_grid->setVerticalSpacing(6);
    m_grid->setColumnStretch(0, 1);
    layout->addLayout(m_grid);
    m_budgetButton->setObjectName(QStringLiteral("budgetButton"));
    m_budgetButton->setToolTip(tr("Each result's uncertainty budget (GUM): sources, sensitivities, contributions, "
                                  "ν_eff and k"));
    m_budgetButton->setEnabled(false);
    connect(m_budgetButton, &QPushButton::clicked, this, &ResultsPanel::showBudgets);
    layout->addWidget(m_budgetButton, 0, Qt::AlignLeft);
    layout->addStretch(1);
    setVerdict(VerdictState::None, QString(), QString());
}

void ResultsPanel::setBudgets(std::vector<BudgetTable> budgets)
{
    m_budgets = std::move(budgets);
    m_budgetButton->setEnabled(!m_budgets.empty());
}

void ResultsPanel::showBudgets()
{
    auto *dialog = new BudgetDialog(m_budgets, this);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    dialog->show();
}

void ResultsPanel::setLines(const QList<ResultLine> &lines)
{
    QStringList keys;
    for (const auto &line : lines)
        keys << line.key;
    if (keys != m_keys) {
        // The set of lines changed: rebuild the grid (rare; values change on every point).
        for (const Row &old : std::as_const(m_rows)) {
            delete old.label;
            delete old.value;
            delete old.note;
        }
        while (QLayoutItem *item = m_grid->takeAt(0))
            delete item; // the nested label layouts
        m_rows.clear();
        QFont valueFont = font();
        valueFont.setPointSizeF(valueFont.pointSizeF() * 1.25);
        valueFont.setBold(true);
        int row = 0;
        for (const auto &line : lines) {
            Row widgets{new QLabel, new QLabel, new QLabel};
            widgets.label->setWordWrap(true);
            widgets.note->setWordWrap(true);
            QFont small = widgets.note->font();
            small.setPointSizeF(small.pointSizeF() * 0.9);
            widgets.note->setFont(small);
            widgets.note->setForegroundRole(QPalette::PlaceholderText);
            widgets.value->setFont(valueFont);
            widgets.value->setObjectName(line.key);
            widgets.value->setTextInteractionFlags(Qt::TextSelectableByMouse);
            widgets.value->setAlignment(Qt::AlignRight | Qt::AlignVCenter);
            widgets.value->setFixedHeight(QFontMetrics(valueFont).height() + 4);
            // Label with its note beneath on the left, the value large on the right.
            auto *labels = new QVBoxLayout;
            labels->setSpacing(0);
            labels->addWidget(widgets.label);
            labels->addWidget(widgets.note);
            m_grid->addLayout(labels, row, 0);
            m_grid->addWidget(widgets.value, row, 1, Qt::AlignRight | Qt::AlignVCenter);
            m_rows.append(widgets);
            ++row;
        }
        m_keys = keys;
    }
    m_values.clear();
    for (qsizetype i = 0; i < lines.size(); ++i) {
        const auto &line = lines[i];
        const Row &widgets = m_rows[i];
        widgets.label->setText(line.label);
        setValueText(widgets.value, line.warning ? QStringLiteral("▲ ") + line.value : line.value);
        if (widgets.value->property("warning").toBool() != line.warning) {
            widgets.value->setProperty("warning", line.warning);
            widgets.value->setStyleSheet(line.warning ? QStringLiteral("QLabel { color: #b35000; }") : QString());
        }
        widgets.note->setText(line.note);
        m_values.insert(line.key, line.value);
    }
    m_placeholder->setVisible(lines.isEmpty());
}

void ResultsPanel::setVerdict(VerdictState state, const QString &text, const QString &rule)
{
    QString symbol;
    QString style;
    switch (state) {
    case VerdictState::None:
        m_verdict->hide();
        m_rule->hide();
        return;
    case VerdictState::Pass:
        symbol = QStringLiteral("✔ ");
        style = QStringLiteral("QLabel { background: #009e73; color: white; padding: 6px; }");
        break;
    case VerdictState::Fail:
        symbol = QStringLiteral("✖ ");
        style = QStringLiteral("QLabel { background: #d55e00; color: white; padding: 6px; }");
        break;
    case VerdictState::ConditionalPass:
        symbol = QStringLiteral("✔? ");
        style = QStringLiteral("QLabel { background: #f0e442; color: #1a1a1a; padding: 6px; }");
        break;
    case VerdictState::ConditionalFail:
        symbol = QStringLiteral("✖? ");
        style = QStringLiteral("QLabel { background: #f0e442; color: #1a1a1a; padding: 6px; }");
        break;
    case VerdictState::NotJudged:
        symbol = QStringLiteral("– ");
        style = QStringLiteral("QLabel { border: 2px solid palette(mid); padding: 6px; }");
        break;
    case VerdictState::Provisional:
        symbol = QStringLiteral("… ");
        style = QStringLiteral("QLabel { background: #999999; color: #1a1a1a; padding: 6px; }");
        break;
    case VerdictState::Incomplete:
        symbol = QStringLiteral("◌ ");
        style = QStringLiteral("QLabel { background: #e69f00; color: #1a1a1a; padding: 6px; }");
        break;
    }
    m_verdict->setText(symbol + text);
    m_verdict->setStyleSheet(style);
    m_rule->setText(rule);
    m_verdict->show();
    m_rule->setVisible(!rule.isEmpty());
}

void ResultsPanel::setPlaceholder(const QString &text)
{
    m_placeholder->setText(text);
}

QString ResultsPanel::value(const QString &key) const { return m_values.value(key); }

QString ResultsPanel::note(const QString &key) const
{
    const auto index = m_keys.indexOf(key);
    return index >= 0 && index < m_rows.size() ? m_rows[index].note->text() : QString();
}
QString ResultsPanel::verdictText() const { return m_verdict->isHidden() ? QString() : m_verdict->text(); }

} // namespace sagline
