#include "SignOffDialog.h"

#include "RecordDialogLayout.h"

#include <QComboBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QPushButton>

namespace sagline {

SignOffDialog::SignOffDialog(const QString &sessionName, const QString &reviewer, QWidget *parent)
    : QDialog(parent), m_reviewer(new QLineEdit(reviewer)), m_decision(new QComboBox), m_comment(new QPlainTextEdit),
      m_problem(new QLabel)
{
    setWindowTitle(tr("Sign off %1").arg(sessionName));
    m_decision->addItem(tr("Accept"), static_cast<int>(ReviewDecision::Accepted));
    m_decision->addItem(tr("Reject"), static_cast<int>(ReviewDecision::Rejected));
    m_decision->addItem(tr("Retest"), static_cast<int>(ReviewDecision::Retest));
    m_comment->setPlaceholderText(tr("Required when rejecting or asking for a retest: say why."));
    auto *form = new QFormLayout;
    form->addRow(tr("Reviewer"), m_reviewer);
    form->addRow(tr("Reviewer's decision"), m_decision);
    form->addRow(tr("Comment"), m_comment);
    QPushButton *signOff = layOutRecordDialog(this, form,
                                              tr("The sign-off is added to the session file as a new review record with "
                                                 "the UTC time. Nothing else in the file changes; earlier sign-offs stay "
                                                 "in its history."),
                                              m_problem, tr("Sign off…"));
    auto recheck = [this, signOff] {
        const std::string problem = signOffRequestError(request());
        m_problem->setText(QString::fromStdString(problem));
        signOff->setEnabled(problem.empty());
    };
    connect(m_reviewer, &QLineEdit::textChanged, this, recheck);
    connect(m_comment, &QPlainTextEdit::textChanged, this, recheck);
    connect(m_decision, &QComboBox::currentIndexChanged, this, recheck);
    recheck();
}

SignOffRequest SignOffDialog::request() const
{
    return {m_reviewer->text().trimmed().toStdString(), static_cast<ReviewDecision>(m_decision->currentData().toInt()),
            m_comment->toPlainText().trimmed().toStdString()};
}

} // namespace sagline
