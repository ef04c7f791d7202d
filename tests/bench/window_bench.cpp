// Window speed on an hour-long take (issue: "the workbench window"), measured
// headless with Qt's offscreen platform. Not a Google Benchmark: it times one
// realistic sequence and prints the figures the issue asks for.
//   1. launch → waveform: build the lane stack, load a 60-minute 48 kHz mono
//      WAV and draw the overview and waveform once;
//   2. UI event-loop latency while the analysis runs in the background (a 5 ms
//      timer's lateness: max and 99th percentile);
//   3. repaint of the whole lane stack at 1600×900 at three zoom levels (whole
//      hour, one minute, 100 ms), each frame scrolled so every lane redraws:
//      median of 25 renders each;
//   4. peak memory (max RSS) against the float32 size of the audio.
// Usage: earmark_window_bench [--minutes M] [--keep FILE.wav]
#include "earmark/io/audio_file.hpp"
#include "earmark/widgets/energy_lane.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/overview_lane.hpp"
#include "earmark/widgets/pitch_lane.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/take_loader.hpp"
#include "earmark/widgets/time_ruler_lane.hpp"
#include "earmark/widgets/view_state.hpp"
#include "earmark/widgets/waveform_lane.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <QApplication>
#include <QElapsedTimer>
#include <QImage>
#include <QTimer>

#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <string>
#include <vector>

using namespace earmark;
using namespace earmark::widgets;

namespace {

double percentile(std::vector<double> v, double p) {
    if (v.empty()) return 0.0;
    std::sort(v.begin(), v.end());
    return v[static_cast<std::size_t>(p / 100.0 * static_cast<double>(v.size() - 1))];
}

double maxRssMiB() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
}

}  // namespace

int main(int argc, char** argv) {
    qputenv("QT_QPA_PLATFORM", "offscreen");
    double minutes = 60.0;
    std::string keep;
    for (int i = 1; i + 1 < argc; ++i) {
        if (std::strcmp(argv[i], "--minutes") == 0) minutes = std::atof(argv[++i]);
        else if (std::strcmp(argv[i], "--keep") == 0) keep = argv[++i];
    }
    test::TempDir dir;
    const std::string wav = keep.empty() ? dir.file("hour.wav") : keep;
    if (keep.empty() || !std::filesystem::exists(wav)) {
        // Synthesised in a child process, so its buffers do not count in the
        // peak memory measured below.
        std::fprintf(stderr, "writing %.0f minutes of 48 kHz speech-like audio…\n", minutes);
        const pid_t child = fork();
        if (child == 0) {
            writeWav(wav, test::speechLike(minutes * 60.0, 48000.0), WavEncoding::Pcm16);
            _exit(0);
        }
        int status = 0;
        waitpid(child, &status, 0);
        if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) return 1;
    }
    const double rssBefore = maxRssMiB();  // includes the synthesis buffer, now freed
    QApplication app(argc, argv);

    QElapsedTimer clock;
    clock.start();
    ViewState view;
    LaneStack stack(&view);
    stack.addLane(new OverviewLane(&view), LaneStack::Placement::Fixed);
    stack.addLane(new TimeRulerLane(&view), LaneStack::Placement::Fixed);
    stack.addLane(new WaveformLane(&view), LaneStack::Placement::Resizable, 2);
    stack.addLane(new SpectrogramLane(&view), LaneStack::Placement::Resizable, 4);
    stack.addLane(new PitchLane(&view), LaneStack::Placement::Resizable, 2);
    stack.addLane(new EnergyLane(&view), LaneStack::Placement::Resizable, 1);
    stack.resize(1600, 900);
    stack.show();

    TakeLoader loader;
    double waveformMs = -1, analysisMs = -1;
    QImage frame(stack.size(), QImage::Format_ARGB32_Premultiplied);
    QObject::connect(&loader, &TakeLoader::audioReady, &stack, [&](quint64, TakeAudioPtr audio) {
        view.resetForDuration(audio->duration());  // as the window does
        stack.setTake(std::move(audio));
        stack.render(&frame);  // the first full draw of overview + waveform
        waveformMs = static_cast<double>(clock.nsecsElapsed()) / 1e6;
    });
    std::vector<double> lateness;
    QElapsedTimer tick;
    QTimer probe;
    probe.setTimerType(Qt::PreciseTimer);
    probe.setInterval(5);
    QObject::connect(&probe, &QTimer::timeout, [&] {
        lateness.push_back(std::max(0.0, static_cast<double>(tick.nsecsElapsed()) / 1e6 - 5.0));
        tick.restart();
    });
    QObject::connect(&loader, &TakeLoader::tracksReady, &stack, [&](quint64, TakeTracksPtr tracks) {
        stack.setTracks(std::move(tracks));
        analysisMs = static_cast<double>(clock.nsecsElapsed()) / 1e6;
        probe.stop();
        app.quit();
    });
    QObject::connect(&loader, &TakeLoader::failed, [&](quint64, const QString& message) {
        std::fprintf(stderr, "failed: %s\n", qPrintable(message));
        app.exit(1);
    });
    loader.open(QString::fromStdString(wav), AnalysisSettings{});
    tick.start();
    probe.start();
    if (app.exec() != 0) return 1;

    const double total = view.duration();
    struct Zoom { const char* name; double span; };
    std::printf("take: %.1f min at 48 kHz mono; float32 size %.0f MiB\n", total / 60.0,
                total * 48000.0 * 4 / (1024.0 * 1024.0));
    std::printf("launch -> overview + waveform drawn: %.0f ms (bar: < 1500 ms)\n", waveformMs);
    std::printf("analysis finished in the background after: %.0f ms\n", analysisMs);
    std::printf("event-loop lateness during analysis: max %.1f ms, p99 %.1f ms over %zu ticks (bar: < 50 ms)\n",
                lateness.empty() ? 0.0 : *std::max_element(lateness.begin(), lateness.end()),
                percentile(lateness, 99), lateness.size());
    for (Zoom z : {Zoom{"whole take", total}, Zoom{"one minute", 60.0}, Zoom{"100 ms", 0.1}}) {
        std::vector<double> ms;
        for (int i = 0; i < 25; ++i) {
            // Each frame scrolls by 2 % of the span (as when dragging or
            // playing with a following view), so every lane draws anew.
            // The whole take cannot scroll: it alternates with 98 % of itself.
            const double span = z.span >= total && i % 2 ? 0.98 * total : z.span;
            const double shift = (i % 2 ? 0.02 : -0.02) * span;
            const double start = std::clamp(total / 2 - span / 2 + shift, 0.0, total - span);
            view.setVisibleRange({start, start + span});
            QElapsedTimer t;
            t.start();
            stack.render(&frame);
            ms.push_back(static_cast<double>(t.nsecsElapsed()) / 1e6);
        }
        std::printf("repaint of the lane stack at 1600x900, %-10s: median %.1f ms (bar: < 16 ms)\n", z.name,
                    percentile(ms, 50));
    }
    std::printf("peak memory: %.0f MiB (before loading: %.0f MiB)\n", maxRssMiB(), rssBefore);
    return 0;
}
