// earmark_long_read_demo DIR: writes DIR/long-read.wav and DIR/long-read.txt,
// a built read of ≈ 5.5 minutes (long_read.hpp) with three planted faults —
// speech 4 dB louder from the 21st join on, a click at the 45th join, and
// sentences 53–60 in another espeak-ng voice — for the docs' long-take
// screenshot (docs/longform.md). Prints the planted times.
#include "earmark/io/audio_file.hpp"
#include "support/long_read.hpp"

#include <cstdio>
#include <exception>
#include <fstream>
#include <string>

int main(int argc, char** argv) {
    if (argc != 2) {
        std::fprintf(stderr, "usage: earmark_long_read_demo DIR\n");
        return 2;
    }
    try {
        using namespace earmark;
        const std::string dir = argv[1];
        const test::LongRead clean = test::makeLongRead();
        const double step = clean.joins[20], click = clean.joins[44];
        test::LongReadPlan plan;
        plan.gainDb = [step](double t) { return t >= step ? 4.0 : 0.0; };
        plan.clicksS = {click};
        plan.speech = [](int i) {
            SpeechParams p = test::livelySpeech();
            if (i >= 52 && i < 60) p.voice = "en+f3";
            return p;
        };
        const test::LongRead read = test::makeLongRead(plan);
        writeWav(dir + "/long-read.wav", read.audio, WavEncoding::Pcm16);
        std::ofstream(dir + "/long-read.txt") << read.text;
        std::printf("%.1f s; level step +4 dB at %.2f s, click at %.2f s, other voice %.2f–%.2f s\n",
                    read.audio.durationSeconds(), step, click, read.sentenceStartS[52], read.sentenceEndS[59]);
        return 0;
    } catch (const std::exception& e) {
        std::fprintf(stderr, "earmark_long_read_demo: %s\n", e.what());
        return 1;
    }
}
