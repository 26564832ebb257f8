#include "SupervisorPin.h"

#include "Sha256.h"

#include <array>
#include <random>

namespace sagline {

namespace {

using Digest = std::array<std::uint8_t, 32>;

// HMAC-SHA-256 (RFC 2104): H((K ^ opad) || H((K ^ ipad) || message)), 64-byte blocks.
class HmacSha256 {
public:
    explicit HmacSha256(std::string_view key)
    {
        std::array<std::uint8_t, 64> block{};
        if (key.size() > block.size()) {
            Sha256 hash;
            hash.update(key);
            const Digest digest = hash.digest();
            std::copy(digest.begin(), digest.end(), block.begin());
        } else {
            std::copy(key.begin(), key.end(), block.begin());
        }
        for (std::size_t i = 0; i < block.size(); ++i) {
            m_inner[i] = static_cast<std::uint8_t>(block[i] ^ 0x36);
            m_outer[i] = static_cast<std::uint8_t>(block[i] ^ 0x5c);
        }
    }

    Digest mac(const std::uint8_t *message, std::size_t count) const
    {
        Sha256 inner;
        inner.update(m_inner.data(), m_inner.size());
        inner.update(message, count);
        const Digest innerDigest = inner.digest();
        Sha256 outer;
        outer.update(m_outer.data(), m_outer.size());
        outer.update(innerDigest.data(), innerDigest.size());
        return outer.digest();
    }

private:
    std::array<std::uint8_t, 64> m_inner{};
    std::array<std::uint8_t, 64> m_outer{};
};

} // namespace

std::vector<std::uint8_t> pbkdf2HmacSha256(std::string_view password, std::string_view salt, std::uint32_t iterations,
                                           std::size_t length)
{
    const HmacSha256 prf(password);
    std::vector<std::uint8_t> out;
    out.reserve(length);
    for (std::uint32_t blockIndex = 1; out.size() < length; ++blockIndex) {
        // U1 = PRF(P, S || INT(i)); T = U1 ^ U2 ^ ... ^ Uc (RFC 8018 §5.2 step 3).
        std::vector<std::uint8_t> first(salt.begin(), salt.end());
        for (int shift = 24; shift >= 0; shift -= 8)
            first.push_back(static_cast<std::uint8_t>(blockIndex >> shift));
        Digest u = prf.mac(first.data(), first.size());
        Digest t = u;
        for (std::uint32_t c = 1; c < iterations; ++c) {
            u = prf.mac(u.data(), u.size());
            for (std::size_t k = 0; k < t.size(); ++k)
                t[k] ^= u[k];
        }
        for (std::size_t k = 0; k < t.size() && out.size() < length; ++k)
            out.push_back(t[k]);
    }
    return out;
}

std::string supervisorPinError(std::string_view pin)
{
    if (pin.size() < supervisorPinMinDigits || pin.size() > supervisorPinMaxDigits)
        return "must be " + std::to_string(supervisorPinMinDigits) + " to " + std::to_string(supervisorPinMaxDigits)
               + " digits, got " + std::to_string(pin.size()) + " characters";
    for (char c : pin)
        if (c < '0' || c > '9')
            return "must be digits only (0-9)";
    return {};
}

SupervisorPinLock makeSupervisorPinLock(std::string_view pin, const std::vector<std::uint8_t> &salt, std::uint32_t iterations)
{
    SupervisorPinLock lock;
    lock.iterations = iterations;
    lock.saltHex = toHex(salt);
    const std::string saltBytes(salt.begin(), salt.end());
    lock.hashHex = toHex(pbkdf2HmacSha256(pin, saltBytes, iterations, 32));
    return lock;
}

SupervisorPinLock makeSupervisorPinLock(std::string_view pin)
{
    std::random_device device; // the system's entropy source (/dev/urandom on Linux)
    std::vector<std::uint8_t> salt(16);
    for (auto &byte : salt)
        byte = static_cast<std::uint8_t>(device() & 0xffu);
    return makeSupervisorPinLock(pin, salt);
}

bool supervisorPinMatches(const SupervisorPinLock &lock, std::string_view pin)
{
    const auto salt = fromHex(lock.saltHex);
    const auto expected = fromHex(lock.hashHex);
    if (!salt || !expected || expected->empty() || lock.scheme != supervisorPinScheme || lock.iterations == 0)
        return false;
    const std::string saltBytes(salt->begin(), salt->end());
    const auto actual = pbkdf2HmacSha256(pin, saltBytes, lock.iterations, expected->size());
    std::uint8_t difference = 0;
    for (std::size_t i = 0; i < actual.size(); ++i)
        difference |= static_cast<std::uint8_t>(actual[i] ^ (*expected)[i]);
    return difference == 0;
}

std::string toHex(const std::vector<std::uint8_t> &bytes)
{
    static const char digits[] = "0123456789abcdef";
    std::string text;
    text.reserve(bytes.size() * 2);
    for (std::uint8_t byte : bytes) {
        text.push_back(digits[byte >> 4]);
        text.push_back(digits[byte & 0x0f]);
    }
    return text;
}

std::optional<std::vector<std::uint8_t>> fromHex(std::string_view text)
{
    if (text.size() % 2 != 0)
        return std::nullopt;
    const auto value = [](char c) -> int {
        if (c >= '0' && c <= '9')
            return c - '0';
        if (c >= 'a' && c <= 'f')
            return c - 'a' + 10;
        if (c >= 'A' && c <= 'F')
            return c - 'A' + 10;
        return -1;
    };
    std::vector<std::uint8_t> bytes;
    bytes.reserve(text.size() / 2);
    for (std::size_t i = 0; i < text.size(); i += 2) {
        const int high = value(text[i]);
        const int low = value(text[i + 1]);
        if (high < 0 || low < 0)
            return std::nullopt;
        bytes.push_back(static_cast<std::uint8_t>(high * 16 + low));
    }
    return bytes;
}

} // namespace sagline
