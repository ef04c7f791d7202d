#include "earmark/acoustic/pronunciations.hpp"

#include "earmark/align/reference_tiers.hpp"
#include "earmark/align/speech_render.hpp"
#include "earmark/core/error.hpp"

#include <algorithm>
#include <fstream>
#include <map>
#include <mutex>
#include <sstream>

namespace earmark {
namespace {

std::string lowerAscii(std::string_view s) {
    std::string out(s);
    for (char& c : out)
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
    return out;
}

// IPA (as espeak-ng writes English) to ARPAbet-style model phones; longest
// symbols first. A table of our own from the IPA chart.
struct IpaRule {
    std::string_view ipa;
    std::string_view phones;  // space-separated model phones, empty = drop
};
constexpr IpaRule kIpaRules[] = {
    {"aɪə", "AY AH"}, {"aʊə", "AW AH"}, {"eɪ", "EY"},  {"aɪ", "AY"},   {"aʊ", "AW"},   {"ɔɪ", "OY"},  {"oʊ", "OW"},
    {"əʊ", "OW"},     {"tʃ", "CH"},     {"dʒ", "JH"},  {"ɜː", "ER"},   {"ɪə", "IH R"}, {"eə", "EH R"}, {"ʊə", "UH R"},
    {"oː", "AO"},     {"iː", "IY"},     {"uː", "UW"},     {"ɑː", "AA"},  {"ɔː", "AO"},   {"ɚ", "ER"},    {"ɝ", "ER"},   {"ɜ", "ER"},
    {"ɑ", "AA"},      {"ɒ", "AA"},      {"æ", "AE"},   {"ʌ", "AH"},    {"ə", "AH"},    {"ɐ", "AH"},   {"ɪ", "IH"},
    {"ᵻ", "IH"},      {"ɨ", "IH"},      {"i", "IY"},   {"ɛ", "EH"},    {"e", "EH"},    {"ʊ", "UH"},   {"u", "UW"},
    {"ɔ", "AO"},      {"o", "OW"},      {"a", "AA"},   {"θ", "TH"},    {"ð", "DH"},    {"ʃ", "SH"},   {"ʒ", "ZH"},
    {"ŋ", "NG"},      {"ɹ", "R"},       {"r", "R"},    {"ɾ", "T"},     {"ʔ", "T"},     {"ɫ", "L"},    {"l", "L"},
    {"j", "Y"},       {"w", "W"},       {"h", "HH"},   {"ç", "HH"},    {"x", "K"},     {"ɡ", "G"},    {"g", "G"},
    {"b", "B"},       {"p", "P"},       {"d", "D"},    {"t", "T"},     {"k", "K"},     {"f", "F"},    {"v", "V"},
    {"s", "S"},       {"z", "Z"},       {"m", "M"},    {"n", "N"},     {"ɬ", "L"},     {"y", "UW"},   {"ø", "ER"},
    {"œ", "ER"},      {"ʏ", "UH"},      {"ɣ", "G"},    {"β", "B"},     {"ʁ", "R"},     {"ʀ", "R"},
};

}  // namespace

PronouncingDictionary PronouncingDictionary::load(const std::filesystem::path& path, const AcousticModel& model) {
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path.string(), "cannot be read (pronouncing dictionary)");
    std::map<std::string, int> phoneIds;
    for (int p = 0; p < model.basePhoneCount(); ++p) phoneIds[model.basePhoneName(p)] = p;
    PronouncingDictionary dict;
    std::string line;
    while (std::getline(in, line)) {
        std::istringstream fields(line);
        std::string word;
        if (!(fields >> word)) continue;
        if (const auto paren = word.find('('); paren != std::string::npos && paren > 0 && word.back() == ')')
            word.erase(paren);
        PhoneSequence phones;
        std::string ph;
        bool ok = true;
        while (fields >> ph) {
            if (ph[0] == '#') break;  // a comment
            auto it = phoneIds.find(ph);
            if (it == phoneIds.end()) {
                ok = false;
                break;
            }
            phones.push_back(it->second);
        }
        if (!ok || phones.empty()) continue;
        dict.entries_[lowerAscii(word)].push_back(std::move(phones));
    }
    if (dict.entries_.empty()) throw InputError(path.string(), "holds no pronunciation in the model's phones");
    return dict;
}

