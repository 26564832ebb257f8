// The seal of a signed-off session (see SessionSeal.h): the digest, sign-off, reopen and check.
#include "SessionSeal.h"

#include "Sha256.h"
#include "SessionStore.h"
#include "SqliteStatement.h"

#include <sqlite3.h>

#include <array>
#include <cstring>
#include <map>
#include <vector>

namespace sagline {

namespace {

// Digest format 1: the tables and columns it covers, in this order. Never change it: a sealed
// file is checked with the list it was sealed with (a new format gets a new list and number).
struct DigestTable {
    const char *name;
    const char *columns;
};
constexpr std::array<DigestTable, 11> digestTables{{
    {"session", "id, created_utc, software_version, operator, unit_serial, setup_json, plan_json, created_by, created_account"},
    {"temperature", "id, time_utc, kind, value_c, source, person, os_account"},
    {"instrument", "id, time_utc, role, identity, accuracy, person, os_account"},
    {"reading", "id, time_utc, step, current_a, voltage_v, u_current_a, u_voltage_v, flags, raw_text, person, os_account"},
    {"exclusion", "id, reading_id, excluded, reason, author, time_utc, os_account"},
    {"note", "id, time_utc, author, text, person, os_account"},
    {"safety_stop", "id, time_utc, step, rule, message, measured, limit_value, person, os_account"},
    {"supersession", "id, reading_id, replacement_id, reason, person, os_account, time_utc"},
    {"sweep_event", "id, time_utc, kind, step, detail, person, os_account"},
    {"sign_off", "id, time_utc, reviewer, verdict, comment, os_account, digest, content_marks"},
    {"reopen", "id, time_utc, sign_off_id, reason, person, os_account"},
}};
constexpr const char *digestFormat = "sagline-seal-1";
// Tables added after format 1: covered when a sign-off's content marks name them (every
// sign-off made since they exist), so older seals still check against what they covered.
constexpr std::array<DigestTable, 1> laterDigestTables{{
    {"primary_reading", "id, voltage_v, u_voltage_v, current_a, u_current_a, power_w, u_power_w, power_factor, "
                        "u_power_factor, reactive_power_var, u_reactive_power_var"},
}};

// Typed and length-prefixed, so no two different contents encode alike ("ab","c" vs "a","bc").
void encodeText(Sha256 &hash, char tag, std::string_view text)
{
    const std::string head = std::string(1, tag) + std::to_string(text.size()) + ':';
    hash.update(head);
    hash.update(text);
}

void encodeColumn(Sha256 &hash, const SqliteStatement &row, int column)
{
    switch (row.columnType(column)) {
    case SQLITE_NULL: hash.update("N;"); break;
    case SQLITE_INTEGER: hash.update("I" + std::to_string(row.columnInt64(column)) + ";"); break;
    case SQLITE_FLOAT: {
        // The exact bits, not a decimal rendering.
        const double value = row.columnDouble(column);
        std::uint64_t bits = 0;
        std::memcpy(&bits, &value, sizeof bits);
        char text[20];
        std::snprintf(text, sizeof text, "R%016llx;", static_cast<unsigned long long>(bits));
        hash.update(text);
        break;
    }
    case SQLITE_BLOB: encodeText(hash, 'B', row.columnText(column)); break;
    default: encodeText(hash, 'T', row.columnText(column)); break;
    }
}

int columnCount(const char *columns)
{
    int count = 1;
    for (const char *c = columns; *c; ++c)
        count += *c == ',' ? 1 : 0;
    return count;
}

using Marks = std::map<std::string, std::int64_t>;

std::string marksText(const Marks &marks)
{
    std::string text;
    for (const DigestTable &table : digestTables) {
        const auto found = marks.find(table.name);
        text += std::string(text.empty() ? "" : ";") + table.name + "=" + std::to_string(found == marks.end() ? 0 : found->second);
    }
    for (const DigestTable &table : laterDigestTables) {
        if (const auto found = marks.find(table.name); found != marks.end())
            text += std::string(";") + table.name + "=" + std::to_string(found->second);
    }
    return text;
}

// "reading=12;note=3" -> marks; nullopt when malformed.
std::optional<Marks> parseMarks(const std::string &text)
{
    Marks marks;
    std::size_t start = 0;
    while (start < text.size()) {
        std::size_t end = text.find(';', start);
        if (end == std::string::npos)
            end = text.size();
        const std::string item = text.substr(start, end - start);
        const std::size_t equals = item.find('=');
        if (equals == std::string::npos || equals == 0 || equals + 1 >= item.size())
            return std::nullopt;
        std::int64_t value = 0;
        for (char c : item.substr(equals + 1)) {
            if (c < '0' || c > '9' || value > (INT64_MAX - 9) / 10)
                return std::nullopt;
            value = value * 10 + (c - '0');
        }
        marks[item.substr(0, equals)] = value;
        start = end + 1;
    }
    return marks;
}

StoreResult<Marks> readMarks(sqlite3 *db)
{
    Marks marks;
    std::vector<DigestTable> tables(digestTables.begin(), digestTables.end());
    tables.insert(tables.end(), laterDigestTables.begin(), laterDigestTables.end());
    for (const DigestTable &table : tables) {
        SqliteStatement query;
        int rc = query.prepare(db, std::string("SELECT coalesce(max(id), 0) FROM ") + table.name);
        if (rc == SQLITE_OK)
            rc = query.step();
        if (rc != SQLITE_ROW)
            return StoreResult<Marks>::failure(sqliteFailure(db, rc, std::string("cannot read the ") + table.name + " table"));
        marks[table.name] = query.columnInt64(0);
    }
    return marks;
}

StoreResult<std::string> digestOf(sqlite3 *db, const Marks &marks, const SignOffRecord &signOff, const std::string &marksField)
{
    Sha256 hash;
    hash.update(digestFormat);
    std::vector<DigestTable> tables(digestTables.begin(), digestTables.end());
    for (const DigestTable &table : laterDigestTables) {
        if (marks.count(table.name))
            tables.push_back(table);
    }
    for (const DigestTable &table : tables) {
        const auto mark = marks.find(table.name);
        const std::int64_t last = mark == marks.end() ? 0 : mark->second;
        encodeText(hash, 'S', table.name);
        SqliteStatement query;
        int rc = query.prepare(db, std::string("SELECT ") + table.columns + " FROM " + table.name + " WHERE id <= ? ORDER BY id");
        if (rc != SQLITE_OK)
            return StoreResult<std::string>::failure(sqliteFailure(db, rc, std::string("cannot read the ") + table.name + " table"));
        query.bind(1, last);
        const int columns = columnCount(table.columns);
        while ((rc = query.step()) == SQLITE_ROW) {
            hash.update("(");
            for (int column = 0; column < columns; ++column)
                encodeColumn(hash, query, column);
            hash.update(")");
        }
        if (rc != SQLITE_DONE)
            return StoreResult<std::string>::failure(sqliteFailure(db, rc, std::string("cannot read the ") + table.name + " table"));
    }
    encodeText(hash, 'S', "signed");
    for (const std::string *field : {&signOff.timeUtc, &signOff.reviewer, &signOff.comment, &signOff.osAccount, &marksField})
        encodeText(hash, 'T', *field);
    encodeText(hash, 'T', toString(signOff.decision));
    return hash.hexDigest();
}

} // namespace

StoreStatus SessionStore::loadSealState()
{
    // In force: the latest sign-off, unless a reopen names it.
    SqliteStatement query;
    int rc = query.prepare(m_db.get(), "SELECT (SELECT max(id) FROM sign_off), "
                                       "(SELECT count(*) FROM reopen WHERE sign_off_id = (SELECT max(id) FROM sign_off))");
    if (rc == SQLITE_OK)
        rc = query.step();
    if (rc != SQLITE_ROW)
        return sqliteFailure(m_db.get(), rc, "cannot read the sign-offs");
    m_sealed = !query.isNull(0) && query.columnInt64(1) == 0;
    return StoreStatus::success();
}

StoreResult<std::string> SessionStore::currentContentMarks() const
{
    auto marks = readMarks(m_db.get());
    if (!marks.ok())
        return StoreResult<std::string>::failure(marks.status());
    return marksText(marks.value);
}

StoreResult<std::string> SessionStore::recomputeSealDigest(const SignOffRecord &record) const
{
    const auto marks = parseMarks(record.contentMarks);
    if (!marks)
        return StoreResult<std::string>::failure(StoreCode::Corrupt, "sign-off " + std::to_string(record.id)
                                                                         + ": its content marks cannot be read");
    return digestOf(m_db.get(), *marks, record, record.contentMarks);
}

StoreResult<std::int64_t> SessionStore::addSignOff(const std::string &reviewer, ReviewDecision verdict, const std::string &comment)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireWritable(); !status.ok())
        return Result::failure(status);
    if (reviewer.find_first_not_of(" \t\r\n") == std::string::npos)
        return Result::failure(StoreCode::InvalidArgument, "sign-off: the reviewer's name is required");
    if (m_sealed)
        return Result::failure(StoreCode::Sealed, m_path + ": already signed off; reopen it (with a reason) to sign it again");
    SqliteTransaction transaction(m_db.get());
    if (transaction.beginCode() != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), transaction.beginCode(), "cannot record the sign-off"));
    const auto marks = readMarks(m_db.get());
    if (!marks.ok())
        return Result::failure(marks.status());
    SignOffRecord record;
    record.timeUtc = now();
    record.reviewer = reviewer;
    record.decision = verdict;
    record.comment = comment;
    record.osAccount = m_actor.osAccount;
    record.contentMarks = marksText(marks.value);
    const auto digest = digestOf(m_db.get(), marks.value, record, record.contentMarks);
    if (!digest.ok())
        return Result::failure(digest.status());
    SqliteStatement insert;
    int rc = insert.prepare(m_db.get(), "INSERT INTO sign_off (time_utc, reviewer, verdict, comment, os_account, digest, "
                                        "content_marks) VALUES (?, ?, ?, ?, ?, ?, ?)");
    if (rc == SQLITE_OK) {
        insert.bind(1, record.timeUtc).bind(2, reviewer).bind(3, std::string_view(toString(verdict))).bind(4, comment);
        insert.bind(5, record.osAccount).bind(6, digest.value).bind(7, record.contentMarks);
        rc = insert.step();
    }
    if (rc == SQLITE_DONE)
        rc = transaction.commit();
    if (rc != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the sign-off; nothing was recorded"));
    m_sealed = true;
    return {sqlite3_last_insert_rowid(m_db.get())};
}

