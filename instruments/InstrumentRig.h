// The instruments of one bench: which instrument serves which meter role, and the optional
// programmable load. Connects them all, and reports a link lost while any of them is down
// and restored once all are back.
#pragma once

#include "MeterRole.h"
#include "PointSink.h"
#include "ProgrammableLoad.h"
#include "ScpiInstrument.h"

#include <QList>
#include <QObject>

#include <memory>

namespace sagline {

class InstrumentRig : public QObject {
    Q_OBJECT
public:
    explicit InstrumentRig(QObject *parent = nullptr);
    ~InstrumentRig() override;

    void addInstrument(ScpiInstrument *instrument); // takes ownership; its roles say what it serves
    void setLoadInstrument(ScpiInstrument *instrument, const ScpiLoadCommands &commands = {}); // takes ownership
    QList<ScpiInstrument *> instruments() const { return m_instruments; }
    ScpiInstrument *instrumentFor(MeterRole role) const;
    const RoleConfig *roleConfig(MeterRole role) const;
    // The secondary meters' accuracy rules as the setup's `meters` section (empty when a
    // secondary role is unserved); `windingUncertaintyC` is carried over from the setup.
    std::optional<MeterSpecs> meterSpecs(std::optional<double> windingUncertaintyC = std::nullopt) const;
    ProgrammableLoad *load() const { return m_load.get(); }

    // Empty when usable; otherwise names the problem (a secondary role unserved, a role served twice).
    QString validate() const;
    void connectAll();    // emits ready() once every instrument is, or connectFailed()
    void disconnectAll();
    bool isReady() const;
    QList<InstrumentIdentityRecord> records() const; // for the session

signals:
    void ready();
    void connectFailed(const QString &message);
    void instrumentError(const QString &message);
    void lost(const QString &message);     // the first instrument to drop
    void restored(const QString &message); // every instrument is back

private:
    void watch(ScpiInstrument *instrument);
    void checkAllReady(bool restoring, const QString &message);
    QList<ScpiInstrument *> allInstruments() const;

    QList<ScpiInstrument *> m_instruments;
    ScpiInstrument *m_loadInstrument = nullptr;
    std::unique_ptr<ProgrammableLoad> m_load;
    bool m_connecting = false;
    bool m_lostReported = false;
};

} // namespace sagline
