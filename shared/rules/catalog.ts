/**
 * Every rule Parley reports, by id (docs/rules.md fixes the ids and severities; the
 * ones marked "added" are ours). Each entry carries what the UI's rule page shows: a title, an
 * explanation (what it means, why it matters for a charger or a sink, what to do) and `ref`, the
 * source of the rule.
 *
 * `basis` says how far `ref` was checked: `from memory` = the section and table were recalled, not
 * looked up in the specification text while writing this; `common practice` = a rule of thumb.
 */
import type { Finding, Severity } from '../core/finding.ts';

export type RuleBasis = 'specification' | 'from memory' | 'common practice';
export type RuleGroup = 'decode' | 'caps' | 'request' | 'timing' | 'protocol' | 'epr' | 'vbus' | 'trace';

export interface RuleEntry {
  severity: Severity;
  title: string;
  explanation: string;
  ref: string;
  basis: RuleBasis;
}

const R31 = 'USB PD R3.1 V1.8';
const R32 = 'USB PD R3.2 V1.1';

export const ruleCatalog = {
  // ---- decode ----------------------------------------------------------------------------------
  'decode.length': {
    severity: 'error',
    title: 'Message length does not match its header',
    explanation:
      'The header says how many 32-bit data objects follow (or, for an extended message, how many bytes its data block holds), and the bytes given do not add up to that. A receiver that trusts the header would read past the end or ignore real data, so the message is not usable. Check that the capture is complete and that bytes were not dropped or doubled when the log was copied.',
    ref: `${R32} §6.2.1.1.2 Number of Data Objects; §6.2.1.2 Extended Message Header (Data Size)`,
    basis: 'from memory',
  },
  'decode.reserved-type': {
    severity: 'warning',
    title: 'Reserved message type',
    explanation:
      'The Message Type field holds a code the specification reserves. A port that follows the specification answers such a message with Not_Supported (or ignores it on older revisions). It usually points at a corrupted capture, a newer revision than the decoder knows, or a vendor experiment; look at the bytes around it before drawing conclusions.',
    ref: `${R32} §6.2.1.1.1 Message Type; Tables 6-5, 6-6 and 6-48 (message type codes)`,
    basis: 'from memory',
  },
  'decode.reserved-bits': {
    severity: 'warning',
    title: 'Reserved bits are set',
    explanation:
      "Bits the specification marks Reserved must be sent as zero and ignored on receipt. Set bits do not break a negotiation by themselves, but a later revision may give them a meaning, so a device that sets them today can misbehave with tomorrow's partner. Report it to the firmware owner of the sending side.",
    ref: `${R32} §1.4.2 Keywords (Reserved); §6.2.1 Message Construction`,
    basis: 'from memory',
  },
  'decode.crc': {
    severity: 'error',
    title: 'Wrong CRC',
    explanation:
      'The CRC-32 sent after the message does not match the bytes. A receiver discards such a message and sends no GoodCRC, so the sender retries. In a capture this usually means noise on the CC line, a bad probe connection or a damaged log; a CRC that is wrong every time points at the sender.',
    ref: `${R32} §5.6.2 CRC; Appendix A CRC calculation`,
    basis: 'from memory',
  },
  // Added by the codec (shared/pd/findings.ts keeps the same severity and ref; the catalog test checks it).
  'decode.rdo-unknown-type': {
    severity: 'warning',
    title: 'Request read without its offers',
    explanation:
      'A Request Data Object does not say what kind of supply it asks for: its fields are read by the type of the offer its Object Position names (fixed and variable, battery, PPS or AVS each lay the bits out differently). Without the Source_Capabilities in force, or when they have no object at that position, Parley shows the request as a fixed-supply request, so the currents or the voltage shown may be wrong. Decode the Request together with the offers it answers, or capture the trace from before the Source_Capabilities.',
    ref: `${R32} §6.4.2 (the RDO is read by the type of the PDO it references)`,
    basis: 'from memory',
  },
  'decode.object-position': {
    severity: 'warning',
    title: 'Request names a reserved object position',
    explanation:
      'The Object Position of a Request counts the offers from 1: 1 to 7 in a Request, 8 to 13 only in an EPR_Request. Zero, and any value past those, is reserved, so the request names no offer and a source must Reject it. Check how the sink firmware fills the field, especially after a change between SPR and EPR mode.',
    ref: `${R32} §6.4.2, Request Data Object tables (Object Position: 1–7, 8–13 only in EPR_Request)`,
    basis: 'from memory',
  },

  // ---- caps (Source_Capabilities) ----------------------------------------------------------------
  'caps.empty': {
    severity: 'error',
    title: 'No power data objects',
    explanation:
      'A Source_Capabilities message must carry at least the vSafe5V fixed supply. With no objects a sink has nothing to request and stays at USB Type-C current. Check that the message was captured whole.',
    ref: `${R31} §6.4.1 Capabilities Message`,
    basis: 'from memory',
  },
  'caps.first-not-vsafe5v': {
    severity: 'error',
    title: 'First offer is not the 5 V fixed supply',
    explanation:
      'Object position 1 of every Source_Capabilities message must be the vSafe5V fixed supply. Sinks rely on it: many request position 1 first, and the fixed-supply flags (dual-role power, unconstrained power, USB communications) are read only from that object. A charger without it fails certification and may not charge some devices at all. Put a 5 V fixed PDO first.',
    ref: `${R31} §6.4.1 Capabilities Message; §6.4.1.2.2 vSafe5V Fixed Supply PDO`,
    basis: 'from memory',
  },
  'caps.order': {
    severity: 'error',
    title: 'Offers out of the required order',
    explanation:
      "The specification fixes the order of the objects: vSafe5V first, the other fixed supplies by rising voltage, then battery and variable supplies by rising minimum voltage, then the augmented objects (SPR AVS, then PPS by rising maximum voltage). Sinks often pick an offer by position and assume the order, so an unordered list can make a sink request the wrong voltage. Sort the PDOs in the source's firmware.",
    ref: `${R31} §6.4.1 Capabilities Message (ordering of PDOs); ${R32} §6.4.1`,
    basis: 'from memory',
  },
  'caps.duplicate': {
    severity: 'error',
    title: 'Two fixed supplies with one voltage',
    explanation:
      'Each fixed voltage may be offered once. Two fixed PDOs with the same voltage leave a sink unsure which current applies and waste one of the seven SPR object positions. Keep the one with the higher current.',
    ref: `${R31} §6.4.1 Capabilities Message`,
    basis: 'from memory',
  },
  'caps.too-many-objects': {
    severity: 'error',
    title: 'More than seven SPR objects',
    explanation:
      "A Source_Capabilities message holds at most seven data objects (the header's Number of Data Objects field counts to 7), and EPR_Source_Capabilities gives the SPR offers positions 1 to 7. More than seven SPR offers cannot be sent; drop the least useful ones.",
    ref: `${R31} §6.2.1.1.2 Number of Data Objects; §6.5.15.1 EPR_Source_Capabilities`,
    basis: 'from memory',
  },
  'caps.epr-position': {
    severity: 'error',
    title: 'EPR offer outside positions 8 and up',
    explanation:
      'EPR offers (fixed supplies above 20 V and EPR AVS) belong only in EPR_Source_Capabilities, starting at object position 8; positions 1 to 7 hold the SPR offers (padded with empty objects when there are fewer). An EPR offer in an SPR Source_Capabilities message, or in positions 1 to 7, can make a sink that is not in EPR mode request 28 V or more. Move EPR objects to position 8 onward of EPR_Source_Capabilities.',
    ref: `${R31} §6.5.15.1 EPR_Source_Capabilities; §6.4.1`,
    basis: 'from memory',
  },
  'caps.power-rules-missing': {
    severity: 'error',
    title: 'A voltage the Power Rules require is missing',
    explanation:
      "The Power Rules tie a source's PDP (its rated power) to the fixed voltages it must offer: 5 V always; above 15 W also 9 V; above 27 W also 15 V; above 45 W also 20 V; EPR sources above 100 W also 28 V, above 140 W 36 V, above 180 W 48 V, and an EPR AVS range. Sinks are designed around these voltages, so a 45 W charger without 9 V may charge a phone slowly or not at all. Offer every required voltage, or declare the PDP the offers really support.",
    ref: `${R31} §10.2.3, Table 10-2 SPR Normative Voltages and Currents; Table 10-3 EPR Normative Voltages and Currents`,
    basis: 'from memory',
  },
  'caps.power-rules-current': {
    severity: 'error',
    title: 'A required voltage has too little current',
    explanation:
      'Each voltage the Power Rules require must come with a current that matches the PDP: 3 A at every required voltage below the highest one, and PDP divided by the voltage at the highest (for example 65 W needs 20 V at 3.25 A; above 60 W the 20 V current exceeds 3 A and needs a 5 A cable). A sink sized for the rating cannot draw its power otherwise. Raise the current, or declare a lower PDP.',
    ref: `${R31} §10.2.3, Table 10-2 SPR Normative Voltages and Currents; Table 10-3 EPR Normative Voltages and Currents`,
    basis: 'from memory',
  },
  'caps.pps-range': {
    severity: 'warning',
    title: 'Programmable range is not a defined one',
    explanation:
      'The Power Rules define the PPS ranges a source should offer: 3.3–5.9 V, 3.3–11 V, 3.3–16 V and 3.3–21 V in R3.0 and R3.1, and 5–11 V, 5–16 V and 5–21 V in R3.2. Other ranges are not forbidden outright, but sinks and certification tests expect the defined ones; a sink looking for 3.3–21 V may reject a 3.3–20 V range. Offer one of the defined ranges.',
    ref: `${R31} §10.2.3.2, SPR Programmable Power Supply voltage ranges table; ${R32} §10.2.3.2`,
    basis: 'from memory',
  },
  'caps.avs-range': {
    severity: 'warning',
    title: 'EPR AVS range is not the defined one',
    explanation:
      "An EPR adjustable supply runs from 15 V up to the highest EPR fixed voltage of the source's PDP band (28 V up to 140 W, 36 V up to 180 W, 48 V up to 240 W). A different range leaves sinks unsure what they may request. Offer the range the Power Rules give for the PDP.",
    ref: `${R31} §10.2.3.3 EPR Adjustable Voltage Supply; Table 10-3`,
    basis: 'from memory',
  },
  'caps.cable-current': {
    severity: 'info',
    title: 'Offer above 3 A needs a 5 A cable',
    explanation:
      "A sink may draw more than 3 A only through a cable whose electronic marker says it carries 5 A; every USB Type-C cable carries 3 A. With an ordinary cable the offer is usable only up to 3 A (a 20 V × 5 A offer gives 60 W, not 100 W), and a source should not advertise more than 3 A before it has read the cable's marker. This is information, not a fault: use a 5 A cable to get the full power.",
    ref: `${R31} §4.4 Cable Type Detection; USB Type-C R2.3 §4.9 Electronically Marked Cables`,
    basis: 'from memory',
  },
  'caps.pdp-inferred': {
    severity: 'info',
    title: 'PDP inferred from the offers',
    explanation:
      'No PDP was declared (with --pdp, the form, or a Source_Capabilities_Extended message), so Parley took the power of the strongest fixed offer, rounded to whole watts, as the PDP and checked the Power Rules against that. If the adapter is rated higher, declare its PDP to check it against its rating.',
    ref: `${R31} §10.2.1 Source Power Rating (PDP); §6.5.1 Source_Capabilities_Extended (Source PDP)`,
    basis: 'from memory',
  },
  'caps.cable-epr': {
    severity: 'info',
    title: 'EPR offers need an EPR-capable cable',
    explanation:
      'Offers above 20 V (fixed 28, 36 or 48 V, and the EPR adjustable range) exist only in EPR mode, and a sink may enter EPR mode only over a cable whose electronic marker says it carries 50 V and 5 A and is EPR capable. Over any other cable the sink stays in SPR mode and cannot use these offers at all (it does not get them at a lower current). If a customer expects the higher power, check the cable first: it needs an EPR-capable 240 W e-marked cable.',
    ref: `${R32} §6.4.10 EPR Mode; §8.3.3.26 EPR entry (the source checks the cable); USB Type-C R2.3 §4.9 Electronically Marked Cables`,
    basis: 'from memory',
  },
  'caps.revision': {
    severity: 'error',
    title: 'PD 2.0 source offers programmable supplies',
    explanation:
      "Augmented PDOs (programmable PPS ranges, adjustable AVS ranges) were added in USB PD Revision 3.0; a Revision 2.0 port cannot offer them and a Revision 2.0 sink reads them as reserved objects. A source whose messages say Specification Revision 2.0 while its Source_Capabilities hold APDOs is inconsistent: either the header field is wrong (the port really speaks 3.x) or the offers are. Ask the charger's firmware owner which one it is.",
    ref: `${R32} §6.2.1.1.5 Specification Revision; §6.4.1 Power Data Objects (APDOs are Revision 3.x only)`,
    basis: 'from memory',
  },
  'caps.label-mismatch': {
    severity: 'warning',
    title: 'Offers disagree with the printed rating',
    explanation:
      'The rating printed on the adapter names a voltage that is not offered, a current that differs from the offer, or a wattage that differs from the PDP. Either the label or the firmware is wrong, and customers judge a charger by its label. Compare the two and correct the one that is wrong.',
    ref: 'common practice',
    basis: 'common practice',
  },

  // ---- request -----------------------------------------------------------------------------------
  'request.position': {
    severity: 'error',
    title: 'Request names an object that was not offered',
    explanation:
      "The Request's Object Position points at no offer of the Source_Capabilities in force (zero, past the last object, or an empty padding object). A source must Reject it, and the sink gets no contract. Look at how the sink firmware counts positions: they start at 1.",
    ref: `${R31} §6.4.2 Request Message (Object Position); §8.3.3.2 Source Port Policy Engine (Capability Response)`,
    basis: 'from memory',
  },
  'request.exceeds-offer': {
    severity: 'error',
    title: 'Request asks for more than the offer',
    explanation:
      'The Operating Current (or power) requested is higher than the offer allows; for fixed and variable supplies the Maximum Operating Current may exceed it only with Capability Mismatch set. A source must Reject such a request. Cap the request at the offered current and set Capability Mismatch when the sink needs more.',
    ref: `${R31} §6.4.2 Request Message, Tables 6-21 to 6-25 (Request Data Objects)`,
    basis: 'from memory',
  },
  'request.epr-copy': {
    severity: 'error',
    title: 'EPR_Request carries the wrong PDO copy',
    explanation:
      'An EPR_Request sends, after its Request Data Object, a copy of the offer it names, so the source can check that the sink read the same EPR_Source_Capabilities. When the copy is not the object at that position, the two sides disagree about what is asked for, and the source must reject the request (or, worse, apply a different supply). Capture the EPR_Source_Capabilities the sink answered and compare: usually the sink kept a stale list or counted positions wrongly.',
    ref: `${R32} §6.4.2 Request Message (EPR_Request: RDO then a copy of the PDO); §6.5.15 EPR_Source_Capabilities`,
    basis: 'from memory',
  },
  'request.cable-current': {
    severity: 'error',
    title: 'More current requested than the cable carries',
    explanation:
      "The cable's electronic marker (its answer to Discover Identity on SOP') states the VBUS current it is built for, 3 A or 5 A. A source must not offer, and a contract must not use, more than the cable carries: above it the cable heats and may be damaged. The trace shows a contract above the cable's rating; the source should have limited its offers to 3 A after reading the cable, or the sink should not have asked for more.",
    ref: `${R32} §6.4.4.3.1 Discover Identity, Passive/Active Cable VDO (VBUS Current Handling Capability); §4.4 Cable Type Detection; USB Type-C R2.3 §4.9`,
    basis: 'from memory',
  },
  'request.out-of-range': {
    severity: 'error',
    title: "Programmable request outside the offer's range",
    explanation:
      "A PPS or AVS request asks for an output voltage below the offer's minimum or above its maximum. The source must Reject it. Clamp the requested voltage into the range of the APDO the request names.",
    ref: `${R31} §6.4.2 Request Message, PPS and AVS Request Data Objects`,
    basis: 'from memory',
  },

  // ---- timing ------------------------------------------------------------------------------------
  'timing.sender-response': {
    severity: 'error',
    title: 'Response came too late',
    explanation:
      'After a message that expects an answer (Source_Capabilities expects a Request; a Request expects Accept, Reject or Wait), the answer must start within tSenderResponse. Later than that, the waiting side times out and sends Soft_Reset or Hard Reset, which interrupts charging. Look for slow firmware paths between receiving the message and answering.',
    ref: `${R32} §6.6.2 SenderResponseTimer; Time Values table (tSenderResponse)`,
    basis: 'from memory',
  },
  'timing.ps-transition': {
    severity: 'error',
    title: 'PS_RDY came too late',
    explanation:
      "After accepting a Request the source must reach the new voltage and send PS_RDY within tPSTransition. A sink that waits longer sends Hard Reset, and power drops. Check the power stage's slew rate and the firmware's wait before PS_RDY.",
    ref: `${R32} §6.6.6 PSTransitionTimer; Time Values table (tPSTransition)`,
    basis: 'from memory',
  },
  'timing.pps-keepalive': {
    severity: 'error',
    title: 'No PPS keep-alive Request',
    explanation:
      'While a PPS contract holds, the sink must send a new Request at least every tPPSRequest (10 s); a source that hears none within tPPSTimeout drops to vSafe5V with a Hard Reset. Make the sink re-send its Request on a timer.',
    ref: `${R32} §6.6.20 SinkPPSPeriodicTimer; Time Values table (tPPSRequest, tPPSTimeout)`,
    basis: 'from memory',
  },
  'timing.receiver-response': {
    severity: 'warning',
    title: 'Slow answer (tReceiverResponse)',
    explanation:
      'A port that receives a message needing an answer (Source_Capabilities, a Request, a swap request) should send that answer within tReceiverResponse, 15 ms. The partner still waits up to tSenderResponse (about 30 ms), so the negotiation did not fail, but there is little margin left: under load or with a retry the answer will be late and the partner will reset. Look at what the answering side does between receiving and answering.',
    ref: `${R32} §6.6.2 SenderResponseTimer; Time Values table (tReceiverResponse 15 ms)`,
    basis: 'from memory',
  },
  'timing.sink-request': {
    severity: 'error',
    title: 'Request repeated too soon after Wait',
    explanation:
      "When a source answers a Request with Wait, the sink must wait at least tSinkRequest (100 ms) before it asks again, unless new Source_Capabilities arrive first. Asking sooner floods a source that has just said it cannot serve the request yet. Fix the sink's SinkRequestTimer.",
    ref: `${R32} §6.6.4.2 SinkRequestTimer; Time Values table (tSinkRequest)`,
    basis: 'from memory',
  },
  'timing.epr-keepalive': {
    severity: 'error',
    title: 'No EPR keep-alive',
    explanation:
      "In EPR mode the sink must show it is still there: when it has nothing else to send it sends EPR_KeepAlive at least every tSinkEPRKeepAlive (0.5 s), and the source, hearing nothing for tSourceEPRKeepAlive (about 1 s), leaves EPR mode with a Hard Reset so that no 28–48 V stays on an unattended cable. A missing keep-alive is the sink's fault and is the usual cause of an EPR adapter dropping to 5 V about a second after the contract.",
    ref: `${R32} §6.6.21 EPR timers (SinkEPRKeepAliveTimer, SourceEPRKeepAliveTimer); §8.3.3.3.11 EPR keep-alive`,
    basis: 'from memory',
  },
  'timing.hard-reset-recovery': {
    severity: 'error',
    title: 'VBUS did not follow the Hard Reset',
    explanation:
      'After a Hard Reset the source must take VBUS to vSafe0V (starting tPSHardReset after the reset, reaching it within tSafe0V), keep it off for tSrcRecover, turn it back on to vSafe5V within tSrcTurnOn and offer again within tFirstSourceCap; it gives up after nHardResetCount resets with no answer. The VBUS readings show a step missed, too early or too late, or more resets than allowed. A source that does not remove VBUS leaves the sink unsure whether the reset happened; one that comes back too early can harm a sink still discharging.',
    ref: `${R32} §7.1.5 Response to Hard Resets; §6.8.3 Hard Reset; Time Values table (tPSHardReset, tSafe0V, tSrcRecover, tSrcTurnOn, tFirstSourceCap); Counter Values (nHardResetCount)`,
    basis: 'from memory',
  },
  'timing.caps-interval': {
    severity: 'warning',
    title: 'Source_Capabilities repeated at the wrong interval',
    explanation:
      "Before a contract, a source repeats Source_Capabilities every tTypeCSendSourceCap (100–200 ms) until a sink answers. Faster repetition floods the line; slower repetition delays charging and can miss the sink's window. Check the source's caps timer.",
    ref: `${R32} §6.6.4.1 SourceCapabilityTimer; Time Values table (tTypeCSendSourceCap)`,
    basis: 'from memory',
  },

  // ---- protocol ----------------------------------------------------------------------------------
  'protocol.missing-goodcrc': {
    severity: 'error',
    title: 'Message not acknowledged',
    explanation:
      'Every message except GoodCRC must be answered with GoodCRC within tReceive; without it the sender retries up to nRetryCount times with the same MessageID. Here a message got no GoodCRC and was not retried as required. Look for CC-line noise, a receiver that is too slow, or a sender that gives up early.',
    ref: `${R32} §6.6.1 CRCReceiveTimer (tReceive); §6.7.1 nRetryCount`,
    basis: 'from memory',
  },
  'protocol.message-id': {
    severity: 'error',
    title: 'MessageID repeats or skips',
    explanation:
      "Each side counts its messages with a 3-bit MessageID that advances after a GoodCRC and stays the same only for a retry. A repeated ID that is not a retry makes the receiver drop the message as a duplicate; a skipped ID points at a lost message or a counter bug. Check the sender's MessageIDCounter handling, especially after Soft_Reset.",
    ref: `${R32} §6.2.1.1.6 MessageID; §6.7.2 MessageIDCounter`,
    basis: 'from memory',
  },
  'protocol.unexpected': {
    severity: 'error',
    title: 'Message not allowed in this state',
    explanation:
      "A message arrived that the receiver's state does not allow: PS_RDY without Accept, a Request before any Source_Capabilities, Accept with nothing to accept. A receiver answers with Soft_Reset, so the negotiation starts over. Compare the sequence with the policy engine state diagrams.",
    ref: `${R32} §8.3.3 State Diagrams`,
    basis: 'from memory',
  },
  'protocol.collision': {
    severity: 'error',
    title: 'Sink started an exchange while the source said SinkTxNG',
    explanation:
      "In USB PD 3.x the source signals through its Rp who may start the next exchange: Rp at 3.0 A means SinkTxOK (the sink may start), Rp at 1.5 A means SinkTxNG (the source is about to send; the sink must not start). A sink that starts anyway, after the source has held SinkTxNG for tSinkTx, collides with the source's message, and one of them is lost. Fix the sink to read Rp before it starts an exchange.",
    ref: `${R32} §5.7 Collision Avoidance; USB Type-C R2.3 §4.8.1.3 (Rp levels as SinkTxOK/SinkTxNG); Time Values table (tSinkTx)`,
    basis: 'from memory',
  },
  'protocol.hard-reset': {
    severity: 'info',
    title: 'Hard Reset',
    explanation:
      'A Hard Reset returns both sides to their defaults: the source drops VBUS to vSafe0V and back to vSafe5V, and the negotiation starts over. It is the last resort after timeouts or failed Soft_Resets; the finding names the likely cause when one appears before it.',
    ref: `${R32} §6.8.3 Hard Reset`,
    basis: 'from memory',
  },
  'protocol.soft-reset': {
    severity: 'info',
    title: 'Soft_Reset',
    explanation:
      'A Soft_Reset resets the message counters and the protocol state without touching VBUS; the source then sends Source_Capabilities again. It is the normal answer to an unexpected message. An occasional one is harmless; many point at a protocol fault worth finding.',
    ref: `${R32} §6.8.1 Soft Reset and Protocol Error`,
    basis: 'from memory',
  },

  // ---- epr ---------------------------------------------------------------------------------------
  'epr.entry': {
    severity: 'error',
    title: 'EPR mode entered out of order',
    explanation:
      "EPR mode has a fixed way in: an explicit SPR contract, the sink's EPR_Mode (Enter), the source's Enter Acknowledged, the source checking the cable's e-marker, then Enter Succeeded; only then come EPR_Source_Capabilities and EPR_Request. The trace shows a step skipped — EPR offers or an EPR_Request outside EPR mode, or EPR mode entered over a cable whose e-marker is not EPR capable (which risks 28–48 V on a cable not built for it).",
    ref: `${R32} §6.4.9 EPR_Mode; §8.3.3.26 EPR Mode entry (source and sink); §6.4.4.3.1 cable VDO EPR Mode Capable`,
    basis: 'from memory',
  },

  // ---- vbus --------------------------------------------------------------------------------------
  'vbus.out-of-range': {
    severity: 'error',
    title: "VBUS outside the contract's tolerance",
    explanation:
      "After PS_RDY the source must hold VBUS within the tolerance of the contract (±5 % for a fixed supply; the programmed voltage within its tolerance for PPS). Outside it, a sink may refuse to charge or be damaged. Measure at the source's connector to separate a source fault from cable drop.",
    ref: `${R32} §7.1.8 Output Voltage Tolerance and Range; Source Electrical Parameters table (vSrcNew)`,
    basis: 'from memory',
  },
  'vbus.over-current': {
    severity: 'warning',
    title: 'Current above the contract',
    explanation:
      'The sink draws more current than the Operating Current of its contract. A source may cut power or lower the voltage to protect itself, and a cable may overheat. Make the sink respect its negotiated current, or request more.',
    ref: `${R32} §7.2.3 Sink Standby; §6.4.2 Request Message (Operating Current)`,
    basis: 'from memory',
  },

  // ---- trace -------------------------------------------------------------------------------------
  'trace.malformed-line': {
    severity: 'warning',
    title: 'Unreadable trace line',
    explanation:
      'A line of the trace file could not be read (not valid JSON, an unknown record, an unreadable hex field). Parley skipped it and analysed the rest, so findings around that point may be incomplete. Check the tool that wrote the trace.',
    ref: 'common practice',
    basis: 'common practice',
  },
  'trace.time-order': {
    severity: 'error',
    title: 'Time goes backwards',
    explanation:
      "A record's time stamp is earlier than the one before it. Timing checks need a monotonic clock, so results near that point cannot be trusted. Look for merged captures or a logger whose clock wrapped.",
    ref: 'common practice',
    basis: 'common practice',
  },
} as const satisfies Record<string, RuleEntry>;

