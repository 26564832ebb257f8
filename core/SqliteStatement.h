// RAII over sqlite3_stmt with checked binding: the first failed bind is kept and returned by
// step(), so a caller checks one code per execution and no bind error goes unnoticed.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

struct sqlite3;
struct sqlite3_stmt;

namespace sagline {

class SqliteStatement {
public:
    SqliteStatement() = default;
    ~SqliteStatement();
    SqliteStatement(SqliteStatement &&other) noexcept;
    SqliteStatement &operator=(SqliteStatement &&other) noexcept;
    SqliteStatement(const SqliteStatement &) = delete;
    SqliteStatement &operator=(const SqliteStatement &) = delete;

    // Compiles one statement; returns SQLITE_OK or the error (then the statement is invalid).
    int prepare(sqlite3 *db, std::string_view sql);
    bool isValid() const { return m_stmt != nullptr; }

    // Parameters are 1-based. A non-finite double binds NULL (SQLite cannot store NaN).
    SqliteStatement &bind(int index, double value);
    SqliteStatement &bind(int index, std::int64_t value);
    SqliteStatement &bind(int index, int value) { return bind(index, static_cast<std::int64_t>(value)); }
    SqliteStatement &bind(int index, std::string_view text);
    // As bind(text) but without a copy (bulk inserts): `text` must stay valid and unchanged
    // until the statement is reset or bound again.
    SqliteStatement &bindUncopied(int index, std::string_view text);
    SqliteStatement &bind(int index, const std::optional<double> &value);
    SqliteStatement &bindNull(int index);

    // SQLITE_ROW, SQLITE_DONE, or an error code (including the first failed bind).
    int step();
    // Makes the statement ready to run again with fresh bindings.
    void reset();
    // Ready to run again with the same bindings: a bulk insert rebinds only what changes.
    void resetKeepingBindings();

    // Columns are 0-based; valid after step() returned SQLITE_ROW.
    bool isNull(int column) const;
    int columnType(int column) const; // SQLITE_INTEGER, SQLITE_FLOAT, SQLITE_TEXT, SQLITE_BLOB or SQLITE_NULL
    double columnDouble(int column) const;
    std::int64_t columnInt64(int column) const;
    std::string columnText(int column) const;               // "" for NULL
    std::string_view columnTextView(int column) const;      // as columnText, valid until the next step()
    std::optional<double> columnOptionalDouble(int column) const; // nullopt for NULL

private:
    void finalize() noexcept;
    void noteBind(int rc);

    sqlite3_stmt *m_stmt = nullptr;
    int m_bindError = 0; // first failed sqlite3_bind_* code since the last reset, 0 if none
};

} // namespace sagline