StoreResult<std::int64_t> SessionStore::reopen(const std::string &reason)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireWritable(); !status.ok())
        return Result::failure(status);
    if (!m_sealed)
        return Result::failure(StoreCode::InvalidArgument, "reopen: " + m_path + " is not signed off, so it is open already");
    if (m_actor.person.find_first_not_of(" \t\r\n") == std::string::npos)
        return Result::failure(StoreCode::InvalidArgument, "reopen: the name of the person reopening it is required");
    if (reason.find_first_not_of(" \t\r\n") == std::string::npos)
        return Result::failure(StoreCode::InvalidArgument, "reopen: a reason is required (why the signed session must change)");
    SqliteStatement insert;
    int rc = insert.prepare(m_db.get(), "INSERT INTO reopen (time_utc, sign_off_id, reason, person, os_account) "
                                        "VALUES (?, (SELECT max(id) FROM sign_off), ?, ?, ?)");
    if (rc == SQLITE_OK) {
        insert.bind(1, now()).bind(2, reason).bind(3, m_actor.person).bind(4, m_actor.osAccount);
        rc = insert.step();
    }
    if (rc != SQLITE_DONE)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the reopen; nothing was recorded"));
    m_sealed = false;
    return {sqlite3_last_insert_rowid(m_db.get())};
}

