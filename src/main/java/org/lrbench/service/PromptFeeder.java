package org.lrbench.service;

import org.lrbench.bench.SimulatedPart;
import java.util.LinkedHashMap;
import java.util.Map;
import org.lrbench.results.Names;
import org.lrbench.lot.PartFeeder;
import org.lrbench.sim.SimLot;

/**
 * Operator prompts through the service. Each prompt is announced as a {@code prompt} event with
 * its own id, and exactly one answer is taken for it: an answer must name the prompt it answers
 * and is refused (409, nothing measured) when that prompt is not the open one, so scans made
 * while a part is being measured are not queued. A serial already measured in the inspection (a
 * double scan) is refused unless the answer is {@code again} with a reason. On the simulated bench
 * the scanned serial picks that part from the simulated tray, as if the operator had placed it.
 */
final class PromptFeeder implements PartFeeder {
    /** An operator's answer to prompt {@code prompt}: a serial, skip, stop, or again (a serial and a reason). */
    record Answer(long prompt, String serial, String action, String reason) {
    }

    private final RunEvents events;
    private final SimLot tray;
    private long lastId;
    private Prompt open;
    private long openId;
    private Answer answer;
    private boolean stopped;

    PromptFeeder(RunEvents events, SimLot tray) {
        this.events = events;
        this.tray = tray;
    }

    /** Takes the answer to the open prompt, or refuses it with the reason (nothing is measured then). */
    synchronized void answer(Answer a) {
        if (stopped) {
            throw new ServiceException(409, "the run is stopping; nothing more is measured");
        }
        if (open == null) {
            throw new ServiceException(409, "prompt " + a.prompt() + " is not open: no prompt is open now (a part is"
                    + " being measured); answer the next prompt when it is shown");
        }
        if (a.prompt() != openId) {
            throw new ServiceException(409, "prompt " + a.prompt() + " is not open; the open prompt is " + openId
                    + " (place part " + open.index() + " of " + open.of() + "); nothing was measured");
        }
        if (a.action() == null || a.action().equals("again")) {
            String problem = Names.problem("serial", a.serial());
            if (problem != null) {
                throw new ServiceException(400, problem);
            }
            if (open.measured().contains(a.serial()) && a.action() == null) {
                throw new ServiceException(409, a.serial() + " is already measured in this lot; to measure it again"
                        + " answer with action again and a reason (the earlier measurement is kept)");
            }
            if (tray != null && tray.parts().stream().noneMatch(p -> p.serial().equals(a.serial()))) {
                throw new ServiceException(409, a.serial() + " is not on the simulated tray");
            }
        }
        if (Names.reasonProblem("reason", a.reason()) != null) {
            throw new ServiceException(400, Names.reasonProblem("reason", a.reason()));
        }
        if ("skip".equals(a.action()) && a.serial() != null && !Names.valid(a.serial())) {
            throw new ServiceException(400, Names.problem("serial", a.serial()));
        }
        open = null;
        answer = a;
        notifyAll();
    }

    /** The open prompt's id, or null while no prompt is open (a part is being measured, say). */
    synchronized Long openPrompt() {
        return open == null ? null : openId;
    }

    synchronized void stop() {
        stopped = true;
        notifyAll();
    }

    @Override
    public synchronized Next next(Prompt prompt) {
        if (stopped) {
            return Next.stop();
        }
        open = prompt;
        openId = ++lastId;
        Map<String, Object> e = new LinkedHashMap<>();
        e.put("prompt", openId);
        e.put("position", prompt.index());
        e.put("of", prompt.of());
        e.put("skipped", prompt.skipped());
        e.put("text", prompt.words() + ", enter or scan its serial");
        events.add("prompt", e);
        try {
            while (answer == null && !stopped) {
                wait(1000);
            }
        } catch (InterruptedException x) {
            Thread.currentThread().interrupt();
            stopped = true;
        }
        open = null;
        Answer a = answer;
        answer = null;
        if (stopped || a == null || "stop".equals(a.action())) {
            return Next.stop();
        }
        if ("skip".equals(a.action())) {
            return Next.skip(a.serial() == null ? "skipped-" + prompt.index() : a.serial());
        }
        SimulatedPart model = tray == null ? null : SimulatedPart.of(tray.parts().stream()
                .filter(p -> p.serial().equals(a.serial())).findFirst().orElseThrow().model());
        return new Next(Action.MEASURE, a.serial(), model, "again".equals(a.action()) ? a.reason() : null);
    }

    @Override
    public void refused(String message) {
        events.add("notice", Map.of("text", message));
    }
}
