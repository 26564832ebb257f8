#include "SessionScan.h"

#include <algorithm>
#include <filesystem>
#include <set>
#include <system_error>

namespace sagline {

namespace fs = std::filesystem;

namespace {

bool hasSessionExtension(const fs::path &path)
{
    std::string extension = path.extension().string();
    std::transform(extension.begin(), extension.end(), extension.begin(),
                   [](unsigned char c) { return static_cast<char>(c >= 'A' && c <= 'Z' ? c + 32 : c); });
    return extension == sessionFileExtension;
}

class Walker {
public:
    Walker(SessionFileList &out, const std::function<bool(std::size_t)> &keepGoing) : m_out(out), m_keepGoing(keepGoing) {}

    void add(const fs::path &path)
    {
        std::error_code error;
        const fs::path canonical = fs::weakly_canonical(path, error);
        const std::string key = error ? path.string() : canonical.string();
        if (m_seen.insert(key).second)
            m_out.files.push_back(path.string());
    }

    // Walks one folder tree, listing *.sagline files. Each folder is read on its own, so an
    // unreadable subfolder is a problem on the list and the rest is still walked. Symbolic links
    // to folders are not followed (no loops).
    void walk(const fs::path &root)
    {
        std::vector<fs::path> pending{root};
        std::vector<fs::path> found;
        while (!pending.empty() && !m_out.cancelled) {
            const fs::path folder = pending.back();
            pending.pop_back();
            std::error_code error;
            fs::directory_iterator it(folder, error);
            if (error) {
                m_out.problems.push_back({folder.string(), "cannot be read: " + error.message()});
                continue;
            }
            for (const fs::directory_iterator end; it != end; it.increment(error)) {
                if (m_keepGoing && !m_keepGoing(m_out.files.size() + found.size())) {
                    m_out.cancelled = true;
                    break;
                }
                const fs::directory_entry &entry = *it;
                std::error_code typeError;
                if (entry.is_symlink(typeError) && entry.is_directory(typeError))
                    continue;
                if (entry.is_directory(typeError))
                    pending.push_back(entry.path());
                else if (entry.is_regular_file(typeError) && hasSessionExtension(entry.path()))
                    found.push_back(entry.path());
            }
            if (error)
                m_out.problems.push_back({folder.string(), "could not be read to the end: " + error.message()});
        }
        std::sort(found.begin(), found.end());
        for (const auto &path : found)
            add(path);
    }

private:
    SessionFileList &m_out;
    const std::function<bool(std::size_t)> &m_keepGoing;
    std::set<std::string> m_seen;
};

} // namespace

SessionFileList findSessionFiles(const std::vector<std::string> &inputs,
                                 const std::function<bool(std::size_t found)> &keepGoing)
{
    SessionFileList out;
    Walker walker(out, keepGoing);
    for (const std::string &input : inputs) {
        if (out.cancelled)
            break;
        std::error_code error;
        const fs::file_status status = fs::status(input, error);
        if (error || !fs::exists(status)) {
            out.problems.push_back({input, "does not exist"});
        } else if (fs::is_directory(status)) {
            walker.walk(input);
        } else if (fs::is_regular_file(status)) {
            walker.add(input); // named explicitly: opened whatever its extension, the open says if it is a session
        } else {
            out.problems.push_back({input, "is not a file or a folder"});
        }
    }
    return out;
}

} // namespace sagline
