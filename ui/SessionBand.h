// The band under the next-step strip that says what state the open session is in, in words,
// whichever tab is open: signed off (read-only, with Reopen), changed after sign-off, altered,
// or incomplete (with Resume). Hidden for a session in progress or complete and unsigned.
#pragma once

#include <QWidget>

class QLabel;
class QPushButton;

namespace sagline {

class SessionBand : public QWidget {
    Q_OBJECT
public:
    enum class Kind { Hidden, Signed, ChangedAfterSignOff, Altered, Incomplete };

    explicit SessionBand(QWidget *parent = nullptr);
    // `text` is shown as given; Reopen and Resume are offered when allowed.
    void setState(Kind kind, const QString &text, bool canReopen, const QString &resumeLabel = {});
    Kind kind() const { return m_kind; }
    QString text() const;
    QPushButton *reopenButton() const { return m_reopen; }
    QPushButton *resumeButton() const { return m_resume; }

signals:
    void reopenRequested();
    void resumeRequested();

private:
    Kind m_kind = Kind::Hidden;
    QLabel *m_text;
    QPushButton *m_reopen;
    QPushButton *m_resume;
};

} // namespace sagline
