// The supervisor's PIN a lab sheet may ask for before a student's session starts. The sheet
// keeps only a salted, slow hash of it: PBKDF2 with HMAC-SHA-256 (RFC 8018 §5.2, HMAC of
// RFC 2104), so the PIN cannot be read off the sheet. A short PIN can still be found by trying
// them all; it shows that a supervisor was there, it is not a password. The supervisor's name
// and the time are recorded with the session either way.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace sagline {

inline constexpr const char *supervisorPinScheme = "pbkdf2-hmac-sha256";
inline constexpr std::uint32_t supervisorPinIterations = 100000; // a slow check per guess (common practice)
inline constexpr std::size_t supervisorPinMinDigits = 4;
inline constexpr std::size_t supervisorPinMaxDigits = 12;

struct SupervisorPinLock {
    std::string scheme = supervisorPinScheme;
    std::uint32_t iterations = supervisorPinIterations;
    std::string saltHex;               // 16 random bytes, hexadecimal
    std::string hashHex;               // 32 bytes of PBKDF2 output, hexadecimal
};

// PBKDF2-HMAC-SHA-256 (RFC 8018 §5.2) of `password` and `salt`, `length` bytes.
std::vector<std::uint8_t> pbkdf2HmacSha256(std::string_view password, std::string_view salt, std::uint32_t iterations,
                                           std::size_t length);

// Why `pin` cannot be a supervisor's PIN ("" when it can): 4 to 12 digits.
std::string supervisorPinError(std::string_view pin);

// A new lock for `pin` with a fresh random salt. Precondition: supervisorPinError(pin) is "".
SupervisorPinLock makeSupervisorPinLock(std::string_view pin);
// The same with the salt given (for the tests).
SupervisorPinLock makeSupervisorPinLock(std::string_view pin, const std::vector<std::uint8_t> &salt,
                                        std::uint32_t iterations = supervisorPinIterations);

// Does `pin` open the lock? Compares every byte whatever the first difference.
bool supervisorPinMatches(const SupervisorPinLock &lock, std::string_view pin);

// Hexadecimal text of bytes, and back (nullopt for odd length or a non-hex character).
std::string toHex(const std::vector<std::uint8_t> &bytes);
std::optional<std::vector<std::uint8_t>> fromHex(std::string_view text);

} // namespace sagline
