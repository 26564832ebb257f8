#include "FieldError.h"

#include "OutputText.h"

namespace sagline {

std::string FieldError::message() const
{
    // A field or a quoted value from a file may be long (a 10 MB cell): the message stays short.
    return printableText(field, 300) + ": " + printableText(rule, 2000);
}

} // namespace sagline
