#include "QuantityField.h"

#include "ReadOnlyLook.h"

#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

namespace sagline {

QuantityField::QuantityField(const QString &field, Unit unit, const QString &placeholder, QWidget *parent)
    : QWidget(parent), m_field(field), m_unit(unit), m_edit(new QLineEdit(this)), m_error(new QLabel(this))
{
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(1);
    m_edit->setPlaceholderText(placeholder);
    m_edit->setAccessibleName(field);
    m_edit->setObjectName(field);
    m_error->setWordWrap(true);
    m_error->setObjectName(field + QStringLiteral(".error"));
    // Red text plus a cross: the error is recognisable without colour.
    m_error->setStyleSheet(QStringLiteral("QLabel { color: #d55e00; font-weight: bold; }"));
    m_error->hide();
    layout->addWidget(m_edit);
    layout->addWidget(m_error);
    connect(m_edit, &QLineEdit::textEdited, this, &QuantityField::edited);
}

QString QuantityField::text() const { return m_edit->text(); }
void QuantityField::setText(const QString &text) { m_edit->setText(text); }
bool QuantityField::isBlank() const { return m_edit->text().trimmed().isEmpty(); }

std::optional<double> QuantityField::value() const
{
    if (isBlank())
        return std::nullopt;
    const auto parsed = parseQuantity(m_edit->text().toStdString(), m_unit);
    if (!parsed.ok)
        return std::nullopt;
    return parsed.value;
}

bool QuantityField::checkUnits()
{
    if (isBlank())
        return true;
    const auto parsed = parseQuantity(m_edit->text().toStdString(), m_unit);
    if (!parsed.ok) {
        setError(QString::fromStdString(parsed.error));
        return false;
    }
    return true;
}

void QuantityField::setError(const QString &rule)
{
    m_error->setText(rule.isEmpty() ? QString() : QStringLiteral("✖ ") + rule);
    m_error->setVisible(!rule.isEmpty());
    m_edit->setToolTip(rule);
}

QString QuantityField::error() const
{
    return m_error->isHidden() ? QString() : m_error->text().mid(2);
}

void QuantityField::setReadOnly(bool readOnly) { setReadOnlyShown(m_edit, readOnly); }

} // namespace sagline
