// Earmark's error types. Every failure names what failed (a file, a parameter)
// and why, so the command line and the window can show one clear line.
#pragma once

#include <stdexcept>
#include <string>

namespace earmark {

// Base of every error Earmark throws on purpose.
class Error : public std::runtime_error {
public:
    // `subject` is what failed: a file path, or "Algorithm.field" for a parameter.
    Error(std::string subject, const std::string& problem)
        : std::runtime_error(subject.empty() ? problem : subject + ": " + problem),
          subject_(std::move(subject)), problem_(problem) {}
    const std::string& subject() const noexcept { return subject_; }
    const std::string& problem() const noexcept { return problem_; }

private:
    std::string subject_;
    std::string problem_;
};

// Bad input data: a missing, unreadable, truncated or non-audio file, or
// samples that cannot be analysed (NaN/Inf). The command line exits 3.
class InputError : public Error {
public:
    using Error::Error;
};

// An invalid parameter, e.g. a negative hop. `subject` is "Params.field".
// The command line exits 2.
class ParamError : public Error {
public:
    using Error::Error;
};

// A file or folder could not be written: disk full, read-only file, folder
// or file system, a session locked by another program too long. `subject`
// is the file; the problem says whether anything was changed. The command
// line exits 4.
class WriteError : public Error {
public:
    using Error::Error;
};

// A change refused because what it was based on changed since it was read:
// another window or rater edited or deleted the same mark. `subject` is the
// session; the problem names who changed it and when, and that nothing was
// changed. The command line exits 1.
class ConflictError : public Error {
public:
    using Error::Error;
};

// Thrown when a progress callback asked to stop.
class Cancelled : public std::runtime_error {
public:
    Cancelled() : std::runtime_error("cancelled") {}
};

}  // namespace earmark
