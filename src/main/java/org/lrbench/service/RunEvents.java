package org.lrbench.service;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Consumer;

/**
 * A run's events in order, each numbered: kept for late subscribers (a page opened mid-run sees the
 * whole run) and pushed to live ones. A subscriber that throws is dropped; the run goes on.
 */
public final class RunEvents {
    private final List<Map<String, Object>> events = new ArrayList<>();
    private final List<Consumer<Map<String, Object>>> subscribers = new ArrayList<>();
    private final Map<Consumer<Map<String, Object>>, Runnable> onEnd = new java.util.HashMap<>();
    private boolean ended;

    /** Adds an event: {@code type} plus fields; returns it with its sequence number. */
    public synchronized Map<String, Object> add(String type, Map<String, Object> fields) {
        Map<String, Object> e = new LinkedHashMap<>();
        e.put("seq", events.size() + 1);
        e.put("type", type);
        e.putAll(fields);
        events.add(e);
        for (Consumer<Map<String, Object>> s : List.copyOf(subscribers)) {
            try {
                s.accept(e);
            } catch (RuntimeException gone) {
                subscribers.remove(s);
            }
        }
        return e;
    }

    /** Replays every event so far to the subscriber, then keeps it informed. */
    public synchronized void subscribe(Consumer<Map<String, Object>> subscriber) {
        subscribe(subscriber, 0);
    }

    /**
     * Replays the events after number {@code afterSeq} (a reconnecting client's Last-Event-ID), then
     * keeps the subscriber informed: a client that reconnects sees no event twice.
     */
    public synchronized void subscribe(Consumer<Map<String, Object>> subscriber, long afterSeq) {
        subscribe(subscriber, afterSeq, () -> { });
    }

    /**
     * As above; {@code whenEnded} runs once the run's last event is out (at once when the run had ended
     * already, after the replay): a stream of a finished run ends.
     */
    public synchronized void subscribe(Consumer<Map<String, Object>> subscriber, long afterSeq, Runnable whenEnded) {
        for (Map<String, Object> e : events) {
            if (((Number) e.get("seq")).longValue() > afterSeq) {
                subscriber.accept(e);
            }
        }
        if (ended) {
            whenEnded.run();
            return;
        }
        subscribers.add(subscriber);
        onEnd.put(subscriber, whenEnded);
    }

    /** The run is over: no event follows; every subscriber's stream is ended. */
    public synchronized void end() {
        ended = true;
        for (Consumer<Map<String, Object>> s : List.copyOf(subscribers)) {
            Runnable r = onEnd.remove(s);
            if (r != null) {
                try {
                    r.run();
                } catch (RuntimeException ignored) {
                    // a subscriber already gone
                }
            }
        }
        subscribers.clear();
    }

    public synchronized boolean ended() {
        return ended;
    }

    public synchronized void unsubscribe(Consumer<Map<String, Object>> subscriber) {
        subscribers.remove(subscriber);
        onEnd.remove(subscriber);
    }

    public synchronized int size() {
        return events.size();
    }

    public synchronized List<Map<String, Object>> all() {
        return List.copyOf(events);
    }
}