const std::vector<PhoneSequence>* PronouncingDictionary::find(std::string_view word) const {
    auto it = entries_.find(lowerAscii(word));
    return it == entries_.end() ? nullptr : &it->second;
}

std::shared_ptr<const PronouncingDictionary> sharedDictionary(const std::filesystem::path& path,
                                                              const AcousticModel& model) {
    static std::mutex mutex;
    static std::map<std::string, std::shared_ptr<const PronouncingDictionary>> cache;
    std::lock_guard lock(mutex);
    const std::string key = path.string() + "\n" + model.folder().string();
    auto& slot = cache[key];
    if (!slot) slot = std::make_shared<const PronouncingDictionary>(PronouncingDictionary::load(path, model));
    return slot;
}

PhoneSequence ipaToModelPhones(std::string_view ipa, const AcousticModel& model) {
    PhoneSequence out;
    std::size_t i = 0;
    while (i < ipa.size()) {
        bool matched = false;
        for (const IpaRule& rule : kIpaRules) {
            if (ipa.substr(i, rule.ipa.size()) != rule.ipa) continue;
            std::istringstream names{std::string(rule.phones)};
            std::string name;
            while (names >> name)
                if (auto id = model.basePhone(name)) out.push_back(*id);
            i += rule.ipa.size();
            matched = true;
            break;
        }
        if (matched) continue;
        // Skip one UTF-8 character we have no phone for (stress, length, ties, spaces).
        ++i;
        while (i < ipa.size() && (static_cast<unsigned char>(ipa[i]) & 0xC0) == 0x80) ++i;
    }
    return out;
}

std::vector<ScriptWord> scriptWords(const std::string& text, const PronouncingDictionary& dictionary,
                                    const AcousticModel& model, const std::string& voice,
                                    std::vector<std::string>* unpronounceable) {
    std::vector<ScriptWord> words;
    std::istringstream tokens(text);
    std::string token;
    while (tokens >> token) {
        const std::string label = tokenLabel(token);
        if (label.empty()) continue;
        // A token of punctuation only keeps itself as its label: drop it.
        if (std::none_of(label.begin(), label.end(), [](char c) {
                return (static_cast<unsigned char>(c) & 0x80) || std::isalnum(static_cast<unsigned char>(c));
            }))
            continue;
        ScriptWord w;
        w.label = label;
        if (const auto* prons = dictionary.find(label)) {
            w.pronunciations = *prons;
        } else {
            // Hyphenated compounds: every part known.
            PhoneSequence joined;
            bool allKnown = label.find('-') != std::string::npos;
            std::istringstream parts(label);
            std::string part;
            while (allKnown && std::getline(parts, part, '-')) {
                if (part.empty()) continue;
                const auto* p = dictionary.find(part);
                if (!p) allKnown = false;
                else joined.insert(joined.end(), p->front().begin(), p->front().end());
            }
            if (allKnown && !joined.empty()) {
                w.pronunciations.push_back(joined);
            } else {
                PhoneSequence guess = ipaToModelPhones(textToIpa(label, voice), model);
                if (!guess.empty()) w.pronunciations.push_back(std::move(guess));
                w.guessed = true;
            }
        }
        if (w.pronunciations.empty()) {
            if (unpronounceable) unpronounceable->push_back(label);
            continue;
        }
        words.push_back(std::move(w));
    }
    if (words.empty()) throw InputError("text", "holds no word that can be pronounced");
    return words;
}

}  // namespace earmark