export type RuleId = keyof typeof ruleCatalog;

export const ruleIds = Object.keys(ruleCatalog) as RuleId[];

export function isRuleId(value: string): value is RuleId {
  return Object.hasOwn(ruleCatalog, value);
}

/** A finding's name in plain words (the catalog's title), or the id itself for a rule this build does not know. */
export function ruleTitle(rule: string): string {
  return isRuleId(rule) ? ruleCatalog[rule].title : rule;
}

export function ruleGroup(rule: RuleId): RuleGroup {
  return rule.slice(0, rule.indexOf('.')) as RuleGroup;
}

/**
 * A finding with the catalog's severity and ref (a caller may give a more precise ref). `lowerTo`
 * may only soften it: a fault the ports recovered from (a CRC error a retry repaired) is a warning.
 */
export function makeFinding(rule: RuleId, message: string, extra: { t?: number; line?: number; object?: number; ref?: string; lowerTo?: Severity } = {}): Finding {
  const entry: RuleEntry = ruleCatalog[rule];
  const rank: Record<Severity, number> = { info: 0, warning: 1, error: 2 };
  const severity = extra.lowerTo !== undefined && rank[extra.lowerTo] < rank[entry.severity] ? extra.lowerTo : entry.severity;
  const finding: Finding = { rule, severity, message, ref: extra.ref ?? entry.ref };
  if (extra.t !== undefined) finding.t = extra.t;
  if (extra.line !== undefined) finding.line = extra.line;
  if (extra.object !== undefined) finding.object = extra.object;
  return finding;
}
