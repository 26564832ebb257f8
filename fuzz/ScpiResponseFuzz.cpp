// libFuzzer target: every SCPI reply parser on arbitrary bytes. Checks the parsers' promises:
// no crash, a Value is always finite and never an overload code, errors always say why.
#include "ScpiCommand.h"
#include "ScpiResponse.h"

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <string_view>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const std::string_view text(reinterpret_cast<const char *>(data), size);

    const sagline::ScpiNumber number = sagline::parseScpiNumber(text);
    if (number.kind == sagline::ScpiNumberKind::Value && (!std::isfinite(number.value) || std::fabs(number.value) >= 9.89e37))
        std::abort();
    if (number.kind == sagline::ScpiNumberKind::Invalid && number.error.empty())
        std::abort();

    const sagline::ScpiIdentity identity = sagline::parseScpiIdentity(text);
    if (identity.ok && (identity.manufacturer.empty() || identity.model.empty()))
        std::abort();
    if (!identity.ok && identity.error.empty())
        std::abort();

    const sagline::ScpiError error = sagline::parseScpiError(text);
    if (!error.ok && error.error.empty())
        std::abort();

    if (sagline::printableReply(text, 64).size() > 64 * 4 + 3)
        std::abort();

    for (const sagline::ScpiCommandUnit &unit : sagline::splitScpiMessage(text))
        (void)sagline::scpiHeaderMatches("SYSTem:ERRor[:NEXT]?", unit.header);
    (void)sagline::scpiHeaderMatches(text, "MEAS:VOLT:AC?");
    return 0;
}
