// Pronunciations of a script's words in an acoustic model's phone set.
//
// Words are looked up in a pronouncing dictionary (one entry per line:
// "word PH PH PH", alternatives as "word(2) …", e.g. the 130k-word US-English
// dictionary shipped with Debian's pocketsphinx-en-us). A word the
// dictionary lacks — an invented place name, a number, an abbreviation — is
// never a failure: its phones are guessed from the phonemes espeak-ng reads
// for it (IPA, mapped onto the model's phones by a table of our own), and the
// word is marked as guessed.
//
// Thread-safety: a loaded dictionary is immutable; `sharedDictionary` loads
// each file once per process under a mutex.
#pragma once

#include "earmark/acoustic/acoustic_model.hpp"

#include <filesystem>
#include <memory>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

namespace earmark {

using PhoneSequence = std::vector<int>;  // base phone ids of an AcousticModel

class PronouncingDictionary {
public:
    // Throws InputError naming the file if it cannot be read or holds no
    // entry; lines with phones the model lacks are skipped.
    static PronouncingDictionary load(const std::filesystem::path& path, const AcousticModel& model);
    // Word lookup, case-insensitive (ASCII); nullptr when absent.
    const std::vector<PhoneSequence>* find(std::string_view word) const;
    std::size_t size() const { return entries_.size(); }

private:
    std::unordered_map<std::string, std::vector<PhoneSequence>> entries_;
};

// The dictionary at `path`, loaded once per process and shared.
std::shared_ptr<const PronouncingDictionary> sharedDictionary(const std::filesystem::path& path,
                                                              const AcousticModel& model);

// Model phones for IPA text (as textToIpa gives). Symbols with no
// counterpart (stress, length, tie bars) are dropped.
PhoneSequence ipaToModelPhones(std::string_view ipa, const AcousticModel& model);

struct ScriptWord {
    std::string label;                           // the token as written, without outer punctuation
    std::vector<PhoneSequence> pronunciations;   // at least one, none empty
    bool guessed = false;                        // not in the dictionary: phones from espeak-ng
};

// The words of `text` (tokens between white space; tokens of punctuation
// only are dropped) with their pronunciations. `voice` is the espeak-ng
// voice used for guesses. Throws InputError("text", …) for text with no
// word; a word for which no phone can be found at all is dropped and listed
// in `unpronounceable`.
std::vector<ScriptWord> scriptWords(const std::string& text, const PronouncingDictionary& dictionary,
                                    const AcousticModel& model, const std::string& voice,
                                    std::vector<std::string>* unpronounceable = nullptr);

}  // namespace earmark
