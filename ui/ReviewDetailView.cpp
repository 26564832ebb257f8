#include "ReviewDetailView.h"

#include "FitPresentation.h"

#include "ReadingsTableModel.h"
#include "ReadingsTableView.h"
#include "ResultsPanel.h"
#include "SessionStore.h"
#include "UncertaintyFormat.h"

#include <QHeaderView>
#include "VerdictCompleteness.h"

#include <QLabel>
#include <QScrollArea>
#include <QScrollBar>
#include <QSplitter>
#include <QTableView>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString text(const std::string &s) { return QString::fromStdString(s).toHtmlEscaped(); }

} // namespace

ReviewDetailView::ReviewDetailView(QWidget *parent)
    : QWidget(parent), m_heading(new QLabel), m_results(new ResultsPanel), m_readings(new ReadingsTableModel(this)),
      m_readingsView(new QTableView), m_history(new QLabel)
{
    m_heading->setWordWrap(true);
    m_heading->setTextFormat(Qt::RichText);
    m_history->setWordWrap(true);
    m_history->setTextFormat(Qt::RichText);
    m_history->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    // The readings as the bench shows them: numbered from 1, flags, exclusion and note in Remarks.
    setUpReadingsTable(m_readingsView, m_readings);
    m_readingsView->setEditTriggers(QAbstractItemView::NoEditTriggers);

    auto *historyScroll = new QScrollArea;
    historyScroll->setWidget(m_history);
    historyScroll->setWidgetResizable(true);
    auto *left = new QWidget;
    auto *leftLayout = new QVBoxLayout(left);
    leftLayout->setContentsMargins(0, 0, 0, 0);
    leftLayout->addWidget(m_results);
    leftLayout->addWidget(historyScroll, 1);
    // The results and the history scroll rather than make the review window taller than a
    // 768 px screen (it grew to 1069 px with this tab shown).
    auto *leftScroll = new QScrollArea;
    leftScroll->setWidget(left);
    leftScroll->setWidgetResizable(true);
    leftScroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    leftScroll->setFrameShape(QFrame::NoFrame);
    auto *split = new QSplitter(Qt::Horizontal);
    split->addWidget(leftScroll);
    split->addWidget(m_readingsView);
    split->setStretchFactor(1, 1);
    split->setSizes({430, 640});
    m_results->setMinimumWidth(400);
    leftScroll->setMinimumWidth(400 + leftScroll->verticalScrollBar()->sizeHint().width());
    historyScroll->setMinimumHeight(140);
    auto *layout = new QVBoxLayout(this);
    layout->addWidget(m_heading);
    layout->addWidget(split, 1);
    showSession(nullptr);
}

void ReviewDetailView::showSession(const SessionRow *row)
{
    m_readings->clear();
    if (!row) {
        m_heading->setText(tr("Click a row of the table to see that session in full (read-only)."));
        m_results->setLines({});
        m_results->setPlaceholder(tr("No session selected."));
        m_results->setVerdict(VerdictState::None, QString(), QString());
        m_history->clear();
        return;
    }
    m_heading->setText(tr("<b>%1</b> · %2 · operator %3 · %4<br><small>%5</small>")
                           .arg(text(row->unitSerial), text(row->createdUtc), text(row->operatorName),
                                row->instruments.empty() ? tr("readings typed in") : text(row->instruments), text(row->path)));
    if (!row->opened) {
        m_results->setLines({});
        m_results->setPlaceholder(tr("This file cannot be opened: %1").arg(QString::fromStdString(row->problem)));
        m_results->setVerdict(VerdictState::None, QString(), QString());
        m_history->clear();
        return;
    }
    const SessionFigures &f = row->figures;
    if (f.ok) {
        // The same lines, verdict and budgets as the window shows at the bench.
        ResultsView view = assessmentView(f.assessment);
        view.lines.append({"points", tr("Points used"), tr("%1 of %2").arg(row->pointsUsed).arg(row->readingCount), QString()});
        m_results->setLines(view.lines);
        applyCompleteness(view, row->progress); // an incomplete session shows no verdict
        m_results->setVerdict(view.state, view.verdictText, view.verdictRule);
        m_results->setBudgets(view.budgets);
    } else {
        m_results->setLines({});
        m_results->setPlaceholder(tr("No fit: %1").arg(QString::fromStdString(f.message)));
        m_results->setVerdict(VerdictState::None, QString(), QString());
        m_results->setBudgets({});
    }

    // Readings with residuals from the session's own fit (read-only, computed by core).
    auto opened = SessionStore::openForReview(row->path);
    if (opened.ok()) {
        const auto readings = opened.value->readings();
        const double a = row->fit.intercept, b = row->fit.slope;
        if (row->fit.ok())
            m_readings->setResidualFunction([a, b](double i, double v) { return v - (a + b * i); });
        m_readings->append(readings.value);
    }

    QString history = tr("<b>Sign-off history</b><br>");
    if (row->seal.state != SealState::NotSigned)
        history += tr("<b>%1</b><br>").arg(text(row->seal.summary()));
    if (row->signOffs.empty())
        history += tr("no sign-off yet<br>");
    for (const SignOffRecord &s : row->signOffs)
        history += tr("%1 · <b>%2</b> by %3%4<br>")
                       .arg(text(s.timeUtc), text(toString(s.decision)), text(s.reviewer),
                            s.comment.empty() ? QString() : QStringLiteral(": ") + text(s.comment));
    history += tr("<br><b>Safety stops</b><br>");
    if (row->safetyStops.empty())
        history += tr("none<br>");
    for (const SafetyStopRecord &s : row->safetyStops)
        history += tr("%1 · step %2 · %3: %4<br>").arg(text(s.timeUtc)).arg(s.step).arg(text(s.rule), text(s.message));
    const SupervisionSummary &sup = row->supervision;
    if (sup.labSheet) {
        history += tr("<br><b>Lab sheet</b> %1 (fingerprint %2), load limit %3 % of rated current<br>")
                       .arg(text(sup.labSheet->title), text(sup.labSheet->fingerprint))
                       .arg(sup.labSheet->maxLoadFraction * 100.0, 0, 'g', 3);
        history += sup.checklist && sup.checklist->complete() ? tr("Safety checklist ticked by %1<br>").arg(text(sup.checklist->student))
                                                              : tr("<b>Safety checklist not complete</b><br>");
        history += tr("Student: %1<br>").arg(text(sup.labSheet->student));
        history += sup.supervisor
                       ? tr("Set-up confirmed by the supervisor %1 at %2%3<br>")
                             .arg(text(sup.supervisor->supervisor), text(sup.supervisor->timeUtc),
                                  sup.supervisor->pinChecked ? tr(" (with the sheet's PIN)") : QString())
                       : tr("<b>No supervisor's confirmation recorded</b><br>");
        history += tr("Limit hits: %1<br>").arg(sup.limitHits.size());
        for (const LimitHit &hit : sup.limitHits)
            history += QStringLiteral("&nbsp;&nbsp;%1 · %2<br>").arg(text(hit.timeUtc), text(hit.message));
    }
    m_history->setText(history);
}

QString ReviewDetailView::historyText() const
{
    return m_history->text();
}

} // namespace sagline
