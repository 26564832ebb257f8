#include "RecordDialogLayout.h"

#include <QDialog>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QPushButton>
#include <QVBoxLayout>

namespace sagline {

QPushButton *layOutRecordDialog(QDialog *dialog, QFormLayout *form, const QString &note, QLabel *problem,
                                const QString &okText)
{
    auto *noteLabel = new QLabel(note);
    noteLabel->setWordWrap(true);
    problem->setWordWrap(true);
    auto *buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
    QPushButton *ok = buttons->button(QDialogButtonBox::Ok);
    ok->setText(okText);
    QObject::connect(buttons, &QDialogButtonBox::accepted, dialog, &QDialog::accept);
    QObject::connect(buttons, &QDialogButtonBox::rejected, dialog, &QDialog::reject);
    auto *layout = new QVBoxLayout(dialog);
    layout->addLayout(form);
    layout->addWidget(noteLabel);
    layout->addWidget(problem);
    layout->addWidget(buttons);
    return ok;
}

} // namespace sagline