const char *toString(SealState state)
{
    switch (state) {
    case SealState::NotSigned: return "not signed";
    case SealState::Signed: return "signed";
    case SealState::ChangedAfterSignOff: return "changed after sign-off";
    case SealState::Altered: return "altered";
    }
    return "not signed";
}

std::string SealReport::summary() const
{
    switch (state) {
    case SealState::NotSigned: return "not signed off";
    case SealState::Signed:
        return "signed off by " + signOff->reviewer + " on " + signOff->timeUtc + " (" + toString(signOff->decision) + ")"
               + (signOff->digest.empty() ? "; signed before sealing existed (no digest)" : "; digest intact");
    case SealState::ChangedAfterSignOff:
        return "changed after sign-off: the sign-off by " + signOff->reviewer + " on " + signOff->timeUtc + " ("
               + toString(signOff->decision) + ") is superseded; reopened by "
               + (reopen->actor.person.empty() ? std::string("(name not recorded)") : reopen->actor.person) + " on "
               + reopen->timeUtc + ": " + reopen->reason;
    case SealState::Altered: {
        std::string text = "ALTERED after sign-off:";
        for (const std::string &finding : findings)
            text += " " + finding + ";";
        text.pop_back();
        return text;
    }
    }
    return {};
}

StoreResult<SealReport> checkSeal(const SessionStore &store)
{
    using Result = StoreResult<SealReport>;
    const auto signOffs = store.signOffs();
    if (!signOffs.ok())
        return Result::failure(signOffs.status());
    SealReport report;
    if (signOffs.value.empty())
        return report;
    const auto reopens = store.reopens();
    if (!reopens.ok())
        return Result::failure(reopens.status());
    for (const SignOffRecord &signOff : signOffs.value) {
        if (signOff.digest.empty())
            continue; // signed before sealing existed
        const auto digest = store.recomputeSealDigest(signOff);
        if (!digest.ok()) {
            report.findings.push_back(digest.message);
            continue;
        }
        if (digest.value != signOff.digest)
            report.findings.push_back("the content signed off by " + signOff.reviewer + " on " + signOff.timeUtc
                                      + " no longer matches its SHA-256 digest");
    }
    const SignOffRecord &latest = signOffs.value.back();
    report.signOff = latest;
    for (const ReopenRecord &reopen : reopens.value) {
        if (reopen.signOffId == latest.id)
            report.reopen = reopen;
    }
    if (!report.reopen && !latest.digest.empty()) {
        // Nothing may be added under a sign-off in force: Sagline refuses it, so rows beyond
        // the marks came from elsewhere.
        const auto now = store.currentContentMarks();
        if (!now.ok())
            return Result::failure(now.status());
        const auto signedMarks = parseMarks(latest.contentMarks);
        const auto nowMarks = parseMarks(now.value);
        if (signedMarks && nowMarks) {
            for (const auto &[table, last] : *nowMarks) {
                const auto found = signedMarks->find(table);
                const std::int64_t signedLast = found == signedMarks->end() ? 0 : found->second;
                // The sign-off row itself comes after its own marks.
                const std::int64_t allowed = table == "sign_off" ? latest.id : signedLast;
                if (last > allowed)
                    report.findings.push_back("rows were added to '" + table + "' after the sign-off without a reopen");
            }
        }
    }
    if (!report.findings.empty())
        report.state = SealState::Altered;
    else
        report.state = report.reopen ? SealState::ChangedAfterSignOff : SealState::Signed;
    return report;
}

} // namespace sagline
