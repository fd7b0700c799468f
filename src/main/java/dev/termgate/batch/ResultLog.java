package dev.termgate.batch;

import com.google.gson.JsonElement;
import com.google.gson.JsonObject;
import com.google.gson.JsonParser;

import java.io.Closeable;
import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.channels.OverlappingFileLockException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicReference;

/**
 * The batch output file, one JSON object per line, written so that a process killed at any moment (SIGKILL)
 * loses no finished result and leaves at most one unfinished last line: each result is appended as one whole
 * line with one write before the worker moves on, and the kernel keeps what was written when the process dies.
 * Forcing to disk (against power loss or a crash of the system) runs on its own thread at most every
 * {@link #SYNC_MILLIS} ms and on close, not once per result: a force per result took up to 60 ms under the lock
 * and held up every other worker. A power loss can therefore lose the results of the last fraction of a second,
 * which the next run asks again. On opening, an unfinished last line (no line break) is cut off; every finished
 * line is kept as it is, even one this version cannot read. An exclusive lock keeps two runs from writing the
 * same file.
 */
public final class ResultLog implements Closeable {

    /** Why the file cannot be used; the message is for the user. */
    public static final class Unusable extends Exception {
        public Unusable(String message) {
            super(message, null, false, false);
        }
    }

    /** How long a written result may wait to be forced to disk (common practice for group commit). */
    static final long SYNC_MILLIS = 200;

    private final Path file;
    private final FileChannel channel;
    private final FileLock lock;
    private final Set<String> finished;
    private final List<String> notices;
    private final AtomicBoolean unforced = new AtomicBoolean();
    private final AtomicReference<IOException> forceFailure = new AtomicReference<>();
    private final ScheduledExecutorService syncer;

    private ResultLog(Path file, FileChannel channel, FileLock lock, Set<String> finished, List<String> notices) {
        this.file = file;
        this.channel = channel;
        this.lock = lock;
        this.finished = finished;
        this.notices = notices;
        this.syncer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "termgate-results-sync");
            t.setDaemon(true);
            return t;
        });
        syncer.scheduleWithFixedDelay(this::forceIfWritten, SYNC_MILLIS, SYNC_MILLIS, TimeUnit.MILLISECONDS);
    }

    private void forceIfWritten() {
        if (!unforced.getAndSet(false)) return;
        try {
            channel.force(false);
        } catch (IOException e) {
            forceFailure.compareAndSet(null, e);
        }
    }

    public static ResultLog open(Path file) throws Unusable {
        Path abs = file.toAbsolutePath();
        Path parent = abs.getParent();
        if (parent == null || !Files.isDirectory(parent)) {
            throw new Unusable("cannot write " + file + ": the directory " + parent + " does not exist");
        }
        if (Files.isDirectory(abs)) throw new Unusable("cannot write " + file + ": it is a directory");
        if (Files.exists(abs) && (!Files.isReadable(abs) || !Files.isWritable(abs))) {
            throw new Unusable("cannot write " + file + ": permission denied (it must be readable and writable, to resume)");
        }
        FileChannel ch;
        try {
            ch = FileChannel.open(abs, StandardOpenOption.CREATE, StandardOpenOption.READ, StandardOpenOption.WRITE);
        } catch (IOException | SecurityException e) {
            throw new Unusable("cannot write " + file + ": " + reason(e));
        }
        FileLock lock;
        try {
            lock = ch.tryLock();
        } catch (IOException | OverlappingFileLockException e) {
            lock = null;
        }
        if (lock == null) {
            closeQuietly(ch);
            throw new Unusable("another batch run is writing " + file + "; wait for it to end or choose another --out");
        }
        try {
            List<String> notices = new ArrayList<>();
            Set<String> done = recover(abs, ch, notices);
            ch.position(ch.size());
            return new ResultLog(file, ch, lock, Collections.synchronizedSet(done), notices);
        } catch (IOException e) {
            closeQuietly(ch);
            throw new Unusable("cannot read " + file + ": " + reason(e));
        }
    }

    /** Reads the ids already recorded and cuts off an unfinished last line. */
    private static Set<String> recover(Path file, FileChannel ch, List<String> notices) throws IOException {
        Set<String> done = new LinkedHashSet<>();
        long size = ch.size();
        if (size == 0) return done;
        byte[] all = Files.readAllBytes(file);
        int end = all.length;
        int lastNl = end - 1;
        while (lastNl >= 0 && all[lastNl] != '\n') lastNl--;
        if (lastNl < end - 1) {
            ch.truncate(lastNl + 1);
            ch.force(true);
            notices.add(file.getFileName() + ": removed an unfinished last line (" + (end - 1 - lastNl)
                    + " bytes) left by an interrupted run");
            end = lastNl + 1;
        }
        String text = new String(all, 0, end, StandardCharsets.UTF_8);
        int n = 0;
        int unreadable = 0;
        for (String line : text.split("\n")) {
            n++;
            if (line.isBlank()) continue;
            try {
                JsonElement e = JsonParser.parseString(line);
                if (e.isJsonObject() && e.getAsJsonObject().has("id")) {
                    done.add(e.getAsJsonObject().get("id").getAsString());
                    continue;
                }
            } catch (RuntimeException ignored) {
                // counted below; the line is kept as it is
            }
            unreadable++;
        }
        if (unreadable > 0) {
            notices.add(file.getFileName() + ": " + unreadable + " line(s) are not results of this tool; they are kept and ignored");
        }
        return done;
    }

    public boolean finished(String id) {
        return finished.contains(id);
    }

    public int finishedCount() {
        return finished.size();
    }

    public List<String> notices() {
        return List.copyOf(notices);
    }

    public Path file() {
        return file;
    }

    /** Appends one result as one whole line; it is forced to disk within {@link #SYNC_MILLIS} ms. */
    public void append(JsonObject result) throws IOException {
        String id = result.get("id").getAsString();
        ByteBuffer buf = ByteBuffer.wrap((dev.termgate.translate.AnswerJson.line(result) + "\n").getBytes(StandardCharsets.UTF_8));
        IOException failed = forceFailure.get();
        if (failed != null) throw failed;
        synchronized (this) {
            while (buf.hasRemaining()) channel.write(buf);
        }
        unforced.set(true);
        finished.add(id);
    }

    @Override
    public synchronized void close() throws IOException {
        // Not shutdownNow: interrupting a thread inside force() would close the channel.
        syncer.shutdown();
        try {
            awaitSyncer();
            forceIfWritten();
            if (forceFailure.get() != null) throw forceFailure.get();
        } finally {
            try {
                if (lock.isValid()) lock.release();
            } finally {
                channel.close();
            }
        }
    }

    private void awaitSyncer() {
        try {
            syncer.awaitTermination(5, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    private static void closeQuietly(FileChannel ch) {
        try {
            ch.close();
        } catch (IOException ignored) {
            // already failing; the first error is the one to report
        }
    }

    private static String reason(Exception e) {
        if (e instanceof java.nio.file.AccessDeniedException) return "permission denied";
        if (e instanceof java.nio.file.NoSuchFileException) return "no such file or directory";
        return String.valueOf(e.getMessage());
    }
}
