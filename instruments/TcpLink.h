// SCPI over a raw TCP socket (LAN instruments, default port 5025; FACTS.md §8).
#pragma once

#include "ScpiLink.h"

#include <QTcpSocket>

namespace sagline {

class TcpLink final : public ScpiLink {
    Q_OBJECT
public:
    static constexpr quint16 defaultPort = 5025;

    TcpLink(const QString &host, quint16 port, QObject *parent = nullptr);
    QString description() const override;
    void setConnectTimeoutMs(int ms) { m_connectTimeoutMs = ms; }

protected:
    void openTransport() override;
    void closeTransport() override;
    bool writeTransport(const QByteArray &bytes, QString *error) override;

private:
    QString m_host;
    quint16 m_port;
    QTcpSocket *m_socket; // child of this
    QTimer m_connectTimer;
    int m_connectTimeoutMs = 3000;
};

} // namespace sagline
