#include "earmark/align/speech_render.hpp"

#include "earmark/core/error.hpp"
#include "utf8.hpp"

#include <espeak-ng/speak_lib.h>

#include <cstring>
#include <mutex>

namespace earmark {
namespace {

// libespeak-ng is one global machine: one mutex guards every use of it.
std::mutex& espeakMutex() {
    static std::mutex m;
    return m;
}

struct Collector {
    std::vector<float> samples;
    std::vector<espeak_EVENT> events;
};
Collector* gCollector = nullptr;  // the render in progress; only touched under espeakMutex()

int collect(short* wav, int count, espeak_EVENT* events) {
    if (!gCollector) return 1;
    if (wav)
        for (int i = 0; i < count; ++i) gCollector->samples.push_back(static_cast<float>(wav[i]) / 32768.0f);
    for (; events && events->type != espeakEVENT_LIST_TERMINATED; ++events) {
        if (events->type == espeakEVENT_WORD || events->type == espeakEVENT_PHONEME)
            gCollector->events.push_back(*events);
    }
    return 0;
}

// Starts the library once; returns its output rate. Caller holds the mutex.
int startEspeak() {
    static int rate = 0;
    if (rate > 0) return rate;
    const int options = espeakINITIALIZE_PHONEME_EVENTS | espeakINITIALIZE_PHONEME_IPA | espeakINITIALIZE_DONT_EXIT;
    rate = espeak_Initialize(AUDIO_OUTPUT_SYNCHRONOUS, 0, nullptr, options);
    if (rate <= 0) {
        rate = 0;
        throw Error("espeak-ng", "cannot start (are its data files installed? Debian package espeak-ng-data)");
    }
    return rate;
}

}  // namespace

void SpeechParams::validate() const {
    if (voice.empty()) throw ParamError("SpeechParams.voice", "is empty");
    if (rateWpm < espeakRATE_MINIMUM || rateWpm > espeakRATE_MAXIMUM)
        throw ParamError("SpeechParams.rateWpm", "must be 80…450 words per minute");
    if (pitch < 0 || pitch > 99) throw ParamError("SpeechParams.pitch", "must be 0…99");
    if (pitchRange < 0 || pitchRange > 99) throw ParamError("SpeechParams.pitchRange", "must be 0…99");
}

RenderedSpeech renderSpeech(const std::string& text, const SpeechParams& params) {
    params.validate();
    std::size_t badByte = 0;
    const auto codePoints = align_detail::decodeUtf8(text, badByte);
    if (!codePoints) throw InputError("text", "is not valid UTF-8 (byte " + std::to_string(badByte + 1) + ")");
    // espeak-ng reports 1-based character positions; map them to bytes.
    const auto byteOfChar = [&](int position) -> std::size_t {
        if (position <= 0) return 0;
        const std::size_t k = static_cast<std::size_t>(position - 1);
        return k < codePoints->size() ? (*codePoints)[k].byteBegin : text.size();
    };

    std::lock_guard lock(espeakMutex());
    const int rate = startEspeak();
    if (espeak_SetVoiceByName(params.voice.c_str()) != EE_OK)
        throw ParamError("SpeechParams.voice", "espeak-ng has no voice '" + params.voice + "'");
    // Parameters persist between calls: set every one that shapes the output.
    espeak_SetParameter(espeakRATE, params.rateWpm, 0);
    espeak_SetParameter(espeakPITCH, params.pitch, 0);
    espeak_SetParameter(espeakRANGE, params.pitchRange, 0);
    espeak_SetParameter(espeakVOLUME, 100, 0);
    espeak_SetParameter(espeakWORDGAP, 0, 0);
    espeak_SetParameter(espeakPUNCTUATION, espeakPUNCT_NONE, 0);
    espeak_SetParameter(espeakCAPITALS, 0, 0);

    RenderedSpeech out;
    if (const espeak_VOICE* v = espeak_GetCurrentVoice()) {
        if (v->name) out.voiceName = v->name;
        if (v->languages && v->languages[0]) out.language = v->languages + 1;  // after the priority byte
    }
    Collector collector;
    gCollector = &collector;
    espeak_SetSynthCallback(collect);
    const espeak_ERROR synth =
        espeak_Synth(text.c_str(), text.size() + 1, 0, POS_CHARACTER, 0, espeakCHARS_UTF8, nullptr, nullptr);
    const espeak_ERROR sync = espeak_Synchronize();
    gCollector = nullptr;
    if (synth != EE_OK || sync != EE_OK) throw Error("espeak-ng", "synthesis failed");

    out.audio.sampleRate = rate;
    out.audio.samples = std::move(collector.samples);
    for (const espeak_EVENT& e : collector.events) {
        SpeechEvent ev;
        ev.timeS = e.audio_position / 1000.0;
        ev.textBegin = byteOfChar(e.text_position);
        if (e.type == espeakEVENT_WORD) {
            if (e.length <= 0) continue;
            ev.kind = SpeechEvent::Kind::Word;
            ev.textEnd = byteOfChar(e.text_position + e.length);
        } else {
            ev.kind = SpeechEvent::Kind::Phoneme;
            ev.textEnd = ev.textBegin;
            ev.phoneme.assign(e.id.string, strnlen(e.id.string, sizeof e.id.string));
        }
        out.events.push_back(std::move(ev));
    }
    return out;
}

std::string textToIpa(const std::string& text, const std::string& voice) {
    if (voice.empty()) throw ParamError("SpeechParams.voice", "is empty");
    std::size_t badByte = 0;
    if (!align_detail::decodeUtf8(text, badByte))
        throw InputError("text", "is not valid UTF-8 (byte " + std::to_string(badByte + 1) + ")");
    std::lock_guard lock(espeakMutex());
    startEspeak();
    if (espeak_SetVoiceByName(voice.c_str()) != EE_OK)
        throw ParamError("SpeechParams.voice", "espeak-ng has no voice '" + voice + "'");
    std::string out;
    const void* cursor = text.c_str();
    // One call per clause; the cursor becomes null at the end of the text.
    while (cursor != nullptr) {
        const char* phonemes = espeak_TextToPhonemes(&cursor, espeakCHARS_UTF8, espeakPHONEMES_IPA);
        if (phonemes == nullptr) break;
        if (!out.empty() && *phonemes) out += ' ';
        out += phonemes;
    }
    return out;
}

}  // namespace earmark
