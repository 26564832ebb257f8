// One typed physical quantity: a line edit that accepts units as typed ("130 mA", "13,8 V"),
// with the rule it broke shown right under it. Parsing is core's parseQuantity.
#pragma once

#include "Units.h"

#include <QWidget>

#include <optional>

class QLabel;
class QLineEdit;

namespace sagline {

class QuantityField : public QWidget {
    Q_OBJECT
public:
    // `field` is the setup-file name ("nameplate.rated_power_va"), used to match errors.
    QuantityField(const QString &field, Unit unit, const QString &placeholder, QWidget *parent = nullptr);

    QString field() const { return m_field; }
    Unit unit() const { return m_unit; }
    QString text() const;
    void setText(const QString &text);
    bool isBlank() const;
    // The value in SI units, or nothing when blank or unreadable (error() says why).
    std::optional<double> value() const;
    // Parses now and shows the unit rule if the text is unreadable; true when readable or blank.
    bool checkUnits();
    void setError(const QString &rule); // empty clears
    QString error() const;
    void setReadOnly(bool readOnly);
    QLineEdit *lineEdit() const { return m_edit; }

signals:
    void edited();

private:
    QString m_field;
    Unit m_unit;
    QLineEdit *m_edit;
    QLabel *m_error;
};

} // namespace sagline
