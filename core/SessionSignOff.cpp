#include "SessionSignOff.h"

#include "SessionSchema.h"
#include "SessionStore.h"

namespace sagline {

namespace {

bool isBlank(const std::string &text)
{
    return text.find_first_not_of(" \t\r\n") == std::string::npos;
}

} // namespace

std::string signOffRequestError(const SignOffRequest &request)
{
    if (isBlank(request.reviewer))
        return "reviewer: the reviewer's name is required";
    if (request.reviewer.size() > 200)
        return "reviewer: at most 200 characters";
    if (request.decision != ReviewDecision::Accepted && isBlank(request.comment))
        return std::string("comment: say why the session is ") + (request.decision == ReviewDecision::Rejected ? "rejected" : "to be repeated");
    if (request.comment.size() > 10000)
        return "comment: at most 10000 characters";
    return {};
}

StoreResult<std::int64_t> signOffSession(const std::string &path, const SignOffRequest &request)
{
    using Result = StoreResult<std::int64_t>;
    if (const std::string error = signOffRequestError(request); !error.empty())
        return Result::failure(StoreCode::InvalidArgument, error);
    {
        // Look first, read-only: the version decides whether signing would change more than one row.
        auto look = SessionStore::openForReview(path);
        if (!look.ok())
            return Result::failure(look.status());
        const int version = look.value->fileSchemaVersion();
        if (version < sessionSchemaVersion)
            return Result::failure(StoreCode::InvalidArgument,
                                   path + ": written by an older Sagline (schema version " + std::to_string(version)
                                       + "); signing would upgrade the file first. Open it in the app for writing "
                                         "to upgrade it, then sign it");
        if (version > sessionSchemaVersion)
            return Result::failure(StoreCode::NewerVersion, path + ": written by a newer Sagline (schema version "
                                                                + std::to_string(version) + "); sign it with that version");
    }
    auto store = SessionStore::openForWriting(path);
    if (!store.ok())
        return Result::failure(store.status());
    store.value->setActor({request.reviewer, ""});
    return store.value->addSignOff(request.reviewer, request.decision, request.comment);
}

} // namespace sagline
