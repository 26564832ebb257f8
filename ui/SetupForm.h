// The nameplate, bench and session form. It holds text as typed; core reads it (the form
// hands core a setup JSON built from the raw strings, so every rule and message is core's)
// and the errors come back here to be shown under the field they name.
#pragma once

#include "ConformityDecision.h"
#include "FieldError.h"
#include "Setup.h"
#include "TemperatureCorrection.h"
#include "Units.h"

#include <QHash>
#include <QWidget>

class QCheckBox;
class QJsonObject;
class QComboBox;
class QFormLayout;
class QLabel;
class QLineEdit;
class QVBoxLayout;

namespace sagline {

class QuantityField;

// Who ran the test and on what, stored with the session.
struct SessionDetails {
    QString operatorName;
    QString unitSerial;
    QString ambientTemperature; // as typed, e.g. "23 °C"
    QString windingTemperature; // as typed; blank = same as ambient
};

// How results are judged: the limit, the decision rule, the temperature correction.
struct VerdictSettings {
    QString regulationLimit;                       // as typed; blank = the setup's specification,
                                                   // "nameplate" = the nameplate's regulation
    DecisionRule rule = DecisionRule::NonBinary;
    QString referenceTemperature;                  // as typed; blank = no correction
    std::optional<TemperatureConstant> constant;   // none = per winding material
};

struct AnalysisSettings;
// The form's text for stored settings (numbers in the fields' units: %, °C).
VerdictSettings verdictSettingsFrom(const AnalysisSettings &settings);

class SetupForm : public QWidget {
    Q_OBJECT
public:
    explicit SetupForm(QWidget *parent = nullptr);

    // The setup file JSON (DESIGN.md) built from the fields as typed; blank fields are left
    // out so core applies its documented defaults.
    QString setupJson() const;
    void loadSetup(const Setup &setup);
    // Every nameplate and bench field blank (core's documented defaults apply), the choices
    // at their first entry; emits changed().
    void clearSetup();
    SessionDetails sessionDetails() const;
    VerdictSettings verdictSettings() const;
    void setSessionDetails(const SessionDetails &details);
    // Shows stored verdict settings (an opened session's record) without emitting verdictChanged.
    void setVerdictSettings(const VerdictSettings &settings);

    // Shows each error under its field; errors naming no field of this form are listed at
    // the top. An empty list clears every message.
    void showErrors(const FieldErrors &errors);
    QStringList shownErrors() const; // "field: rule" for every error on display
    void setLocked(bool locked);     // read-only once readings exist
    // The session's details and the verdict settings too: a signed-off or read-only session
    // shows what its file says and takes no edits.
    void setRecordLocked(bool locked);
    // Operator, serial and temperatures are written into the session when it is created; once a
    // session is open they show the file's values and are read-only, so no result on screen uses
    // a value the file does not hold. Call after setRecordLocked.
    void setDetailsLocked(bool locked);
    QuantityField *quantityField(const QString &field) const;
    // The field's label as the form shows it ("Rated power" for "nameplate.rated_power_va");
    // "" for a field the form does not have.
    QString labelFor(const QString &field) const;
    // An error as a person reads it: the field's label, then the rule ("Rated power: must be
    // above zero"); a field the form does not know is named as core named it.
    QString spokenError(const FieldError &error) const;
    // The nameplate as typed (a preset): the setup file's "nameplate" object of strings.
    QJsonObject nameplateValues() const;
    // Puts a preset's nameplate into the form (the other sections stay); emits changed().
    void applyNameplate(const QJsonObject &nameplate);

signals:
    void changed();        // the nameplate or bench: the plan is recomputed
    void verdictChanged(); // only how results are judged

private:
    QuantityField *addQuantity(QFormLayout *form, const QString &label, const QString &field,
                               Unit unit, const QString &placeholder);
    // The meters' accuracy and the specification's limits (ui/SetupFormMeters.cpp).
    void addMetersAndSpecification(QVBoxLayout *layout);
    void loadMetersAndSpecification(const Setup &setup);
    QHash<QString, QuantityField *> m_fields;
    QHash<QString, QString> m_labels; // field key -> label on the form
    QComboBox *m_construction;
    QComboBox *m_material;
    QComboBox *m_fuseType;
    QComboBox *m_decisionRule;
    QComboBox *m_temperatureConstant;
    QCheckBox *m_allowOverload;
    QLineEdit *m_operator;
    QLineEdit *m_serial;
    QLineEdit *m_specificationSource;
    QLabel *m_otherErrors;
};

} // namespace sagline
