"use client";

import { useEffect, useRef, useState } from "react";
import { useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { ComeBackOffer } from "./come-back-offer";
import { currentScreen, go, goFrom } from "./hash-route";
import { lookUpTag } from "./tag-lookup";

const READER_ID = "tag-reader";

/** Reads a bike's QR tag with the tablet camera (html5-qrcode) and opens its job. */
export function ScanScreen() {
  const { db } = useBench();
  const [message, setMessage] = useState<string>("Starting the camera…");
  const [failed, setFailed] = useState(false);
  const [comeBackFrom, setComeBackFrom] = useState<{ workOrderId: string; number: number } | null>(null);
  const done = useRef(false);

  useEffect(() => {
    let scanner: import("html5-qrcode/esm/html5-qrcode").Html5Qrcode | null = null;
    let cancelled = false;
    (async () => {
      // the camera-and-decoder class alone, not the package's index with its own scanner UI and images
      const [{ Html5Qrcode }, { Html5QrcodeSupportedFormats }] = await Promise.all([
        import("html5-qrcode/esm/html5-qrcode"),
        import("html5-qrcode/esm/core"),
      ]);
      if (cancelled) return;
      // a bike's tag is a QR code, and the decoder is built for QR codes only (app/bench/_scanner/)
      scanner = new Html5Qrcode(READER_ID, { verbose: false, formatsToSupport: [Html5QrcodeSupportedFormats.QR_CODE] });
      try {
        await scanner.start(
          { facingMode: "environment" },
          { fps: 10 },
          async (text) => {
            if (done.current) return;
            done.current = true;
            // the screen the tag was read on: stopping the camera takes a moment, and the mechanic may move on meanwhile
            const from = currentScreen();
            setMessage(`Read tag ${text}`);
            await scanner?.stop().catch(() => undefined);
            const r = await lookUpTag(db, text);
            if (r.ok) goFrom(from, { screen: "job", jobId: r.jobId });
            else {
              setFailed(true);
              setMessage(r.message);
              setComeBackFrom(r.comeBackFrom ?? null);
            }
          },
          () => undefined,
        );
        if (!cancelled) setMessage("Hold the tag in front of the camera.");
      } catch (e) {
        setFailed(true);
        setMessage(`The camera could not start (${e instanceof Error ? e.message : String(e)}). Type the tag code instead.`);
      }
    })();
    return () => {
      cancelled = true;
      if (scanner?.isScanning) void scanner.stop().catch(() => undefined);
    };
  }, [db]);

  return (
    <div className="flex flex-col gap-4 p-4">
      <h1 className="text-3xl font-bold">Scan a tag</h1>
      <div id={READER_ID} className="mx-auto w-full max-w-xl overflow-hidden rounded-xl border-4 border-steel-900 bg-black" />
      <p role="status" data-testid="scan-message" className={`text-xl font-bold ${failed ? "text-fail" : ""}`}>
        {message}
      </p>
      {comeBackFrom && <ComeBackOffer from={comeBackFrom} />}
      <BigButton tone="plain" onClick={() => go({ screen: "home" })}>
        Type the tag code instead
      </BigButton>
    </div>
  );
}
