#include "SessionBand.h"

#include <QHBoxLayout>
#include <QLabel>
#include <QPushButton>

namespace sagline {

SessionBand::SessionBand(QWidget *parent)
    : QWidget(parent), m_text(new QLabel), m_reopen(new QPushButton(tr("Reopen for changes…"))),
      m_resume(new QPushButton)
{
    auto *layout = new QHBoxLayout(this);
    layout->setContentsMargins(8, 4, 8, 4);
    m_text->setWordWrap(true);
    m_text->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_text->setAccessibleName(tr("Session state"));
    layout->addWidget(m_text, 1);
    layout->addWidget(m_resume);
    layout->addWidget(m_reopen);
    m_reopen->setToolTip(tr("Lift the sign-off to change the session: your name and your reason are recorded, and "
                            "the session then says \"changed after sign-off\" everywhere"));
    connect(m_reopen, &QPushButton::clicked, this, &SessionBand::reopenRequested);
    connect(m_resume, &QPushButton::clicked, this, &SessionBand::resumeRequested);
    setAutoFillBackground(true);
    setState(Kind::Hidden, {}, false);
}

void SessionBand::setState(Kind kind, const QString &text, bool canReopen, const QString &resumeLabel)
{
    m_kind = kind;
    m_text->setText(text);
    m_reopen->setVisible(canReopen);
    m_resume->setVisible(!resumeLabel.isEmpty());
    m_resume->setText(resumeLabel);
    // Okabe–Ito hues, each with a symbol so the state never rests on colour alone.
    QString style;
    switch (kind) {
    case Kind::Hidden: hide(); return;
    case Kind::Signed: style = QStringLiteral("background: #56b4e9; color: #0b1d2a;"); break;
    case Kind::ChangedAfterSignOff:
    case Kind::Incomplete: style = QStringLiteral("background: #f0e442; color: #1a1a1a;"); break;
    case Kind::Altered: style = QStringLiteral("background: #d55e00; color: white;"); break;
    }
    m_text->setStyleSheet(QStringLiteral("QLabel { font-weight: bold; %1 padding: 4px; }").arg(style));
    show();
}

QString SessionBand::text() const { return isVisible() || m_kind != Kind::Hidden ? m_text->text() : QString(); }

} // namespace sagline
