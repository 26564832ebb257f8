#include "ReadOnlyLook.h"

#include <QLineEdit>
#include <QPalette>

namespace sagline {

void setReadOnlyShown(QLineEdit *edit, bool readOnly)
{
    edit->setReadOnly(readOnly);
    if (!readOnly) {
        edit->setPalette(QPalette()); // back to the inherited palette
        return;
    }
    QPalette palette = edit->parentWidget() ? edit->parentWidget()->palette() : edit->palette();
    for (const QPalette::ColorGroup group : {QPalette::Active, QPalette::Inactive, QPalette::Disabled})
        palette.setColor(group, QPalette::Base, palette.color(group, QPalette::Window));
    edit->setPalette(palette);
}

} // namespace sagline
