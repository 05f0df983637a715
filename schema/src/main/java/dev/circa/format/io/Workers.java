package dev.circa.format.io;

/** What the readers' helper threads share. Stateless. */
final class Workers {
    private Workers() {
    }

    /**
     * Interrupts {@code worker} and waits until it has ended, keeping the caller's own interrupt for
     * afterwards (a reader that stops must not leave a thread behind).
     */
    static void stop(Thread worker) {
        worker.interrupt();
        boolean interrupted = false;
        while (worker.isAlive()) {
            try {
                worker.join();
            } catch (InterruptedException e) {
                interrupted = true;
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
    }
}
