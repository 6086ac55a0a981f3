// A request body kept off the event loop's heap as it arrives, for a worker thread to read whole.
// Each chunk Node's HTTP parser hands over is a buffer of its own: it is moved (not copied) into a
// message queue, and the queue's receiving port goes to the worker with the job. V8 counts the
// buffers a heap holds against an allowance (64 MiB) past which it collects that heap in full: a
// 38 MiB trace joined into one buffer here counted twice (its chunks and the buffer), so every
// upload set off a full collection of the event loop's heap, and readings waited behind its steps.
import { MessageChannel, receiveMessageOnPort, type MessagePort } from 'node:worker_threads';
import type { ReceivedBytes } from '../../shared/contracts/contract';

/** What goes to the worker: the port to read from and how many bytes it must give. */
export interface BytesParcel {
  port: MessagePort;
  byteLength: number;
}

/** A body being received (server/http/body-bytes.ts); a route's handler gets it as ReceivedBytes. */
export class ReceivedBody implements ReceivedBytes {
  private readonly channel = new MessageChannel();
  private taken = false;
  byteLength = 0;

  /** Moves a chunk out of this thread's heap; one that shares its memory is copied first. */
  add(chunk: Uint8Array) {
    // Read before the move: a moved chunk is left empty.
    this.byteLength += chunk.byteLength;
    const owns = chunk.byteOffset === 0 && chunk.byteLength === chunk.buffer.byteLength && chunk.buffer instanceof ArrayBuffer;
    const own = owns ? chunk : new Uint8Array(chunk);
    try {
      this.channel.port1.postMessage(own, [own.buffer as ArrayBuffer]);
    } catch {
      // A buffer Node marked as not movable (from its shared pool): its copy moves instead.
      const copy = new Uint8Array(own);
      this.channel.port1.postMessage(copy, [copy.buffer]);
    }
  }

  /** The port for one worker's transfer list (the worker reads it with readParcel). */
  take(): BytesParcel {
    if (this.taken) throw new Error('These bytes have already gone to a worker.');
    this.taken = true;
    return { port: this.channel.port2, byteLength: this.byteLength };
  }

  /** Frees what nobody read: called once the answer has gone. */
  close() {
    this.channel.port1.close();
    if (!this.taken) this.channel.port2.close();
  }
}

/** The body a handler was given, as the server received it; anything else is a bug. */
export function receivedBody(body: ReceivedBytes): ReceivedBody {
  if (body instanceof ReceivedBody) return body;
  throw new Error('A text body must come through bodyBytes.');
}

/** In the worker: the parcel's bytes in one buffer, checked whole. */
export function readParcel(parcel: BytesParcel): Uint8Array<ArrayBuffer> {
  const out = new Uint8Array(parcel.byteLength);
  let at = 0;
  for (let m = receiveMessageOnPort(parcel.port); m; m = receiveMessageOnPort(parcel.port)) {
    const chunk = m.message as Uint8Array;
    if (at + chunk.byteLength > out.byteLength) throw new Error('A parcel gave more bytes than it announced.');
    out.set(chunk, at);
    at += chunk.byteLength;
  }
  parcel.port.close();
  if (at !== out.byteLength) throw new Error(`A parcel gave ${at} of its ${out.byteLength} bytes.`);
  return out;
}
