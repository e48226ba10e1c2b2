package org.lrbench.service;

import java.util.Map;
import java.util.Set;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import org.lrbench.run.PartFeeder;
import org.lrbench.sim.SimLot;

/**
 * Operator prompts through the service: each position is announced as a {@code prompt} event and
 * waits for an answer (a scanned serial, skip or stop) posted to the API. On the simulated bench the
 * scanned serial picks that part from the simulated tray, as if the operator had placed it.
 */
final class PromptFeeder implements PartFeeder {
    /** An operator's answer: a serial, or the words skip and stop. */
    record Answer(String serial, String action) {
    }

    private final BlockingQueue<Answer> answers = new LinkedBlockingQueue<>();
    private final RunEvents events;
    private final SimLot tray;
    private final Set<String> done;
    private volatile boolean stopped;

    PromptFeeder(RunEvents events, SimLot tray, Set<String> done) {
        this.events = events;
        this.tray = tray;
        this.done = done;
    }

    void answer(Answer a) {
        answers.add(a);
    }

    void stop() {
        stopped = true;
        answers.add(new Answer(null, "stop"));
    }

    @Override
    public Next next(int index, int of) {
        events.add("prompt", Map.of("position", index, "of", of,
                "text", "place part " + index + " of " + of + ", enter or scan its serial"));
        while (!stopped) {
            Answer a;
            try {
                a = answers.poll(1, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return Next.stop();
            }
            if (a == null) {
                continue;
            }
            if ("stop".equals(a.action())) {
                return Next.stop();
            }
            if ("skip".equals(a.action())) {
                return new Next(Action.SKIP, a.serial() == null ? "skipped-" + index : a.serial(), null);
            }
            if (done.contains(a.serial())) {
                events.add("notice", Map.of("text", a.serial() + " is already measured in this lot"));
                continue;
            }
            if (tray == null) {
                return new Next(Action.MEASURE, a.serial(), null);
            }
            var part = tray.parts().stream().filter(p -> p.serial().equals(a.serial())).findFirst();
            if (part.isEmpty()) {
                events.add("notice", Map.of("text", a.serial() + " is not on the simulated tray"));
                continue;
            }
            return new Next(Action.MEASURE, a.serial(), part.get().model());
        }
        return Next.stop();
    }
}
