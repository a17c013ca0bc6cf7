import { createServer, request, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';

/**
 * Stands between the devices and the API, like a flaky phone connection. It forwards every request
 * to the API it points at; for a push the API answered, it may wait for the whole answer (so the
 * server has committed) and then cut the connection instead of passing the answer on. When the API
 * cannot be reached it answers 502, as a balancer would.
 */
export class DroppingProxy {
  pushesAnswered = 0;
  pushesDropped = 0;
  pushesInFlight = 0;
  private server: Server | undefined;

  constructor(
    public targetPort: number,
    private readonly dropRate: number,
    private readonly random: () => number,
  ) {}

  async listen(): Promise<string> {
    this.server = createServer((req, res) => {
      const isPush = req.method === 'POST' && (req.url ?? '').startsWith('/api/sync/push');
      let open = isPush;
      if (open) this.pushesInFlight += 1;
      const settle = () => {
        if (open) this.pushesInFlight -= 1;
        open = false;
      };
      const upstream = request(
        { host: '127.0.0.1', port: this.targetPort, method: req.method, path: req.url, headers: req.headers },
        (answer) => {
          const chunks: Buffer[] = [];
          answer.on('data', (chunk: Buffer) => chunks.push(chunk));
          answer.on('error', () => {
            settle();
            res.socket?.destroy();
          });
          answer.on('end', () => {
            settle();
            if (isPush && answer.statusCode === 200) {
              this.pushesAnswered += 1;
              if (this.random() < this.dropRate) {
                this.pushesDropped += 1;
                res.socket?.destroy();
                return;
              }
            }
            res.writeHead(answer.statusCode ?? 502, answer.headers);
            res.end(Buffer.concat(chunks));
          });
        },
      );
      upstream.on('error', () => {
        settle();
        if (res.headersSent) return void res.socket?.destroy();
        res.writeHead(502, { 'content-type': 'application/json' });
        res.end(JSON.stringify({ error: { code: 'unreachable', message: 'The API could not be reached.' } }));
      });
      req.pipe(upstream);
    });
    await new Promise<void>((resolve) => this.server!.listen(0, '127.0.0.1', resolve));
    return `http://127.0.0.1:${(this.server.address() as AddressInfo).port}`;
  }

  close(): Promise<void> {
    return new Promise((resolve) => {
      if (!this.server) return resolve();
      this.server.closeAllConnections();
      this.server.close(() => resolve());
    });
  }
}
